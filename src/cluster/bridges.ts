// Adjacency → bridges (edges whose removal disconnects their component), by Tarjan's low-link method, iteratively.
import type { Adjacency } from './graph.js';

export interface Bridges {
  /** Edge numbers of the bridges, ascending. */
  edges: Int32Array;
  /** For each bridge: vertices on the smaller side once it is removed. */
  minSide: Int32Array;
  /** For each bridge: vertices in its whole component. */
  component: Int32Array;
}

/**
 * Bridges of an undirected simple graph (Tarjan 1974, "A note on finding the bridges of a graph": a DFS tree edge
 * (u,v) is a bridge iff low[v] > disc[u]), with the sizes of the two sides from DFS subtree sizes. Runs with an
 * explicit stack, so a component of any size cannot overflow the call stack.
 */
export function findBridges(n: number, g: Adjacency): Bridges {
  const disc = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const next = new Int32Array(n); // next adjacency position to visit
  const parentEdge = new Int32Array(n);
  const size = new Int32Array(n); // DFS subtree size
  const stack = new Int32Array(n);
  const found: [edge: number, minSide: number, component: number][] = [];
  let time = 0;
  for (let s = 0; s < n; s++) {
    if (disc[s] !== -1 || g.offset[s] === g.offset[s + 1]) continue;
    const here: [edge: number, below: number][] = [];
    let sp = 0;
    disc[s] = low[s] = time++;
    parentEdge[s] = -1;
    next[s] = g.offset[s];
    size[s] = 1;
    stack[sp++] = s;
    while (sp > 0) {
      const v = stack[sp - 1];
      if (next[v] < g.offset[v + 1]) {
        const i = next[v]++;
        const w = g.target[i], e = g.edge[i];
        if (e === parentEdge[v]) continue;
        if (disc[w] === -1) {
          disc[w] = low[w] = time++;
          parentEdge[w] = e;
          next[w] = g.offset[w];
          size[w] = 1;
          stack[sp++] = w;
        } else if (disc[w] < low[v]) low[v] = disc[w];
      } else {
        sp--;
        if (sp > 0) {
          const u = stack[sp - 1];
          if (low[v] < low[u]) low[u] = low[v];
          size[u] += size[v];
          if (low[v] > disc[u]) here.push([parentEdge[v], size[v]]);
        }
      }
    }
    for (const [e, below] of here) found.push([e, Math.min(below, size[s] - below), size[s]]);
  }
  found.sort((x, y) => x[0] - y[0]);
  return { edges: Int32Array.from(found, (f) => f[0]), minSide: Int32Array.from(found, (f) => f[1]), component: Int32Array.from(found, (f) => f[2]) };
}
