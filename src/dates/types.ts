// The shapes a catalogued date turns into: an interval of years, empty, impossible or unread (each with a reason and a
// hint).
import type { CenturyConvention } from '../model.js';

export type { CenturyConvention };

/** Which written form produced a reading. EDTF strings other than a bare year or century are `edtf`. */
export type DateForm =
  'year' | 'circa' | 'range' | 'decade' | 'century' | 'century-range' | 'part-of-century' | 'before' | 'after' | 'edtf';

/** Inclusive span of astronomical years (1 BC = 0, 2 BC = -1); open or unknown ends are ±Infinity. */
export interface YearSpan {
  readonly start: number;
  readonly end: number;
}

/**
 * A readable date as an inclusive interval of astronomical years (ISO 8601-1 §4.3.2 year numbering: 1 BC is 0).
 * `start`/`end` are integers, or -Infinity/+Infinity for an open or unknown EDTF interval end (EDTF Level 1
 * "Extended Interval"). `approximate`: ca./~/%/S or an estimated width (before/after), already folded into the bounds.
 * `uncertain`: `?` was written (no widening). `century`: the text names a century (ordinal number, e.g. 15 for
 * "15th century", `14`, `14XX` or "the 1400s"; `last` for a century range). `byConvention`: present only when the
 * text uses a century label whose years depend on the counting convention; holds both strict readings.
 */
export interface IntervalReading {
  readonly kind: 'interval';
  readonly start: number;
  readonly end: number;
  readonly form: DateForm;
  readonly approximate: boolean;
  readonly uncertain: boolean;
  readonly century?: { readonly ordinal: number; readonly last?: number };
  readonly byConvention?: { readonly ordinal: YearSpan; readonly iso: YearSpan };
}

export interface EmptyReading {
  readonly kind: 'empty';
}

/**
 * A date that breaks a rule of the calendar or of order (month 13, 31 April, a range that ends before it starts, a
 * year after LATEST_YEAR, a 0th century): bad input. `reason` names the broken rule.
 */
export interface ImpossibleReading {
  readonly kind: 'impossible';
  readonly reason: string;
  readonly hint: string;
}

/** Text that is no date form we read ("undated", "Renaissance"): kept as catalogued, left out of date comparisons. */
export interface UnreadReading {
  readonly kind: 'unread';
  readonly reason: string;
  readonly hint: string;
}

/** Impossible or unread: the text gives no interval. */
export type InvalidReading = ImpossibleReading | UnreadReading;

export type DateReading = IntervalReading | EmptyReading | ImpossibleReading | UnreadReading;

/**
 * Latest year a catalogued date may name. A fixed constant, not the clock, so readings are deterministic.
 * EDTF letter-prefixed years (`Y170000002`, EDTF Level 1 "Letter-prefixed calendar year") are exempt: they exist
 * to write years beyond four digits.
 */
export const LATEST_YEAR = 2100;

export const EMPTY: EmptyReading = Object.freeze({ kind: 'empty' });

export function impossible(reason: string, hint: string): ImpossibleReading {
  return { kind: 'impossible', reason, hint };
}

export function unread(reason: string, hint: string): UnreadReading {
  return { kind: 'unread', reason, hint };
}
