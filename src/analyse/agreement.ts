// Clusters + links + the gold concordance → recall, precision, F1 and the gold pairs the claims miss.
import type { Model } from '../model.js';
import { pairKey, type LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { UnionFind } from '../cluster/union-find.js';
import type { Agreement, MissedPair } from './types.js';

/**
 * Agreement with the hand-made gold concordance (design, pipeline step 4):
 * - recall = share of the distinct gold pairs whose two works share a cluster (a direct same claim or a chain of them);
 * - precision = among same-cluster pairs (direct claims and implied pairs) of works both named in the gold file, the
 *   share the gold file makes the same work, reading its pairs transitively (gold components);
 * - F1 = harmonic mean of the two (van Rijsbergen 1979, F-measure with β = 1).
 * Counts pairs per cluster from member tallies, so no pair is enumerated. Null ratios when undefined (0/0).
 */
export function agreement(model: Model, linkSet: LinkSet, clustering: Clustering): Agreement {
  const n = model.works.length;
  const gold = new UnionFind(n);
  const inGold = new Uint8Array(n);
  const seen = new Set<number>();
  let goldPairs = 0,
    found = 0;
  const missed: MissedPair[] = [];
  for (const g of model.gold) {
    inGold[g.a] = inGold[g.b] = 1;
    gold.union(g.a, g.b);
    const k = pairKey(g.a, g.b);
    if (seen.has(k)) continue;
    seen.add(k);
    goldPairs++;
    const ca = clustering.clusterOf[g.a];
    if (ca >= 0 && ca === clustering.clusterOf[g.b]) {
      found++;
      continue;
    }
    const li = linkSet.byPair.get(k);
    const l = li === undefined ? undefined : linkSet.links[li];
    missed.push({
      a: g.a,
      b: g.b,
      line: g.line,
      link: l && { kind: l.kind, status: l.status, best: l.best, support: l.support },
    });
  }
  let claimedPairs = 0,
    correctPairs = 0;
  for (const c of clustering.clusters) {
    const tally = new Map<number, number>();
    let k = 0;
    for (const w of c.members) {
      if (!inGold[w]) continue;
      k++;
      const r = gold.find(w);
      tally.set(r, (tally.get(r) ?? 0) + 1);
    }
    claimedPairs += (k * (k - 1)) / 2;
    for (const t of tally.values()) correctPairs += (t * (t - 1)) / 2;
  }
  const recall = goldPairs ? found / goldPairs : null;
  const precision = claimedPairs ? correctPairs / claimedPairs : null;
  const f1 =
    recall !== null && precision !== null && recall + precision > 0
      ? (2 * precision * recall) / (precision + recall)
      : recall === null || precision === null
        ? null
        : 0;
  let goldWorks = 0;
  for (let w = 0; w < n; w++) goldWorks += inGold[w];
  return { goldPairs, found, recall, goldWorks, claimedPairs, correctPairs, precision, f1, missed };
}
