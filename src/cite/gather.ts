// Quads of a release → the cited claims: each link with its works, image matches, runs, curator review, and the
// release.
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { iri } from '../namespaces.js';
import { KIND_OF, STATUS_OF, refOfWorkIri } from '../history/names.js';
import type { CitedClaim, CitedConflict, CitedMatch, CitedRelease, CitedReview, CitedRun, CitedWork } from './types.js';

const { namedNode } = N3.DataFactory;
const T = (p: Parameters<typeof iri>[0], l: string) => namedNode(iri(p, l));
const A = T('rdf', 'type');

/**
 * Reads values of one subject from an N3 store; collects every quad it reads into `used` (the citation's statements).
 */
export class Reader {
  readonly used = new N3.Store();
  constructor(readonly store: N3.Store) {}
  all(s: string, p: N3.NamedNode): string[] {
    const qs = this.store.getQuads(namedNode(s), p, null, null);
    this.used.addQuads(qs);
    return [...new Set(qs.map((q) => q.object.value))].sort();
  }
  one = (s: string, p: N3.NamedNode): string | undefined => this.all(s, p)[0];
  /** Every statement about `s` (for the JSON-LD subgraph). */
  describe(s: string): void {
    this.used.addQuads(this.store.getQuads(namedNode(s), null, null, null));
  }
  is = (s: string, type: N3.NamedNode) => this.store.countQuads(namedNode(s), A, type, null) > 0;
  quads = (): Quad[] => this.used.getQuads(null, null, null, null);
}

/**
 * Partner works: key, `partnerKey:workId` (decoded after the partner dataset's void:uriSpace), name, title, date, page.
 */
export function citedWork(r: Reader, w: string): CitedWork {
  r.describe(w);
  const partner = r.one(w, T('cx', 'partner')) ?? '';
  const ds = r.one(w, T('void', 'inDataset'));
  const space = ds ? r.one(ds, T('void', 'uriSpace')) : undefined;
  const partnerName = ds ? r.one(ds, T('dcterms', 'title')) : undefined;
  return {
    iri: w,
    ref: refOfWorkIri(w, partner, space),
    partner,
    partnerName,
    title: r.one(w, T('dcterms', 'title')),
    date: r.one(w, T('cx', 'dateAsCatalogued')),
    page: r.one(w, T('foaf', 'page')),
  };
}

