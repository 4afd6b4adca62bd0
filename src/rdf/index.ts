// RDF stage: the release view → units of quads (provenance, one per cluster, one per stray link), streamed in a fixed
// order.
import { looksLikeIri } from '../io/iri.js';
import type { Quad, NamedNode } from '@rdfjs/types';
import type { Model } from '../model.js';
import { workRef } from '../model.js';
import type { Link } from '../link/types.js';
import { matchesOf } from '../link/index.js';
import { compileTemplate, encodeUnreserved } from '../io/template.js';
import { term, nn, str, typed, int, bool, dec, when, hash, fill, inGraph, numberLiteral } from './terms.js';
import type { ReleaseView } from './view.js';

export type GraphName = 'claims' | 'evidence' | 'provenance' | 'dataset';
export const GRAPHS: GraphName[] = ['claims', 'evidence', 'provenance', 'dataset'];

/** A self-contained slice of the release: validated together, written together, filed under the partners it touches. */
export interface Unit {
  kind: 'provenance' | 'cluster' | 'link' | 'dataset';
  id: string;
  quads: Quad[];
  /** Partner numbers whose records the unit touches; 'all' for shared provenance and the dataset description. */
  partners: Set<number> | 'all';
}

/** Claim-triple counts per (subject partner, object partner, predicate), for the VoID linksets. */
export type LinksetCounts = Map<string, number>;

const a = term('rdf', 'type');
const T = {
  Link: term('cx', 'Link'),
  Entity: term('prov', 'Entity'),
  ImageMatch: term('cx', 'ImageMatch'),
  Activity: term('prov', 'Activity'),
  MatchRun: term('cx', 'MatchRun'),
  SoftwareAgent: term('prov', 'SoftwareAgent'),
  Plan: term('prov', 'Plan'),
  Association: term('prov', 'Association'),
  Review: term('cx', 'CuratorReview'),
  Person: term('prov', 'Person'),
  Cluster: term('cx', 'Cluster'),
  Implied: term('cx', 'ImpliedPair'),
  Conflict: term('cx', 'DateConflict'),
};
const STATUS = {
  confirmed: term('cx', 'Confirmed'),
  proposed: term('cx', 'Proposed'),
  rejected: term('cx', 'Rejected'),
  candidate: term('cx', 'Proposed'),
};
const KIND = { same: term('cx', 'Same'), part: term('cx', 'Part'), related: term('cx', 'Related') };
/** Vocabulary terms used per quad below, looked up once (by prefix: names are prefix + local name). */
const [
  cxBridge,
  cxConfidence,
  cxCoverageObject,
  cxCoverageSubject,
  cxDateAsCatalogued,
  cxKind,
  cxMeanScore,
  cxMember,
  cxMemberCount,
  cxNote,
  cxObjectWork,
  cxOverlap,
  cxOversized,
  cxParameter,
  cxParameterName,
  cxParameterValue,
  cxPartner,
  cxPartnerCount,
  cxRelation,
  cxScore,
  cxSeverity,
  cxSourceImage,
  cxStatus,
  cxSubjectWork,
  cxSupport,
  cxTargetImage,
  cxThroughThirdArchive,
  cxVerdict,
  cxWorkA,
  cxWorkB,
] = [
  'bridge',
  'confidence',
  'coverageObject',
  'coverageSubject',
  'dateAsCatalogued',
  'kind',
  'meanScore',
  'member',
  'memberCount',
  'note',
  'objectWork',
  'overlap',
  'oversized',
  'parameter',
  'parameterName',
  'parameterValue',
  'partner',
  'partnerCount',
  'relation',
  'score',
  'severity',
  'sourceImage',
  'status',
  'subjectWork',
  'support',
  'targetImage',
  'throughThirdArchive',
  'verdict',
  'workA',
  'workB',
].map((l) => term('cx', l));
const [dctermsDate, dctermsTitle] = ['date', 'title'].map((l) => term('dcterms', l));
const [foafPage] = ['page'].map((l) => term('foaf', l));
const [owlVersionInfo] = ['versionInfo'].map((l) => term('owl', l));
const [
  provAgent,
  provEndedAtTime,
  provHadPlan,
  provQualifiedAssociation,
  provStartedAtTime,
  provWasAssociatedWith,
  provWasAttributedTo,
  provWasDerivedFrom,
  provWasGeneratedBy,
] = [
  'agent',
  'endedAtTime',
  'hadPlan',
  'qualifiedAssociation',
  'startedAtTime',
  'wasAssociatedWith',
  'wasAttributedTo',
  'wasDerivedFrom',
  'wasGeneratedBy',
].map((l) => term('prov', l));
const [rdfsLabel] = ['label'].map((l) => term('rdfs', l));
const [voidInDataset] = ['inDataset'].map((l) => term('void', l));

