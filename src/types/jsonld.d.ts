// Minimal typings for the parts of jsonld.js concordat uses (the package ships none).
declare module 'jsonld' {
  type Options = Record<string, unknown>;
  const jsonld: {
    fromRDF(dataset: unknown, options?: Options): Promise<object[]>;
    toRDF(input: unknown, options?: Options): Promise<unknown>;
    frame(input: unknown, frame: object, options?: Options): Promise<object>;
    compact(input: unknown, ctx: object, options?: Options): Promise<object>;
  };
  export default jsonld;
}
