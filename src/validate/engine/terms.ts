// n3 term ids → term kinds, literal parts, XSD lexical-form checks and SPARQL-style ordering, as the SHACL core
// value-type, range and string constraints need them (SHACL §4.1–§4.4).
import { iri } from '../../namespaces.js';

/** An n3 term id: an IRI as is, `_:label` for a blank node, `"lexical"`, `"lexical"@lang` or `"lexical"^^datatype`. */
export type TermId = string;

export const XSD_STRING = iri('xsd', 'string');
export const RDF_LANG_STRING = iri('rdf', 'langString');

export function isLiteral(id: TermId): boolean {
  return id.charCodeAt(0) === 34; // "
}

export function isBlank(id: TermId): boolean {
  return id.charCodeAt(0) === 95 && id.charCodeAt(1) === 58; // _:
}

export function isIri(id: TermId): boolean {
  return !isLiteral(id) && !isBlank(id);
}

/** A literal's lexical form, language tag ('' when none) and datatype IRI (RDF 1.1 Concepts §3.3). */
export interface LiteralParts {
  lexical: string;
  language: string;
  datatype: string;
}

export function literalParts(id: TermId): LiteralParts {
  const end = id.lastIndexOf('"');
  const lexical = id.slice(1, end);
  const rest = id.slice(end + 1);
  if (rest.startsWith('@'))
    return { lexical, language: rest.slice(1).replace(/--(ltr|rtl)$/, ''), datatype: RDF_LANG_STRING };
  if (rest.startsWith('^^')) return { lexical, language: '', datatype: rest.slice(2) };
  return { lexical, language: '', datatype: XSD_STRING };
}

/**
 * SPARQL 1.1 str(): an IRI's text, a literal's lexical form; a blank node has none (SHACL §4.4 treats it as failing).
 */
export function stringValue(id: TermId): string | null {
  if (isBlank(id)) return null;
  return isLiteral(id) ? literalParts(id).lexical : id;
}

const INTEGER = /^[+-]?[0-9]+$/;
const DECIMAL = /^[+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)$/;
const FLOATING = /^([+-]?([0-9]+(\.[0-9]*)?|\.[0-9]+)([Ee][+-]?[0-9]+)?|[+-]?INF|NaN)$/;
const TZ = '(Z|[+-]((0[0-9]|1[0-3]):[0-5][0-9]|14:00))?';
const DATE_PART = '-?([1-9][0-9]{3,}|0[0-9]{3})-(0[1-9]|1[0-2])-(0[1-9]|[12][0-9]|3[01])';
const TIME_PART = '(([01][0-9]|2[0-3]):[0-5][0-9]:[0-5][0-9](\\.[0-9]+)?|24:00:00(\\.0+)?)';
const DATE = new RegExp(`^${DATE_PART}${TZ}$`);
const DATE_TIME = new RegExp(`^${DATE_PART}T${TIME_PART}${TZ}$`);
const TIME = new RegExp(`^${TIME_PART}${TZ}$`);
const G_YEAR = new RegExp(`^-?([1-9][0-9]{3,}|0[0-9]{3})${TZ}$`);
const G_YEAR_MONTH = new RegExp(`^-?([1-9][0-9]{3,}|0[0-9]{3})-(0[1-9]|1[0-2])${TZ}$`);

/** Integer subtypes of xsd:integer with their inclusive bounds (XML Schema 1.1 Part 2 §3.4.13–§3.4.25). */
const INTEGER_RANGES: Readonly<Record<string, [bigint | null, bigint | null]>> = {
  integer: [null, null],
  nonNegativeInteger: [0n, null],
  positiveInteger: [1n, null],
  nonPositiveInteger: [null, 0n],
  negativeInteger: [null, -1n],
  long: [-(2n ** 63n), 2n ** 63n - 1n],
  int: [-(2n ** 31n), 2n ** 31n - 1n],
  short: [-32768n, 32767n],
  byte: [-128n, 127n],
  unsignedLong: [0n, 2n ** 64n - 1n],
  unsignedInt: [0n, 2n ** 32n - 1n],
  unsignedShort: [0n, 65535n],
  unsignedByte: [0n, 255n],
};

/**
 * Days in a month of a (proleptic Gregorian) year, for the day-of-month check of xsd:date (XML Schema 1.1 Part 2
 * §D.2.1).
 */
function dayFits(lexical: string): boolean {
  const m = /^(-?\d+)-(\d\d)-(\d\d)/.exec(lexical);
  if (!m) return false;
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  const days = [31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1];
  return day <= days;
}

