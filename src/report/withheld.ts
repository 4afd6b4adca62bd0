// Weighed evidence, held links and cluster splits → the report's "withheld" section: what was not published and why.
import { IMAGE_VERDICTS } from '../evidence/index.js';
import { HELD_REASONS, type LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import type { Model } from '../model.js';

/** The withheld section as JSON-ready data (lists capped at `limit`, totals beside them). */
export function withheldData(model: Model, linkSet: LinkSet, clustering: Clustering, limit: number) {
  const ev = linkSet.evidence;
  const partners = model.project.partners;
  const byVerdict = Object.fromEntries(IMAGE_VERDICTS.slice(1).map((v) => [v, 0]));
  for (const i of ev.indiscriminate) byVerdict[IMAGE_VERDICTS[ev.verdict[i]]]++;
  const held = Object.fromEntries(HELD_REASONS.map((r) => [r, 0]));
  let sameClaims = 0;
  for (const l of linkSet.links) {
    if (l.held) held[l.held]++;
    if (l.kind === 'same' && (l.status === 'confirmed' || l.status === 'proposed')) sameClaims++;
  }
  const largest = clustering.clusters.reduce((m, c) => Math.max(m, c.members.length), 0);
  return {
    method: {
      hubAbove: ev.hubAbove,
      suspectFrom: ev.suspectFrom,
      medianWorksMatched: ev.median,
      madWorksMatched: ev.mad,
    },
    indiscriminateImages: ev.indiscriminate.length,
    byVerdict,
    rowsSetAside: ev.rowsSetAside,
    images: Array.from(ev.indiscriminate.subarray(0, limit), (i) => ({
      partner: partners[model.works[model.images.work[i]].partner].key,
      image: model.images.id[i],
      work: model.works[model.images.work[i]].id,
      why: IMAGE_VERDICTS[ev.verdict[i]],
      worksMatched: ev.stats.works[i],
      partnersMatched: ev.stats.partners[i],
      rows: ev.stats.matchedImages[i],
    })),
    heldLinks: held,
    splits: clustering.splits.slice(0, limit),
    splitsTotal: clustering.splits.length,
    before: clustering.before,
    after: { clusters: clustering.clusters.length, largest, impliedPairs: clustering.impliedTotal, sameClaims },
    pairwiseLimit: clustering.pairwiseLimit,
  };
}
