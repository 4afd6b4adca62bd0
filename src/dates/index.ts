// Catalogued date text → an interval of astronomical years (or empty / impossible / unread); two readings → agreement.
import {
  type CenturyConvention,
  type DateReading,
  type IntervalReading,
  EMPTY,
  LATEST_YEAR,
  impossible,
  unread,
} from './types.js';
import { parseEdtf } from './edtf.js';
import { APPROX_PREFIX, HINT, interval, parseYearForms } from './freetext.js';
import { parseCentury } from './century.js';
import { type DateLanguage, DATE_LANGUAGES, canonicalPhrase } from './languages.js';

export type {
  CenturyConvention,
  DateForm,
  DateReading,
  EmptyReading,
  IntervalReading,
  ImpossibleReading,
  InvalidReading,
  UnreadReading,
  YearSpan,
} from './types.js';
export { LATEST_YEAR } from './types.js';
export { DATE_LANGUAGES, type DateLanguage } from './languages.js';
export { type DateAgreement, compareDates } from './compare.js';

const YEAR4 = /^\d{4}$/;
/** `1520-22`: EDTF month/season or an abbreviated range. */
const YEAR_DASH_TWO = /^(\d\d)(\d\d)-(\d\d)$/;
const WHITESPACE = /\s+/g;
const DASHES = /[\u2010-\u2015\u2212]/g;
const UNCERTAIN_SUFFIX = / ?(?:\?|\(\?\))$/;
const APPROX_SUFFIX = / (?:approx\.?|approximately|circa|ca\.?)$/;

/**
 * Reads one catalogued date. Years are astronomical (ISO 8601-1 §4.3.2: 1 BC = 0, 2 BC = −1), inclusive integers;
 * open or unknown EDTF ends are ±Infinity. Order: blank → empty; EDTF (LoC EDTF 2019, Levels 0–2, and ISO 8601-2
 * centuries `14`; see parseEdtf); then free text (case and spacing ignored, en dashes read as hyphens): year forms
 * (parseYearForms) and century labels (parseCentury, where `convention` applies), each optionally prefixed with
 * ca./c./circa/about/approx. or followed by approx./approximately (widened by `tolerance`) and suffixed with `?`
 * (uncertain). `YYYY-NN` with NN greater
 * than YYYY's last two digits (`1520-22`, `1910-30`) is read as the abbreviated range, which also covers the EDTF
 * month or season reading. Impossible dates (month 13, 31 June, 29 February 1475, range ending before its start,
 * year after LATEST_YEAR, 0th century) are `impossible` with a reason naming the broken rule; text we cannot read is
 * `unread`
 * with reason "not a date form we can read". Free text that is not canonical English is then read in the partner's
 * `language` (canonicalPhrase), or, when the partner names none, in every language of DATE_LANGUAGES: one reading
 * if they agree, the hull of the readings if a phrase means different things in different languages (`v. 1480`:
 * French *vers*, German *vor*), as the union is used where the century convention is unknown.
 */
export function parseDate(text: string, convention: CenturyConvention, language?: DateLanguage): DateReading {
  const t = text.trim();
  if (t === '') return EMPTY;
  if (YEAR4.test(t)) {
    const y = Number(t);
    return y > LATEST_YEAR
      ? impossible(`impossible year ${t}: in the future (after ${LATEST_YEAR})`, 'check the year for a typing error')
      : interval(y, y, 'year', false, false);
  }
  const yd = YEAR_DASH_TWO.exec(t);
  if (yd === null || Number(yd[3]) <= Number(yd[2])) {
    const e = parseEdtf(t);
    if (e !== null) return e;
  }
  const s = t.toLowerCase().replace(WHITESPACE, ' ').replace(DASHES, '-');
  return (
    parseCanonical(s, convention) ?? parsePhrase(s, convention, language) ?? unread('not a date form we can read', HINT)
  );
}

/** Distinct phrases read through the language tables, by convention, language and text (bounded; cleared when full). */
const PHRASES = new Map<string, DateReading | null>();
const PHRASE_CACHE_SIZE = 1 << 16;

function parsePhrase(s: string, convention: CenturyConvention, language: DateLanguage | undefined): DateReading | null {
  const key = `${convention}|${language ?? ''}|${s}`;
  const hit = PHRASES.get(key);
  if (hit !== undefined || PHRASES.has(key)) return hit ?? null;
  if (PHRASES.size >= PHRASE_CACHE_SIZE) PHRASES.clear();
  let found: IntervalReading | undefined, impossible: DateReading | undefined;
  for (const lang of language === undefined ? DATE_LANGUAGES : [language]) {
    const c = canonicalPhrase(s, lang);
    if (c === s) continue;
    const r = parseCanonical(c, convention);
    if (r === null) continue;
    if (r.kind !== 'interval') {
      impossible ??= r;
      continue;
    }
    found = found === undefined ? r : hull(found, r);
  }
  const out = found ?? impossible ?? null;
  PHRASES.set(key, out);
  return out;
}

/** The smallest interval holding both readings (a phrase read differently in two languages). */
function hull(a: IntervalReading, b: IntervalReading): IntervalReading {
  if (a.start === b.start && a.end === b.end) return a;
  return {
    kind: 'interval',
    start: Math.min(a.start, b.start),
    end: Math.max(a.end, b.end),
    form: a.form === b.form ? a.form : 'range',
    approximate: true,
    uncertain: a.uncertain || b.uncertain,
  };
}

function parseCanonical(text: string, convention: CenturyConvention): DateReading | null {
  let s = text;
  let uncertain = false,
    approx = false;
  const u = UNCERTAIN_SUFFIX.exec(s);
  if (u !== null) {
    uncertain = true;
    s = s.slice(0, u.index);
  }
  const a = APPROX_PREFIX.exec(s);
  if (a !== null) {
    approx = true;
    s = s.slice(a[0].length);
  }
  const z = APPROX_SUFFIX.exec(s);
  if (z !== null) {
    approx = true;
    s = s.slice(0, z.index);
  }
  if (s.startsWith('the ')) s = s.slice(4);
  return parseYearForms(s, approx, uncertain) ?? parseCentury(s, convention, approx, uncertain);
}