/** IRIs of everything the release names, built once from the project and the vocab map patterns. */
export class Namer {
  private work: ((w: number) => string)[];
  private image: ((id: string, work: string) => string)[];
  private page: (((w: string) => string) | undefined)[];
  readonly base: string;
  constructor(
    private readonly model: Model,
    readonly patterns: Record<string, string>,
  ) {
    this.base = model.project.base;
    const ps = model.project.partners;
    this.work = ps.map((p) => {
      const f = compileTemplate(p.workIri, 'work');
      return (w: number) => f(model.works[w].id);
    });
    // Compiled once per partner: the pieces between {image} expressions, each with its {work} slots (the project
    // check rejects unbalanced braces, so no {work} spans an {image}).
    this.image = ps.map((p) => {
      const pieces = p.imageIri.split('{image}').map((piece) => compileTemplate(piece, 'work'));
      return (id: string, work: string) => {
        const enc = encodeUnreserved(id);
        let out = pieces[0](work);
        for (let i = 1; i < pieces.length; i++) out += enc + pieces[i](work);
        return out;
      };
    });
    this.page = ps.map((p) => (p.recordPage ? compileTemplate(p.recordPage, 'work') : undefined));
  }
  iri(pattern: string, vars: Record<string, string> = {}): string {
    return fill(this.patterns[pattern], vars, this.base);
  }
  workIri = (w: number) => this.work[this.model.works[w].partner](w);
  imageIri = (img: number) => {
    const w = this.model.images.work[img];
    return this.image[this.model.works[w].partner](this.model.images.id[img], this.model.works[w].id);
  };
  recordPage = (w: number) => this.page[this.model.works[w].partner]?.(this.model.works[w].id);
  private graphs = new Map<GraphName, NamedNode>();
  /** A graph's IRI term, made once and shared by every quad in that graph. */
  graph = (g: GraphName): NamedNode => {
    let node = this.graphs.get(g);
    if (!node) this.graphs.set(g, (node = nn(this.iri('graph', { graph: g }))));
    return node;
  };
  linkIri = (l: Link) => this.iri('link', { hash: hash(workRef(this.model, l.a), workRef(this.model, l.b)) });
  /** An image match's IRI, from its two image IRIs (pass them when already built) and its run. */
  matchIri = (r: number, ra = this.imageIri(this.model.matches.a[r]), rb = this.imageIri(this.model.matches.b[r])) =>
    this.iri('match', { hash: hash(ra, rb, this.model.runs[this.model.matches.run[r]].id) });
  runIri = (r: number) => this.iri('run', { run: this.model.runs[r].id });
  private runNodes: NamedNode[] = [];
  /** A run's IRI term, made once and shared (every match of the run points to it). */
  runNode = (r: number): NamedNode => (this.runNodes[r] ??= nn(this.runIri(r)));
  agentIri = (r: number) =>
    this.iri('software', { software: this.model.runs[r].software, version: this.model.runs[r].version });
  /**
   * A curator's IRI: their own (ORCID) when given, else one minted from the name (a hash when the name has no letters).
   */
  curatorIri = (c: string) => {
    if (looksLikeIri(c)) return c; // checked as an IRI when the decisions file was read
    const slug = c
      .toLowerCase()
      .normalize('NFKD')
      .replace(/\p{M}/gu, '')
      .replace(/[^\p{L}\p{N}]+/gu, '-')
      .replace(/^-|-$/g, '');
    return this.iri('curator', { name: slug || `n-${hash(c)}` });
  };
  partnerDataset = (p: number) => this.iri('partnerDataset', { partner: this.model.project.partners[p].key });
  reviewIri = (d: number) => {
    const x = this.model.decisions[d];
    return this.iri('review', {
      hash: hash(workRef(this.model, x.a), workRef(this.model, x.b), x.curator, x.date, x.verdict),
    });
  };
}

