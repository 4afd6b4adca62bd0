// Work links → clusters (connected components over same claims) with diagnostics and stable IDs (design, step 3).
import type { Model } from '../model.js';
import { refRank, workRef } from '../model.js';
import { isClaim } from '../link/index.js';
import type { LinkSet } from '../link/types.js';
import { adjacency } from './graph.js';
import { findBridges } from './bridges.js';
import { impliedPairs } from './implied.js';
import { assignIds, byNumber } from './ids.js';
import { UnionFind } from './union-find.js';
import { coherentClaims, unweighed } from './coherence.js';
import type { Cluster, ClusterOptions, ClusterRegistry, Clustering, Split } from './types.js';

export type { Cluster, ClusterOptions, ClusterRegistry, Clustering, ImpliedPairs, RetiredId } from './types.js';
export { readClusterRegistry, writeClusterRegistry, registryOf, CLUSTERS_CSV_HEADER } from './registry.js';
export { formatClusterId } from './ids.js';
export { CUT_REASONS, BRIDGE_KEEP_AT, type CutReason } from './coherence.js';

/**
 * One artwork has about one record per archive, so a cluster with more than twice as many members as there are
 * partners is suspect (common practice, no source).
 */
export const OVERSIZE_PER_PARTNER = 2;
/**
 * Largest cluster whose member pairs are listed one by one (implied pairs, date conflicts): with coherent clusters
 * only curators' decisions can make a cluster this large, and no cluster's pairs grow quadratically in the release.
 */
export const PAIRWISE_LIMIT = 64;

/**
 * Clusters = connected components of ≥ 2 works over `same` links that are confirmed or proposed (design, pipeline
 * step 3), found by union-find over work numbers in typed arrays. Diagnostics: implied pairs, bridges (Tarjan 1974)
 * in clusters of three or more works with the size of their smaller side, oversized clusters. IDs stay stable against
 * `previous` (see assignIds; standards digest §9).
 */
export function cluster(
  model: Model,
  linkSet: LinkSet,
  previous?: ClusterRegistry,
  options: ClusterOptions = {},
): Clustering {
  const n = model.works.length;
  const links = linkSet.links;
  const oversizeAt = options.oversizeAt ?? OVERSIZE_PER_PARTNER * model.project.partners.length;
  const before = unweighed(model, linkSet);
  const claims: number[] = [];
  links.forEach((l, i) => {
    if (l.kind === 'same' && isClaim(l)) claims.push(i);
  });
  // coherent clusters (coherence.ts): the cut links are withheld from the release and go to review
  const coherence =
    options.coherence === false
      ? { kept: claims, cut: new Int32Array(0), cutReason: new Uint8Array(0) }
      : coherentClaims(model, linkSet, claims, oversizeAt);
  for (const e of coherence.cut) linkSet.hold(e, 'split');
  const sameEdges = coherence.kept;
  const uf = new UnionFind(n);
  for (const e of sameEdges) uf.union(links[e].a, links[e].b);

  // group works by root: temp index per root, then member and link lists by counting
  const tempOf = new Int32Array(n).fill(-1);
  const memberCount: number[] = [];
  const inEdge = new Uint8Array(n);
  for (const e of sameEdges) inEdge[links[e].a] = inEdge[links[e].b] = 1;
  for (let w = 0; w < n; w++) {
    if (!inEdge[w]) continue;
    const r = uf.find(w);
    if (tempOf[r] === -1) {
      tempOf[r] = memberCount.length;
      memberCount.push(0);
    }
    memberCount[tempOf[r]]++;
  }
  const t = memberCount.length;
  const members = memberCount.map((c) => new Int32Array(c));
  const fill = new Int32Array(t);
  for (let w = 0; w < n; w++)
    if (inEdge[w]) {
      const ti = tempOf[uf.find(w)];
      members[ti][fill[ti]++] = w;
    }
  const edgeLists: number[][] = members.map(() => []);
  for (const e of sameEdges) edgeLists[tempOf[uf.find(links[e].a)]].push(e);

  const clustered: number[] = [];
  for (let w = 0; w < n; w++) if (inEdge[w]) clustered.push(w);
  const rank = refRank(model, clustered);
  for (const m of members) m.sort((x, y) => rank[x] - rank[y]);
  const order = [...members.keys()].sort((x, y) => rank[members[x][0]] - rank[members[y][0]]);

  const { ids, retired } = assignIds(
    order.map((ti) => Array.from(members[ti], (w) => workRef(model, w))),
    previous,
  );
  const clusters: Cluster[] = order.map((ti, k) => ({
    id: ids[k],
    members: members[ti],
    links: Int32Array.from(edgeLists[ti]),
    partners: [...new Set(Array.from(members[ti], (w) => model.works[w].partner))].sort((x, y) => x - y),
    oversized: members[ti].length > oversizeAt,
  }));
  clusters.sort((x, y) => byNumber(x.id, y.id));

  const clusterOf = new Int32Array(n).fill(-1);
  clusters.forEach((c, ci) => c.members.forEach((w) => (clusterOf[w] = ci)));
  const g = adjacency(
    n,
    sameEdges,
    (e) => links[e].a,
    (e) => links[e].b,
  );
  // the one link of a two-work cluster is trivially a bridge: only links of larger clusters are listed
  const found = findBridges(n, g, links.length);
  const keep = Array.from(found.edges.keys()).filter((i) => found.component[i] >= 3);
  const bridges = Int32Array.from(keep, (i) => found.edges[i]);
  const bridgeMinSide = Int32Array.from(keep, (i) => found.minSide[i]);
  const pairwiseLimit = options.pairwiseLimit ?? PAIRWISE_LIMIT;
  const { implied, total } = impliedPairs(model, linkSet, clusters, pairwiseLimit);
  const splits = splitsOf(model, linkSet, claims, coherence.cut, clusters, clusterOf);
  return {
    clusters,
    clusterOf,
    implied,
    impliedTotal: total,
    bridges,
    bridgeMinSide,
    oversizeAt,
    pairwiseLimit,
    retired,
    cut: coherence.cut,
    cutReason: coherence.cutReason,
    splits,
    before,
  };
}

/** The components the claims would have formed that the cuts split, with the clusters made of them (by first ID). */
function splitsOf(
  model: Model,
  linkSet: LinkSet,
  claims: number[],
  cut: Int32Array,
  clusters: Cluster[],
  clusterOf: Int32Array,
): Split[] {
  if (cut.length === 0) return [];
  const uf = new UnionFind(model.works.length);
  for (const e of claims) uf.union(linkSet.links[e].a, linkSet.links[e].b);
  const roots = new Map<number, Split>();
  for (const e of cut) {
    const r = uf.find(linkSet.links[e].a);
    if (!roots.has(r)) roots.set(r, { works: 0, clusters: [], alone: 0, cutLinks: 0 });
    roots.get(r)!.cutLinks++;
  }
  for (let w = 0; w < model.works.length; w++) {
    const s = roots.get(uf.find(w));
    if (!s) continue;
    s.works++;
    if (clusterOf[w] < 0) s.alone++;
    else if (!s.clusters.includes(clusters[clusterOf[w]].id)) s.clusters.push(clusters[clusterOf[w]].id);
  }
  const out = [...roots.values()];
  for (const s of out) s.clusters.sort(byNumber);
  return out.sort((x, y) => y.works - x.works || byNumber(x.clusters[0] ?? 'c0', y.clusters[0] ?? 'c0'));
}
