// A citation's statements (links, matches, runs, reviews, works, dataset) → one compacted JSON-LD document.
import type { Quad } from '@rdfjs/types';
import { JSONLD_CONTEXT, compactQuads } from '../rdf/jsonld.js';
import type { Citation } from './types.js';

const key = (q: Quad) => `${q.subject.value}\u0000${q.predicate.value}\u0000${q.object.value}`;

/**
 * The statements a citation rests on, graph names dropped, each once, in a fixed order, as JSON-LD 1.1 compacted
 * against the release context (see compactQuads); decimals stay strings under xsd:decimal coercion.
 */
export async function citationJsonLd(c: Citation): Promise<object> {
  const seen = new Set<string>();
  const quads = [...c.quads]
    .sort((x, y) => (key(x) < key(y) ? -1 : 1))
    .filter((q) => !seen.has(key(q)) && !!seen.add(key(q)));
  return compactQuads(quads, JSONLD_CONTEXT, 'citation');
}
