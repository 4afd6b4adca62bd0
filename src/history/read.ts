// A release folder (concordance.nq, dataset.ttl, clusters.csv) → its snapshot, provenance and tombstone invalidations.
import { verifyRelease } from '../store/complete.js';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import { streamRdfFile } from '../rdf/read.js';
import { readClusterRegistry } from '../cluster/index.js';
import { UserError } from '../errors.js';
import { P, KIND_OF, STATUS_OF, refOfWorkIri } from './names.js';
import type { ActivityInfo, LinkState, PreviousRelease, ReleaseSnapshot, WorkName } from './types.js';
import { RELEASE_FILES } from '../rdf/formats.js';

const need = (folder: string, file: string, field: string): string => {
  const f = path.join(folder, file);
  if (!existsSync(f))
    throw new UserError({
      file: f,
      line: 0,
      field,
      message: `the release folder has no ${file}`,
      hint: 'name the folder of a release built by concordat',
    });
  return f;
};

/** The dataset IRI, dcat:version and dcterms:issued of a release's dataset description (DCAT 3 §6.6, §11). */
export function datasetIdentity(
  quads: Iterable<Quad>,
  file: string,
): { dataset: string; version: string; issued?: string } {
  const datasets = new Set<string>();
  const version = new Map<string, string>();
  const issued = new Map<string, string>();
  for (const q of quads) {
    if (q.predicate.value === P.type && q.object.value === P.Dataset) datasets.add(q.subject.value);
    else if (q.predicate.value === P.version) version.set(q.subject.value, q.object.value);
    else if (q.predicate.value === P.issued) issued.set(q.subject.value, q.object.value);
  }
  const dataset = [...datasets].filter((d) => version.has(d)).sort()[0];
  if (!dataset)
    throw new UserError({
      file,
      line: 0,
      field: 'dcat:version',
      message: 'no dcat:Dataset with a dcat:version',
      hint: "the release's dataset description names its version",
    });
  return { dataset, version: version.get(dataset)!, issued: issued.get(dataset) };
}

