// Retired cluster IDs (tombstones) → one unit of quads: deprecated, replaced by their successors, invalidated by a
// release.
import type { Quad } from '@rdfjs/types';
import { term, nn, bool, typed, inGraph } from './terms.js';
import type { Namer, Unit } from './index.js';
import type { RetiredView } from './view.js';

/** When and by what a retired ID was invalidated: a release activity IRI and, when the release is dated, its time. */
export interface Invalidation {
  activity: string;
  time?: string;
}

/**
 * Tombstones (standards digest §9): each retired `{base}work/{id}` stays a cx:Cluster with `owl:deprecated true`
 * (OWL 2 Structural Spec §5.5), `dcterms:isReplacedBy` each successor (DCMI Terms; never owl:sameAs, which would
 * re-merge split parts) and `prov:wasInvalidatedBy` / `prov:invalidatedAtTime` (PROV-O §3.2) when known.
 */
export function retiredUnit(retired: RetiredView[], namer: Namer, invalidations: Map<string, Invalidation>): Unit {
  const quads: Quad[] = [];
  const g = inGraph(namer.graph('provenance'), quads);
  const a = term('rdf', 'type');
  for (const r of retired) {
    const C = nn(namer.iri('cluster', { cluster: r.id }));
    g(C, a, term('cx', 'Cluster'));
    g(C, term('owl', 'deprecated'), bool(true));
    for (const s of r.replacedBy) g(C, term('dcterms', 'isReplacedBy'), nn(namer.iri('cluster', { cluster: s })));
    const inv = invalidations.get(r.id);
    if (inv) {
      g(C, term('prov', 'wasInvalidatedBy'), nn(inv.activity));
      if (inv.time) g(C, term('prov', 'invalidatedAtTime'), typed(inv.time, 'dateTime'));
    }
  }
  return { kind: 'cluster', id: 'retired', quads, partners: 'all' };
}
