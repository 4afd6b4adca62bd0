// Century labels (15th century, late 15th c., first half of the 16th century, 15th-16th century) → years per
// convention.
import { type CenturyConvention, type DateReading, type YearSpan, LATEST_YEAR, impossible } from './types.js';
import { CENTURY_PARTS, tolerance } from './calendar.js';

const PART =
  '(early|mid|middle|late|(?:first|second|1st|2nd) half|(?:first|second|third|fourth|last|1st|2nd|3rd|4th) quarter|(?:first|second|last) third)(?: of)?(?: the)?[ -]?';
const ORD = '(\\d{1,2})(?:st|nd|rd|th)?';
const CENTURY = new RegExp(
  `^(?:${PART})?${ORD}(?: ?(?: century)? ?(?:-|to|/|and) ?(?:the )?(?:${PART})?${ORD})? ?(?:c|cent|century|centuries)\\.?(?: (bc|bce|b\\.c\\.|b\\.c\\.e\\.|ad|a\\.d\\.|ce|c\\.e\\.))?$`,
);
/**
 * A part of a hundred years written as hundreds (`late 1400s`, Italian `fine Quattrocento`): ISO counting by its
 * digits.
 */
const HUNDREDS_PART = new RegExp(`^${PART}(\\d{1,2})00'?s$`);
const HINT = 'write the century as an ordinal from 1 (15th century), or years';

/** First year of the n-th century AD: ordinal counting (no year 0) starts at (n−1)·100+1, ISO 8601-2 at (n−1)·100. */
function firstYear(n: number, iso: boolean): number {
  return (n - 1) * 100 + (iso ? 0 : 1);
}

/**
 * Reads a century label. `ordinal`: the 15th century is 1401–1500; `iso` (ISO 8601-2 century 14): 1400–1499;
 * `unknown`: the union of both, 1400–1500. Parts (CENTURY_PARTS: thirds, halves, quarters) are offsets inside the
 * century as counted by the convention. A range ("late 15th-early 16th century") runs from the first label's start
 * to the second's end. BC centuries are counted ordinally whatever the convention (2nd century BC = 200–101 BC =
 * astronomical −199…−100). `approx` widens by tolerance(100 × centuries spanned, or the part's length).
 * The reading keeps both strict readings in `byConvention` (AD only) for compareDates. Returns null when no label.
 */
export function parseCentury(
  s: string,
  convention: CenturyConvention,
  approx: boolean,
  uncertain: boolean,
): DateReading | null {
  const h = HUNDREDS_PART.exec(s);
  if (h !== null) return hundredsPart(h, approx, uncertain);
  const m = CENTURY.exec(s);
  if (m === null) return null;
  const [, p1, n1Text, p2, n2Text, era] = m;
  const n1 = Number(n1Text),
    n2 = n2Text === undefined ? n1 : Number(n2Text);
  if (n1 === 0 || n2 === 0) return impossible('impossible century: there is no 0th century', HINT);
  const part1 = p1 === undefined ? undefined : CENTURY_PARTS[p1];
  const part2 = p2 === undefined ? (n2Text === undefined ? part1 : undefined) : CENTURY_PARTS[p2];
  const form =
    p1 !== undefined || p2 !== undefined ? 'part-of-century' : n2Text !== undefined ? 'century-range' : 'century';
  const bc = era !== undefined && era.startsWith('b');
  if (bc) {
    if (n2 > n1)
      return impossible(
        `impossible century range ${n1}-${n2} BC: ends before it starts`,
        'put the earlier century first',
      );
    const start = -(n1 * 100 - 1) + (part1?.[0] ?? 0),
      end = -(n2 * 100 - 1) + (part2?.[1] ?? 99);
    const w = approx ? tolerance(end - start + 1) : 0;
    return { kind: 'interval', start: start - w, end: end + w, form, approximate: approx, uncertain };
  }
  if (n2 < n1)
    return impossible(`impossible century range ${n1}-${n2}: ends before it starts`, 'put the earlier century first');
  const isoStart = firstYear(n1, true) + (part1?.[0] ?? 0),
    isoEnd = firstYear(n2, true) + (part2?.[1] ?? 99);
  if (isoStart > LATEST_YEAR) return impossible(`impossible century ${n1}: in the future (after ${LATEST_YEAR})`, HINT);
  const w = approx ? tolerance(isoEnd - isoStart + 1) : 0;
  const iso: YearSpan = { start: isoStart - w, end: isoEnd + w };
  const ordinal: YearSpan = { start: iso.start + 1, end: iso.end + 1 };
  const chosen =
    convention === 'iso' ? iso : convention === 'ordinal' ? ordinal : { start: iso.start, end: ordinal.end };
  return {
    kind: 'interval',
    start: chosen.start,
    end: chosen.end,
    form,
    approximate: approx,
    uncertain,
    century: n2Text === undefined ? { ordinal: n1 } : { ordinal: n1, last: n2 },
    byConvention: { ordinal, iso },
  };
}

/** `late 1400s`: a part of the years 1400–1499 (the digits fix the counting, so no convention applies). */
function hundredsPart(m: RegExpExecArray, approx: boolean, uncertain: boolean): DateReading {
  const [, p, h] = m;
  const first = Number(h) * 100,
    part = CENTURY_PARTS[p];
  if (first > LATEST_YEAR) return impossible(`impossible year ${first}: in the future (after ${LATEST_YEAR})`, HINT);
  const start = first + part[0],
    end = first + part[1];
  const w = approx ? tolerance(end - start + 1) : 0;
  return {
    kind: 'interval',
    start: start - w,
    end: end + w,
    form: 'part-of-century',
    approximate: approx,
    uncertain,
    century: { ordinal: Number(h) + 1 },
  };
}
