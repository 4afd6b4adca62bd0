// Discriminating evidence of each work pair → one confidence score: best photo, agreeing photos, agreeing third works.

/** Share of the best score a same-work claim resting on one photograph pair gives up (see sameConfidence). */
export const SINGLE_PHOTO_DOUBT = 1 / 3;
/** Third works counted as agreement, at most (a third and a fourth say little more). */
export const MAX_TRIANGLES = 2;
/** Neighbours of a work looked at when counting triangles, at most: keeps the pass linear at hub works. */
export const TRIANGLE_SCAN = 64;

/**
 * Confidence of a machine `same` link (src/evidence/README.md, "Link confidence"):
 *
 *   confidence = best × (1 − SINGLE_PHOTO_DOUBT × ½^agreement)
 *
 * `best` is the best score among the link's reliable, discriminating image pairs (overlap ≥ minOverlap; no image
 * that matches regardless of the artwork). `agreement` counts what else agrees: further photographs
 * (min(distinct matched photos of a, of b) − 1: coverage on both sides, so one photo matching three of the other's
 * does not count thrice) plus third works strongly linked to both (≤ MAX_TRIANGLES). One photograph pair alone keeps
 * two thirds of its score (0.8 → 0.533; 0.7 → 0.467, below proposeAt 0.5: review); every agreeing piece halves the
 * doubt (0.7 with one more photo pair → 0.583). Look-alike works (replicas, prints from one plate, pendants) typically
 * share one moderately similar photograph and nothing else, which is exactly the case the doubt holds back.
 * Set-aside rows (indiscriminate images) add nothing: the share they had is reported beside the link instead.
 */
export function sameConfidence(best: number, agreement: number): number {
  return best * (1 - SINGLE_PHOTO_DOUBT * 0.5 ** agreement);
}

/**
 * Third works agreeing with each link in `candidates`: works joined to both ends by a `strong` link (a same link whose
 * confidence on its own photographs reaches proposeAt, or a curator's same). Counted up to MAX_TRIANGLES, scanning at
 * most TRIANGLE_SCAN neighbours of each end, so the cost is linear in the links.
 */
export function triangles(
  works: number,
  a: Int32Array,
  b: Int32Array,
  strong: Uint8Array,
  candidates: Uint8Array,
): Uint8Array {
  const offset = new Int32Array(works + 1);
  for (let i = 0; i < a.length; i++)
    if (strong[i]) {
      offset[a[i] + 1]++;
      offset[b[i] + 1]++;
    }
  for (let w = 0; w < works; w++) offset[w + 1] += offset[w];
  const fill = offset.slice(0, works);
  const nb = new Int32Array(offset[works]);
  for (let i = 0; i < a.length; i++)
    if (strong[i]) {
      nb[fill[a[i]]++] = b[i];
      nb[fill[b[i]]++] = a[i];
    }
  const stamp = new Int32Array(works).fill(-1);
  const out = new Uint8Array(a.length);
  for (let i = 0; i < a.length; i++) {
    if (!candidates[i]) continue;
    const x = a[i],
      y = b[i];
    for (let k = offset[x]; k < Math.min(offset[x + 1], offset[x] + TRIANGLE_SCAN); k++) stamp[nb[k]] = i;
    let t = 0;
    for (let k = offset[y]; k < Math.min(offset[y + 1], offset[y] + TRIANGLE_SCAN) && t < MAX_TRIANGLES; k++) {
      const z = nb[k];
      if (z !== x && stamp[z] === i) t++;
    }
    out[i] = t;
  }
  return out;
}
