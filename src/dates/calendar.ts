// Calendar facts and the widths chosen for vague dates: leap years, month lengths, sub-year groups, tolerances.

/** Proleptic Gregorian leap year on astronomical numbering (ISO 8601-1 §4.3.2.1): year 0 is a leap year. */
export function isLeap(year: number): boolean {
  return year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
}

const MONTH_DAYS = [0, 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

export function daysInMonth(month: number, leap: boolean): number {
  return month === 2 && leap ? 29 : MONTH_DAYS[month];
}

/**
 * EDTF sub-year groupings (LoC EDTF 2019, Level 1 "Seasons" 21–24 and Level 2 "Sub-year groupings" 25–41) as
 * [first month, last month]. A season is read inside its own calendar year, so winter is December (north) or
 * June–August (south); quarters, quadrimesters and semesters follow the calendar.
 */
export const SUB_YEAR: Readonly<Record<number, readonly [number, number]>> = {
  21: [3, 5],
  22: [6, 8],
  23: [9, 11],
  24: [12, 12],
  25: [3, 5],
  26: [6, 8],
  27: [9, 11],
  28: [12, 12],
  29: [9, 11],
  30: [12, 12],
  31: [3, 5],
  32: [6, 8],
  33: [1, 3],
  34: [4, 6],
  35: [7, 9],
  36: [10, 12],
  37: [1, 4],
  38: [5, 8],
  39: [9, 12],
  40: [1, 6],
  41: [7, 12],
};

/**
 * Years added on each side of an approximate date (ca., circa, about, EDTF `~` and `%`), by the span of years the
 * unqualified expression covers: max(10, ⌊span / 4⌋). So a year or a decade gets ±10 years, a third of a century
 * ±10, a half ±12, a century ±25, a millennium (`1XXX~`) ±250. Common practice, no source; EDTF gives `~` no width.
 * Expressions finer than a year (month, season, day) get ±1 year.
 */
export function tolerance(spanYears: number): number {
  return Math.max(10, Math.floor(spanYears / 4));
}
export const SUB_YEAR_TOLERANCE = 1;

/**
 * Width in years of "before Y" (Y−50 … Y) and "after Y" (Y … Y+50), boundary year included. Common practice, no source.
 */
export const BEFORE_AFTER_WIDTH = 50;

/**
 * Parts of a century as [first, last] offsets into its 100 years (0 = the century's first year under the chosen
 * convention). Thirds for early/mid/late and for first/second/last third (33/34/33 years), halves, quarters.
 * Common practice, no source.
 */
export const CENTURY_PARTS: Readonly<Record<string, readonly [number, number]>> = {
  early: [0, 32],
  mid: [33, 66],
  middle: [33, 66],
  late: [67, 99],
  'first half': [0, 49],
  '1st half': [0, 49],
  'second half': [50, 99],
  '2nd half': [50, 99],
  'first quarter': [0, 24],
  '1st quarter': [0, 24],
  'second quarter': [25, 49],
  '2nd quarter': [25, 49],
  'third quarter': [50, 74],
  '3rd quarter': [50, 74],
  'fourth quarter': [75, 99],
  '4th quarter': [75, 99],
  'last quarter': [75, 99],
  'first third': [0, 32],
  'second third': [33, 66],
  'last third': [67, 99],
};

/** Whether a two-character EDTF month/day token (digits or `X`, EDTF Level 1/2 "Unspecified digit") can be `n`. */
export function maskAllows(token: string, n: number): boolean {
  const t0 = token.charCodeAt(0);
  const t1 = token.charCodeAt(1);
  return (t0 === 88 || t0 - 48 === ((n / 10) | 0)) && (t1 === 88 || t1 - 48 === n % 10);
}
