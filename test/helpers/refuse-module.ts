// Module resolve hook for a child process: importing rdf-validate-shacl fails, to show which runs never load it.
export async function resolve(
  specifier: string,
  context: unknown,
  next: (s: string, c: unknown) => Promise<unknown>,
): Promise<unknown> {
  if (specifier.startsWith('rdf-validate-shacl')) throw new Error(`refused to load ${specifier}`);
  return next(specifier, context);
}
