// SPARQL text + user-supplied parameter values → SPARQL text with each declared `?name` replaced by an escaped term.
import { UserError, EXIT } from '../errors.js';
import { NS } from '../namespaces.js';

/** The value kinds a query header may declare (`# param work: iri`). */
export type ParamType = 'iri' | 'string' | 'integer' | 'decimal' | 'boolean';

/** One declared parameter of a query file. */
export interface ParamDecl {
  name: string;
  type: ParamType;
  doc: string;
}

const DECL = /^#\s*param\s+([A-Za-z_][A-Za-z0-9_]*)\s*:\s*([A-Za-z]+)\s*(.*)$/;
// SPARQL 1.1 Query §19.8 [139] IRIREF ::= '<' ([^<>"{}|^`\]-[#x00-#x20])* '>'
const IRIREF = /<[^<>"{}|^`\\\u0000-\u0020]*>/y;
const NOT_IN_IRIREF = /[<>"{}|^`\\\u0000-\u0020]/;
const ABSOLUTE = /^[A-Za-z][A-Za-z0-9+.-]*:/; // RFC 3987 §2.2 scheme ":" …
// eslint-disable-next-line no-misleading-character-class -- combining marks belong to VARNAME on their own
const VARNAME = /[\p{L}\p{N}_\u00B7\u0300-\u036F\u203F-\u2040]/u; // §19.8 [166] VARNAME, simplified to letter classes
// §19.8 [146] INTEGER, [147] DECIMAL (signed forms [149]–[151])
const INTEGER = /^[+-]?[0-9]+$/;
const DECIMAL = /^[+-]?[0-9]*\.?[0-9]+$/;

const bad = (field: string, message: string, hint: string): UserError =>
  new UserError({ file: '--param', line: 0, field, message, hint }, EXIT.badInput);

/** Reads `# param <name>: <type> <doc>` lines from the query's leading comment block. */
export function declaredParams(query: string): ParamDecl[] {
  const out: ParamDecl[] = [];
  for (const raw of query.split('\n')) {
    const line = raw.trim();
    if (line === '') continue;
    if (!line.startsWith('#')) break;
    const m = DECL.exec(line);
    if (!m) continue;
    const type = m[2].toLowerCase();
    if (!(type in RENDER))
      throw bad(
        m[1],
        `unknown parameter type "${m[2]}" in the query header`,
        `use one of ${Object.keys(RENDER).join(', ')}`,
      );
    out.push({ name: m[1], type: type as ParamType, doc: m[3].trim() });
  }
  return out;
}

/**
 * An absolute IRI as a SPARQL IRIREF (§19.8 [139]); refuses characters IRIREF cannot hold instead of guessing an
 * encoding.
 */
export function sparqlIri(value: string, field = 'iri'): string {
  const m = NOT_IN_IRIREF.exec(value);
  if (m) {
    const shown =
      m[0].charCodeAt(0) <= 0x20 ? `U+${m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}` : `"${m[0]}"`;
    throw bad(
      field,
      `the IRI contains ${shown}, which an IRI cannot hold`,
      'percent-encode it (a space is %20) or check the value',
    );
  }
  if (!ABSOLUTE.test(value))
    throw bad(field, `"${value}" is not an absolute IRI`, 'give the full IRI, starting with its scheme such as https:');
  return `<${value}>`;
}

const ECHAR: Record<string, string> = {
  '\\': '\\\\',
  '"': '\\"',
  '\n': '\\n',
  '\r': '\\r',
  '\t': '\\t',
  '\b': '\\b',
  '\f': '\\f',
};

/**
 * A string as a SPARQL STRING_LITERAL_QUOTE (§19.8 [156]), escaping with ECHAR ([160]) what that production excludes.
 */
export function sparqlString(value: string): string {
  return `"${value.replace(/[\\"\n\r\t\b\f]/g, (c) => ECHAR[c])}"`;
}

const RENDER: Record<ParamType, (value: string, field: string) => string> = {
  iri: (v, f) => sparqlIri(v, f),
  string: (v) => sparqlString(v),
  integer: (v, f) => {
    if (!INTEGER.test(v)) throw bad(f, `"${v}" is not an integer`, 'digits only, optionally signed');
    return v;
  },
  decimal: (v, f) => {
    if (!DECIMAL.test(v)) throw bad(f, `"${v}" is not a decimal number`, 'e.g. 0.85');
    return `${sparqlString(v)}^^<${NS.xsd}decimal>`;
  },
  boolean: (v, f) => {
    if (v !== 'true' && v !== 'false') throw bad(f, `"${v}" is not a boolean`, 'true or false');
    return v;
  },
};

/** Renders one value for one declared parameter. */
export function renderParam(decl: ParamDecl, value: string): string {
  return RENDER[decl.type](value, decl.name);
}

/**
 * Walks SPARQL text (§19 grammar, lexical level only), calling `onVar` for each `?name` / `$name` outside comments,
 * strings and IRIs; its return value replaces the variable (undefined keeps it).
 */
export function rewriteVariables(query: string, onVar: (name: string) => string | undefined): string {
  let out = '';
  let i = 0;
  const n = query.length;
  while (i < n) {
    const c = query[i];
    let j = i + 1;
    if (c === '#') {
      j = query.indexOf('\n', i);
      if (j < 0) j = n;
    } else if (c === '"' || c === "'") {
      const long = query.startsWith(c.repeat(3), i);
      j = long ? i + 3 : i + 1;
      while (j < n && !(long ? query.startsWith(c.repeat(3), j) : query[j] === c || query[j] === '\n'))
        j += query[j] === '\\' ? 2 : 1;
      j = Math.min(n, j + (long ? 3 : 1));
    } else if (c === '<') {
      IRIREF.lastIndex = i;
      if (IRIREF.test(query)) j = IRIREF.lastIndex;
    } else if ((c === '?' || c === '$') && VARNAME.test(query[i + 1] ?? '')) {
      while (j < n && VARNAME.test(query[j])) j++;
      const replaced = onVar(query.slice(i + 1, j));
      if (replaced !== undefined) {
        out += replaced;
        i = j;
        continue;
      }
    }
    out += query.slice(i, j);
    i = j;
  }
  return out;
}

/** Substitutes every declared parameter; unknown or missing values are user errors naming the parameter. */
export function bindParams(query: string, values: Record<string, string>): string {
  const decls = new Map(declaredParams(query).map((d) => [d.name, d]));
  const known = [...decls.keys()].join(', ') || 'none';
  for (const name of Object.keys(values))
    if (!decls.has(name)) throw bad(name, `the query declares no parameter "${name}"`, `its parameters: ${known}`);
  for (const d of decls.values())
    if (!(d.name in values))
      throw bad(
        d.name,
        `missing value for parameter "${d.name}" (${d.type})`,
        `add --param ${d.name}=<${d.type}>${d.doc ? `: ${d.doc}` : ''}`,
      );
  const rendered = new Map([...decls.values()].map((d) => [d.name, renderParam(d, values[d.name])]));
  return rewriteVariables(query, (name) => rendered.get(name));
}

const FORMS = ['SELECT', 'ASK', 'CONSTRUCT', 'DESCRIBE'] as const;
/** The query form of a SPARQL query (§16 Query Forms). */
export type QueryForm = (typeof FORMS)[number];

/** Finds the query form keyword after the prologue; update requests and unknown text are user errors. */
export function queryForm(query: string): QueryForm {
  const m = /\b(SELECT|ASK|CONSTRUCT|DESCRIBE|INSERT|DELETE|LOAD|CLEAR|DROP|CREATE|ADD|MOVE|COPY|WITH)\b/i.exec(
    stripNonCode(query),
  );
  const first = m ? m[1].toUpperCase() : '';
  if ((FORMS as readonly string[]).includes(first)) return first as QueryForm;
  throw new UserError(
    {
      file: 'query',
      line: 0,
      field: '',
      message: first ? `${first} is an update, not a query` : 'no SELECT, ASK, CONSTRUCT or DESCRIBE found',
      hint: 'concordat query runs read-only queries; use concordat load to change a store',
    },
    EXIT.badInput,
  );
}

/** The query with comments, strings and IRIs blanked, so keywords inside them are not seen. */
function stripNonCode(query: string): string {
  return query.replace(
    /#[^\n]*|"""[\s\S]*?"""|'''[\s\S]*?'''|"(?:[^"\\\n]|\\.)*"|'(?:[^'\\\n]|\\.)*'|<[^<>"{}|^`\\\u0000-\u0020]*>/g,
    ' ',
  );
}
