// Store answers (SPARQL JSON results text, N-Triples text) → QueryResult with blank nodes relabelled b0, b1, … in
// order.
import { Parser, type Term as N3Term } from 'n3';
import { UserError, EXIT } from '../errors.js';
import { NS } from '../namespaces.js';
import type { QueryResult, ResultQuad, Term } from './types.js';

const XSD_STRING = `${NS.xsd}string`;
const RDF_LANG_STRING = `${NS.rdf}langString`;

interface JsonTerm {
  type: string;
  value: string;
  datatype?: string;
  'xml:lang'?: string;
}

/** Gives blank nodes stable labels in order of first appearance, so answers from different stores compare equal. */
class Relabel {
  private readonly seen = new Map<string, string>();
  term(t: Term): Term {
    if (t.type !== 'bnode') return t;
    let l = this.seen.get(t.value);
    if (l === undefined) this.seen.set(t.value, (l = `b${this.seen.size}`));
    return { type: 'bnode', value: l };
  }
}

function fromJson(j: JsonTerm, where: string): Term {
  // SPARQL 1.1 Query Results JSON Format §3.2.2; "typed-literal" is the 2008 Note's form, still sent by some stores.
  if (j.type === 'uri') return { type: 'uri', value: j.value };
  if (j.type === 'bnode') return { type: 'bnode', value: j.value };
  if (j.type === 'literal' || j.type === 'typed-literal') {
    const lang = j['xml:lang'];
    if (lang) return { type: 'literal', value: j.value, lang: lang.toLowerCase() };
    if (j.datatype && j.datatype !== XSD_STRING && j.datatype !== RDF_LANG_STRING)
      return { type: 'literal', value: j.value, datatype: j.datatype };
    return { type: 'literal', value: j.value };
  }
  throw new UserError(
    {
      file: where,
      line: 0,
      field: 'type',
      message: `unknown term type "${j.type}" in the store's answer`,
      hint: 'the endpoint must answer in SPARQL 1.1 Query Results JSON',
    },
    EXIT.failure,
  );
}

/** Parses a SPARQL 1.1 Query Results JSON document (§3: head.vars + results.bindings, or boolean). */
export function parseResultsJson(text: string, where: string): QueryResult {
  let doc: { head?: { vars?: string[] }; boolean?: boolean; results?: { bindings?: Record<string, JsonTerm>[] } };
  try {
    doc = JSON.parse(text);
  } catch {
    throw new UserError(
      {
        file: where,
        line: 0,
        field: '',
        message: `the store's answer is not JSON: ${text.slice(0, 120)}`,
        hint: 'check the query endpoint URL',
      },
      EXIT.failure,
    );
  }
  if (typeof doc.boolean === 'boolean') return { kind: 'boolean', value: doc.boolean };
  const vars = doc.head?.vars ?? [];
  const relabel = new Relabel();
  const rows = (doc.results?.bindings ?? []).map((b) => {
    const row: Record<string, Term> = {};
    for (const v of vars) if (b[v]) row[v] = relabel.term(fromJson(b[v], where));
    return row;
  });
  return { kind: 'bindings', vars, rows };
}

function fromN3(t: N3Term): Term {
  if (t.termType === 'NamedNode') return { type: 'uri', value: t.value };
  if (t.termType === 'BlankNode') return { type: 'bnode', value: t.value };
  if (t.termType === 'Literal') {
    if (t.language) return { type: 'literal', value: t.value, lang: t.language.toLowerCase() };
    const dt = t.datatype.value;
    return dt === XSD_STRING || dt === RDF_LANG_STRING
      ? { type: 'literal', value: t.value }
      : { type: 'literal', value: t.value, datatype: dt };
  }
  throw new Error(`unexpected term type ${t.termType}`);
}

/** Parses N-Triples (RDF 1.1 N-Triples §2) as returned for CONSTRUCT / DESCRIBE. */
export function parseNTriples(text: string, where: string): QueryResult {
  let parsed;
  try {
    parsed = new Parser({ format: 'N-Triples', blankNodePrefix: '' }).parse(text);
  } catch (err) {
    throw new UserError(
      {
        file: where,
        line: 0,
        field: '',
        message: `the store's answer is not N-Triples: ${(err as Error).message}`,
        hint: 'check the query endpoint URL',
      },
      EXIT.failure,
    );
  }
  const relabel = new Relabel();
  const quads: ResultQuad[] = parsed.map((q) => ({
    subject: relabel.term(fromN3(q.subject)),
    predicate: fromN3(q.predicate),
    object: relabel.term(fromN3(q.object)),
  }));
  return { kind: 'quads', quads };
}
