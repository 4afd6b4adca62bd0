// Work numbers → the text a person needs beside them in reports: reference, title, date as catalogued, record page.
import type { Model } from '../model.js';
import { workRef } from '../model.js';
import { recordPager } from '../analyse/readings.js';

export interface WorkContext {
  ref(w: number): string;
  title(w: number): string;
  date(w: number): string;
  page(w: number): string;
}

/** Cached per work, so a report touching the same work many times formats it once. */
export function workContext(model: Model): WorkContext {
  const refs = new Map<number, string>();
  const page = recordPager(model);
  return {
    ref: (w) => {
      let r = refs.get(w);
      if (r === undefined) refs.set(w, (r = workRef(model, w)));
      return r;
    },
    title: (w) => model.works[w].title,
    date: (w) => model.works[w].date,
    page,
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
