// Model, links, clustering and analysis → the release view: what is published, with the one Namer that names it.
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import type { Analysis } from '../analyse/types.js';
import type { VocabMap } from './vocab-map.js';
import { Namer } from './index.js';

export interface ClusterView {
  id: string;
  /** Work numbers, sorted by reference (the clustering's own array, shared: read only). */
  members: Int32Array;
  /** Indices into LinkSet.links of the links whose both ends are members (the clustering's array, read only). */
  links: Int32Array;
  /** Link indices whose removal splits the cluster. */
  bridges: number[];
  implied: { a: number; b: number; throughThirdArchive: boolean }[];
  conflicts: { a: number; b: number; severity: 'conflict' | 'soft' }[];
  oversized: boolean;
}

export interface RetiredView {
  id: string;
  replacedBy: string[];
}

/** What every writer of the release reads (RDF units, history, pages): one view, named by one Namer. */
export interface ReleaseView {
  model: Model;
  links: LinkSet;
  clusters: ClusterView[];
  retired: RetiredView[];
  vocab: VocabMap;
  /** IRIs of everything the release names, from the project's templates and the vocab map's patterns. */
  namer: Namer;
}

/** The release view: clusters with their bridges, implied pairs and date conflicts; retired cluster IDs; the Namer. */
export function releaseView(
  model: Model,
  links: LinkSet,
  clustering: Clustering,
  analysis: Analysis | undefined,
  vocab: VocabMap,
): ReleaseView {
  return {
    model,
    links,
    clusters: clusterViews(clustering, analysis),
    retired: clustering.retired,
    vocab,
    namer: new Namer(model, vocab.iris),
  };
}

/** Clustering (columns) → what the RDF stage reads per cluster. */
function clusterViews(clustering: Clustering, analysis?: Analysis): ClusterView[] {
  const views: ClusterView[] = clustering.clusters.map((c) => ({
    id: c.id,
    members: c.members,
    links: c.links,
    bridges: [],
    implied: [],
    conflicts: [],
    oversized: c.oversized,
  }));
  const bridgeSet = new Set(clustering.bridges);
  for (const v of views) for (const l of v.links) if (bridgeSet.has(l)) v.bridges.push(l);
  const im = clustering.implied;
  for (let i = 0; i < im.count; i++)
    views[im.cluster[i]].implied.push({ a: im.a[i], b: im.b[i], throughThirdArchive: im.throughThird[i] === 1 });
  for (const c of analysis?.conflicts ?? [])
    if (c.cluster >= 0) views[c.cluster].conflicts.push({ a: c.work, b: c.anchor, severity: 'conflict' });
  return views;
}
