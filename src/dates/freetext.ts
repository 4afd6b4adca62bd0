// Cataloguers' free-text dates (1475, ca. 1480, 1470-90, 1470s, before 1500) → an interval of years.
import { type DateForm, type DateReading, type IntervalReading, LATEST_YEAR, impossible } from './types.js';
import { BEFORE_AFTER_WIDTH, tolerance } from './calendar.js';

const A = '(?:circa|ca\\.?|c\\.?|approx\\.?|approximately|about|around|~)';
/** Leading approximation word, only when a date follows. */
export const APPROX_PREFIX = new RegExp(`^${A} ?(?=\\d|early|mid|late|first|second|third|fourth|last|the )`);
const ERA = '(bc|bce|b\\.c\\.|b\\.c\\.e\\.|ad|a\\.d\\.|ce|c\\.e\\.)';
const YEAR = new RegExp(`^(?:(?:ad|a\\.d\\.) ?)?(\\d{1,4})(?: ?${ERA})?$`);
const HUNDREDS = /^(\d{1,2})00'?s$/;
const DECADE = /^(\d{2,3})0'?s$/;
const RANGE = new RegExp(`^(?:between )?(${A} ?)?(\\d{3,4})('?s)? ?(?:-|to|until|and|/) ?(${A} ?)?(\\d{1,4})('?s)?$`);
const BOUND = /^(before|by|not after|earlier than|after|not before|later than) (\d{3,4})$/;
const AFTER_WORDS = new Set(['after', 'not before', 'later than']);

export const HINT =
  'write a year (1475), ca. 1480, a range (1470-1490), a decade (1470s), a century (15th century), ' +
  'before/after 1500, or EDTF (147X, 1470/1490)';

export function interval(
  start: number,
  end: number,
  form: DateForm,
  approximate: boolean,
  uncertain: boolean,
): IntervalReading {
  return { kind: 'interval', start, end, form, approximate, uncertain };
}

function future(y: number): DateReading {
  return impossible(`impossible year ${y}: in the future (after ${LATEST_YEAR})`, 'check the year for a typing error');
}

/**
 * Reads the year-based free-text forms (after any ca./c./circa/about prefix has been removed, `approx` telling
 * whether it was there): `1475`, `64 BC`, `AD 800` (BC years to astronomical: n BC = 1 − n); decades `1470s` and
 * hundreds `1800s` (1800–1899); ranges `1470-1490`, `1470 - 90`, `1470-5`, `1470s-1480s`, `between 1470 and 1490`,
 * `1856-ca. 1865` (each end widened by its own ca.); `before 1500` = 1450–1500, `after 1480` = 1480–1530
 * (BEFORE_AFTER_WIDTH). Returns null when none of these forms matches.
 */
export function parseYearForms(s: string, approx: boolean, uncertain: boolean): DateReading | null {
  let m = YEAR.exec(s);
  if (m !== null) {
    const n = Number(m[1]),
      era = m[2];
    if (era === undefined && m[1].length < 3) return null; // "90" is not a year we dare read
    if (n === 0 && era !== undefined)
      return impossible('impossible year 0: AD/BC counting has no year 0', 'write 1 BC or 1 AD');
    const y = era !== undefined && era.startsWith('b') ? 1 - n : n;
    if (y > LATEST_YEAR) return future(y);
    const w = approx ? tolerance(1) : 0;
    return interval(y - w, y + w, approx ? 'circa' : 'year', approx, uncertain);
  }
  m = HUNDREDS.exec(s);
  if (m !== null) {
    const start = Number(m[1]) * 100;
    if (start > LATEST_YEAR) return future(start);
    const w = approx ? tolerance(100) : 0;
    return {
      ...interval(start - w, start + 99 + w, 'century', approx, uncertain),
      century: { ordinal: start / 100 + 1 },
    };
  }
  m = DECADE.exec(s);
  if (m !== null) {
    const start = Number(m[1]) * 10;
    if (start > LATEST_YEAR) return future(start);
    const w = approx ? tolerance(10) : 0;
    return interval(start - w, start + 9 + w, 'decade', approx, uncertain);
  }
  m = RANGE.exec(s);
  if (m !== null) return range(m, approx, uncertain);
  m = BOUND.exec(s);
  if (m !== null) {
    const y = Number(m[2]);
    if (y > LATEST_YEAR) return future(y);
    return AFTER_WORDS.has(m[1])
      ? interval(y, y + BEFORE_AFTER_WIDTH, 'after', true, uncertain)
      : interval(y - BEFORE_AFTER_WIDTH, y, 'before', true, uncertain);
  }
  return null;
}

function range(m: RegExpExecArray, approx: boolean, uncertain: boolean): DateReading {
  const [, a1, startText, s1, a2, endText, s2] = m;
  const start = Number(startText);
  let end = Number(endText);
  if (endText.length < startText.length) {
    const unit = 10 ** endText.length;
    end += start - (start % unit);
  }
  const endLast = s2 !== undefined ? end + 9 : end;
  if (endLast < start) {
    return impossible(
      `impossible range ${startText}-${endText}: ends before it starts`,
      'put the earlier year first (1470-1490)',
    );
  }
  if (start > LATEST_YEAR || endLast > LATEST_YEAR) return future(Math.max(start, endLast));
  const w1 = approx || a1 !== undefined ? tolerance(s1 !== undefined ? 10 : 1) : 0;
  const w2 = approx || a2 !== undefined ? tolerance(s2 !== undefined ? 10 : 1) : 0;
  return interval(start - w1, endLast + w2, 'range', w1 + w2 > 0, uncertain);
}
