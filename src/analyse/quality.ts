// Clusters and part claims + an answer key (work → artwork, detail → whole) → pair, B-cubed and part-of
// precision/recall/F1.
import type { Model } from '../model.js';
import { isClaim } from '../link/index.js';
import { pairKey, type LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { cachedWorkRef } from '../model.js';

/** The truth of a scenario: each work's artwork (by `partnerKey:workId`), and the artwork each detail is part of. */
export interface Truth {
  artwork: Map<string, string>;
  partOf: Map<string, string>;
}

export interface Prf {
  precision: number;
  recall: number;
  f1: number;
}

export interface Quality {
  /**
   * Pairs of works put in one cluster (the published same-work claims, direct or implied) against same-artwork pairs.
   */
  pair: Prf & { claimed: number; correct: number; truePairs: number };
  /** B-cubed over every work (Bagga & Baldwin 1998; Amigó et al., Information Retrieval 12(4), 2009). */
  bcubed: Prf;
  /** (detail work, whole work) pairs a published part claim asserts, read through both works' clusters. */
  partOf: Prf & { claimed: number; correct: number; truePairs: number };
}

const prf = (correct: number, claimed: number, truth: number): Prf => {
  const precision = claimed ? correct / claimed : 1;
  const recall = truth ? correct / truth : 1;
  return { precision, recall, f1: precision + recall ? (2 * precision * recall) / (precision + recall) : 0 };
};

/**
 * Measures a release's same-work and part-of claims against an answer key. Pair counts come from cluster × artwork
 * tallies (no pair is listed); F1 is the harmonic mean (van Rijsbergen 1979). A work the key does not name is an
 * artwork of its own.
 */
export function quality(model: Model, linkSet: LinkSet, clustering: Clustering, truth: Truth): Quality {
  const ref = cachedWorkRef(model);
  const n = model.works.length;
  const art = Array.from({ length: n }, (_, w) => truth.artwork.get(ref(w)) ?? `work ${ref(w)}`);
  const artSize = new Map<string, number>();
  for (const a of art) artSize.set(a, (artSize.get(a) ?? 0) + 1);
  // pairs and B-cubed from cluster × artwork tallies
  let claimed = 0,
    correct = 0,
    truePairs = 0,
    bp = 0,
    br = 0;
  for (const s of artSize.values()) truePairs += (s * (s - 1)) / 2;
  const inCluster = new Uint8Array(n);
  for (const c of clustering.clusters) {
    const k = c.members.length;
    claimed += (k * (k - 1)) / 2;
    const tally = new Map<string, number>();
    for (const w of c.members) {
      inCluster[w] = 1;
      tally.set(art[w], (tally.get(art[w]) ?? 0) + 1);
    }
    for (const t of tally.values()) correct += (t * (t - 1)) / 2;
    for (const w of c.members) {
      const t = tally.get(art[w])!;
      bp += t / k;
      br += t / artSize.get(art[w])!;
    }
  }
  for (let w = 0; w < n; w++)
    if (!inCluster[w]) {
      bp += 1;
      br += 1 / artSize.get(art[w])!;
    }

  // part-of: each part claim asserts (detail, whole) for every member of both works' clusters
  const members = (w: number) =>
    clustering.clusterOf[w] >= 0 ? clustering.clusters[clustering.clusterOf[w]].members : [w];
  const asserted = new Set<number>();
  let partCorrect = 0;
  for (const l of linkSet.links) {
    if (l.kind !== 'part' || !isClaim(l) || l.part === undefined) continue;
    const whole = l.part === l.a ? l.b : l.a;
    for (const d of members(l.part))
      for (const x of members(whole)) {
        const k = pairKey(d, x) * 2 + (d < x ? 0 : 1);
        if (d === x || asserted.has(k)) continue;
        asserted.add(k);
        if (truth.partOf.get(art[d]) === art[x]) partCorrect++;
      }
  }
  let partTruth = 0;
  for (const [detail, whole] of truth.partOf) partTruth += (artSize.get(detail) ?? 0) * (artSize.get(whole) ?? 0);
  return {
    pair: { ...prf(correct, claimed, truePairs), claimed, correct, truePairs },
    bcubed: (() => {
      const p = bp / n,
        r = br / n;
      return { precision: p, recall: r, f1: p + r ? (2 * p * r) / (p + r) : 0 };
    })(),
    partOf: {
      ...prf(partCorrect, asserted.size, partTruth),
      claimed: asserted.size,
      correct: partCorrect,
      truePairs: partTruth,
    },
  };
}
