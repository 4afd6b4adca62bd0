// Changes against the previous release → RDF units: the release activity, earlier link states, revisions and
// invalidations.
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { term, nn, str, int, dec, typed, inGraph } from '../rdf/terms.js';
import { isPublished, type Namer, type Unit } from '../rdf/index.js';
import type { Model } from '../model.js';
import type { ReleaseView } from '../rdf/view.js';
import type { LinkEvidence } from './evidence.js';
import { matchesOf } from '../link/index.js';
import { P, earlierStateIri } from './names.js';
import type { LinkState, PreviousRelease, ReleaseSnapshot } from './types.js';

const a = term('rdf', 'type');
const KIND = { same: term('cx', 'Same'), part: term('cx', 'Part'), related: term('cx', 'Related') };
const STATUS = {
  confirmed: term('cx', 'Confirmed'),
  proposed: term('cx', 'Proposed'),
  rejected: term('cx', 'Rejected'),
};
const isClaim = (l: LinkState) => l.status !== 'rejected';

/** The release date as an xsd:dateTime (midnight UTC of dcterms:issued); undefined when the release is undated. */
export const releaseTime = (issued?: string) => (issued ? `${issued}T00:00:00Z` : undefined);

/**
 * Subjects reachable from `seeds` through the previous release's provenance quads, stopping at IRIs the new release
 * describes.
 */
function closure(seeds: Iterable<string>, provenance: Map<string, Quad[]>, describedNow: Set<string>): string[] {
  const seen = new Set<string>();
  const stack = [...seeds];
  while (stack.length) {
    const s = stack.pop()!;
    if (seen.has(s) || describedNow.has(s) || !provenance.has(s)) continue;
    seen.add(s);
    for (const q of provenance.get(s)!) if (q.object.termType === 'NamedNode') stack.push(q.object.value);
  }
  return [...seen].sort();
}

/** Links of the previous release that are gone now or whose status or kind changed, with their current state. */
export function changedLinks(prev: ReleaseSnapshot, current: ReleaseSnapshot): [LinkState, LinkState | undefined][] {
  const changed: [LinkState, LinkState | undefined][] = [];
  for (const [iri, old] of prev.links) {
    const now = current.links.get(iri);
    if (!now || now.status !== old.status || now.kind !== old.kind) changed.push([old, now]);
  }
  return changed;
}

/**
 * IRIs of the image matches the current release describes behind the links in `iris` (same naming as the RDF stage).
 */
export function currentMatchIris(view: ReleaseView, namer: Namer, iris: Set<string>): Set<string> {
  const out = new Set<string>();
  for (const l of view.links.links) {
    if (!isPublished(l) || !iris.has(namer.linkIri(l))) continue;
    for (const r of matchesOf(view.links, l)) out.add(namer.matchIri(r));
  }
  return out;
}

/**
 * Units for what changed since `previous` (PROV-O §3.2 expanded terms; standards digest §2 and §3):
 * - the release activity `{base}release/{version}` (prov:Activity, cx:Release), dated by the project's release date;
 * - for each link whose status or kind changed, or that is gone: its earlier state `{link}/v/{previous version}`
 * (a cx:LinkState, not a cx:Link, with the old status, relation, kind, score, confidence, image matches and provenance,
 * `dcterms:isVersionOf` the
 *   link; matches this release no longer holds are copied from the previous one);
 *   the link `prov:wasRevisionOf` that state when it is still published;
 * - a claim that is gone or now rejected: `prov:wasInvalidatedBy` the release activity, `prov:invalidatedAtTime` its
 * date;
 * - the previous release's descriptions of runs, reviews and agents the earlier states name and this release does not.
 * What is said about a link still published goes into `attached` (by link IRI), to be written with the link itself.
 */
