// Works → their catalogued dates read as year intervals (per partner convention), and record pages; cached per work.
import type { Model } from '../model.js';
import { compileTemplate } from '../io/template.js';
import { parseDate, type DateReading } from '../dates/index.js';

/** Date reading of a work under its partner's century convention and date language, parsed once. */
export function dateReader(model: Model): (w: number) => DateReading {
  const cache: (DateReading | undefined)[] = new Array(model.works.length);
  return (w) => {
    let r = cache[w];
    if (r === undefined) {
      const work = model.works[w];
      const partner = model.project.partners[work.partner];
      r = cache[w] = parseDate(work.date, partner.centuryConvention, partner.language);
    }
    return r;
  };
}

/** Record page of a work: the partner's `recordPage` template expanded (RFC 6570 §3.2.2), '' when none is set. */
export function recordPager(model: Model): (w: number) => string {
  const pages = model.project.partners.map((p) => (p.recordPage ? compileTemplate(p.recordPage, 'work') : () => ''));
  return (w) => pages[model.works[w].partner](model.works[w].id);
}

/** An interval as `start/end` (EDTF Level 0 interval form), open ends as `..` (EDTF Level 1). */
export function formatInterval(r: DateReading): string {
  if (r.kind !== 'interval') return '';
  const y = (n: number) => (Number.isFinite(n) ? String(n) : '..');
  return r.start === r.end ? y(r.start) : `${y(r.start)}/${y(r.end)}`;
}

/**
 * Century bucket of a reading: hundreds of its midpoint year (`1400-1499`), `undated` when empty, unreadable or open.
 */
export function centuryOf(r: DateReading): string {
  if (r.kind !== 'interval' || !Number.isFinite(r.start) || !Number.isFinite(r.end)) return UNDATED;
  const h = Math.floor((r.start + r.end) / 2 / 100) * 100;
  let label = LABELS.get(h);
  if (label === undefined) LABELS.set(h, (label = `${h}-${h + 99}`));
  return label;
}

const LABELS = new Map<number, string>();

export const UNDATED = 'undated';
