// Claims + clusters → per ordered partner pair (and per century) the works of one partner matched at the other.
import type { Model } from '../model.js';
import { isClaim } from '../link/index.js';
import type { LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { adjacency } from '../cluster/graph.js';
import type { DateReading } from '../dates/index.js';
import { centuryOf, UNDATED } from './readings.js';
import type { CenturyCell, OverlapCell, OverlapStats } from './types.js';

const share = (matched: number, works: number) => (works === 0 ? 0 : matched / works);

/**
 * For each ordered pair of partners (P, Q): how many of P's works match a work at Q — a confirmed or proposed `same`
 * or `part` link to it, or membership of one cluster — and that number as a share of P's works (design, pipeline
 * step 4, "overlap statistics"). Per century too, by the midpoint of the work's date interval.
 */
export function overlapStats(
  model: Model,
  linkSet: LinkSet,
  clustering: Clustering,
  read: (w: number) => DateReading,
): OverlapStats {
  const np = model.project.partners.length,
    n = model.works.length;
  const links = linkSet.links;
  const claimEdges: number[] = [];
  links.forEach((l, i) => {
    if ((l.kind === 'same' || l.kind === 'part') && isClaim(l)) claimEdges.push(i);
  });
  const g = adjacency(
    n,
    claimEdges,
    (e) => links[e].a,
    (e) => links[e].b,
  );

  const works = new Int32Array(np);
  const matched = new Int32Array(np * np);
  const byCentury = new Map<string, { works: Int32Array; matched: Int32Array }>();
  const seen = new Int32Array(np).fill(-1); // seen[q] === w: work w matches partner q
  for (let w = 0; w < n; w++) {
    const p = model.works[w].partner;
    works[p]++;
    const century = centuryOf(read(w));
    let row = byCentury.get(century);
    if (!row) byCentury.set(century, (row = { works: new Int32Array(np), matched: new Int32Array(np * np) }));
    row.works[p]++;
    const mark = (q: number) => {
      if (q === p || seen[q] === w) return;
      seen[q] = w;
      matched[p * np + q]++;
      row!.matched[p * np + q]++;
    };
    for (let i = g.offset[w]; i < g.offset[w + 1]; i++) mark(model.works[g.target[i]].partner);
    const ci = clustering.clusterOf[w];
    if (ci >= 0) for (const q of clustering.clusters[ci].partners) mark(q);
  }

  const pairs: OverlapCell[] = [];
  for (let p = 0; p < np; p++)
    for (let q = 0; q < np; q++)
      if (p !== q)
        pairs.push({
          from: p,
          to: q,
          works: works[p],
          matched: matched[p * np + q],
          share: share(matched[p * np + q], works[p]),
        });
  const order = [...byCentury.keys()].sort((x, y) =>
    x === UNDATED ? 1 : y === UNDATED ? -1 : parseInt(x) - parseInt(y),
  );
  const centuries: CenturyCell[] = [];
  for (let p = 0; p < np; p++)
    for (let q = 0; q < np; q++) {
      if (p === q) continue;
      for (const century of order) {
        const row = byCentury.get(century)!;
        if (row.works[p] === 0) continue;
        const m = row.matched[p * np + q];
        centuries.push({ from: p, to: q, century, works: row.works[p], matched: m, share: share(m, row.works[p]) });
      }
    }
  return { pairs, centuries };
}
