// The release view + history units → every unit of the release in publishing order, the dataset description last.
import { datasetUnit } from './dataset.js';
import { isPublished, releaseUnits, type LinksetCounts, type Unit } from './index.js';
import type { ReleaseView } from './view.js';

/** The release's units, read once, and what they counted on the way. */
export interface UnitStream {
  /** Shared provenance, clusters by ID, links outside clusters, `extra` (history), then the dataset description. */
  units: Generator<Unit>;
  /** How many units `units` yields (for progress). */
  size: number;
  /** Claim triples per predicate IRI; complete once `units` has been read to the end. */
  claims(): Record<string, number>;
}

/**
 * Units of the whole release (design, "Outputs"): the dataset description comes last because its VoID linksets
 * count the claims of every unit before it; `previousVersion` is the previous release's dataset IRI (dcat:previousVersion).
 */
export function releaseStream(view: ReleaseView, extra: Unit[] = [], previousVersion?: string): UnitStream {
  const counts: LinksetCounts = new Map();
  // links outside every cluster become units of their own
  const inClusters = new Uint8Array(view.links.links.length);
  for (const c of view.clusters) for (const li of c.links) inClusters[li] = 1;
  let stray = 0;
  view.links.links.forEach((l, i) => { if (!inClusters[i] && isPublished(l)) stray++; });
  function* units(): Generator<Unit> {
    yield* releaseUnits(view, counts);
    yield* extra;
    yield datasetUnit(view.model, view.namer, counts, previousVersion);
  }
  const claims = () => {
    const out: Record<string, number> = {};
    for (const [key, n] of counts) {
      const p = key.split('|')[2];
      out[p] = (out[p] ?? 0) + n;
    }
    return out;
  };
  return { units: units(), size: 1 + view.clusters.length + stray + extra.length + 1, claims };
}
