// Clusters + same claims → implied pairs (same cluster, no direct claim), marking those joined only via a third
// archive.
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import { int32 } from '../util/columns.js';
import type { Cluster, ImpliedPairs } from './types.js';
import { UnionFind } from './union-find.js';

/**
 * Component labels of a cluster's members in the subgraph of works from partners p and q only (one label array per
 * partner pair, keyed `p * partnerCount + q` with p < q). Two works of p and q with different labels are joined in
 * the cluster only through a work of a third partner.
 */
function twoPartnerLabels(model: Model, linkSet: LinkSet, c: Cluster, local: Int32Array): Map<number, Int32Array> {
  const labels = new Map<number, Int32Array>();
  const k = c.members.length,
    np = model.project.partners.length;
  if (c.partners.length < 3) return labels; // with two partners every path stays within them
  const partnerOf = (w: number) => model.works[w].partner;
  const uf = new UnionFind(k);
  for (let x = 0; x < c.partners.length; x++)
    for (let y = x + 1; y < c.partners.length; y++) {
      const p = c.partners[x],
        q = c.partners[y];
      for (let i = 0; i < k; i++) uf.reset(i);
      for (const li of c.links) {
        const l = linkSet.links[li];
        const pa = partnerOf(l.a),
          pb = partnerOf(l.b);
        if ((pa === p || pa === q) && (pb === p || pb === q)) uf.union(local[l.a], local[l.b]);
      }
      const lab = new Int32Array(k);
      for (let i = 0; i < k; i++) lab[i] = uf.find(i);
      labels.set(p * np + q, lab);
    }
  return labels;
}

/**
 * Lists the implied pairs of every cluster of at most `pairwiseLimit` members (in cluster order, then by member
 * reference) and counts them in all clusters: a cluster of k members with m same claims has k(k−1)/2 − m.
 */
export function impliedPairs(
  model: Model,
  linkSet: LinkSet,
  clusters: Cluster[],
  pairwiseLimit: number,
): { implied: ImpliedPairs; total: number } {
  const a = int32(),
    b = int32(),
    cl = int32(),
    cross = int32(),
    third = int32();
  const local = new Int32Array(model.works.length);
  let direct = new Uint8Array(0); // k × k: same claim between local members i and j
  const np = model.project.partners.length;
  let total = 0;
  clusters.forEach((c, ci) => {
    const k = c.members.length;
    total += (k * (k - 1)) / 2 - c.links.length;
    if (k > pairwiseLimit) return;
    c.members.forEach((w, i) => (local[w] = i));
    if (direct.length < k * k) direct = new Uint8Array(k * k);
    else direct.fill(0, 0, k * k);
    for (const li of c.links) {
      const x = local[linkSet.links[li].a],
        y = local[linkSet.links[li].b];
      direct[x * k + y] = direct[y * k + x] = 1;
    }
    const labels = twoPartnerLabels(model, linkSet, c, local);
    for (let i = 0; i < k; i++)
      for (let j = i + 1; j < k; j++) {
        if (direct[i * k + j]) continue;
        const x = c.members[i],
          y = c.members[j];
        const px = model.works[x].partner,
          py = model.works[y].partner;
        const lab = px === py ? undefined : labels.get(Math.min(px, py) * np + Math.max(px, py));
        a.push(x);
        b.push(y);
        cl.push(ci);
        cross.push(px === py ? 0 : 1);
        third.push(lab !== undefined && lab[i] !== lab[j] ? 1 : 0);
      }
  });
  return {
    implied: {
      count: a.length,
      a: a.trim(),
      b: b.trim(),
      cluster: cl.trim(),
      crossPartner: Uint8Array.from(cross.trim()),
      throughThird: Uint8Array.from(third.trim()),
    },
    total,
  };
}