/** Subject and object of a link's claim: the detail is part of the larger work; otherwise the ordered pair. */
export function claimEnds(l: Link): [number, number] {
  if (l.kind === 'part' && l.part !== undefined) return l.part === l.a ? [l.a, l.b] : [l.b, l.a];
  return [l.a, l.b];
}

/** Links that appear in the release: every status except `candidate`. */
export const isPublished = (l: Link) => l.status !== 'candidate';

/**
 * Where each published link outside every cluster (a stray link) is written, so that every subject is described in one
 * unit only (one Turtle block per subject): with the cluster of its claim's subject work when that work is clustered,
 * else in one unit per claim subject (in order of that subject's first stray link).
 */
export interface StrayPlan {
  /** Per cluster index: stray links written with that cluster. */
  withCluster: number[][];
  /** Per unclustered claim subject: its stray links, in link order. */
  bySubject: Map<number, number[]>;
  /** Cluster index of each work, -1 when unclustered. */
  clusterOf: Int32Array;
  /**
   * Per unclustered claim subject: partners of the works whose stray links name it as their object (its unit goes to
   * their slices too, so they get its description).
   */
  referrers: Map<number, Set<number>>;
}

/** Plans where the stray links go (see {@link StrayPlan}). */
export function strayPlan(view: ReleaseView): StrayPlan {
  const { model, links } = view;
  const clusterOf = new Int32Array(model.works.length).fill(-1);
  const inCluster = new Uint8Array(links.links.length);
  view.clusters.forEach((c, i) => {
    for (const w of c.members) clusterOf[w] = i;
    for (const li of c.links) inCluster[li] = 1;
  });
  const withCluster: number[][] = view.clusters.map(() => []);
  const bySubject = new Map<number, number[]>();
  for (let li = 0; li < links.links.length; li++) {
    const l = links.links[li];
    if (inCluster[li] || !isPublished(l)) continue;
    const s = claimEnds(l)[0];
    if (clusterOf[s] >= 0) withCluster[clusterOf[s]].push(li);
    else {
      const list = bySubject.get(s);
      if (list) list.push(li);
      else bySubject.set(s, [li]);
    }
  }
  const referrers = new Map<number, Set<number>>();
  const refer = (li: number) => {
    const [s, o] = claimEnds(links.links[li]);
    if (!bySubject.has(o)) return;
    const set = referrers.get(o) ?? referrers.set(o, new Set()).get(o)!;
    set.add(model.works[s].partner);
  };
  for (const list of withCluster) list.forEach(refer);
  for (const list of bySubject.values()) list.forEach(refer);
  return { withCluster, bySubject, clusterOf, referrers };
}

/** Options of {@link releaseUnits}. */
export interface UnitOptions {
  /**
   * More quads about published links, by link IRI, written in the link's unit (e.g. `prov:wasRevisionOf` its earlier
   * state).
   */
  attached?: ReadonlyMap<string, Quad[]>;
  /** The stray plan, when the caller made it already. */
  plan?: StrayPlan;
}

/**
 * Generates the release's units in a fixed order: shared provenance, clusters by ID (with the stray links whose claim
 * subject they hold), then the other stray links, one unit per claim subject (see {@link strayPlan}). Every subject
 * is described in one unit only; `attached` gives more quads about a published link (by its IRI: e.g. its earlier
 * state), written in that link's unit.
 */
