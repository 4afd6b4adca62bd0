// A true year and a partner's cataloguing style → the free-text date a partner's export would carry.

/** How a partner counts centuries; `unknown` when the partner does not say. */
export type Convention = 'ordinal' | 'iso' | 'unknown';

/** The written forms partners use; every rendering of year y is an interval that contains y. */
export type DateStyle =
  | 'year' | 'ca' | 'range' | 'century' | 'century-abbr' | 'late-century'
  | 'edtf-decade' | 'edtf-approx' | 'edtf-interval';

/** English ordinal: 15 → "15th", 21 → "21st". */
export function ordinal(n: number): string {
  const teen = n % 100 >= 11 && n % 100 <= 13;
  const suffix = teen ? 'th' : (['th', 'st', 'nd', 'rd'][n % 10] ?? 'th');
  return `${n}${suffix}`;
}

/** Century number of a year: ordinal counting (1401–1500 = 15th) or ISO/EDTF counting (1400–1499 = 15th). */
export function centuryOf(year: number, convention: Convention): number {
  return convention === 'ordinal' ? Math.ceil(year / 100) : Math.floor(year / 100) + 1;
}

/** Position of a year inside its century, 1..100 (ordinal) or 0..99 (otherwise). */
function positionInCentury(year: number, convention: Convention): number {
  return convention === 'ordinal' ? year - (centuryOf(year, convention) - 1) * 100 : year % 100;
}

const RENDER: Record<DateStyle, (y: number, c: Convention) => string | null> = {
  year: (y) => `${y}`,
  ca: (y) => `ca. ${y}`,
  range: (y) => `${y - 10}-${y + 10}`,
  century: (y, c) => `${ordinal(centuryOf(y, c))} century`,
  'century-abbr': (y, c) => `${ordinal(centuryOf(y, c))} c.`,
  // "late" is only written where nobody would argue: the last quarter of the century
  'late-century': (y, c) => (positionInCentury(y, c) >= 75 && positionInCentury(y, c) <= 97
    ? `late ${ordinal(centuryOf(y, c))} century` : null),
  'edtf-decade': (y) => `${Math.floor(y / 10)}X`,
  'edtf-approx': (y) => `${y}~`,
  'edtf-interval': (y) => `${y - 10}/${y + 10}`,
};

/** The text of year y in a style, or null when the style does not fit that year (EDTF Level 1 for the EDTF forms). */
export function renderDate(year: number, style: DateStyle, convention: Convention): string | null {
  return RENDER[style](year, convention);
}
