// What pages share while a site is written: the release's identity, shard widths, labels of runs, reviews and
// curators, and links from one document to the document of any IRI.
import { iri } from '../namespaces.js';
import type { Statement } from './nquads.js';
import type { SiteInfo } from './info.js';
import { docOf, relPath, routeOf, type ShardWidths } from './routes.js';
import { rootOf } from './html.js';
import { CONTEXT } from './jsonld.js';

export const V = {
  type: iri('rdf', 'type'),
  label: iri('rdfs', 'label'),
  title: iri('dcterms', 'title'),
  date: iri('dcterms', 'date'),
  member: iri('cx', 'member'),
  partner: iri('cx', 'partner'),
  dateAsCatalogued: iri('cx', 'dateAsCatalogued'),
  page: iri('foaf', 'page'),
  inDataset: iri('void', 'inDataset'),
  subjectWork: iri('cx', 'subjectWork'),
  objectWork: iri('cx', 'objectWork'),
  relation: iri('cx', 'relation'),
  kind: iri('cx', 'kind'),
  status: iri('cx', 'status'),
  score: iri('cx', 'score'),
  confidence: iri('cx', 'confidence'),
  support: iri('cx', 'support'),
  derivedFrom: iri('prov', 'wasDerivedFrom'),
  generatedBy: iri('prov', 'wasGeneratedBy'),
  attributedTo: iri('prov', 'wasAttributedTo'),
  associatedWith: iri('prov', 'wasAssociatedWith'),
  startedAt: iri('prov', 'startedAtTime'),
  endedAt: iri('prov', 'endedAtTime'),
  invalidatedBy: iri('prov', 'wasInvalidatedBy'),
  invalidatedAt: iri('prov', 'invalidatedAtTime'),
  revisionOf: iri('prov', 'wasRevisionOf'),
  isVersionOf: iri('dcterms', 'isVersionOf'),
  replacedBy: iri('dcterms', 'isReplacedBy'),
  deprecated: iri('owl', 'deprecated'),
  sourceImage: iri('cx', 'sourceImage'),
  targetImage: iri('cx', 'targetImage'),
  overlap: iri('cx', 'overlap'),
  verdict: iri('cx', 'verdict'),
  note: iri('cx', 'note'),
  workA: iri('cx', 'workA'),
  workB: iri('cx', 'workB'),
  severity: iri('cx', 'severity'),
  versionInfo: iri('owl', 'versionInfo'),
  hasDateConflict: iri('cx', 'hasDateConflict'),
  impliedPair: iri('cx', 'impliedPair'),
  throughThird: iri('cx', 'throughThirdArchive'),
  memberCount: iri('cx', 'memberCount'),
  bridge: iri('cx', 'bridge'),
  Cluster: iri('cx', 'Cluster'),
  Link: iri('cx', 'Link'),
} as const;

/** Statements of one subject, by predicate. */
export class Node {
  readonly by = new Map<string, Statement[]>();
  constructor(readonly iri: string) {}
  add(st: Statement): void {
    const v = this.by.get(st.p);
    if (v) v.push(st);
    else this.by.set(st.p, [st]);
  }
  all = (p: string): string[] => (this.by.get(p) ?? []).map((s) => s.o.value);
  one = (p: string): string | undefined => this.by.get(p)?.[0]?.o.value;
}

/** Statements grouped by subject, in first-seen order. */
export function nodesOf(statements: readonly Statement[]): Map<string, Node> {
  const m = new Map<string, Node>();
  for (const st of statements) {
    let n = m.get(st.s);
    if (!n) m.set(st.s, (n = new Node(st.s)));
    n.add(st);
  }
  return m;
}

const BY_LENGTH = Object.entries(CONTEXT).sort((a, b) => b[1].length - a[1].length);
/** `cx:score` for a known namespace, else the IRI. */
export function curie(x: string): string {
  for (const [p, ns] of BY_LENGTH) if (x.startsWith(ns) && x.length > ns.length) return `${p}:${x.slice(ns.length)}`;
  return x;
}

export class SiteContext {
  /** Provenance statements by subject: runs and their plans, agents, reviews, curators (shared by every cluster). */
  readonly prov = new Map<string, Node>();
  widths: ShardWidths = {};
  constructor(readonly info: SiteInfo) {}

  addProv(st: Statement): void {
    let n = this.prov.get(st.s);
    if (!n) this.prov.set(st.s, (n = new Node(st.s)));
    n.add(st);
  }

  /** Document path and fragment of a minted IRI, or null for an outside IRI. */
  locate(x: string): { doc: string; fragment: string } | null {
    const rel = relPath(x, this.info.base);
    const route = rel === null ? null : routeOf(rel);
    if (!rel || !route) return null;
    const doc = docOf(route, this.widths);
    return { doc, fragment: doc === rel ? '' : rel };
  }

  /**
   * A link from the page of `fromDoc` to the HTML document describing `x` (the IRI itself when it is not minted here).
   */
  href(x: string, fromDoc: string): string {
    const at = this.locate(x);
    if (!at || !this.hasDoc(x)) return x;
    return `${rootOf(fromDoc)}${at.doc.split('/').map(encodeURIComponent).join('/')}.html${at.fragment ? `#${at.fragment.split('/').map(encodeURIComponent).join('/')}` : ''}`;
  }

  /** Documents known to be in this site beyond the release's own (carried over from an earlier site). */
  readonly carried = new Set<string>();
  /**
   * Whether the document of a minted IRI is in the site. Every document of the release is, except the datasets of
   * other releases (`dcat:previousVersion`, the release activity's `prov:used`): those only when carried over.
   */
  hasDoc(x: string): boolean {
    const at = this.locate(x);
    if (!at) return false;
    const route = routeOf(decodeURIComponent(x.slice(this.info.base.length)));
    return route?.kind !== 'dataset' || x.startsWith(this.info.dataset) || this.carried.has(at.doc);
  }

  /** A short human name: rdfs:label of runs, agents and curators; else the last path segment or compact IRI. */
  label(x: string): string {
    const n = this.prov.get(x);
    const l = n?.one(V.label);
    if (l) return n!.one(V.versionInfo) && !l.includes(n!.one(V.versionInfo)!) ? `${l} ${n!.one(V.versionInfo)}` : l;
    const c = curie(x);
    if (c !== x) return c;
    return x.startsWith(this.info.base) ? decodeURIComponent(x.slice(this.info.base.length)) : x;
  }
}
