// A list of links (work pairs) → adjacency in compressed sparse rows (CSR), typed arrays only.

/** Neighbours of v are `target[offset[v] .. offset[v+1])`, reached over link `edge[i]`. */
export interface Adjacency {
  offset: Int32Array;
  target: Int32Array;
  edge: Int32Array;
}

/** Builds CSR adjacency over `n` vertices from the links whose indexes are in `edges` (each link gives two entries). */
export function adjacency(
  n: number,
  edges: ArrayLike<number>,
  a: (e: number) => number,
  b: (e: number) => number,
): Adjacency {
  const offset = new Int32Array(n + 1);
  for (let i = 0; i < edges.length; i++) {
    offset[a(edges[i]) + 1]++;
    offset[b(edges[i]) + 1]++;
  }
  for (let v = 0; v < n; v++) offset[v + 1] += offset[v];
  const fill = offset.slice(0, n);
  const target = new Int32Array(offset[n]);
  const edge = new Int32Array(offset[n]);
  for (let i = 0; i < edges.length; i++) {
    const e = edges[i],
      x = a(e),
      y = b(e);
    target[fill[x]] = y;
    edge[fill[x]++] = e;
    target[fill[y]] = x;
    edge[fill[y]++] = e;
  }
  return { offset, target, edge };
}
