// A catalogued date → impossible (bad input), unread (a warning) or fine, for the load stage (parsing lives in
// src/dates).
import { parseDate, type InvalidReading } from '../dates/index.js';
import type { CenturyConvention, DateLanguage } from '../model.js';

/**
 * Impossible dates are bad input (month 13, 31 April, a range ending before it starts); text we merely cannot read
 * ("undated", "Renaissance") is kept as catalogued and left out of date comparisons. Returns either reading with its
 * reason and hint; undefined when the date reads (or is blank).
 */
export function checkCatalogueDate(
  text: string,
  convention: CenturyConvention,
  language?: DateLanguage,
): InvalidReading | undefined {
  const r = parseDate(text, convention, language);
  return r.kind === 'impossible' || r.kind === 'unread' ? r : undefined;
}
