// A catalogued date → "impossible" or fine, for the load stage's bad-input check (parsing lives in analyse/dates).
import { parseDate } from '../analyse/dates.js';
import type { CenturyConvention } from '../model.js';

/**
 * Impossible dates are bad input (month 13, 31 April, a range ending before it starts); text we merely cannot read
 * ("undated", "Renaissance") is kept as catalogued and left out of date comparisons. Returns the reason when impossible.
 */
export function checkCatalogueDate(text: string, convention: CenturyConvention): { reason: string; hint: string } | undefined {
  const r = parseDate(text, convention);
  if (r.kind !== 'invalid') return undefined;
  return IMPOSSIBLE.test(r.reason) ? { reason: r.reason, hint: r.hint } : undefined;
}

const IMPOSSIBLE = /impossible|month|day|before (its )?start|ends before|future|after \d{4}|0th|zero/i;