/** XSD local name → lexical-space test (XML Schema 1.1 Part 2 §3.3); datatypes not listed accept any lexical form. */
const LEXICAL: Readonly<Record<string, (lexical: string) => boolean>> = {
  decimal: (s) => DECIMAL.test(s),
  float: (s) => FLOATING.test(s),
  double: (s) => FLOATING.test(s),
  boolean: (s) => s === 'true' || s === 'false' || s === '1' || s === '0',
  date: (s) => DATE.test(s) && dayFits(s),
  dateTime: (s) => DATE_TIME.test(s) && dayFits(s),
  time: (s) => TIME.test(s),
  gYear: (s) => G_YEAR.test(s),
  gYearMonth: (s) => G_YEAR_MONTH.test(s),
  ...Object.fromEntries(
    Object.entries(INTEGER_RANGES).map(([name, [min, max]]) => [
      name,
      (s: string) => {
        if (!INTEGER.test(s)) return false;
        const n = BigInt(s);
        return (min === null || n >= min) && (max === null || n <= max);
      },
    ]),
  ),
};

const XSD = iri('xsd', '');

/**
 * Whether a literal is well-formed for its datatype (SHACL §4.1.2: an ill-formed literal fails sh:datatype). Checked
 * for the XSD numeric, boolean, date and time types; rdf:langString needs a language tag; other datatypes pass.
 */
export function wellFormed(parts: LiteralParts): boolean {
  if (parts.datatype === RDF_LANG_STRING) return parts.language !== '';
  if (!parts.datatype.startsWith(XSD)) return true;
  const test = LEXICAL[parts.datatype.slice(XSD.length)];
  return test ? test(parts.lexical) : true;
}

type Category = 'numeric' | 'string' | 'boolean' | 'dateTime' | 'date' | 'time';

function categoryOf(parts: LiteralParts): Category | null {
  if (parts.datatype === XSD_STRING) return 'string';
  if (!parts.datatype.startsWith(XSD)) return null;
  const local = parts.datatype.slice(XSD.length);
  if (local in INTEGER_RANGES || local === 'decimal' || local === 'float' || local === 'double') return 'numeric';
  if (local === 'boolean' || local === 'dateTime' || local === 'date' || local === 'time') return local;
  return null;
}

/** Milliseconds since the epoch, and whether a timezone was given, of an xsd:dateTime/date/time lexical form. */
function instant(category: 'dateTime' | 'date' | 'time', lexical: string): [number, boolean] {
  const zoned = /(Z|[+-]\d\d:\d\d)$/.test(lexical);
  const text =
    category === 'date'
      ? lexical.replace(/^(-?\d+-\d\d-\d\d)/, '$1T00:00:00')
      : category === 'time'
        ? `1972-12-31T${lexical}`
        : lexical;
  return [Date.parse(zoned ? text : `${text}Z`), zoned];
}

function numberOf(category: Category, lexical: string): number {
  if (category === 'boolean') return lexical === 'true' || lexical === '1' ? 1 : 0;
  if (lexical === 'INF' || lexical === '+INF') return Infinity;
  if (lexical === '-INF') return -Infinity;
  return Number(lexical);
}

/** A literal reduced to what ordering needs: its category and a number or a string to compare, or null. */
type Orderable = { category: Category; key: number | string; zoned: boolean } | null;

const orderables = new Map<TermId, Orderable>();

function orderableOf(id: TermId): Orderable {
  let found = orderables.get(id);
  if (found !== undefined) return found;
  found = null;
  if (isLiteral(id)) {
    const parts = literalParts(id);
    const category = categoryOf(parts);
    if (category !== null && wellFormed(parts)) {
      if (category === 'string') found = { category, key: parts.lexical, zoned: false };
      else if (category === 'numeric' || category === 'boolean')
        found = { category, key: numberOf(category, parts.lexical), zoned: false };
      else {
        const [key, zoned] = instant(category, parts.lexical);
        found = { category, key, zoned };
      }
      if (typeof found.key === 'number' && Number.isNaN(found.key)) found = null;
    }
  }
  if (orderables.size > 100_000) orderables.clear();
  orderables.set(id, found);
  return found;
}

/**
 * Orders two terms as SPARQL 1.1's `<` does (Query §17.3 operator mapping): numbers by value, strings by UTF-16 code
 * unit, booleans, and dates or times with the same timezone presence. Returns a negative, zero or positive number, or
 * null when the terms cannot be compared (IRIs, blank nodes, different kinds, ill-formed literals, NaN) — a failure
 * for the SHACL range constraints (§4.3) and for sh:lessThan (§4.5.3).
 */
export function compareTerms(a: TermId, b: TermId): number | null {
  const x = orderableOf(a);
  const y = orderableOf(b);
  if (x === null || y === null || x.category !== y.category || x.zoned !== y.zoned) return null;
  if (typeof x.key === 'string') return x.key < (y.key as string) ? -1 : x.key > (y.key as string) ? 1 : 0;
  return x.key - (y.key as number);
}

/** SPARQL 1.1 langMatches (Query §17.4.3.2, RFC 4647 §3.3.1 basic filtering). */
export function langMatches(tag: string, range: string): boolean {
  if (tag === '') return false;
  if (range === '*') return true;
  const t = tag.toLowerCase();
  const r = range.toLowerCase();
  return t === r || t.startsWith(`${r}-`);
}
