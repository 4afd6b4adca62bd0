// History stage: the previous release + the release being built → changes, their RDF units, changes.md and changes.ttl.
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
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
import type { Changes, PreviousRelease } from './types.js';
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
}

/**
 * What a build adds about time (design, pipeline steps 3 and 7; standards digest §9): tombstones for every retired
 * cluster ID (those retired now invalidated by this release, older ones keeping their recorded invalidation), and,
 * with a previous release, the changes against it and their provenance units.
 */
export async function releaseHistory(view: ReleaseView, clustering: Clustering, previous?: PreviousRelease): Promise<ReleaseHistory> {
  const { namer } = view;
  const units: Unit[] = [];
  let attached = new Map<string, Quad[]>();
  let changes: Changes | undefined;
  const invalidations = new Map<string, Invalidation>();
  if (previous) {
    const version = view.model.project.release.version;
    if (previous.snapshot.version === version)
      throw new UserError({ file: view.model.projectFile, line: 0, field: 'release.version', message: `"${version}" is also the version of the previous release in ${previous.folder}`, hint: 'give every release its own version: release and earlier-state IRIs are named by it' });
    const current = snapshotOfView(view, clustering, namer);
    changes = compareSnapshots(previous.snapshot, current);
    const changed = changedLinks(previous.snapshot, current);
    const evidence = await readLinkEvidence(previous.folder, new Set(changed.map(([old]) => old.iri)));
    const matchesNow = currentMatchIris(view, namer, new Set(changed.filter(([, now]) => now).map(([old]) => old.iri)));
    const made = historyUnits(view.model, namer, previous, current, changed, evidence, matchesNow);
    units.push(...made.units);
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
  return { units, attached, changes };
}

/** Writes changes.md and changes.ttl (the history units' quads and those attached to links, as Turtle) into the release folder. */
export async function writeChanges(dir: string, history: ReleaseHistory): Promise<void> {
  if (!history.changes) return;
  await writeFile(path.join(dir, 'changes.md'), changesMarkdown(history.changes));
  await writeQuads(path.join(dir, 'changes.ttl'), 'turtle', [...history.units.flatMap((u) => u.quads), ...[...history.attached.values()].flat()]);
}
