// Catalogued date text → an interval of astronomical years (or empty / invalid); two readings → agreement.
import { type CenturyConvention, type DateReading, EMPTY, LATEST_YEAR, invalid } from './types.js';
import { parseEdtf } from './edtf.js';
import { APPROX_PREFIX, HINT, interval, parseYearForms } from './freetext.js';
import { parseCentury } from './century.js';

export type { CenturyConvention, DateForm, DateReading, EmptyReading, IntervalReading, InvalidReading, YearSpan } from './types.js';
export { LATEST_YEAR } from './types.js';
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
 * ca./c./circa/about/approx. or followed by approx./approximately (widened by `tolerance`) and suffixed with `?` (uncertain). `YYYY-NN` with NN greater
 * than YYYY's last two digits (`1520-22`, `1910-30`) is read as the abbreviated range, which also covers the EDTF
 * month or season reading. Impossible dates (month 13, 31 June, 29 February 1475, range ending before its start,
 * year after LATEST_YEAR, 0th century) are `invalid` with a reason that says so; text we cannot read is `invalid`
 * with reason "not a date form we can read".
 */
export function parseDate(text: string, convention: CenturyConvention): DateReading {
  const t = text.trim();
  if (t === '') return EMPTY;
  if (YEAR4.test(t)) {
    const y = Number(t);
    return y > LATEST_YEAR ? invalid(`impossible year ${t}: in the future (after ${LATEST_YEAR})`, 'check the year for a typing error')
      : interval(y, y, 'year', false, false);
  }
  const yd = YEAR_DASH_TWO.exec(t);
  if (yd === null || Number(yd[3]) <= Number(yd[2])) {
    const e = parseEdtf(t);
    if (e !== null) return e;
  }
  return parseFreeText(t, convention) ?? invalid('not a date form we can read', HINT);
}

function parseFreeText(t: string, convention: CenturyConvention): DateReading | null {
  let s = t.toLowerCase().replace(WHITESPACE, ' ').replace(DASHES, '-');
  let uncertain = false, approx = false;
  const u = UNCERTAIN_SUFFIX.exec(s);
  if (u !== null) { uncertain = true; s = s.slice(0, u.index); }
  const a = APPROX_PREFIX.exec(s);
  if (a !== null) { approx = true; s = s.slice(a[0].length); }
  const z = APPROX_SUFFIX.exec(s);
  if (z !== null) { approx = true; s = s.slice(0, z.index); }
  if (s.startsWith('the ')) s = s.slice(4);
  return parseYearForms(s, approx, uncertain) ?? parseCentury(s, convention, approx, uncertain);
}
