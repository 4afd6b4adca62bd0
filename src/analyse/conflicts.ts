// Clusters + catalogued dates → pairs of members whose dates conflict (disjoint) or softly conflict (century label).
import type { Model } from '../model.js';
import type { Clustering } from '../cluster/types.js';
import { compareDates, type DateReading } from '../dates/index.js';
import type { DateConflict } from './types.js';

/**
 * Every pair of members of a cluster (up to Clustering.pairwiseLimit members) whose dates compare as `conflict`
 * (disjoint intervals) or `soft` (apart only by the century-counting convention) (design, pipeline step 4; EDTF
 * intervals per partner convention, standards digest §10). In cluster order, then member order.
 */
export function dateConflicts(model: Model, clustering: Clustering, read: (w: number) => DateReading): DateConflict[] {
  const out: DateConflict[] = [];
  clustering.clusters.forEach((c, ci) => {
    if (c.members.length > clustering.pairwiseLimit) return;
    const dated = Array.from(c.members).filter((w) => read(w).kind === 'interval');
    for (let i = 0; i < dated.length; i++)
      for (let j = i + 1; j < dated.length; j++) {
        const ra = read(dated[i]), rb = read(dated[j]);
        const verdict = compareDates(ra, rb);
        if ((verdict === 'conflict' || verdict === 'soft') && ra.kind === 'interval' && rb.kind === 'interval')
          out.push({ cluster: ci, a: dated[i], b: dated[j], severity: verdict, readingA: ra, readingB: rb });
      }
  });
  return out;
}
