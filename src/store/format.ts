// QueryResult → text: SPARQL 1.1 Results JSON / CSV / TSV, an aligned table for people, N-Triples for graphs.
import { NS } from '../namespaces.js';
import { csvCell } from '../io/csv-write.js';
import type { QueryResult, ResultQuad, Term } from './types.js';

/** Output formats of `concordat query`. */
export type ResultFormat = 'table' | 'csv' | 'tsv' | 'json';

const XSD = NS.xsd;
const NT_ESCAPE: Record<string, string> = {
  '\\': '\\\\',
  '"': '\\"',
  '\n': '\\n',
  '\r': '\\r',
  '\t': '\\t',
  '\b': '\\b',
  '\f': '\\f',
};
const u4 = (c: string): string => `\\u${c.charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}`;

/** A string's body escaped as in RDF 1.1 N-Triples §2.4 (STRING_LITERAL_QUOTE with ECHAR, UCHAR for other controls). */
export function escapeString(s: string): string {
  return s.replace(/[\\"\n\r\t\b\f\u0000-\u001F\u007F]/g, (c) => NT_ESCAPE[c] ?? u4(c));
}

/** One term in N-Triples syntax (RDF 1.1 N-Triples §2.3–2.5); IRIs escape what IRIREF excludes with UCHAR. */
export function ntTerm(t: Term): string {
  if (t.type === 'uri') return `<${t.value.replace(/[\u0000-\u0020<>"{}|^`\\]/g, u4)}>`;
  if (t.type === 'bnode') return `_:${t.value}`;
  const body = `"${escapeString(t.value)}"`;
  if (t.lang) return `${body}@${t.lang}`;
  return t.datatype ? `${body}^^${ntTerm({ type: 'uri', value: t.datatype })}` : body;
}

/** One triple as an N-Triples line. */
export function ntLine(q: ResultQuad): string {
  return `${ntTerm(q.subject)} ${ntTerm(q.predicate)} ${ntTerm(q.object)} .`;
}

const BARE_NUMBER: Record<string, RegExp> = {
  [`${XSD}integer`]: /^[+-]?[0-9]+$/,
  [`${XSD}decimal`]: /^[+-]?[0-9]*\.[0-9]+$/,
  [`${XSD}double`]: /^[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)[eE][+-]?[0-9]+$/,
};

/** TSV cell: the term in Turtle syntax, numbers abbreviated (SPARQL 1.1 Results CSV/TSV, "TSV" section). */
function tsvCell(t: Term | undefined): string {
  if (!t) return '';
  if (t.type === 'literal' && t.datatype && BARE_NUMBER[t.datatype]?.test(t.value)) return t.value;
  return ntTerm(t);
}

/** CSV cell: IRI, lexical form or `_:label`, quoted per RFC 4180 §2 when it holds `"`, `,`, CR or LF. */
function csvTerm(t: Term | undefined): string {
  if (!t) return '';
  return csvCell(t.type === 'bnode' ? `_:${t.value}` : t.value);
}

/** Shortened term for people: prefixed names from the project's namespace table, plain numbers, quoted strings. */
function tableCell(t: Term | undefined): string {
  if (!t) return '';
  const short = (iri: string): string | undefined => {
    for (const [p, ns] of Object.entries(NS))
      if (iri.startsWith(ns) && /^[A-Za-z0-9_-]*$/.test(iri.slice(ns.length))) return `${p}:${iri.slice(ns.length)}`;
    return undefined;
  };
  if (t.type === 'uri') return short(t.value) ?? `<${t.value}>`;
  if (t.type === 'literal' && t.datatype) {
    if (BARE_NUMBER[t.datatype]?.test(t.value) || t.datatype === `${XSD}boolean`) return t.value;
    return `"${escapeString(t.value)}"^^${short(t.datatype) ?? `<${t.datatype}>`}`;
  }
  return ntTerm(t);
}

function jsonTerm(t: Term): Record<string, string> {
  if (t.type !== 'literal') return { type: t.type, value: t.value };
  if (t.lang) return { type: 'literal', value: t.value, 'xml:lang': t.lang };
  return t.datatype ? { type: 'literal', value: t.value, datatype: t.datatype } : { type: 'literal', value: t.value };
}

function table(vars: string[], rows: Record<string, Term>[]): string {
  const cells = rows.map((r) => vars.map((v) => tableCell(r[v])));
  const head = vars.map((v) => `?${v}`);
  // a loop, not Math.max(...cells): a spread of 150k rows overflows the call stack
  const width = vars.map((_, i) => cells.reduce((w, c) => Math.max(w, c[i].length), head[i].length));
  const line = (c: string[]): string =>
    c
      .map((s, i) => s.padEnd(width[i]))
      .join('  ')
      .trimEnd();
  return [line(head), width.map((w) => '-'.repeat(w)).join('  '), ...cells.map(line)].join('\n') + '\n';
}

const SELECT_WRITERS: Record<ResultFormat, (vars: string[], rows: Record<string, Term>[]) => string> = {
  // SPARQL 1.1 Query Results JSON Format §3
  json: (vars, rows) =>
    JSON.stringify(
      {
        head: { vars },
        results: {
          bindings: rows.map((r) => Object.fromEntries(vars.filter((v) => r[v]).map((v) => [v, jsonTerm(r[v])]))),
        },
      },
      null,
      2,
    ) + '\n',
  // SPARQL 1.1 Query Results CSV and TSV Formats, "CSV": header of names without "?", CRLF line ends
  csv: (vars, rows) =>
    [vars.join(','), ...rows.map((r) => vars.map((v) => csvTerm(r[v])).join(','))].join('\r\n') + '\r\n',
  // same document, "TSV": header of "?names", LF line ends
  tsv: (vars, rows) =>
    [vars.map((v) => `?${v}`).join('\t'), ...rows.map((r) => vars.map((v) => tsvCell(r[v])).join('\t'))].join('\n') +
    '\n',
  table,
};

/** Writes a query result in the chosen format: ASK → `true`/`false` (JSON: §3.3 boolean), graphs → N-Triples. */
export function formatResult(result: QueryResult, format: ResultFormat): string {
  if (result.kind === 'boolean')
    return format === 'json' ? JSON.stringify({ head: {}, boolean: result.value }) + '\n' : `${result.value}\n`;
  if (result.kind === 'quads') return result.quads.map((q) => ntLine(q) + '\n').join('');
  return SELECT_WRITERS[format](result.vars, result.rows);
}
