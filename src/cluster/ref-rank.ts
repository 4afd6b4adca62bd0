// Work numbers → their rank in reference order (`partnerKey:workId`, code-point order), so sorts compare integers.
import type { Model } from '../model.js';
import { workRef } from '../model.js';

/**
 * Ranks `works` by reference (the order the link stage sorts by) into `rank[w]` (0-based among `works`); other
 * entries stay -1. Each reference string is built once; later sorts compare the integers.
 */
export function refRank(model: Model, works: ArrayLike<number>): Int32Array {
  const rank = new Int32Array(model.works.length).fill(-1);
  const refs = Array.from(works, (w) => workRef(model, w));
  const order = Array.from(refs.keys()).sort((x, y) => (refs[x] < refs[y] ? -1 : refs[x] > refs[y] ? 1 : 0));
  order.forEach((i, r) => (rank[works[i]] = r));
  return rank;
}
