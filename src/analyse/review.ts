// Links + cluster diagnostics → the curators' review queue, ranked: most useful decisions first.
import { refRank, type Model } from '../model.js';
import { isClaim, matchesOf } from '../link/index.js';
import { pairKey, type Link, type LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { float64, int32 } from '../util/columns.js';
import { denseRank, sortByKeys } from '../util/sort.js';
import { REVIEW_REASONS, type ReviewQueue, type ReviewReason } from './types.js';

/**
 * The best match of a link whose every match lies below minOverlap, through discriminating images only (a mount back
 * says nothing about parts either), and its detail work (the partial match's image_a, as the input contract has it).
 */
function smallOverlap(model: Model, linkSet: LinkSet, l: Link): { score: number; detail: number } | undefined {
  const m = model.matches;
  let best: { score: number; detail: number } | undefined;
  for (const r of matchesOf(linkSet, l))
    if (!linkSet.evidence.setAside[r] && (best === undefined || m.score[r] > best.score))
      best = { score: m.score[r], detail: model.images.work[m.a[r]] };
  return best;
}

/** Unreviewed claims scoring at least this are quick wins for a curator (common practice, no source). */
export const HIGH_SCORE_AT = 0.9;

const tier = (r: ReviewReason) => REVIEW_REASONS.indexOf(r);

/**
 * Ranks what curators should look at by what a decision would change (design, pipeline step 4), by tier, then score
 * (highest first), then references, and keeps the first `limit` rows (policy.reviewLimit; the rest are counted):
 * 1. `contradicts-distinct`: two works a curator called distinct that the claims still put in one cluster;
 * 2. `split` / `bridge` (one tier): links that hold a cluster together — machine links the cluster stage cut to keep
 *    clusters coherent, and unreviewed claims whose removal would split a cluster into two clusters of two or more;
 * 3. `indiscriminate`: links touched by images that match regardless of the artwork (held back, or published on
 *    other evidence with such rows beside it);
 * 4. `look-alike`: links whose evidence reached proposeAt but whose confidence did not (one moderately similar
 *    photograph and nothing else: a replica, a print from the same plate, a pendant, or the same work);
 * 5. `small-overlap`: pairs whose only matches at or above proposeAt cover less than `minOverlap` of the smaller
 *    image (a detail photographed so small in the whole that the match alone cannot carry a claim, or a shared motif):
 *    never proposed, so only a curator can say `part`; ranked by that best score, detail (image_a) first;
 * 6. `high-score`: unreviewed claims scoring ≥ `highScoreAt` (quick wins);
 * 7. `implied-third-archive`, then `implied`: same-cluster pairs with no direct claim and no curator decision;
 * 8. `proposed`: every other proposed link nobody has reviewed.
 * A link reviewed by a curator is never queued again. For a `part` link the detail work comes first, so that a
 * curator who writes `part` states it the right way round (design: decisions file, work_a part of work_b).
 */
export function reviewQueue(
  model: Model,
  linkSet: LinkSet,
  clustering: Clustering,
  highScoreAt = HIGH_SCORE_AT,
  limit = model.project.policy.reviewLimit,
): ReviewQueue {
  const links = linkSet.links;
  const isBridge = new Uint8Array(links.length); // bridges joining two groups that would each stay a cluster
  clustering.bridges.forEach((li, k) => {
    if (clustering.bridgeMinSide[k] >= 2) isBridge[li] = 1;
  });
  const a = int32(),
    b = int32(),
    reason = int32(),
    link = int32(),
    scores = float64();
  const add = (x: number, y: number, r: ReviewReason, li: number, score = li >= 0 ? links[li].best : -1) => {
    a.push(x);
    b.push(y);
    reason.push(tier(r));
    link.push(li);
    scores.push(score);
  };
  const { proposeAt } = model.project.policy;
  const HELD: Record<string, ReviewReason> = {
    split: 'split',
    indiscriminate: 'indiscriminate',
    'look-alike': 'look-alike',
  };
  links.forEach((l, i) => {
    if (l.decision === undefined && l.reliableSupport === 0 && l.support > 0) {
      const faint = smallOverlap(model, linkSet, l);
      if (faint && faint.score >= proposeAt)
        add(faint.detail, faint.detail === l.a ? l.b : l.a, 'small-overlap', i, faint.score);
      return;
    }
    if (l.decision !== undefined || !(isClaim(l) || l.held)) return;
    const r: ReviewReason | undefined = l.held
      ? HELD[l.held]
      : isBridge[i]
        ? 'bridge'
        : l.setAside > 0
          ? 'indiscriminate'
          : l.best >= highScoreAt
            ? 'high-score'
            : l.status === 'proposed'
              ? 'proposed'
              : undefined;
    if (r === undefined) return; // confirmed by score (autoConfirmAt) below highScoreAt: the policy settled it
    const [x, y] = l.kind === 'part' && l.part === l.b ? [l.b, l.a] : [l.a, l.b];
    add(x, y, r, i);
  });
  const im = clustering.implied;
  for (let k = 0; k < im.count; k++) {
    const li = linkSet.byPair.get(pairKey(im.a[k], im.b[k])) ?? -1;
    const l = li >= 0 ? links[li] : undefined;
    if (l?.decision !== undefined && l.status !== 'rejected') continue; // a curator already called it part or related
    add(
      im.a[k],
      im.b[k],
      l?.status === 'rejected' ? 'contradicts-distinct' : im.throughThird[k] ? 'implied-third-archive' : 'implied',
      li,
    );
  }

  const A = a.trim(),
    B = b.trim(),
    R = reason.trim(),
    L = link.trim(),
    score = scores.trim();
  const queued = new Set<number>();
  for (let i = 0; i < A.length; i++) {
    queued.add(A[i]);
    queued.add(B[i]);
  }
  const byRef = refRank(model, [...queued]);
  // split and bridge share one tier; score highest first; then references
  const band = Uint8Array.from(R, (r) => (r === tier('split') ? tier('bridge') : r));
  const s = denseRank(score);
  const rank = sortByKeys(A.length, [
    { values: band, size: REVIEW_REASONS.length },
    { values: s.rank.map((r) => s.size - 1 - r), size: s.size },
    { values: Int32Array.from(A, (w) => byRef[w]), size: queued.size },
    { values: Int32Array.from(B, (w) => byRef[w]), size: queued.size },
  ]);
  const byReason = REVIEW_REASONS.map(() => 0);
  for (const r of R) byReason[r]++;
  const kept = rank.subarray(0, Math.min(limit, rank.length));
  return {
    count: kept.length,
    total: rank.length,
    byReason,
    limit,
    a: Int32Array.from(kept, (i) => A[i]),
    b: Int32Array.from(kept, (i) => B[i]),
    reason: Uint8Array.from(kept, (i) => R[i]),
    link: Int32Array.from(kept, (i) => L[i]),
  };
}