function citedRun(r: Reader, run: string): CitedRun {
  r.describe(run);
  const agent = r.one(run, T('prov', 'wasAssociatedWith'));
  if (agent) r.describe(agent);
  const parameters: CitedRun['parameters'] = [];
  for (const assoc of r.all(run, T('prov', 'qualifiedAssociation'))) {
    r.describe(assoc);
    for (const plan of r.all(assoc, T('prov', 'hadPlan'))) {
      r.describe(plan);
      for (const p of r.all(plan, T('cx', 'parameter'))) {
        r.describe(p);
        parameters.push({
          name: r.one(p, T('cx', 'parameterName')) ?? p,
          value: r.one(p, T('cx', 'parameterValue')) ?? '',
        });
      }
    }
  }
  parameters.sort((x, y) => (x.name < y.name ? -1 : x.name > y.name ? 1 : 0));
  return {
    iri: run,
    id: decodeURIComponent(run.replace(/^.*\//, '')),
    software: agent ? r.one(agent, T('rdfs', 'label')) : undefined,
    version: agent ? r.one(agent, T('owl', 'versionInfo')) : undefined,
    started: r.one(run, T('prov', 'startedAtTime')),
    parameters,
  };
}

function citedReview(r: Reader, review: string): CitedReview {
  r.describe(review);
  const curator = r.one(review, T('prov', 'wasAssociatedWith')) ?? '';
  if (curator) r.describe(curator);
  return {
    iri: review,
    curator,
    curatorName: curator ? r.one(curator, T('rdfs', 'label')) : undefined,
    date: r.one(review, T('prov', 'endedAtTime')) ?? r.one(review, T('dcterms', 'date')),
    verdict: r.one(review, T('cx', 'verdict')),
    note: r.one(review, T('cx', 'note')),
  };
}

/** One cx:Link and its evidence chain (PROV-O §3.1: wasDerivedFrom, wasGeneratedBy, wasAttributedTo). */
export function citedClaim(r: Reader, link: string): CitedClaim {
  r.describe(link);
  const matches: CitedMatch[] = r.all(link, T('prov', 'wasDerivedFrom')).map((m) => {
    r.describe(m);
    return {
      iri: m,
      source: r.one(m, T('cx', 'sourceImage')) ?? '',
      target: r.one(m, T('cx', 'targetImage')) ?? '',
      score: Number(r.one(m, T('cx', 'score'))),
      overlap: Number(r.one(m, T('cx', 'overlap'))),
      run: r.one(m, T('prov', 'wasGeneratedBy')),
    };
  });
  const generators = r.all(link, T('prov', 'wasGeneratedBy'));
  const reviewIri = generators.find((g) => r.is(g, T('cx', 'CuratorReview')));
  const runIris = [
    ...new Set([
      ...generators.filter((g) => r.is(g, T('cx', 'MatchRun'))),
      ...matches.map((m) => m.run).filter((x): x is string => !!x),
    ]),
  ].sort();
  const score = r.one(link, T('cx', 'score'));
  const confidence = r.one(link, T('cx', 'confidence'));
  return {
    link,
    subject: citedWork(r, r.one(link, T('cx', 'subjectWork'))!),
    object: citedWork(r, r.one(link, T('cx', 'objectWork'))!),
    relation: r.one(link, T('cx', 'relation')),
    kind: KIND_OF[r.one(link, T('cx', 'kind')) ?? ''],
    status: STATUS_OF[r.one(link, T('cx', 'status')) ?? ''],
    score: score === undefined ? undefined : Number(score),
    confidence: confidence === undefined ? undefined : Number(confidence),
    support: Number(r.one(link, T('cx', 'support')) ?? 0),
    matches,
    runs: runIris.map((x) => citedRun(r, x)),
    review: reviewIri ? citedReview(r, reviewIri) : undefined,
  };
}

/**
 * The date conflicts of a cluster (cx:hasDateConflict → cx:DateConflict with cx:workA, cx:workB, cx:severity), by IRI.
 */
export function citedConflicts(r: Reader, cluster: string): CitedConflict[] {
  return r.all(cluster, T('cx', 'hasDateConflict')).map((x) => {
    r.describe(x);
    const [a, b] = [r.one(x, T('cx', 'workA')), r.one(x, T('cx', 'workB'))];
    return { iri: x, severity: r.one(x, T('cx', 'severity')), a: citedWork(r, a ?? ''), b: citedWork(r, b ?? '') };
  });
}

/**
 * The release the quads come from: the dcat:Dataset with a dcat:version that no other dataset names as its
 * dcat:previousVersion (DCAT 3 §11; a store holding several releases cites the newest), with title, date, licence,
 * publisher.
 */
export function citedRelease(r: Reader): CitedRelease | undefined {
  const versioned = r.store
    .getSubjects(T('dcat', 'version'), null, null)
    .map((s) => s.value)
    .filter((d) => r.is(d, T('dcat', 'Dataset')));
  const older = new Set(r.store.getObjects(null, T('dcat', 'previousVersion'), null).map((o) => o.value));
  const dataset = versioned.filter((d) => !older.has(d)).sort()[0] ?? versioned.sort()[0];
  if (!dataset) return undefined;
  const publisher = r.one(dataset, T('dcterms', 'publisher'));
  for (const p of [
    T('rdf', 'type'),
    T('dcterms', 'title'),
    T('dcat', 'version'),
    T('dcterms', 'issued'),
    T('dcterms', 'license'),
    T('dcterms', 'publisher'),
    T('dcat', 'previousVersion'),
  ])
    r.all(dataset, p);
  if (publisher) {
    r.all(publisher, T('foaf', 'name'));
    r.all(publisher, A);
  }
  return {
    dataset,
    title: r.one(dataset, T('dcterms', 'title')),
    version: r.one(dataset, T('dcat', 'version'))!,
    issued: r.one(dataset, T('dcterms', 'issued')),
    license: r.one(dataset, T('dcterms', 'license')),
    publisher: publisher ? r.one(publisher, T('foaf', 'name')) : undefined,
  };
}
