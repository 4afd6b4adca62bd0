// Disjoint sets over integer IDs in typed arrays (union by rank, path halving): no object per element, no recursion.

/** Union-find over 0..n-1 (Tarjan 1975; union by rank with path halving, near-constant amortised time). */
export class UnionFind {
  readonly parent: Int32Array;
  readonly rank: Int32Array;
  constructor(n: number) {
    this.parent = new Int32Array(n);
    this.rank = new Int32Array(n);
    for (let i = 0; i < n; i++) this.parent[i] = i;
  }

  find(x: number): number {
    const p = this.parent;
    while (p[x] !== x) {
      p[x] = p[p[x]];
      x = p[x];
    }
    return x;
  }

  /** Joins the sets of x and y; returns false when they were already one. */
  union(x: number, y: number): boolean {
    let rx = this.find(x),
      ry = this.find(y);
    if (rx === ry) return false;
    if (this.rank[rx] < this.rank[ry]) [rx, ry] = [ry, rx];
    this.parent[ry] = rx;
    if (this.rank[rx] === this.rank[ry]) this.rank[rx]++;
    return true;
  }

  /** Makes x a singleton again (only for elements whose set holds nothing else, or on a fresh sweep). */
  reset(x: number): void {
    this.parent[x] = x;
    this.rank[x] = 0;
  }
}