export function* releaseUnits(view: ReleaseView, counts: LinksetCounts, opts: UnitOptions = {}): Generator<Unit> {
  const { model, links, namer } = view;
  const { attached, plan = strayPlan(view) } = opts;
  const described = new Uint8Array(model.works.length);
  const matchDone = matchIrisCanRepeat(model, namer) ? new Set<string>() : null;
  /** Works that are described only in the unit of their own stray links (unclustered claim subjects). */
  const ownUnit = new Uint8Array(model.works.length);
  for (const s of plan.bySubject.keys()) ownUnit[s] = 1;
  const ctx: LinkContext = {
    view,
    namer,
    described,
    matchDone,
    counts,
    attached,
    describe: (w) => plan.clusterOf[w] < 0 && !ownUnit[w],
  };

  yield provenanceUnit(view, namer);

  for (let ci = 0; ci < view.clusters.length; ci++) {
    const c = view.clusters[ci];
    const quads: Quad[] = [];
    const partners = new Set<number>();
    const claims = inGraph(namer.graph('claims'), quads);
    const prov = inGraph(namer.graph('provenance'), quads);
    const cl = nn(namer.iri('cluster', { cluster: c.id }));
    prov(cl, a, T.Cluster);
    for (const w of c.members) {
      prov(cl, cxMember, nn(namer.workIri(w)));
      partners.add(model.works[w].partner);
      describeWork(w, described, claims, namer, model);
    }
    prov(cl, cxMemberCount, int(c.members.length));
    prov(cl, cxPartnerCount, int(partners.size));
    if (c.oversized) prov(cl, cxOversized, bool(true));
    for (const li of c.bridges) prov(cl, cxBridge, nn(namer.linkIri(links.links[li])));
    /** A pair node of the cluster (implied pair or date conflict), named from the ordered pair of works. */
    const pairNode = (pattern: 'implied' | 'conflict', link: string, type: NamedNode, x: { a: number; b: number }) => {
      const node = nn(namer.iri(pattern, { cluster: c.id, hash: hash(workRef(model, x.a), workRef(model, x.b)) }));
      prov(cl, term('cx', link), node);
      prov(node, a, type);
      prov(node, cxWorkA, nn(namer.workIri(x.a)));
      prov(node, cxWorkB, nn(namer.workIri(x.b)));
      return node;
    };
    for (const p of c.implied)
      prov(pairNode('implied', 'impliedPair', T.Implied, p), cxThroughThirdArchive, bool(p.throughThirdArchive));
    for (const x of c.conflicts)
      prov(pairNode('conflict', 'hasDateConflict', T.Conflict, x), cxSeverity, str(x.severity));
    for (const li of c.links) {
      const l = links.links[li];
      if (isPublished(l)) linkQuads(l, ctx, quads);
    }
    // stray links whose claim subject is a member: their slices are those of both ends' partners
    for (const li of plan.withCluster[ci]) {
      const l = links.links[li];
      linkQuads(l, ctx, quads);
      partners.add(model.works[l.a].partner);
      partners.add(model.works[l.b].partner);
    }
    yield { kind: 'cluster', id: c.id, quads, partners };
  }
  for (const [s, lis] of plan.bySubject) {
    const quads: Quad[] = [];
    const partners = new Set<number>(plan.referrers.get(s));
    describeWork(s, described, inGraph(namer.graph('claims'), quads), namer, model);
    let id = '';
    for (const li of lis) {
      const l = links.links[li];
      const iri = linkQuads(l, ctx, quads);
      id ||= iri;
      partners.add(model.works[l.a].partner);
      partners.add(model.works[l.b].partner);
    }
    yield { kind: 'link', id, quads, partners };
  }
}

/** What linkQuads needs besides the link: the release, the shared bookkeeping, and which ends it may describe. */
interface LinkContext {
  view: ReleaseView;
  namer: Namer;
  described: Uint8Array;
  matchDone: Set<string> | null;
  counts: LinksetCounts;
  attached?: ReadonlyMap<string, Quad[]>;
  /** Whether a link's unit describes this end work (false: its own unit does). */
  describe: (w: number) => boolean;
}

function describeWork(
  w: number,
  described: Uint8Array,
  emit: ReturnType<typeof inGraph>,
  namer: Namer,
  model: Model,
): void {
  if (described[w]) return;
  described[w] = 1;
  const work = model.works[w];
  const s = nn(namer.workIri(w));
  if (work.title) emit(s, dctermsTitle, str(work.title));
  if (work.date) emit(s, cxDateAsCatalogued, str(work.date));
  const page = namer.recordPage(w);
  if (page) emit(s, foafPage, nn(page));
  emit(s, voidInDataset, nn(namer.partnerDataset(work.partner)));
  emit(s, cxPartner, str(model.project.partners[work.partner].key));
}

