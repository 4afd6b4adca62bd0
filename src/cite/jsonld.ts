// A citation's statements (links, matches, runs, reviews, works, dataset) → one compacted JSON-LD document.
import jsonld from 'jsonld';
import type { Quad } from '@rdfjs/types';
import { JSONLD_CONTEXT } from '../publish/jsonld.js';
import type { Citation } from './types.js';

const documentLoader = async (url: string) => {
  throw new Error(`concordat does not fetch remote JSON-LD documents (${url})`);
};

const key = (q: Quad) => `${q.subject.value}\u0000${q.predicate.value}\u0000${q.object.value}`;

/**
 * The statements a citation rests on, graph names dropped, as JSON-LD 1.1 compacted against the release context
 * (JSON-LD 1.1 API §4.6 fromRDF, §4.1 compaction); decimals stay strings under xsd:decimal coercion.
 */
export async function citationJsonLd(c: Citation): Promise<object> {
  const seen = new Set<string>();
  const dataset = [...c.quads].sort((x, y) => (key(x) < key(y) ? -1 : 1)).filter((q) => !seen.has(key(q)) && !!seen.add(key(q))).map((q) => ({
    subject: { termType: q.subject.termType, value: q.subject.value },
    predicate: { termType: 'NamedNode', value: q.predicate.value },
    object: q.object.termType === 'Literal'
      ? { termType: 'Literal', value: q.object.value, datatype: { termType: 'NamedNode', value: q.object.datatype.value }, ...(q.object.language ? { language: q.object.language } : {}) }
      : { termType: q.object.termType, value: q.object.value },
    graph: { termType: 'DefaultGraph', value: '' },
  }));
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const expanded = await jsonld.fromRDF(dataset as any, { useNativeTypes: false });
  return jsonld.compact(expanded, { '@context': JSONLD_CONTEXT }, { documentLoader });
}
