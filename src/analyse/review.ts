// Links + cluster diagnostics → the curators' review queue, ranked: most useful decisions first.
import { refRank, type Model } from '../model.js';
import { isClaim } from '../link/index.js';
import { pairKey, type LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { float64, int32 } from '../util/columns.js';
import { denseRank, sortByKeys } from '../util/sort.js';
import { REVIEW_REASONS, type ReviewQueue, type ReviewReason } from './types.js';

/** Unreviewed claims scoring at least this are quick wins for a curator (common practice, no source). */
export const HIGH_SCORE_AT = 0.9;

const tier = (r: ReviewReason) => REVIEW_REASONS.indexOf(r);

/**
 * Ranks what curators should look at (design, pipeline step 4), by tier, then score (highest first), then references:
 * 1. `contradicts-distinct`: two works a curator called distinct that the claims still put in one cluster;
 * 2. `bridge` / `high-score`: unreviewed claims whose removal would split a cluster into two clusters (both sides
 *    of at least two works: one false link merges two artworks), or scoring ≥ `highScoreAt` (one tier, by score);
 * 3. `implied-third-archive`, then `implied`: same-cluster pairs with no direct claim and no curator decision;
 * 4. `proposed`: every other proposed link nobody has reviewed.
 * A link reviewed by a curator is never queued again. For a `part` link the detail work comes first, so that a
 * curator who writes `part` states it the right way round (design: decisions file, work_a part of work_b).
 */
export function reviewQueue(model: Model, linkSet: LinkSet, clustering: Clustering, highScoreAt = HIGH_SCORE_AT): ReviewQueue {
  const links = linkSet.links;
  const isBridge = new Uint8Array(links.length); // bridges joining two groups that would each stay a cluster
  clustering.bridges.forEach((li, k) => { if (clustering.bridgeMinSide[k] >= 2) isBridge[li] = 1; });
  const a = int32(), b = int32(), reason = int32(), link = int32(), scores = float64();
  const add = (x: number, y: number, r: ReviewReason, li: number) => {
    a.push(x); b.push(y); reason.push(tier(r)); link.push(li);
    scores.push(li >= 0 ? links[li].best : -1);
  };
  links.forEach((l, i) => {
    if (l.decision !== undefined || !isClaim(l)) return;
    const r: ReviewReason | undefined = isBridge[i] ? 'bridge' : l.best >= highScoreAt ? 'high-score' : l.status === 'proposed' ? 'proposed' : undefined;
    if (r === undefined) return; // confirmed by score (autoConfirmAt) below highScoreAt: the policy settled it
    const [x, y] = l.kind === 'part' && l.part === l.b ? [l.b, l.a] : [l.a, l.b];
    add(x, y, r, i);
  });
  const im = clustering.implied;
  for (let k = 0; k < im.count; k++) {
    const li = linkSet.byPair.get(pairKey(im.a[k], im.b[k])) ?? -1;
    const l = li >= 0 ? links[li] : undefined;
    if (l?.decision !== undefined && l.status !== 'rejected') continue; // a curator already called it part or related
    add(im.a[k], im.b[k], l?.status === 'rejected' ? 'contradicts-distinct' : im.throughThird[k] ? 'implied-third-archive' : 'implied', li);
  }

  const A = a.trim(), B = b.trim(), R = reason.trim(), L = link.trim(), score = scores.trim();
  const queued = new Set<number>();
  for (let i = 0; i < A.length; i++) { queued.add(A[i]); queued.add(B[i]); }
  const byRef = refRank(model, [...queued]);
  // bridge and high-score share one tier; score highest first; then references
  const band = Uint8Array.from(R, (r) => (r === tier('high-score') ? tier('bridge') : r));
  const s = denseRank(score);
  const rank = sortByKeys(A.length, [
    { values: band, size: REVIEW_REASONS.length },
    { values: s.rank.map((r) => s.size - 1 - r), size: s.size },
    { values: Int32Array.from(A, (w) => byRef[w]), size: queued.size },
    { values: Int32Array.from(B, (w) => byRef[w]), size: queued.size },
  ]);
  return {
    count: rank.length,
    a: Int32Array.from(rank, (i) => A[i]),
    b: Int32Array.from(rank, (i) => B[i]),
    reason: Uint8Array.from(rank, (i) => R[i]),
    link: Int32Array.from(rank, (i) => L[i]),
  };
}
