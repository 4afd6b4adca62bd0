// Statements → JSON-LD 1.1 node objects (one per subject, in first-seen order) and the text of a document holding them.
import { NS, iri } from '../namespaces.js';
import type { Statement, Term } from './nquads.js';

const RDF_TYPE = iri('rdf', 'type');
/** Prefixes of the site's JSON-LD documents: the publishing prefixes (JSON-LD 1.1 §4.1.5 compact IRIs). */
const PREFIXES = ['rdf', 'rdfs', 'xsd', 'owl', 'skos', 'dcterms', 'prov', 'void', 'dcat', 'foaf', 'cx'] as const;
export const CONTEXT: Record<string, string> = Object.fromEntries(PREFIXES.map((p) => [p, NS[p]]));
const BY_LENGTH = PREFIXES.map((p) => [p, NS[p]] as const).sort((a, b) => b[1].length - a[1].length);

/** A property IRI as a compact IRI when a prefix covers it and the rest is a plain name, else the IRI itself. */
function key(p: string): string {
  for (const [name, ns] of BY_LENGTH)
    if (p.startsWith(ns) && /^[A-Za-z_][A-Za-z0-9_-]*$/.test(p.slice(ns.length)))
      return `${name}:${p.slice(ns.length)}`;
  return p;
}

/** A value object (JSON-LD 1.1 §4.2): node references by @id, literals with @type or @language. */
function value(o: Term): object {
  if (o.kind === 'iri') return { '@id': o.value };
  if (o.kind === 'bnode') return { '@id': `_:${o.value}` };
  if (o.language) return { '@value': o.value, '@language': o.language };
  if (o.datatype && o.datatype !== iri('xsd', 'string')) return { '@value': o.value, '@type': o.datatype };
  return { '@value': o.value };
}

/** Node objects of the statements, one per subject, as JSON text joined by commas (for a `@graph` array). */
export function jsonldNodes(statements: readonly Statement[]): string {
  const nodes = new Map<string, Record<string, unknown[]>>();
  for (const st of statements) {
    let n = nodes.get(st.s);
    if (!n) nodes.set(st.s, (n = {}));
    if (st.p === RDF_TYPE && st.o.kind === 'iri') (n['@type'] ??= []).push(st.o.value);
    else (n[key(st.p)] ??= []).push(value(st.o));
  }
  const out: string[] = [];
  for (const [s, n] of nodes) out.push(JSON.stringify({ '@id': s, ...n }));
  return out.join(',\n');
}

/** A whole JSON-LD document: the context and a `@graph` of node texts (JSON-LD 1.1 §4.9 named graphs / `@graph`). */
export function jsonldDocument(nodeTexts: readonly string[]): string {
  const body = nodeTexts.filter((t) => t.length > 0).join(',\n');
  return `{"@context":${JSON.stringify(CONTEXT)},\n"@graph":[\n${body}\n]}\n`;
}
