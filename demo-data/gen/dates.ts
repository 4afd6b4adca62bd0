// A true year and a partner's cataloguing style and language → the free-text date a partner's export would carry.
import type { Lang } from './titles.js';

/** How a partner counts centuries; `unknown` when the partner does not say. */
export type Convention = 'ordinal' | 'iso' | 'unknown';

/** The written forms partners use; every rendering of year y is an interval that contains y. */
export type DateStyle =
  | 'year'
  | 'ca'
  | 'range'
  | 'century'
  | 'century-abbr'
  | 'late-century'
  | 'edtf-decade'
  | 'edtf-approx'
  | 'edtf-interval';

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
  'late-century': (y, c) =>
    positionInCentury(y, c) >= 75 && positionInCentury(y, c) <= 97 ? `late ${ordinal(centuryOf(y, c))} century` : null,
  'edtf-decade': (y) => `${Math.floor(y / 10)}X`,
  'edtf-approx': (y) => `${y}~`,
  'edtf-interval': (y) => `${y - 10}/${y + 10}`,
};

/** Roman numeral for a century number (French catalogues write XVe siècle). */
export function roman(n: number): string {
  const parts: [number, string][] = [
    [10, 'X'],
    [9, 'IX'],
    [5, 'V'],
    [4, 'IV'],
    [1, 'I'],
  ];
  let out = '';
  for (const [v, r] of parts)
    while (n >= v) {
      out += r;
      n -= v;
    }
  return out;
}

/**
 * The same styles as catalogues in German and French write them (each the same interval as the English form, so
 * the story's dates do not move): `um 1480`, `1470 bis 1490`, `15. Jh.`; `vers 1480`, `entre 1470 et 1490`,
 * `XVe siècle`, `XVe s.`, `fin du XVe siècle`. Styles a language does not list keep the English (or EDTF) form.
 */
const IN_LANGUAGE: Partial<Record<Lang, Partial<Record<DateStyle, (y: number, c: Convention) => string | null>>>> = {
  de: {
    ca: (y) => `um ${y}`,
    range: (y) => `${y - 10} bis ${y + 10}`,
    century: (y, c) => `${centuryOf(y, c)}. Jh.`,
    'century-abbr': (y, c) => `${centuryOf(y, c)}. Jahrhundert`,
    'late-century': (y, c) => (RENDER['late-century'](y, c) === null ? null : `Ende ${centuryOf(y, c)}. Jh.`),
  },
  fr: {
    ca: (y) => `vers ${y}`,
    range: (y) => `entre ${y - 10} et ${y + 10}`,
    century: (y, c) => `${roman(centuryOf(y, c))}e siècle`,
    'century-abbr': (y, c) => `${roman(centuryOf(y, c))}e s.`,
    'late-century': (y, c) =>
      RENDER['late-century'](y, c) === null ? null : `fin du ${roman(centuryOf(y, c))}e siècle`,
  },
};

/**
 * The text of year y in a style and the partner's language, or null when the style does not fit that year (EDTF
 * Level 1 for the EDTF forms).
 */
export function renderDate(year: number, style: DateStyle, convention: Convention, lang: Lang = 'en'): string | null {
  return (IN_LANGUAGE[lang]?.[style] ?? RENDER[style])(year, convention);
}

/** A century label in the partner's language: `16th century`, `16. Jh.`, `XVIe siècle`. */
export function centuryLabel(n: number, lang: Lang): string {
  return lang === 'de' ? `${n}. Jh.` : lang === 'fr' ? `${roman(n)}e siècle` : `${ordinal(n)} century`;
}
