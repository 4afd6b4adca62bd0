// The release view + history units → every unit of the release in publishing order, the dataset description last.
import { datasetUnit } from './dataset.js';
import type { Quad } from '@rdfjs/types';
import { releaseUnits, strayPlan, type LinksetCounts, type Unit } from './index.js';
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
 * count the claims of every unit before it; `previousVersion` is the previous release's dataset IRI
 * (dcat:previousVersion);
 * `attached` holds quads about published links to write in each link's unit (see releaseUnits).
 */
export function releaseStream(
  view: ReleaseView,
  extra: Unit[] = [],
  previousVersion?: string,
  attached?: ReadonlyMap<string, Quad[]>,
): UnitStream {
  const counts: LinksetCounts = new Map();
  // links outside every cluster go with their claim subject's cluster, or into one unit per subject
  const plan = strayPlan(view);
  function* units(): Generator<Unit> {
    yield* releaseUnits(view, counts, { plan, attached });
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
  return { units: units(), size: 1 + view.clusters.length + plan.bySubject.size + extra.length + 1, claims };
}