export function historyUnits(
  model: Model,
  namer: Namer,
  previous: PreviousRelease,
  current: ReleaseSnapshot,
  changed: [LinkState, LinkState | undefined][],
  evidence: LinkEvidence,
  matchesNow: Set<string>,
): { units: Unit[]; attached: Map<string, Quad[]> } {
  const prev = previous.snapshot;
  const version = model.project.release.version;
  const R = nn(namer.iri('release', { version }));
  const time = releaseTime(model.project.release.issued);
  const G = namer.graph('provenance');
  const shared: Quad[] = [];
  const g = inGraph(G, shared);
  g(R, a, term('prov', 'Activity'));
  g(R, a, term('cx', 'Release'));
  g(R, term('rdfs', 'label'), str(`release ${version}`));
  g(R, term('prov', 'wasAssociatedWith'), nn(namer.iri('publisher')));
  g(R, term('dcat', 'version'), str(version));
  if (time) g(R, term('prov', 'endedAtTime'), typed(time, 'dateTime'));
  g(R, term('prov', 'used'), nn(prev.dataset));
  g(R, term('prov', 'generated'), nn(current.dataset));

  const describedNow = new Set<string>();
  for (const l of current.links.values()) for (const x of [...l.generatedBy, ...l.attributedTo]) describedNow.add(x);
  model.runs.forEach((_, r) => {
    describedNow.add(namer.runIri(r));
    describedNow.add(namer.agentIri(r));
  });

  const partnerNo = new Map(model.project.partners.map((p, i) => [p.key, i]));
  const matchRuns = (m: string) =>
    (evidence.quads.get(m) ?? []).filter((q) => q.predicate.value === P.generatedBy).map((q) => q.object.value);
  const seeds = changed.flatMap(([old]) => [
    ...old.generatedBy,
    ...old.attributedTo,
    ...(evidence.matches.get(old.iri) ?? []).flatMap(matchRuns),
  ]);
  const copied = closure(seeds, previous.provenance, describedNow);
  for (const s of copied)
    for (const q of previous.provenance.get(s)!) {
      const copy = N3.DataFactory.quad(q.subject, q.predicate, q.object, G) as Quad;
      shared.push(copy);
    }
  const units: Unit[] = [{ kind: 'provenance', id: 'history', quads: shared, partners: 'all' }];
  const attached = new Map<string, Quad[]>();

  for (const [old, now] of changed) {
    const quads: Quad[] = [];
    const p = inGraph(G, quads);
    const L = nn(old.iri);
    const E = nn(earlierStateIri(old.iri, prev.version));
    p(E, a, term('cx', 'LinkState'));
    p(E, a, term('prov', 'Entity'));
    p(E, term('cx', 'subjectWork'), nn(old.subject));
    p(E, term('cx', 'objectWork'), nn(old.object));
    if (old.relation) p(E, term('cx', 'relation'), nn(old.relation));
    p(E, term('cx', 'kind'), KIND[old.kind]);
    p(E, term('cx', 'status'), STATUS[old.status]);
    p(E, term('cx', 'support'), int(old.support));
    if (old.score !== undefined) p(E, term('cx', 'score'), dec(old.score));
    if (old.confidence !== undefined) p(E, term('cx', 'confidence'), dec(old.confidence));
    const matchQuads: Quad[] = [];
    for (const m of evidence.matches.get(old.iri) ?? []) {
      p(E, term('prov', 'wasDerivedFrom'), nn(m));
      if (matchesNow.has(m)) continue;
      for (const q of evidence.quads.get(m) ?? [])
        matchQuads.push(N3.DataFactory.quad(q.subject, q.predicate, q.object, namer.graph('evidence')) as Quad);
    }
    for (const x of old.generatedBy) p(E, term('prov', 'wasGeneratedBy'), nn(x));
    for (const x of old.attributedTo) p(E, term('prov', 'wasAttributedTo'), nn(x));
    p(E, term('dcterms', 'isVersionOf'), L);
    // about the link itself: with its description when it is still published (one unit per subject), else here
    const about: Quad[] = [];
    const l = now ? inGraph(G, about) : p;
    if (now) l(L, term('prov', 'wasRevisionOf'), E);
    else l(L, a, term('prov', 'Entity'));
    if (isClaim(old) && (!now || !isClaim(now))) {
      l(L, term('prov', 'wasInvalidatedBy'), R);
      if (time) l(L, term('prov', 'invalidatedAtTime'), typed(time, 'dateTime'));
    }
    if (about.length) attached.set(L.value, about);
    const partners = new Set<number>();
    for (const w of [old.subject, old.object]) {
      const n = partnerNo.get(prev.works.get(w)?.partner ?? '');
      if (n !== undefined) partners.add(n);
    }
    units.push({ kind: 'link', id: old.iri, quads: quads.concat(matchQuads), partners });
  }
  return { units, attached };
}
