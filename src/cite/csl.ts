// A citation → CSL-JSON: one item of type "dataset" for the release, quoting the cited claim's stable IRI.
import type { Citation } from './types.js';
import { sentence } from './text.js';

/** A CSL-JSON date variable: `{"date-parts": [[year, month, day]]}` (CSL 1.0.2, Appendix IV "Date" / csl-data.json). */
function dateParts(iso: string): { 'date-parts': number[][] } {
  return { 'date-parts': [iso.slice(0, 10).split('-').map(Number)] };
}

export interface CslItem {
  id: string;
  type: 'dataset';
  title?: string;
  version?: string;
  issued?: { 'date-parts': number[][] };
  author?: { literal: string }[];
  publisher?: string;
  license?: string;
  URL: string;
  note?: string;
}

/**
 * CSL-JSON (citation-style-language/schema, csl-data.json): an array of items. The item cites the dataset release
 * (type "dataset", title, version, issued, the consortium as author and publisher, licence) at the IRI of what was
 * cited (the link, work or cluster); the note carries the claim sentences and the dataset IRI. No access date: the
 * output never depends on the clock.
 */
export function citationCsl(c: Citation): CslItem[] {
  const r = c.release;
  const note = [...c.claims.map((x) => sentence(x, r)), `Dataset: ${r.dataset}`].join('\n');
  return [{
    id: c.target.iri,
    type: 'dataset',
    ...(r.title ? { title: r.title } : {}),
    version: r.version,
    ...(r.issued ? { issued: dateParts(r.issued) } : {}),
    ...(r.publisher ? { author: [{ literal: r.publisher }], publisher: r.publisher } : {}),
    ...(r.license ? { license: r.license } : {}),
    URL: c.target.iri,
    note,
  }];
}
