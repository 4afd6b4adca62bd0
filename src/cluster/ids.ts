// New clusters (as member refs) + the previous release's ID registry → stable opaque IDs and retired IDs with
// successors.
import type { ClusterRegistry, RetiredId } from './types.js';

const ID = /^c(\d+)$/;

/** `c000184`: opaque, six digits at least (Cool URIs for the Semantic Web, W3C IG Note 2008, §4: no meaning in IDs). */
export function formatClusterId(n: number): string {
  return `c${String(n).padStart(6, '0')}`;
}

/** The number of a cluster ID, or undefined when the text is not one. */
export function clusterIdNumber(id: string): number | undefined {
  const m = ID.exec(id);
  return m ? Number(m[1]) : undefined;
}

/** Orders cluster IDs by their number (c9 before c10). */
export const byNumber = (x: string, y: string) => clusterIdNumber(x)! - clusterIdNumber(y)!;

export interface IdAssignment {
  /** ID of each new cluster, in the order given. */
  ids: string[];
  /** Tombstones carried forward plus IDs retired now, sorted by ID. */
  retired: RetiredId[];
}

/**
 * Assigns IDs to `clusters` (member refs; clusters given in a deterministic order, e.g. by smallest member ref).
 * 1. Each active ID of `previous` chooses the new cluster holding most of its former members (ties → the cluster
 *    given first). 2. A cluster chosen by several old IDs keeps the one with the largest overlap (ties → the older,
 *    i.e. smaller, ID); the others are retired, replaced by every new cluster holding their former members (largest
 *    overlap first, then by ID). 3. Clusters without an ID get the next numbers after the highest ID ever issued, in
 *    the order given. An old ID with no member left in any cluster is retired with no successor. Tombstones are kept
 *    forever. (Standards digest §9: greatest member overlap, ties → older ID; merged/split IDs → isReplacedBy.)
 */
export function assignIds(clusters: readonly (readonly string[])[], previous?: ClusterRegistry): IdAssignment {
  const ids: (string | undefined)[] = clusters.map(() => undefined);
  const retired: RetiredId[] = (previous?.retired ?? []).map((r) => ({ id: r.id, replacedBy: [...r.replacedBy] }));
  let highest = 0;
  for (const r of retired) highest = Math.max(highest, clusterIdNumber(r.id) ?? 0);
  const oldIds = [...(previous?.active.keys() ?? [])].sort(byNumber);
  for (const id of oldIds) highest = Math.max(highest, clusterIdNumber(id) ?? 0);

  const where = new Map<string, number>();
  if (previous) clusters.forEach((refs, ci) => refs.forEach((r) => where.set(r, ci)));
  const overlaps = new Map<string, [cluster: number, overlap: number][]>(); // largest first
  const claims = new Map<number, { id: string; overlap: number }>();
  for (const id of oldIds) {
    const count = new Map<number, number>();
    for (const r of previous!.active.get(id)!) {
      const ci = where.get(r);
      if (ci !== undefined) count.set(ci, (count.get(ci) ?? 0) + 1);
    }
    const list = [...count].sort((x, y) => y[1] - x[1] || x[0] - y[0]);
    overlaps.set(id, list);
    if (list.length === 0) continue;
    const [ci, overlap] = list[0];
    const held = claims.get(ci);
    if (!held || overlap > held.overlap) claims.set(ci, { id, overlap }); // oldest first, so a tie keeps the older
  }
  const kept = new Set<string>();
  for (const [ci, { id }] of claims) {
    ids[ci] = id;
    kept.add(id);
  }
  const final = ids.map((id) => id ?? formatClusterId(++highest));
  for (const id of oldIds) {
    if (kept.has(id)) continue;
    const succ = overlaps
      .get(id)!
      .map(([ci, n]) => [final[ci], n] as const)
      .sort((x, y) => y[1] - x[1] || byNumber(x[0], y[0]));
    retired.push({ id, replacedBy: succ.map((s) => s[0]) });
  }
  retired.sort((x, y) => byNumber(x.id, y.id));
  return { ids: final, retired };
}
