// A catalogued date → impossible (bad input), unread (a warning) or fine, for the load stage (parsing lives in src/dates).
import { parseDate } from '../dates/index.js';
import type { CenturyConvention, DateLanguage } from '../model.js';

/**
 * Impossible dates are bad input (month 13, 31 April, a range ending before it starts); text we merely cannot read
 * ("undated", "Renaissance") is kept as catalogued and left out of date comparisons. Returns the reason when impossible.
 */
export function checkCatalogueDate(text: string, convention: CenturyConvention, language?: DateLanguage): { kind: 'impossible' | 'unread'; reason: string; hint: string } | undefined {
  const r = parseDate(text, convention, language);
  if (r.kind !== 'invalid') return undefined;
  return { kind: IMPOSSIBLE.test(r.reason) ? 'impossible' : 'unread', reason: r.reason, hint: r.hint };
}

const IMPOSSIBLE = /impossible|month|day|before (its )?start|ends before|future|after \d{4}|0th|zero/i;
