// One EDTF date (no interval, no set) → its year bounds, ordering keys and qualifiers, or the reason it is impossible.
import { LATEST_YEAR } from './types.js';
import { SUB_YEAR, daysInMonth, isLeap, maskAllows } from './calendar.js';

/**
 * A parsed EDTF date. `minYear`/`maxYear`: years it may fall in (X digits and S widen them), before any tolerance.
 * `minKey`/`maxKey`: earliest/latest day as year·10000 + month·100 + day, for ordering interval ends.
 * `span`: years covered by the unqualified expression, or 0 when a month, season or day is given.
 */
export interface Point {
  minYear: number;
  maxYear: number;
  minKey: number;
  maxKey: number;
  span: number;
  /** `~` or `%` written: widen by the tolerance. */
  approx: boolean;
  /** `S` written: the bounds are already the significant-digit range, an estimate (not widened further). */
  significant: boolean;
  uncertain: boolean;
  /** Ordinal number of the century written as `14XX` (15), else 0. */
  century: number;
}

// [?~%] prefix/suffix qualifiers per component: EDTF Level 1 "Qualification of a date (complete)", Level 2
// "Qualification of individual component"; X digits: Level 1/2 "Unspecified digit(s)"; S: Level 2 "Significant digits".
const DATE =
  /^([?~%])?(-)?([\dX]{4})(?:S(\d+))?([?~%])?(?:-([?~%])?([\dX]{2})([?~%])?(?:-([?~%])?([\dX]{2})([?~%])?)?)?(?:T(\d\d):(\d\d):(\d\d)(Z|[+-]\d\d(?::\d\d)?)?)?$/;
// Level 1 "Letter-prefixed calendar year", Level 2 "Exponential year" and significant digits.
const LETTER_YEAR = /^Y(-)?(\d+)(?:E(\d+))?(?:S(\d+))?$/;

const scratch = { m0: 0, d0: 0, m1: 0, d1: 0 };

/**
 * Parses one EDTF date (LoC EDTF 2019, Levels 0–2, dates only). Returns null when the text does not have EDTF date
 * syntax, a string (the reason) when it does but names an impossible date, else the Point.
 * `allowTime`: date-times are accepted only as stand-alone dates (EDTF Level 0 "Date and Time").
 */
export function parsePoint(text: string, allowTime: boolean): Point | string | null {
  if (text.charCodeAt(0) === 89 /* Y */) return letterYear(text);
  const m = DATE.exec(text);
  if (m === null) return null;
  const [, q1, minus, yearTok, sig, q2, q3, month, q4, q5, day, q6, hh] = m;
  if (hh !== undefined) {
    if (!allowTime || day === undefined) return null;
    if (!validTime(m)) return 'impossible time of day or time zone';
  }
  if (sig !== undefined && month !== undefined) return null;
  let lo = 0,
    hi = 0,
    masked = false;
  for (let i = 0; i < 4; i++) {
    const c = yearTok.charCodeAt(i);
    if (c === 88) {
      masked = true;
      lo = lo * 10;
      hi = hi * 10 + 9;
    } else {
      lo = lo * 10 + c - 48;
      hi = hi * 10 + c - 48;
    }
  }
  if (minus !== undefined) {
    if (hi === 0) return 'impossible year -0000: minus zero is not a year';
    const t = lo;
    lo = -hi;
    hi = -t;
  }
  if (lo > LATEST_YEAR) return `impossible year ${yearTok}: in the future (after ${LATEST_YEAR})`;
  let span = hi - lo + 1;
  if (sig !== undefined) {
    const s = Number(sig);
    if (s < 1 || s > 4 || masked) return 'impossible significant digits';
    [lo, hi] = significant(lo, 4, s);
    span = hi - lo + 1;
  }
  const why = monthDay(masked ? true : isLeap(lo), month, day);
  if (why !== null) return why;
  if (month !== undefined) span = 0;
  const quals = (q1 ?? '') + (q2 ?? '') + (q3 ?? '') + (q4 ?? '') + (q5 ?? '') + (q6 ?? '');
  return {
    minYear: lo,
    maxYear: hi,
    minKey: lo * 10000 + scratch.m0 * 100 + scratch.d0,
    maxKey: hi * 10000 + scratch.m1 * 100 + scratch.d1,
    span,
    approx: quals.includes('~') || quals.includes('%'),
    significant: sig !== undefined,
    uncertain: quals.includes('?') || quals.includes('%'),
    century: minus === undefined && month === undefined && /^\d\dXX$/.test(yearTok) ? lo / 100 + 1 : 0,
  };
}

