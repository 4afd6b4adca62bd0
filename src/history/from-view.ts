// A release being built (its view and namer) → the same snapshot a reader would get from its files.
import { claimEnds, isPublished, type Namer } from '../rdf/index.js';
import { dec } from '../rdf/terms.js';
import type { ReleaseView } from '../rdf/view.js';
import { registryOf } from '../cluster/index.js';
import type { Clustering } from '../cluster/types.js';
import { refOfWorkIri } from './names.js';
import type { ActivityInfo, LinkState, ReleaseSnapshot, WorkName } from './types.js';

const round = (x: number) => Number(dec(x).value);

/**
 * The snapshot of the release `view` describes, built from the same data the RDF stage writes (so that comparing it
 * with a release read from disk gives what `concordat diff` would give once the release is written).
 */
export function snapshotOfView(view: ReleaseView, clustering: Clustering, namer: Namer): ReleaseSnapshot {
  const { model } = view;
  const partners = model.project.partners;
  const spaces = partners.map((p) => p.workIri.slice(0, p.workIri.indexOf('{')));
  const works = new Map<string, WorkName>();
  const name = (w: number): string => {
    const iri = namer.workIri(w);
    const p = model.works[w].partner;
    if (!works.has(iri))
      works.set(iri, { partner: partners[p].key, ref: refOfWorkIri(iri, partners[p].key, spaces[p]) });
    return iri;
  };
  const links = new Map<string, LinkState>();
  for (const l of view.links.links) {
    if (!isPublished(l)) continue;
    const [s, o] = claimEnds(l);
    const iri = namer.linkIri(l);
    const relation = view.vocab.predicate(l.kind, l.status) ?? undefined;
    const decided = l.decision !== undefined;
    const generatedBy = decided ? [namer.reviewIri(l.decision!)] : l.runs.map(namer.runIri);
    const attributedTo = decided
      ? [namer.curatorIri(model.decisions[l.decision!].curator)]
      : [...new Set(l.runs.map(namer.agentIri))];
    links.set(iri, {
      iri,
      subject: name(s),
      object: name(o),
      kind: l.kind,
      status: l.status as LinkState['status'],
      relation,
      score: l.reliableSupport > 0 ? round(l.best) : undefined,
      support: l.support,
      generatedBy: generatedBy.sort(),
      attributedTo: attributedTo.sort(),
    });
  }
  const sorted = new Map([...links].sort((x, y) => (x[0] < y[0] ? -1 : 1)));
  const activities = new Map<string, ActivityInfo>();
  model.runs.forEach((r, i) =>
    activities.set(namer.runIri(i), { kind: 'run', id: r.id, software: r.software, version: r.version }),
  );
  for (const l of view.links.links) {
    if (!isPublished(l) || l.decision === undefined) continue;
    const d = model.decisions[l.decision];
    const curator = namer.curatorIri(d.curator);
    activities.set(namer.reviewIri(l.decision), {
      kind: 'review',
      curator,
      ...(curator !== d.curator ? { curatorName: d.curator } : {}),
      date: d.date,
      verdict: d.verdict,
    });
  }
  const project = model.project;
  return {
    version: project.release.version,
    issued: project.release.issued,
    dataset: namer.iri('dataset', { version: project.release.version }),
    links: sorted,
    works,
    activities,
    clusters: registryOf(model, clustering),
  };
}
