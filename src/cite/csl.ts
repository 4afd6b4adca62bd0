// A citation → CSL-JSON: one item per claim (URL = the claim's link IRI), plus one for a cited cluster with its date
// conflicts.
import type { Citation, CitedClaim, CitedRelease } from './types.js';
import { assertedBy, claimPhrase, conflictLine, sentence } from './text.js';

/** A CSL-JSON date variable: `{"date-parts": [[year, month, day]]}` (csl-data.json, definitions/date-variable). */
function dateParts(iso: string): { 'date-parts': number[][] } {
  return { 'date-parts': [iso.slice(0, 10).split('-').map(Number)] };
}

/**
 * Only variables of csl-data.json; what has no variable of its own goes into `custom` (the schema's key-value object).
 */
export interface CslItem {
  id: string;
  type: 'dataset';
  title: string;
  'container-title'?: string;
  version?: string;
  issued?: { 'date-parts': number[][] };
  author?: { literal: string }[];
  curator?: { literal: string }[];
  publisher?: string;
  URL: string;
  note: string;
  custom: Record<string, unknown>;
}

/**
 * Fields every item shares: the release as the container, its version and date, the consortium as author and publisher.
 */
function releaseFields(r: CitedRelease) {
  return {
    ...(r.title ? { 'container-title': r.title } : {}),
    version: r.version,
    ...(r.issued ? { issued: dateParts(r.issued) } : {}),
    ...(r.publisher ? { author: [{ literal: r.publisher }], publisher: r.publisher } : {}),
  };
}

function claimItem(c: CitedClaim, r: CitedRelease): CslItem {
  const who = assertedBy(c);
  const pages = [c.subject.page, c.object.page].filter((p): p is string => !!p);
  const note = [
    sentence(c, r),
    ...(pages.length ? [`Records: ${pages.join(' ; ')}`] : []),
    `Dataset: ${r.dataset}`,
  ].join('\n');
  return {
    id: c.link,
    type: 'dataset',
    title: claimPhrase(c),
    ...releaseFields(r),
    ...(who.kind === 'curator' ? { curator: [{ literal: who.name }] } : {}),
    URL: c.link,
    note,
    custom: {
      kind: c.kind,
      status: c.status,
      ...(c.score !== undefined ? { score: c.score } : {}),
      ...(c.confidence !== undefined ? { confidence: c.confidence } : {}),
      assertedBy: who,
      ...(c.review?.date ? { decided: c.review.date } : {}),
      works: [c.subject.iri, c.object.iri],
      related: pages,
      dataset: r.dataset,
      ...(r.license ? { license: r.license } : {}),
    },
  };
}

/**
 * CSL-JSON (citation-style-language/schema, schemas/input/csl-data.json): an array of items, one per cited claim, of
 * type "dataset": the claim in words as title, the release as container (title, version, issued, the consortium as
 * author and publisher), the deciding curator as `curator`, `URL` = the claim's link IRI; the partner record pages as
 * related links in `custom.related` and in `note`, with the full sentence. A cited cluster adds one item for the
 * cluster (`URL` = its IRI) listing its date conflicts. No access date: the output never depends on the clock.
 */
export function citationCsl(c: Citation): CslItem[] {
  const r = c.release;
  const items = c.claims.map((x) => claimItem(x, r));
  if (c.target.kind === 'cluster') {
    const conflicts = c.conflicts ?? [];
    items.push({
      id: c.target.iri,
      type: 'dataset',
      title: `Cluster ${c.target.iri.replace(/^.*\//, '')}: ${c.claims.length} claim${c.claims.length === 1 ? '' : 's'}, ${conflicts.length} date conflict${conflicts.length === 1 ? '' : 's'}`,
      ...releaseFields(r),
      URL: c.target.iri,
      note: [...conflicts.map((x) => `Date ${conflictLine(x)}`), `Dataset: ${r.dataset}`].join('\n'),
      custom: {
        claims: c.claims.map((x) => x.link),
        dateConflicts: conflicts.map((x) => ({
          iri: x.iri,
          severity: x.severity,
          works: [x.a.iri, x.b.iri],
          dates: [x.a.date ?? '', x.b.date ?? ''],
        })),
        dataset: r.dataset,
        ...(r.license ? { license: r.license } : {}),
      },
    });
  }
  return items;
}
