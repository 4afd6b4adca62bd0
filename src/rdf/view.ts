// What the RDF stage reads: the model, the links, clusters with diagnostics, retired cluster IDs, the vocab map.
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import type { VocabMap } from './vocab-map.js';

export interface ClusterView {
  id: string;
  /** Work numbers, sorted by reference. */
  members: number[];
  /** Indices into LinkSet.links of the links whose both ends are members. */
  links: number[];
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

export interface ReleaseView {
  model: Model;
  links: LinkSet;
  clusters: ClusterView[];
  retired: RetiredView[];
  vocab: VocabMap;
}