/**
 * Can two evidence rows of published links name the same image match? Only when two images share an IRI or two runs
 * an ID: link() already counts a run's repeated image pair once, and every row belongs to exactly one link. When they
 * cannot, the release needs no set of every match IRI written so far (millions of strings at the largest scales).
 * Image IRIs are compared by a 53-bit hash of each (8 bytes an image, where a set of the IRIs took ≈ 0.8 GB of
 * garbage at 1M works); only IRIs whose hashes meet are then compared as text, so the answer is exact.
 */
export function matchIrisCanRepeat(model: Model, namer: Pick<Namer, 'imageIri'>): boolean {
  if (new Set(model.runs.map((r) => r.id)).size !== model.runs.length) return true;
  const n = model.images.count;
  const keys = new Float64Array(n);
  for (let img = 0; img < n; img++) keys[img] = hash53(namer.imageIri(img));
  const sorted = keys.slice().sort();
  const met = new Set<number>();
  for (let i = 1; i < n; i++) if (sorted[i] === sorted[i - 1]) met.add(sorted[i]);
  if (met.size === 0) return false;
  const seen = new Set<string>();
  for (let img = 0; img < n; img++) {
    if (!met.has(keys[img])) continue;
    const iri = namer.imageIri(img);
    if (seen.has(iri)) return true;
    seen.add(iri);
  }
  return false;
}

/**
 * A 53-bit hash of a string (exact in a double): 32 bits of FNV-1a (IETF draft-eastlake-fnv §2) and 21 bits of a
 * second multiplicative hash over the UTF-16 code units (common practice, no source), so that equal keys are rare.
 */
function hash53(s: string): number {
  let h1 = 0x811c9dc5;
  let h2 = 0x9747b28c;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    h1 = Math.imul(h1 ^ c, 0x01000193);
    h2 = Math.imul(h2 ^ c, 0x5bd1e995);
    h2 ^= h2 >>> 15;
  }
  return (h1 >>> 0) * 2097152 + ((h2 >>> 0) & 0x1fffff);
}

