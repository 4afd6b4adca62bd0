// What the analyse stage finds: date conflicts, overlap statistics, agreement with the gold concordance, review queue.
import type { IntervalReading, YearSpan } from '../dates/index.js';
import type { LinkKind, LinkStatus } from '../link/types.js';

/**
 * A record whose catalogued date lies more than the policy's dateTolerance from the date most of its cluster gives
 * (`against: 'cluster'`), or a detail whose date lies that far from the work it is part of (`against: 'whole'`).
 */
export interface DateConflict {
  /**
   * Index into Clustering.clusters: the record's cluster (for a detail in none, its whole's); -1 when neither has one.
   */
  cluster: number;
  /** The record (work number) whose date disagrees. */
  work: number;
  reading: IntervalReading;
  against: 'cluster' | 'whole';
  /** For `whole`: the work the record is part of. */
  whole?: number;
  /** A record carrying the consensus date (the most common reading in the consensus group), or the whole. */
  anchor: number;
  /** Years the consensus dates span (for `whole`: its cluster's consensus, or its own date). */
  consensus: YearSpan;
  /** Records whose dates make the consensus, of `dated` records with a readable date. */
  support: number;
  dated: number;
  /** No majority: another group of records as large gives another date. */
  tie: boolean;
  /** Years between the record's date and the consensus span (more than the tolerance). */
  apart: number;
}

/** For partner `from` (P) and partner `to` (Q): P's works that match a work at Q, and their share of P's works. */
export interface OverlapCell {
  from: number;
  to: number;
  works: number;
  matched: number;
  /** matched / works (0 when P has no works). */
  share: number;
}

/** The same per century of the work's date (midpoint of its interval), e.g. `1400-1499`, or `undated`. */
export interface CenturyCell extends OverlapCell {
  century: string;
}

export interface OverlapStats {
  /** Every ordered pair of distinct partners, by (from, to). */
  pairs: OverlapCell[];
  /** Ordered partner pairs × centuries with at least one work of `from`, by (from, to, century). */
  centuries: CenturyCell[];
}

/** The best evidence for a gold pair the claims miss: the link between the two works, if any. */
export interface MissedPair {
  a: number;
  b: number;
  /** Line of the pair in the gold file. */
  line: number;
  link?: { kind: LinkKind; status: LinkStatus; best: number; support: number };
}

export interface Agreement {
  /** Distinct pairs listed in the gold file. */
  goldPairs: number;
  /** Gold pairs whose works share a cluster (joined directly or through other works). */
  found: number;
  recall: number | null;
  /** Works named in the gold file. */
  goldWorks: number;
  /** Same-cluster pairs (direct claims and implied pairs) of works both named in the gold file. */
  claimedPairs: number;
  /** Those of them that the gold file makes the same work (transitive closure of its pairs). */
  correctPairs: number;
  precision: number | null;
  f1: number | null;
  /** In gold-file order. */
  missed: MissedPair[];
}

/**
 * Why a pair is in the review queue, most urgent first (the order is the ranking tier; `split` and `bridge` share one):
 * what a decision would change most comes first (see review.ts).
 */
export const REVIEW_REASONS = [
  'contradicts-distinct',
  'split',
  'bridge',
  'indiscriminate',
  'look-alike',
  'small-overlap',
  'high-score',
  'implied-third-archive',
  'implied',
  'proposed',
] as const;
export type ReviewReason = (typeof REVIEW_REASONS)[number];

/** The review queue as columns, in rank order. `reason` indexes REVIEW_REASONS; `link` is -1 when there is none. */
export interface ReviewQueue {
  /** Rows listed (at most `limit`). */
  count: number;
  /** Rows the queue would hold without the bound, and how many of them each reason has (REVIEW_REASONS order). */
  total: number;
  byReason: number[];
  /** The bound (policy.reviewLimit). */
  limit: number;
  a: Int32Array;
  b: Int32Array;
  reason: Uint8Array;
  link: Int32Array;
}

export interface Analysis {
  conflicts: DateConflict[];
  overlap: OverlapStats;
  /** Null when the project has no gold concordance. */
  agreement: Agreement | null;
  review: ReviewQueue;
}
