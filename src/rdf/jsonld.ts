// The only adapter over the jsonld package (loaded on first use, offline): JSON-LD text → N-Quads, quads → compacted
// JSON-LD.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Quad } from '@rdfjs/types';
import type JsonLd from 'jsonld';
import { UserError } from '../errors.js';
import { parseJson } from '../io/json-file.js';

/** The release's JSON-LD context (vocab-map/context.jsonld), shared by the dumps, the pages and citations. */
export const CONTEXT_FILE = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '..',
  '..',
  '..',
  'vocab-map',
  'context.jsonld',
);
export const JSONLD_CONTEXT: Record<string, unknown> = JSON.parse(readFileSync(CONTEXT_FILE, 'utf8'))['@context'];

let api: Promise<typeof JsonLd> | null = null;
/** jsonld.js, imported on first use: it is large, and most commands never need it. */
function jsonld(): Promise<typeof JsonLd> {
  api ??= import('jsonld').then((m) => m.default);
  return api;
}

/** A document loader that fetches nothing: `contexts` maps URLs to local documents; anything else is an error. */
function offlineLoader(file: string, contexts: Record<string, unknown>) {
  return async (url: string) => {
    if (Object.hasOwn(contexts, url)) return { contextUrl: null, documentUrl: url, document: contexts[url] };
    throw new UserError({
      file,
      line: 0,
      field: '@context',
      message: `remote document ${url} is not fetched`,
      hint: 'inline the context in the file',
    });
  };
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
  try {
    return (await (
      await jsonld()
    ).toRDF(doc, { base, format: 'application/n-quads', documentLoader: offlineLoader(file, contexts) })) as string;
  } catch (err) {
    const cause = (err as { details?: { cause?: unknown } }).details?.cause;
    if (cause instanceof UserError) throw cause;
    if (err instanceof UserError) throw err;
    const e = err as { name?: string; message?: string; details?: { code?: string } };
    if (e.name !== 'jsonld.SyntaxError' && !e.details?.code && e.name !== 'jsonld.InvalidUrl') throw err;
    throw new UserError({
      file,
      line: 0,
      field: '',
      message: `invalid JSON-LD: ${e.details?.code ?? e.message}`,
      hint: e.message ?? 'check the JSON-LD document',
    });
  }
}

/**
 * Quads → one JSON-LD document compacted against `context` (JSON-LD 1.1 API §4.6 fromRDF, §4.1 compaction), graph
 * names dropped, offline. Literals keep their lexical form (useNativeTypes false): decimals stay strings under
 * xsd:decimal coercion.
 */
export async function compactQuads(
  quads: readonly Quad[],
  context: Record<string, unknown>,
  label: string,
): Promise<object> {
  const dataset = quads.map((q) => ({
    subject: { termType: q.subject.termType, value: q.subject.value },
    predicate: { termType: 'NamedNode', value: q.predicate.value },
    object:
      q.object.termType === 'Literal'
        ? {
            termType: 'Literal',
            value: q.object.value,
            datatype: { termType: 'NamedNode', value: q.object.datatype.value },
            ...(q.object.language ? { language: q.object.language } : {}),
          }
        : { termType: q.object.termType, value: q.object.value },
    graph: { termType: 'DefaultGraph', value: '' },
  }));
  const api = await jsonld();
  const expanded = await api.fromRDF(dataset, { useNativeTypes: false });
  return api.compact(expanded, { '@context': context }, { documentLoader: offlineLoader(label, {}) });
}
