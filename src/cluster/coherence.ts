// Same claims → the claims clusters keep and the ones cut to keep every cluster one coherent artwork.
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import { adjacency } from './graph.js';
import { findBridges } from './bridges.js';
import { UnionFind } from './union-find.js';

/** A bridge joining two groups of two or more works is kept only at this confidence or above (see coherentClaims). */
export const BRIDGE_KEEP_AT = 0.6;

export const CUT_REASONS = ['oversize', 'weak-bridge'] as const;
export type CutReason = (typeof CUT_REASONS)[number];

export interface Coherence {
  /** Same claims kept, ascending link index. */
  kept: number[];
  /** Same claims cut (ascending link index) and why (index into CUT_REASONS). */
  cut: Int32Array;
  cutReason: Uint8Array;
}

/**
 * Splits incoherent clusters (src/cluster/README.md, "Coherent clusters"), two published rules in turn:
 * 1. **Size-bounded single linkage.** Claims are joined strongest first (curator decisions before any machine link,
 *    then by confidence, then link order) as in Kruskal's maximum-spanning-forest construction, and a machine link
 *    that would grow a cluster beyond `cap` members is cut instead: the clusters are those of the maximum spanning
 *    forest with its weakest links removed until no part is oversized (Zahn, "Graph-theoretical methods for
 *    detecting and describing gestalt clusters", IEEE Trans. Computers C-20(1), 1971; Kruskal, Proc. AMS 7, 1956).
 *    A cluster of at most `cap` members is never touched: every union in it stays under the cap.
 * 2. **Weak bridges.** A machine link that is the only connection between two groups of two or more works (a bridge;
 *    Tarjan 1974) and whose confidence is below BRIDGE_KEEP_AT is cut: two records of the same artwork on either side
 *    would normally match across it as well (the weakly connected partitions that duplicate-detection clustering
 *    separates; Hassanzadeh, Chiang, Lee & Miller, "Framework for evaluating clustering algorithms in duplicate
 *    detection", PVLDB 2(1), 2009).
 * Curators' `same` decisions are never cut. O(E log E) for the sort, linear otherwise.
 */
export function coherentClaims(model: Model, linkSet: LinkSet, sameEdges: readonly number[], cap: number): Coherence {
  const links = linkSet.links;
  const n = model.works.length;
  const curator = (e: number) => links[e].decision !== undefined;
  // sort keys read once into typed arrays (links are records over columns: a getter per read)
  const cur = Uint8Array.from(sameEdges, (e) => Number(curator(e))),
    conf = Float64Array.from(sameEdges, (e) => links[e].confidence);
  const order = Int32Array.from(sameEdges.keys())
    .sort((x, y) => cur[y] - cur[x] || conf[y] - conf[x] || sameEdges[x] - sameEdges[y])
    .map((k) => sameEdges[k]);
  const uf = new UnionFind(n);
  const size = new Int32Array(n).fill(1);
  const kept: number[] = [],
    cut: number[] = [],
    reason: number[] = [];
  for (const e of order) {
    const ra = uf.find(links[e].a),
      rb = uf.find(links[e].b);
    if (ra !== rb) {
      if (!curator(e) && size[ra] + size[rb] > cap) {
        cut.push(e);
        reason.push(0);
        continue;
      }
      uf.union(ra, rb);
      size[uf.find(ra)] = size[ra] + size[rb];
    }
    kept.push(e);
  }
  kept.sort((x, y) => x - y);
  const g = adjacency(
    n,
    kept,
    (e) => links[e].a,
    (e) => links[e].b,
  );
  const bridges = findBridges(n, g, links.length);
  const weak = new Set<number>();
  bridges.edges.forEach((e, k) => {
    if (bridges.minSide[k] >= 2 && !curator(e) && links[e].confidence < BRIDGE_KEEP_AT) weak.add(e);
  });
  for (const e of weak) {
    cut.push(e);
    reason.push(1);
  }
  const byLink = Array.from(cut.keys()).sort((x, y) => cut[x] - cut[y]);
  return {
    kept: weak.size ? kept.filter((e) => !weak.has(e)) : kept,
    cut: Int32Array.from(byLink, (k) => cut[k]),
    cutReason: Uint8Array.from(byLink, (k) => reason[k]),
  };
}

/** Clusters, largest cluster and implied pairs the same claims would give without weighing or splitting. */
export interface Unweighed {
  clusters: number;
  largest: number;
  impliedPairs: number;
  sameClaims: number;
}

/**
 * What the claims would have been before the evidence stage and the splits: every same link whose best reliable
 * score reaches proposeAt (or a curator's same), joined into components. For the report's "before and after".
 */
export function unweighed(model: Model, linkSet: LinkSet): Unweighed {
  const n = model.works.length;
  const uf = new UnionFind(n);
  const { proposeAt } = model.project.policy;
  let sameClaims = 0;
  for (const l of linkSet.links) {
    const d = l.decision === undefined ? undefined : model.decisions[l.decision].verdict;
    const claim = d === undefined ? l.kind === 'same' && l.reliableSupport > 0 && l.best >= proposeAt : d === 'same';
    if (!claim) continue;
    sameClaims++;
    uf.union(l.a, l.b);
  }
  const size = new Int32Array(n);
  for (let w = 0; w < n; w++) size[uf.find(w)]++;
  let clusters = 0,
    largest = 0,
    pairs = 0;
  for (let w = 0; w < n; w++) {
    if (size[w] < 2) continue;
    clusters++;
    largest = Math.max(largest, size[w]);
    pairs += (size[w] * (size[w] - 1)) / 2;
  }
  return { clusters, largest, impliedPairs: pairs - sameClaims, sameClaims };
}
