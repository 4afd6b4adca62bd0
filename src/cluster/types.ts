// Clusters (one artwork each) with their diagnostics and stable IDs: the output of the cluster stage.

/** One cluster: ≥ 2 works joined by confirmed or proposed `same` links. */
export interface Cluster {
  /** Opaque, stable across releases (`c000001`); see ids.ts. */
  id: string;
  /** Work numbers, sorted by reference (`partnerKey:workId`, code-point order). */
  members: Int32Array;
  /** Indexes into LinkSet.links of the same claims joining the members, ascending. */
  links: Int32Array;
  /** Partner numbers present, ascending. */
  partners: number[];
  /** More members than Clustering.oversizeAt. */
  oversized: boolean;
}

/**
 * Implied pairs as columns (one entry per pair; no object per pair): same cluster, no confirmed or proposed `same`
 * link between them. `a`/`b` are ordered by reference; `cluster` indexes Clustering.clusters.
 * `throughThird` is 1 for a pair of two partners whose every joining path passes through a work of a third partner.
 */
export interface ImpliedPairs {
  count: number;
  a: Int32Array;
  b: Int32Array;
  cluster: Int32Array;
  crossPartner: Uint8Array;
  throughThird: Uint8Array;
}

/** A cluster ID that is no longer in use, with the IDs that replaced it (empty: its members are all gone). */
export interface RetiredId {
  id: string;
  replacedBy: string[];
}

/** The ID registry of a release (its clusters.csv): active IDs with member refs, and every tombstone so far. */
export interface ClusterRegistry {
  /** ID → member refs (`partnerKey:workId`). */
  active: Map<string, string[]>;
  retired: RetiredId[];
}

/** A component the same claims would have formed, split by the coherence rules. */
export interface Split {
  /** Works in the component. */
  works: number;
  /** IDs of the clusters made of it, ascending. */
  clusters: string[];
  /** Its works left in no cluster. */
  alone: number;
  /** Links cut inside it. */
  cutLinks: number;
}

export interface ClusterOptions {
  /** Split incoherent clusters (default true; see coherence.ts). False: plain connected components. */
  coherence?: boolean;
  /** A cluster with more members than this is flagged oversized. Default: OVERSIZE_PER_PARTNER × partners. */
  oversizeAt?: number;
  /** Pairwise diagnostics (implied pairs, date conflicts) are listed only for clusters up to this size. */
  pairwiseLimit?: number;
}

export interface Clustering {
  /** Sorted by ID. */
  clusters: Cluster[];
  /** Work number → index in `clusters`, or -1 when the work is in no cluster. */
  clusterOf: Int32Array;
  implied: ImpliedPairs;
  /** Implied pairs in every cluster, including those too large to list (see pairwiseLimit). */
  impliedTotal: number;
  /**
   * Indexes into LinkSet.links of the links whose removal splits their cluster, ascending; only in clusters of three
   * or more works (the one link of a pair is trivially a bridge and is not listed).
   */
  bridges: Int32Array;
  /**
   * Parallel to `bridges`: works on the smaller side. ≥ 2 means the link joins two groups that would each stay a
   * cluster.
   */
  bridgeMinSide: Int32Array;
  oversizeAt: number;
  pairwiseLimit: number;
  /** Every retired ID: tombstones carried from the previous registry and the ones retired now; sorted by ID. */
  retired: RetiredId[];
  /** Same claims cut to keep clusters coherent (link indexes, ascending; now candidates held as `split`). */
  cut: Int32Array;
  /** Parallel to `cut`: index into CUT_REASONS. */
  cutReason: Uint8Array;
  /** Components the cuts split, largest first. */
  splits: Split[];
  /** The claims without evidence weighing or splits, for the report's before and after. */
  before: { clusters: number; largest: number; impliedPairs: number; sameClaims: number };
}
