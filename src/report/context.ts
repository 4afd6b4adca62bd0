// Work numbers → the text a person needs beside them in reports: reference, title, date as catalogued, record page.
import type { Model } from '../model.js';
import { cachedWorkRef } from '../model.js';
import { recordPager } from '../analyse/readings.js';

export interface WorkContext {
  ref(w: number): string;
  title(w: number): string;
  date(w: number): string;
  page(w: number): string;
}

/** Cached per work, so a report touching the same work many times formats it once. */
export function workContext(model: Model): WorkContext {
  return {
    ref: cachedWorkRef(model),
    title: (w) => model.works[w].title,
    date: (w) => model.works[w].date,
    page: recordPager(model),
  };
}

/** A ratio or score for files: at most 4 decimals, no trailing zeros; '' for null. */
export function num(x: number | null): string {
  return x === null ? '' : String(Math.round(x * 1e4) / 1e4);
}

/** A ratio as a percentage with one decimal (84.4%); '—' for null. */
export function percent(x: number | null): string {
  return x === null ? '—' : `${(Math.round(x * 1000) / 10).toFixed(1)}%`;
}