function letterYear(text: string): Point | string | null {
  const m = LETTER_YEAR.exec(text);
  if (m === null) return null;
  const [, minus, digits, exp, sig] = m;
  const abs = Number(digits) * 10 ** Number(exp ?? 0);
  if (abs < 10000) return null; // Y is for years of five or more digits (EDTF Level 1)
  const y = minus === undefined ? abs : -abs;
  let lo = y,
    hi = y;
  if (sig !== undefined) {
    const n = String(abs).length,
      s = Number(sig);
    if (s < 1 || s > n) return 'impossible significant digits';
    [lo, hi] = significant(y, n, s);
  }
  return {
    minYear: lo,
    maxYear: hi,
    minKey: lo * 10000 + 101,
    maxKey: hi * 10000 + 1231,
    span: hi - lo + 1,
    approx: false,
    significant: sig !== undefined,
    uncertain: false,
    century: 0,
  };
}

/** Years sharing the first `s` of the `n` digits of `y` (EDTF Level 2 "Significant digits": 1950S2 → 1900–1999). */
function significant(y: number, n: number, s: number): [number, number] {
  const unit = 10 ** (n - s);
  const base = Math.floor(Math.abs(y) / unit) * unit;
  return y >= 0 ? [base, base + unit - 1] : [-(base + unit - 1), -base];
}

/**
 * Checks month (or sub-year group) and day against the calendar; fills `scratch` with the earliest/latest month-day.
 */
function monthDay(leap: boolean, month: string | undefined, day: string | undefined): string | null {
  if (month === undefined) {
    scratch.m0 = 1;
    scratch.d0 = 1;
    scratch.m1 = 12;
    scratch.d1 = 31;
    return null;
  }
  let first = 0,
    last = 0;
  if (!month.includes('X')) {
    const mv = Number(month);
    const group = SUB_YEAR[mv];
    if (mv >= 1 && mv <= 12) {
      first = mv;
      last = mv;
    } else if (group !== undefined) {
      if (day !== undefined) return `impossible date: sub-year group ${month} cannot take a day`;
      scratch.m0 = group[0];
      scratch.d0 = 1;
      scratch.m1 = group[1];
      scratch.d1 = daysInMonth(group[1], leap);
      return null;
    } else return `impossible month ${month}`;
  } else {
    for (let mv = 1; mv <= 12; mv++)
      if (maskAllows(month, mv)) {
        if (first === 0) first = mv;
        last = mv;
      }
    if (first === 0) return `impossible month ${month}`;
  }
  if (day === undefined) {
    scratch.m0 = first;
    scratch.d0 = 1;
    scratch.m1 = last;
    scratch.d1 = daysInMonth(last, leap);
    return null;
  }
  if (first === last && !day.includes('X')) {
    const dv = Number(day);
    if (dv < 1 || dv > daysInMonth(first, leap)) return dayReason(month, day);
    scratch.m0 = scratch.m1 = first;
    scratch.d0 = scratch.d1 = dv;
    return null;
  }
  let found = false;
  for (let mv = first; mv <= last; mv++) {
    if (!maskAllows(month, mv)) continue;
    for (let dv = 1, n = daysInMonth(mv, leap); dv <= n; dv++) {
      if (!maskAllows(day, dv)) continue;
      if (!found) {
        scratch.m0 = mv;
        scratch.d0 = dv;
        found = true;
      }
      scratch.m1 = mv;
      scratch.d1 = dv;
    }
  }
  return found ? null : dayReason(month, day);
}

function dayReason(month: string, day: string): string {
  return month === '02' && day === '29'
    ? 'impossible day 29 February: not a leap year'
    : `impossible day ${day} in month ${month}`;
}

function validTime(m: RegExpExecArray): boolean {
  const h = Number(m[12]),
    min = Number(m[13]),
    s = Number(m[14]),
    tz = m[15];
  if (h > 23 && !(h === 24 && min === 0 && s === 0)) return false;
  if (min > 59 || s > 60) return false; // 60: leap second (ISO 8601-1 §4.3.2)
  if (tz === undefined || tz === 'Z') return true;
  return Number(tz.slice(1, 3)) <= 23 && (tz.length === 3 || Number(tz.slice(4, 6)) <= 59);
}
