// Indexes + integer sort keys → the indexes in key order, by stable counting sorts (no comparator callbacks).

export interface SortKey {
  /** Key of index i, an integer in [0, size). */
  values: ArrayLike<number>;
  size: number;
}

/**
 * Sorts 0..n-1 by `keys[0]`, then `keys[1]`, … (least-significant-digit radix sort: one stable counting sort per key,
 * last key first; Cormen et al., Introduction to Algorithms, §8.2–8.3). O(n + size) per key, typed arrays only.
 */
export function sortByKeys(n: number, keys: SortKey[]): Int32Array {
  let order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  let next = new Int32Array(n);
  for (let k = keys.length - 1; k >= 0; k--) {
    const { values, size } = keys[k];
    const start = new Int32Array(size + 1);
    for (let i = 0; i < n; i++) start[values[i] + 1]++;
    for (let v = 0; v < size; v++) start[v + 1] += start[v];
    for (let p = 0; p < n; p++) {
      const i = order[p];
      next[start[values[i]]++] = i;
    }
    [order, next] = [next, order];
  }
  return order;
}

/** Dense ranks of numbers (equal values share a rank, smallest = 0), and how many distinct values there are. */
export function denseRank(values: Float64Array): { rank: Int32Array; size: number } {
  const sorted = Float64Array.from(values).sort();
  let size = 0;
  for (let i = 0; i < sorted.length; i++) if (i === 0 || sorted[i] !== sorted[i - 1]) sorted[size++] = sorted[i];
  const rank = new Int32Array(values.length);
  for (let i = 0; i < values.length; i++) {
    let lo = 0,
      hi = size - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (sorted[mid] < values[i]) lo = mid + 1;
      else hi = mid;
    }
    rank[i] = lo;
  }
  return { rank, size };
}

/** Stable counting sort of `items` by `key[item]` (keys in [0, buckets); Cormen et al., §8.2). */
export function countingSort(items: Int32Array, key: Int32Array, buckets: number): Int32Array {
  const starts = new Int32Array(buckets + 1);
  for (const it of items) starts[key[it] + 1]++;
  for (let k = 0; k < buckets; k++) starts[k + 1] += starts[k];
  const out = new Int32Array(items.length);
  for (const it of items) out[starts[key[it]]++] = it;
  return out;
}
