// Two date readings → agree, soft (century-label ambiguity only), conflict (disjoint) or unknown.
import type { DateReading, IntervalReading, YearSpan } from './types.js';

export type DateAgreement = 'agree' | 'soft' | 'conflict' | 'unknown';

function overlaps(a: YearSpan, b: YearSpan): boolean {
  return a.start <= b.end && b.start <= a.end;
}

/**
 * Compares two readings as inclusive year intervals (design: analyse, "disjoint intervals = conflict, different
 * century only = soft conflict"):
 * - `unknown` when either side is empty, impossible or unread;
 * - `conflict` when the intervals, as read under each side's own convention, share no year;
 * - `soft` when they share a year, at least one side is a century label (`byConvention` set), and reading every
 *   century label on both sides by one strict convention (all ordinal, or all ISO) makes them disjoint: the overlap
 *   exists only because of the years the two conventions disagree about (a century's first or last year);
 * - `agree` otherwise.
 * Worked examples: "15th century" (unknown: 1400–1500) vs 1500 → soft (all-ISO 1400–1499 misses 1500);
 * "15th century" (ordinal 1401–1500) vs 1500 → soft (ISO reading misses it); "15th century" (iso 1400–1499) vs 1500
 * → conflict; "15th century" vs "16th century" (both unknown, share 1500) → soft; 1475 vs "late 15th century" → agree;
 * 1475 vs 1520 → conflict.
 */
export function compareDates(a: DateReading, b: DateReading): DateAgreement {
  if (a.kind !== 'interval' || b.kind !== 'interval') return 'unknown';
  if (!overlaps(a, b)) return 'conflict';
  if (a.byConvention === undefined && b.byConvention === undefined) return 'agree';
  return overlaps(strict(a, 'ordinal'), strict(b, 'ordinal')) && overlaps(strict(a, 'iso'), strict(b, 'iso'))
    ? 'agree'
    : 'soft';
}

function strict(r: IntervalReading, convention: 'ordinal' | 'iso'): YearSpan {
  return r.byConvention === undefined ? r : r.byConvention[convention];
}
