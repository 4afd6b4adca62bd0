// Evidence rows → per-image statistics: matched images, distinct works and partners, agreement of the other photos.
import type { Model } from '../model.js';
import { countingSort } from '../util/sort.js';

/** Rows naming each image, as compressed sparse rows: image i's rows are `row[offset[i] .. offset[i+1])`. */
export interface ImageRows {
  offset: Int32Array;
  row: Int32Array;
  /** The work at the other end of the row, parallel to `row`. */
  other: Int32Array;
}

/**
 * Rows that could propose a link on their own: score ≥ proposeAt and overlap ≥ minOverlap. The statistics count only
 * these, the match graph at the proposal threshold; the low-scoring background every run reports says nothing.
 */
export function proposing(model: Model, proposeAt: number, minOverlap: number): Uint8Array {
  const m = model.matches;
  const out = new Uint8Array(m.count);
  for (let r = 0; r < m.count; r++) out[r] = m.score[r] >= proposeAt && m.overlap[r] >= minOverlap ? 1 : 0;
  return out;
}

/** The proposing evidence rows under both their images (two passes of counting, typed arrays only). */
export function imageRows(model: Model, use: Uint8Array): ImageRows {
  const { matches, images } = model;
  const offset = new Int32Array(images.count + 1);
  let used = 0;
  for (let r = 0; r < matches.count; r++)
    if (use[r]) {
      used++;
      offset[matches.a[r] + 1]++;
      offset[matches.b[r] + 1]++;
    }
  for (let i = 0; i < images.count; i++) offset[i + 1] += offset[i];
  const fill = offset.slice(0, images.count);
  const row = new Int32Array(2 * used),
    other = new Int32Array(2 * used);
  for (let r = 0; r < matches.count; r++) {
    if (!use[r]) continue;
    const a = matches.a[r],
      b = matches.b[r];
    row[fill[a]] = r;
    other[fill[a]++] = images.work[b];
    row[fill[b]] = r;
    other[fill[b]++] = images.work[a];
  }
  return { offset, row, other };
}

/**
 * Distinct works and partners each image matched. Sorts a copy of each image's slice of other-end works, so the cost
 * is O(R log d) for R rows and d rows per image: an image matching thousands of works costs no pair list.
 */
export function distinctCounts(model: Model, ir: ImageRows): { works: Int32Array; partners: Int32Array } {
  const n = model.images.count;
  const works = new Int32Array(n),
    partners = new Int32Array(n);
  const sorted = Int32Array.from(ir.other);
  const stamp = new Int32Array(model.project.partners.length).fill(-1);
  for (let i = 0; i < n; i++) {
    const s = sorted.subarray(ir.offset[i], ir.offset[i + 1]).sort();
    for (let k = 0; k < s.length; k++) {
      if (k > 0 && s[k] === s[k - 1]) continue;
      works[i]++;
      const p = model.works[s[k]].partner;
      if (stamp[p] !== i) {
        stamp[p] = i;
        partners[i]++;
      }
    }
  }
  return { works, partners };
}

/**
 * For each row end, whether the row's work pair has another row through neither of this end's image nor an image in
 * `ignore`: another photograph of the two works agrees. Rows are grouped by work pair with two counting sorts;
 * each group is scanned with a per-image tally, so the cost is linear in the rows. Bit 1: end a, bit 2: end b.
 */
export function corroboration(model: Model, ignore: Uint8Array, use: Uint8Array): Uint8Array {
  const { matches, images } = model;
  const n = model.works.length;
  const lo = new Int32Array(matches.count),
    hi = new Int32Array(matches.count);
  for (let r = 0; r < matches.count; r++) {
    const x = images.work[matches.a[r]],
      y = images.work[matches.b[r]];
    lo[r] = x < y ? x : y;
    hi[r] = x < y ? y : x;
  }
  const ids = new Int32Array(matches.count);
  for (let r = 0; r < matches.count; r++) ids[r] = r;
  const rows = countingSort(countingSort(ids, hi, n), lo, n);
  const out = new Uint8Array(matches.count);
  const tally = new Int32Array(images.count); // eligible rows of the current group per image; reset after each group
  for (let s = 0; s < rows.length;) {
    let e = s + 1;
    while (e < rows.length && lo[rows[e]] === lo[rows[s]] && hi[rows[e]] === hi[rows[s]]) e++;
    // eligible rows of the group, and how many of them each image takes part in
    let eligible = 0;
    for (let k = s; k < e; k++) {
      const r = rows[k],
        a = matches.a[r],
        b = matches.b[r];
      if (ignore[a] || ignore[b] || !use[r]) continue;
      eligible++;
      tally[a]++;
      tally[b]++;
    }
    for (let k = s; k < e; k++) {
      const r = rows[k];
      if (eligible - tally[matches.a[r]] > 0) out[r] |= 1;
      if (eligible - tally[matches.b[r]] > 0) out[r] |= 2;
    }
    for (let k = s; k < e; k++) {
      tally[matches.a[rows[k]]] = 0;
      tally[matches.b[rows[k]]] = 0;
    }
    s = e;
  }
  return out;
}

