// Cite stage: a target (`partner:work`, work, link or cluster IRI) + a release or store folder → a citation, in four
// formats.
import { UserError, EXIT } from '../errors.js';
import { readSource, type CiteSource } from './source.js';
import { findTarget } from './find.js';
import { Reader, citedClaim, citedConflicts, citedRelease } from './gather.js';
import { citationText, citationMarkdown } from './text.js';
import { citationCsl } from './csl.js';
import { citationJsonLd } from './jsonld.js';
import type { Citation } from './types.js';

export type { Citation } from './types.js';
export type CiteFormat = 'text' | 'markdown' | 'jsonld' | 'csl-json';

/** Output format → renderer (one row per format). */
export const CITE_FORMATS: Record<CiteFormat, (c: Citation) => Promise<string> | string> = {
  text: citationText,
  markdown: citationMarkdown,
  jsonld: async (c) => JSON.stringify(await citationJsonLd(c), null, 2) + '\n',
  'csl-json': (c) => JSON.stringify(citationCsl(c), null, 2) + '\n',
};

/** The citation as plain data (`cite --json`): everything but the statements it rests on. */
export function citationData(c: Citation): Omit<Citation, 'quads'> {
  const { quads: _quads, ...data } = c;
  return data;
}

const STATUS_ORDER = { confirmed: 0, proposed: 1, rejected: 2 };

/**
 * Builds the citation of `query` from the release (design, pipeline step 9): every claim about it with status, kind,
 * score, image matches, run, curator and release. A target the release holds no claim about is exit 1, naming the
 * nearest work references or successors.
 */
export async function cite(query: string, source: CiteSource): Promise<Citation> {
  const store = await readSource(source);
  const found = findTarget(store, query);
  if (!found.ok)
    throw new UserError(
      {
        file: source.release ?? source.store!,
        line: 0,
        field: 'target',
        message: found.message,
        hint: found.nearest.length
          ? `nearest: ${found.nearest.join(', ')}`
          : 'check the reference: partnerKey:workId, or a work, link or cluster IRI',
      },
      EXIT.failure,
    );
  const r = new Reader(store);
  const release = citedRelease(r);
  if (!release)
    throw new UserError({
      file: source.release ?? source.store!,
      line: 0,
      field: 'dcat:version',
      message: 'no dataset description (dcat:Dataset with dcat:version) found',
      hint: 'load the whole release, including its dataset graph',
    });
  const claims = found.links.map((l) => citedClaim(r, l));
  claims.sort(
    (x, y) =>
      STATUS_ORDER[x.status] - STATUS_ORDER[y.status] ||
      (y.score ?? -1) - (x.score ?? -1) ||
      (x.link < y.link ? -1 : 1),
  );
  const conflicts = found.kind === 'cluster' ? citedConflicts(r, found.iri) : [];
  return { query, target: { kind: found.kind, iri: found.iri }, release, claims, conflicts, quads: r.quads() };
}
