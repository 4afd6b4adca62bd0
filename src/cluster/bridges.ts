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
export function findBridges(n: number, g: Adjacency, edgeCount: number): Bridges {
  const disc = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const next = new Int32Array(n); // next adjacency position to visit
  const parentEdge = new Int32Array(n);
  const size = new Int32Array(n); // DFS subtree size
  const stack = new Int32Array(n);
  const minSide = new Int32Array(edgeCount); // 0: not a bridge
  const component = new Int32Array(edgeCount);
  let count = 0;
  let time = 0;
  for (let s = 0; s < n; s++) {
    if (disc[s] !== -1 || g.offset[s] === g.offset[s + 1]) continue;
    const here: number[] = []; // bridge edges of this component; minSide holds the size below them for now
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
        const w = g.target[i],
          e = g.edge[i];
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
          if (low[v] > disc[u]) {
            here.push(parentEdge[v]);
            minSide[parentEdge[v]] = size[v];
          }
        }
      }
    }
    for (const e of here) {
      minSide[e] = Math.min(minSide[e], size[s] - minSide[e]);
      component[e] = size[s];
    }
    count += here.length;
  }
  const out: Bridges = {
    edges: new Int32Array(count),
    minSide: new Int32Array(count),
    component: new Int32Array(count),
  };
  for (let e = 0, k = 0; e < edgeCount; e++)
    if (minSide[e] > 0) {
      out.edges[k] = e;
      out.minSide[k] = minSide[e];
      out.component[k++] = component[e];
    }
  return out;
}
