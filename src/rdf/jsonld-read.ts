// JSON-LD text → N-Quads text via jsonld.js, offline: the only adapter over the jsonld package for reading.
import { UserError } from '../errors.js';
import { parseJson } from '../io/json-file.js';

/** Minimal view of the parts of jsonld.js used here (the package ships no types). */
interface JsonLdApi {
  toRDF(input: unknown, options: Record<string, unknown>): Promise<string>;
}

let api: Promise<JsonLdApi> | null = null;
function jsonld(): Promise<JsonLdApi> {
  const name = 'jsonld';
  api ??= import(name).then((m: { default?: JsonLdApi }) => (m.default ?? m) as JsonLdApi);
  return api;
}

/**
 * Converts a JSON-LD document to N-Quads (JSON-LD 1.1 API §4.6 toRdf) with a document loader that refuses every
 * fetch, so remote contexts are an error rather than a network request. `contexts` maps context URLs to
 * local documents the caller vouches for.
 */
export async function jsonldToNQuads(
  text: string,
  file: string,
  base: string,
  contexts: Record<string, unknown> = {},
): Promise<string> {
  const doc = parseJson(text, file);
  const documentLoader = async (url: string) => {
    if (Object.hasOwn(contexts, url)) return { contextUrl: null, documentUrl: url, document: contexts[url] };
    throw new UserError({ file, line: 0, field: '@context', message: `remote document ${url} is not fetched`, hint: 'inline the context in the file' });
  };
  try {
    return await (await jsonld()).toRDF(doc, { base, format: 'application/n-quads', documentLoader });
  } catch (err) {
    const cause = (err as { details?: { cause?: unknown } }).details?.cause;
    if (cause instanceof UserError) throw cause;
    if (err instanceof UserError) throw err;
    const e = err as { name?: string; message?: string; details?: { code?: string } };
    if (e.name !== 'jsonld.SyntaxError' && !e.details?.code && e.name !== 'jsonld.InvalidUrl') throw err;
    throw new UserError({ file, line: 0, field: '', message: `invalid JSON-LD: ${e.details?.code ?? e.message}`, hint: e.message ?? 'check the JSON-LD document' });
  }
}