/** What the provenance graph says about the reviews and runs that links name as prov:wasGeneratedBy (PROV-O §3.1). */
export function activitiesOf(links: Iterable<LinkState>, provenance: Map<string, Quad[]>): Map<string, ActivityInfo> {
  const get = (s: string, p: string) => provenance.get(s)?.find((q) => q.predicate.value === p)?.object.value;
  const is = (s: string, type: string) =>
    !!provenance.get(s)?.some((q) => q.predicate.value === P.type && q.object.value === type);
  const out = new Map<string, ActivityInfo>();
  for (const l of links)
    for (const g of l.generatedBy) {
      if (out.has(g)) continue;
      if (is(g, P.CuratorReview)) {
        const curator = get(g, P.associatedWith) ?? '';
        const name = get(curator, P.label),
          date = get(g, P.endedAt) ?? get(g, P.date),
          verdict = get(g, P.verdict);
        out.set(g, {
          kind: 'review',
          curator,
          ...(name ? { curatorName: name } : {}),
          ...(date ? { date } : {}),
          ...(verdict ? { verdict } : {}),
        });
      } else if (is(g, P.MatchRun)) {
        const agent = get(g, P.associatedWith);
        const software = agent && get(agent, P.label),
          version = agent && get(agent, P.versionInfo);
        out.set(g, {
          kind: 'run',
          id: decodeURIComponent(g.replace(/^.*\//, '')),
          ...(software ? { software } : {}),
          ...(version ? { version } : {}),
        });
      }
    }
  return out;
}

/**
 * Reads the release in `folder` (design, "Outputs"): links (cx:Link with subject, object, relation, kind, status,
 * score, support, generating activity, agents) from concordance.nq, leaving out earlier states (dcterms:isVersionOf);
 * the cluster registry from clusters.csv; the dataset IRI, version and date from dataset.ttl.
 */
export async function readRelease(folder: string): Promise<PreviousRelease> {
  const nq = need(folder, RELEASE_FILES.nquads, 'previous');
  const ds = need(folder, RELEASE_FILES.dataset, 'previous');
  const csv = need(folder, RELEASE_FILES.clusters, 'previous');
  // the files read are checked against SHA256SUMS: a cut or changed release is refused, never read as a smaller one
  await verifyRelease(folder, [RELEASE_FILES.nquads, RELEASE_FILES.dataset, RELEASE_FILES.clusters], {
    hashNeededOnly: true,
  });
  const dsQuads: Quad[] = [];
  await streamRdfFile(ds, (q) => dsQuads.push(q));
  const identity = datasetIdentity(dsQuads, ds);

  const links = new Map<string, Partial<LinkState> & { generatedBy: string[]; attributedTo: string[] }>();
  const skip = new Set<string>();
  const versions = new Set<string>();
  const workPartner = new Map<string, string>(),
    workDataset = new Map<string, string>(),
    uriSpace = new Map<string, string>();
  const clusters = new Set<string>();
  const inval = new Map<string, { activity?: string; time?: string }>();
  const provenance = new Map<string, Quad[]>();
  await streamRdfFile(nq, (q) => {
    const s = q.subject.value,
      p = q.predicate.value,
      o = q.object.value;
    if (p === P.type && o === P.Link) {
      skip.add(s);
      links.set(s, { iri: s, generatedBy: [], attributedTo: [] });
      return;
    }
    if (p === P.type && (o === P.Cluster || o === P.ImpliedPair || o === P.DateConflict)) {
      skip.add(s);
      if (o === P.Cluster) clusters.add(s);
      return;
    }
    const l = links.get(s);
    if (l) {
      if (p === P.subjectWork) l.subject = o;
      else if (p === P.objectWork) l.object = o;
      else if (p === P.relation) l.relation = o;
      else if (p === P.kind) l.kind = KIND_OF[o];
      else if (p === P.status) l.status = STATUS_OF[o];
      else if (p === P.score) l.score = Number(o);
      else if (p === P.confidence) l.confidence = Number(o);
      else if (p === P.support) l.support = Number(o);
      else if (p === P.generatedBy) l.generatedBy.push(o);
      else if (p === P.attributedTo) l.attributedTo.push(o);
      else if (p === P.isVersionOf) versions.add(s);
      return;
    }
    if (clusters.has(s) && (p === P.invalidatedBy || p === P.invalidatedAt)) {
      const x = inval.get(s) ?? {};
      if (p === P.invalidatedBy) x.activity = o;
      else x.time = o;
      inval.set(s, x);
      return;
    }
    if (p === P.partner) workPartner.set(s, o);
    else if (p === P.inDataset) workDataset.set(s, o);
    else if (p === P.uriSpace) uriSpace.set(s, o);
    else if (!skip.has(s) && q.subject.termType === 'NamedNode' && q.graph.value.endsWith('graph/provenance')) {
      const list = provenance.get(s);
      if (list) list.push(q);
      else provenance.set(s, [q]);
    }
  });
  for (const v of versions) links.delete(v);

  const works = new Map<string, WorkName>();
  const name = (w: string) => {
    if (works.has(w)) return;
    const partner = workPartner.get(w) ?? '';
    works.set(w, { partner, ref: refOfWorkIri(w, partner, uriSpace.get(workDataset.get(w) ?? '')) });
  };
  const done = new Map<string, LinkState>();
  for (const [iri, l] of [...links].sort((x, y) => (x[0] < y[0] ? -1 : 1))) {
    if (!l.subject || !l.object || !l.kind || !l.status)
      throw new UserError({
        file: nq,
        line: 0,
        field: iri,
        message: 'a cx:Link without subject, object, kind or status',
        hint: 'the release is damaged; rebuild it',
      });
    name(l.subject);
    name(l.object);
    done.set(iri, {
      iri,
      subject: l.subject,
      object: l.object,
      kind: l.kind,
      status: l.status,
      relation: l.relation,
      score: l.score,
      ...(l.confidence !== undefined ? { confidence: l.confidence } : {}),
      support: l.support ?? 0,
      generatedBy: l.generatedBy.sort(),
      attributedTo: l.attributedTo.sort(),
    });
  }
  const snapshot: ReleaseSnapshot = {
    ...identity,
    links: done,
    works,
    activities: activitiesOf(done.values(), provenance),
    clusters: await readClusterRegistry(csv),
  };
  const clusterInvalidations = new Map<string, { activity: string; time?: string }>();
  for (const [c, x] of inval) if (x.activity) clusterInvalidations.set(c, { activity: x.activity, time: x.time });
  return { folder: path.resolve(folder), snapshot, provenance, clusterInvalidations };
}