/**
 * Distinct matched works of image `i` with at least one corroborated row (see corroboration), and the *opportunities*:
 * matched works where both works have another usable photograph (`usable[w]` ≥ 2), so that agreement could be seen.
 */
export function corroboratedWorks(
  model: Model,
  ir: ImageRows,
  corr: Uint8Array,
  usable: Int32Array,
  i: number,
): { corroborated: number; opportunities: number } {
  const keys: number[] = [];
  for (let k = ir.offset[i]; k < ir.offset[i + 1]; k++) {
    const r = ir.row[k];
    const bit = model.matches.a[r] === i ? corr[r] & 1 : (corr[r] >> 1) & 1;
    keys.push(ir.other[k] * 2 + bit);
  }
  keys.sort((x, y) => x - y);
  let count = 0,
    opportunities = 0;
  const own = usable[model.images.work[i]] >= 2;
  for (let k = 0; k < keys.length; k++) {
    const last = k + 1 === keys.length || keys[k + 1] >> 1 !== keys[k] >> 1;
    if (!last) continue;
    if (keys[k] & 1) count++;
    if (own && usable[keys[k] >> 1] >= 2) opportunities++;
  }
  return { corroborated: count, opportunities };
}

/** Sorted distinct work-pair keys (pairKey) of rows whose two images are both kept (`ignore` 0): binary-searchable. */
export function workPairs(model: Model, ignore: Uint8Array, use: Uint8Array): Float64Array {
  const { matches, images } = model;
  const keys = new Float64Array(matches.count);
  let k = 0;
  for (let r = 0; r < matches.count; r++) {
    if (ignore[matches.a[r]] || ignore[matches.b[r]] || !use[r]) continue;
    const x = images.work[matches.a[r]],
      y = images.work[matches.b[r]];
    keys[k++] = x < y ? x * 67108864 + y : y * 67108864 + x;
  }
  const sorted = keys.subarray(0, k).sort();
  let d = 0;
  for (let i = 0; i < k; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) sorted[d++] = sorted[i];
  return sorted.slice(0, d);
}

function has(keys: Float64Array, key: number): boolean {
  let lo = 0,
    hi = keys.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >>> 1;
    if (keys[mid] === key) return true;
    if (keys[mid] < key) lo = mid + 1;
    else hi = mid - 1;
  }
  return false;
}

/** Matched works of one image sampled for the triangle test, at most (120 work pairs). */
export const TRIANGLE_SAMPLE = 16;

/**
 * Triangle support of image `i`: the share of pairs of its matched works (the first TRIANGLE_SAMPLE of them) that
 * match each other too. The records of one artwork match each other; the works a mount back or a colour chart
 * matches are unrelated and do not (a nearest-neighbour graph of look-alike scans has a low clustering coefficient).
 */
export function triangleSupport(ir: ImageRows, pairs: Float64Array, i: number): number {
  const s = Int32Array.from(ir.other.subarray(ir.offset[i], ir.offset[i + 1])).sort();
  const works: number[] = [];
  for (let k = 0; k < s.length && works.length < TRIANGLE_SAMPLE; k++)
    if (k === 0 || s[k] !== s[k - 1]) works.push(s[k]);
  let pairsSeen = 0,
    closed = 0;
  for (let x = 0; x < works.length; x++)
    for (let y = x + 1; y < works.length; y++) {
      pairsSeen++;
      if (has(pairs, works[x] * 67108864 + works[y])) closed++;
    }
  return pairsSeen ? closed / pairsSeen : 1;
}
