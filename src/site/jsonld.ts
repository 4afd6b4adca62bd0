// Statements → JSON-LD 1.1 node objects (one per subject, in first-seen order) and the text of a document holding them.
import { NS, iri } from '../namespaces.js';
import type { Statement, Term } from './nquads.js';

const RDF_TYPE = iri('rdf', 'type');
const XSD_STRING = iri('xsd', 'string');
const XSD_INTEGER = iri('xsd', 'integer');
const XSD_BOOLEAN = iri('xsd', 'boolean');
/** Prefixes of the site's JSON-LD documents: the publishing prefixes (JSON-LD 1.1 §4.1.5 compact IRIs). */
const PREFIXES = ['rdf', 'rdfs', 'xsd', 'owl', 'skos', 'dcterms', 'prov', 'void', 'dcat', 'foaf', 'cx'] as const;
export const CONTEXT: Record<string, string> = Object.fromEntries(PREFIXES.map((p) => [p, NS[p]]));
const BY_LENGTH = PREFIXES.map((p) => [p, NS[p]] as const).sort((a, b) => b[1].length - a[1].length);
/**
 * The prefix standing for the release's base in `@id` values: a term whose IRI ends in `/` or `#` is a prefix (JSON-LD
 * 1.1 §4.1.5), and a compact IRI expands by plain concatenation, so `base:link/35e6…` is exactly `{base}link/35e6…`.
 */
const BASE = 'base';
/**
 * Integers in the canonical lexical form and short enough to stay exact as JSON numbers (JSON-LD 1.1 Processing
 * Algorithms §8.6: a JSON number without fraction becomes an xsd:integer in its canonical form).
 */
const CANONICAL_INTEGER = /^(?:0|-?[1-9][0-9]{0,14})$/;
const NAME = /^[A-Za-z_][A-Za-z0-9_-]*$/;

/** An IRI as a compact IRI when a prefix covers it and the rest is a plain name, else the IRI itself. */
function compactIri(p: string): string {
  for (const [name, ns] of BY_LENGTH)
    if (p.startsWith(ns) && NAME.test(p.slice(ns.length))) return `${name}:${p.slice(ns.length)}`;
  return p;
}
/** Predicates, classes and datatypes repeat: their compact forms, remembered (up to a few thousand). */
const compacted = new Map<string, string>();
function compact(p: string): string {
  let c = compacted.get(p);
  if (c === undefined) {
    if (compacted.size >= 4096) compacted.clear();
    // copies: `p` is a slice of the release's text (and its compact form built on one) and would keep its whole chunk
    // of the file alive
    const copy = (x: string) => JSON.parse(JSON.stringify(x)) as string;
    compacted.set(copy(p), (c = copy(compactIri(p))));
  }
  return c;
}

/** Writes a site's JSON-LD: node objects of statements, and whole documents with the context. */
export class JsonLd {
  private readonly context: string;
  private readonly baseOk: boolean;
  constructor(private readonly base: string) {
    this.context = JSON.stringify({ ...CONTEXT, [BASE]: base });
    // a base ending in '/' or '#' is a prefix; anything after it that starts with '//' would read as an absolute IRI
    this.baseOk = /[/#]$/.test(base);
  }

  /** An `@id` value: IRIs under the base as `base:…`, vocabulary terms as compact IRIs, others absolute. */
  private id(x: string): string {
    if (this.baseOk && x.startsWith(this.base) && !x.startsWith('//', this.base.length))
      return `${BASE}:${x.slice(this.base.length)}`;
    return compact(x);
  }

  /**
   * A value as JSON text (JSON-LD 1.1 §4.2): node references by `@id`; strings as JSON strings, canonical integers and
   * booleans as JSON numbers and booleans (§4.2.1 native types); other literals with `@type` or `@language`.
   */
  private value(o: Term): string {
    if (o.kind === 'iri') return `{"@id":${JSON.stringify(this.id(o.value))}}`;
    if (o.kind === 'bnode') return `{"@id":${JSON.stringify(`_:${o.value}`)}}`;
    const v = JSON.stringify(o.value);
    if (o.language) return `{"@value":${v},"@language":${JSON.stringify(o.language)}}`;
    const dt = o.datatype;
    if (!dt || dt === XSD_STRING) return v;
    if (dt === XSD_INTEGER && CANONICAL_INTEGER.test(o.value)) return o.value;
    if (dt === XSD_BOOLEAN && (o.value === 'true' || o.value === 'false')) return o.value;
    return `{"@value":${v},"@type":${JSON.stringify(compact(dt))}}`;
  }

  /**
   * Node objects of the statements, one per subject in first-seen order, as JSON text joined by commas (for a `@graph`
   * array); a key with one value has no array (JSON-LD 1.1 §4.3.1: an array only groups the values). Written as text
   * directly: no object per value, no walk by JSON.stringify.
   */
  nodes(statements: readonly Statement[]): string {
    const nodes = new Map<string, Map<string, string[]>>();
    for (const st of statements) {
      let n = nodes.get(st.s);
      if (!n) nodes.set(st.s, (n = new Map()));
      const isType = st.p === RDF_TYPE && st.o.kind === 'iri';
      const k = isType ? '@type' : compact(st.p);
      const text = isType ? JSON.stringify(compact(st.o.value)) : this.value(st.o);
      const l = n.get(k);
      if (l) l.push(text);
      else n.set(k, [text]);
    }
    const out: string[] = [];
    for (const [s, n] of nodes) {
      let t = `{"@id":${JSON.stringify(this.id(s))}`;
      for (const [k, vs] of n) t += `,${JSON.stringify(k)}:${vs.length === 1 ? vs[0] : `[${vs.join(',')}]`}`;
      out.push(t + '}');
    }
    return out.join(',\n');
  }

  /** A whole JSON-LD document: the context and a `@graph` of node texts (JSON-LD 1.1 §4.9 named graphs / `@graph`). */
  document(nodeTexts: readonly string[]): string {
    const body = nodeTexts.filter((t) => t.length > 0).join(',\n');
    return `{"@context":${this.context},\n"@graph":[\n${body}\n]}\n`;
  }
}