function linkQuads(l: Link, ctx: LinkContext, quads: Quad[]): string {
  const { view, namer, described, matchDone, counts } = ctx;
  const { model } = view;
  const claims = inGraph(namer.graph('claims'), quads);
  const prov = inGraph(namer.graph('provenance'), quads);
  const ev = inGraph(namer.graph('evidence'), quads);
  const [s, o] = claimEnds(l);
  if (ctx.describe(s)) describeWork(s, described, claims, namer, model);
  if (ctx.describe(o)) describeWork(o, described, claims, namer, model);
  const predicate = view.vocab.predicate(l.kind, l.status);
  const S = nn(namer.workIri(s)),
    O = nn(namer.workIri(o));
  if (predicate) {
    claims(S, nn(predicate), O);
    const key = `${model.works[s].partner}|${model.works[o].partner}|${predicate}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  const L = nn(namer.linkIri(l));
  prov(L, a, T.Link);
  prov(L, a, T.Entity);
  prov(L, cxSubjectWork, S);
  prov(L, cxObjectWork, O);
  if (predicate) prov(L, cxRelation, nn(predicate));
  prov(L, cxKind, KIND[l.kind]);
  prov(L, cxStatus, STATUS[l.status]);
  prov(L, cxSupport, int(l.support));
  if (l.reliableSupport > 0) {
    prov(L, cxScore, dec(l.best));
    prov(L, cxMeanScore, dec(l.mean));
    // the link confidence from all the evidence (src/evidence/README.md): 0 when only indiscriminate images carry it
    prov(L, cxConfidence, dec(l.confidence));
  }
  if (l.support > 0) {
    prov(L, cxCoverageSubject, dec(s === l.a ? l.coverageA : l.coverageB));
    prov(L, cxCoverageObject, dec(s === l.a ? l.coverageB : l.coverageA));
  }
  const { matches } = model;
  for (const r of matchesOf(view.links, l)) {
    const ia = matches.a[r],
      ib = matches.b[r];
    const [ra, rb] = [namer.imageIri(ia), namer.imageIri(ib)];
    const id = namer.matchIri(r, ra, rb);
    prov(L, provWasDerivedFrom, nn(id));
    if (matchDone) {
      if (matchDone.has(id)) continue; // the same image match named by two rows (see matchIrisCanRepeat)
      matchDone.add(id);
    }
    const M = nn(id);
    ev(M, a, T.ImageMatch);
    ev(M, a, T.Entity);
    ev(M, cxSourceImage, nn(ra));
    ev(M, cxTargetImage, nn(rb));
    ev(M, cxScore, dec(matches.score[r]));
    ev(M, cxOverlap, dec(matches.overlap[r]));
    ev(M, provWasGeneratedBy, namer.runNode(matches.run[r]));
  }
  if (l.decision !== undefined) {
    prov(L, provWasGeneratedBy, nn(namer.reviewIri(l.decision)));
    prov(L, provWasAttributedTo, nn(namer.curatorIri(model.decisions[l.decision].curator)));
  } else {
    for (const r of l.runs) prov(L, provWasGeneratedBy, namer.runNode(r));
    for (const agent of new Set(l.runs.map(namer.agentIri))) prov(L, provWasAttributedTo, nn(agent));
  }
  const more = ctx.attached?.get(L.value);
  if (more) for (const q of more) quads.push(q);
  return L.value;
}

/** Runs, software agents, plans, curator reviews and curators: shared by every cluster. */
function provenanceUnit(view: ReleaseView, namer: Namer): Unit {
  const { model } = view;
  const quads: Quad[] = [];
  const prov = inGraph(namer.graph('provenance'), quads);
  const agents = new Set<string>();
  model.runs.forEach((run, r) => {
    const R = nn(namer.runIri(r));
    const agent = namer.agentIri(r);
    const plan = nn(namer.iri('plan', { run: run.id }));
    const assoc = nn(namer.iri('association', { run: run.id }));
    prov(R, a, T.Activity);
    prov(R, a, T.MatchRun);
    prov(R, rdfsLabel, str(`${run.software} ${run.version}, run ${run.id}`));
    prov(R, provStartedAtTime, typed(run.started, 'dateTime'));
    prov(R, provWasAssociatedWith, nn(agent));
    prov(R, provQualifiedAssociation, assoc);
    prov(assoc, a, T.Association);
    prov(assoc, provAgent, nn(agent));
    prov(assoc, provHadPlan, plan);
    prov(plan, a, T.Plan);
    prov(plan, a, T.Entity);
    for (const name of Object.keys(run.parameters).sort()) {
      const P = nn(namer.iri('parameter', { run: run.id, name }));
      const v = run.parameters[name];
      prov(plan, cxParameter, P);
      prov(P, cxParameterName, str(name));
      prov(
        P,
        cxParameterValue,
        typeof v === 'object' && v !== null
          ? numberLiteral(v.number)
          : typeof v === 'boolean'
            ? bool(v)
            : str(String(v)),
      );
    }
    if (!agents.has(agent)) {
      agents.add(agent);
      prov(nn(agent), a, T.SoftwareAgent);
      prov(nn(agent), rdfsLabel, str(run.software));
      prov(nn(agent), owlVersionInfo, str(run.version));
    }
  });
  const people = new Set<string>();
  const deciding = new Set(
    view.links.links
      .filter(isPublished)
      .map((l) => l.decision)
      .filter((d): d is number => d !== undefined),
  );
  for (const d of [...deciding].sort((x, y) => x - y)) {
    const x = model.decisions[d];
    const R = nn(namer.reviewIri(d));
    const person = namer.curatorIri(x.curator);
    prov(R, a, T.Activity);
    prov(R, a, T.Review);
    prov(R, provWasAssociatedWith, nn(person));
    prov(R, x.date.includes('T') ? provEndedAtTime : dctermsDate, when(x.date));
    prov(R, cxVerdict, str(x.verdict));
    if (x.note) prov(R, cxNote, str(x.note));
    if (!people.has(person)) {
      people.add(person);
      prov(nn(person), a, T.Person);
      if (person !== x.curator) prov(nn(person), rdfsLabel, str(x.curator));
    }
  }
  return { kind: 'provenance', id: 'provenance', quads, partners: 'all' };
}

export type { NamedNode };
