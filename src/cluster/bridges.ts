// Adjacency → bridges (edges whose removal disconnects their component), by Tarjan's low-link method, iteratively.
import type { Adjacency } from './graph.js';

/**
 * Bridges of an undirected simple graph (Tarjan 1974, "A note on finding the bridges of a graph": an edge (u,v) of the
 * DFS tree is a bridge iff low[v] > disc[u]). Runs with an explicit stack, so a cluster of any size cannot overflow
 * the call stack. Returns the edge numbers of the bridges, ascending.
 */
export function findBridges(n: number, g: Adjacency): Int32Array {
  const disc = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const next = new Int32Array(n); // next adjacency position to visit
  const parentEdge = new Int32Array(n);
  const stack = new Int32Array(n);
  const found: number[] = [];
  let time = 0;
  for (let s = 0; s < n; s++) {
    if (disc[s] !== -1 || g.offset[s] === g.offset[s + 1]) continue;
    let sp = 0;
    disc[s] = low[s] = time++;
    parentEdge[s] = -1;
    next[s] = g.offset[s];
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
          stack[sp++] = w;
        } else if (disc[w] < low[v]) low[v] = disc[w];
      } else {
        sp--;
        if (sp > 0) {
          const u = stack[sp - 1];
          if (low[v] < low[u]) low[u] = low[v];
          if (low[v] > disc[u]) found.push(parentEdge[v]);
        }
      }
    }
  }
  return Int32Array.from(found.sort((x, y) => x - y));
}
