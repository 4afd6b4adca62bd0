// JSON-LD text → N-Quads text via jsonld.js, offline: the only adapter over the jsonld package for reading.
import { UserError } from '../errors.js';

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

/** 1-based line and column of a character offset. */
function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let start = 0;
  for (let i = text.indexOf('\n'); i !== -1 && i < offset; i = text.indexOf('\n', i + 1)) {
    line++;
    start = i + 1;
  }
  return { line, column: offset - start + 1 };
}

/** Parses JSON, turning a syntax error into a UserError that names the line (RFC 8259 §2). */
export function parseJson(text: string, file: string): unknown {
  try {
    return JSON.parse(text);
  } catch (err) {
    const message = (err as Error).message;
    const pos = /position (\d+)/.exec(message);
    const where = pos ? lineColumn(text, Number(pos[1])) : { line: 0, column: undefined };
    throw new UserError({ file, line: where.line, column: where.column, field: '', message: `invalid JSON: ${message}`, hint: 'fix the JSON syntax' });
  }
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
