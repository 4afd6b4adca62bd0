// History stage: the previous release + the release being built → changes, their RDF units, changes.md and changes.ttl.
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Unit } from '../rdf/index.js';
import type { ReleaseView } from '../rdf/view.js';
import type { Clustering } from '../cluster/types.js';
import { retiredUnit, type Invalidation } from '../rdf/retired.js';
import { writeQuads } from '../rdf/serialize.js';
import { snapshotOfView } from './from-view.js';
import { compareSnapshots } from './compare.js';
import { changesMarkdown } from './markdown.js';
import { changedLinks, currentMatchIris, historyUnits, releaseTime } from './units.js';
import { readLinkEvidence } from './evidence.js';
import type { ActivityInfo, Changes, PreviousRelease, ReleaseSnapshot } from './types.js';
import type { Quad } from '@rdfjs/types';
import { inGraph, nn, str, term, when } from '../rdf/terms.js';
import { UserError } from '../errors.js';

export { readRelease } from './read.js';
export { compareSnapshots, isEmpty } from './compare.js';
export { changesMarkdown } from './markdown.js';
export type { Changes, PreviousRelease, ReleaseSnapshot } from './types.js';

export interface ReleaseHistory {
  /** Units to publish after the clusters: release activity, earlier link states, tombstones. */
  units: Unit[];
  /** Quads about links still published (by link IRI), written in each link's own unit (releaseUnits `attached`). */
  attached: Map<string, Quad[]>;
  /** Changes against the previous release; undefined for a first release. */
  changes?: Changes;
  /** Who made each added or changed claim, as statements the release also holds (for changes.ttl). */
  madeBy?: Quad[];
}

/**
 * What a build adds about time (design, pipeline steps 3 and 7; standards digest §9): tombstones for every retired
 * cluster ID (those retired now invalidated by this release, older ones keeping their recorded invalidation), and,
 * with a previous release, the changes against it and their provenance units.
 */
export async function releaseHistory(
  view: ReleaseView,
  clustering: Clustering,
  previous?: PreviousRelease,
): Promise<ReleaseHistory> {
  const { namer } = view;
  const units: Unit[] = [];
  let attached = new Map<string, Quad[]>();
  let changes: Changes | undefined;
  let madeBy: Quad[] | undefined;
  const invalidations = new Map<string, Invalidation>();
  if (previous) {
    const version = view.model.project.release.version;
    if (previous.snapshot.version === version)
      throw new UserError({
        file: view.model.projectFile,
        line: 0,
        field: 'release.version',
        message: `"${version}" is also the version of the previous release in ${previous.folder}`,
        hint: 'give every release its own version: release and earlier-state IRIs are named by it',
      });
    const current = snapshotOfView(view, clustering, namer);
    changes = compareSnapshots(previous.snapshot, current);
    madeBy = madeByQuads(changes, current, namer.graph('provenance'));
    const changed = changedLinks(previous.snapshot, current);
    const evidence = await readLinkEvidence(previous.folder, new Set(changed.map(([old]) => old.iri)));
    const matchesNow = currentMatchIris(view, namer, new Set(changed.filter(([, now]) => now).map(([old]) => old.iri)));
    const made = historyUnits(view.model, namer, previous, current, changed, evidence, matchesNow);
    for (const u of made.units) units.push(u); // no spread: one unit per changed link can exceed the stack
    attached = made.attached;
    for (const r of view.retired) {
      const carried = previous.clusterInvalidations.get(namer.iri('cluster', { cluster: r.id }));
      if (carried) invalidations.set(r.id, carried);
    }
    const activity = namer.iri('release', { version: view.model.project.release.version });
    const time = releaseTime(view.model.project.release.issued);
    for (const r of changes.clusters.retired) invalidations.set(r.id, { activity, ...(time ? { time } : {}) });
  }
  if (view.retired.length) units.push(retiredUnit(view.retired, namer, invalidations));
  return { units, attached, changes, madeBy };
}

/**
 * For every claim added or changed: the link's prov:wasGeneratedBy and prov:wasAttributedTo (PROV-O §3.1), and for a
 * curator's review who made it (prov:wasAssociatedWith, the person's rdfs:label), when and with which verdict.
 */
function madeByQuads(changes: Changes, current: ReleaseSnapshot, graph: Quad['graph']): Quad[] {
  const out: Quad[] = [];
  const g = inGraph(graph, out);
  const links = [
    ...new Set([...changes.claims.added, ...changes.claims.status, ...changes.claims.kind].map((c) => c.link)),
  ].sort();
  const reviews = new Set<string>();
  const names = new Map<string, string>();
  for (const iri of links) {
    const l = current.links.get(iri)!;
    for (const x of l.generatedBy) {
      g(nn(iri), term('prov', 'wasGeneratedBy'), nn(x));
      if (current.activities.get(x)?.kind === 'review') reviews.add(x);
    }
    for (const x of l.attributedTo) g(nn(iri), term('prov', 'wasAttributedTo'), nn(x));
  }
  for (const r of [...reviews].sort()) {
    const info = current.activities.get(r) as Extract<ActivityInfo, { kind: 'review' }>;
    g(nn(r), term('prov', 'wasAssociatedWith'), nn(info.curator));
    if (info.date)
      g(nn(r), info.date.includes('T') ? term('prov', 'endedAtTime') : term('dcterms', 'date'), when(info.date));
    if (info.verdict) g(nn(r), term('cx', 'verdict'), str(info.verdict));
    if (info.curatorName) names.set(info.curator, info.curatorName);
  }
  for (const [person, name] of [...names].sort()) g(nn(person), term('rdfs', 'label'), str(name));
  return out;
}

/**
 * Writes changes.md and changes.ttl (the history units' quads, those attached to links still published, and who made
 * each change, as Turtle) into the release folder.
 */
export async function writeChanges(dir: string, history: ReleaseHistory): Promise<void> {
  if (!history.changes) return;
  await writeFile(path.join(dir, 'changes.md'), changesMarkdown(history.changes));
  await writeQuads(path.join(dir, 'changes.ttl'), 'turtle', [
    ...history.units.flatMap((u) => u.quads),
    ...[...history.attached.values()].flat(),
    ...(history.madeBy ?? []),
  ]);
}
