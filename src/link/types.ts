// Work-to-work links: the output of the link stage, read by cluster, analyse, rdf and publish.
import type { WeighedEvidence } from '../evidence/types.js';

export type LinkKind = 'same' | 'part' | 'related';
/**
 * `candidate`: evidence below the proposal threshold (or only unreliable partial matches); never published as a claim.
 */
export type LinkStatus = 'confirmed' | 'proposed' | 'rejected' | 'candidate';

/**
 * Why a machine link with evidence at or above `proposeAt` is not published as a claim (see src/evidence/README.md):
 * `indiscriminate`: only images that match regardless of the artwork carried it; `look-alike`: its confidence stays
 * below `proposeAt` (e.g. one moderately similar photograph and nothing else); `split`: the cluster stage cut it to
 * keep clusters coherent.
 */
export const HELD_REASONS = ['indiscriminate', 'look-alike', 'split'] as const;
export type HeldReason = (typeof HELD_REASONS)[number];

/** One work-to-work link (read only: stored column by column, see columns.ts). */
export interface Link {
  /** Work numbers, ordered so that ref(a) < ref(b) (`partnerKey:workId`, code-point order): stable across releases. */
  readonly a: number;
  readonly b: number;
  readonly kind: LinkKind;
  readonly status: LinkStatus;
  /** For kind `part`: the work that is the detail (part of the other). */
  readonly part?: number;
  /** Image pairs behind the link (all of them, reliable or not). */
  readonly support: number;
  /** Image pairs whose overlap reaches `minOverlap`: only these can propose. */
  readonly reliableSupport: number;
  /** Best and mean score over reliable matches (0 when none). */
  readonly best: number;
  readonly mean: number;
  /** Largest overlap among reliable matches (decides same vs part). */
  readonly maxOverlap: number;
  /** Link confidence in [0,1] from all the evidence (src/evidence/README.md, "Link confidence"); 0 without evidence. */
  readonly confidence: number;
  /** Evidence rows through an image that is not discriminating (kept as evidence; no weight in `confidence`). */
  readonly setAside: number;
  /** Why a link the machine would have proposed is withheld (then status `candidate`). */
  readonly held?: HeldReason;
  /** Share of each work's images that appear in the link's matches. */
  readonly coverageA: number;
  readonly coverageB: number;
  /** Run numbers (Model.runs) with at least one match behind the link, ascending (shared between links: read only). */
  readonly runs: number[];
  /** Index into Model.decisions of the deciding row (the latest for the pair), when a curator decided. */
  readonly decision?: number;
  /** Where the link's evidence rows start in LinkSet.matchRows (`support` rows from there; see matchesOf). */
  readonly matchStart: number;
}

export interface LinkSet {
  /** Every work pair with evidence or a decision, sorted by (ref a, ref b). */
  links: Link[];
  /** `a,b` (work numbers, either order) → index in `links`. */
  byPair: { get(key: number): number | undefined };
  /** Row numbers in Model.matches behind each link, link after link, each link's rows in input order. */
  matchRows: Int32Array;
  /** Evidence rows that repeat an image pair already reported by the same run: counted once (`row` repeats `first`). */
  duplicates: { row: number; first: number }[];
  /** The weighed evidence the links were made from (per-image statistics, rows set aside). */
  evidence: WeighedEvidence;
  /** Withholds link `i` (status `candidate`, `held` = reason): how the cluster stage sends a cut link to review. */
  hold(i: number, reason: HeldReason): void;
}

/** Key of an unordered work pair for maps; exact while work numbers stay below 2^26. */
export function pairKey(a: number, b: number): number {
  return a < b ? a * 67108864 + b : b * 67108864 + a;
}
