// What pages share while a site is written: the release's identity, shard widths, labels of runs, reviews and
// curators, and links from one document to the document of any IRI.
import { iri } from '../namespaces.js';
import type { Statement } from './nquads.js';
import type { SiteInfo } from './info.js';
import { docOf, relPath, routeOf, type ShardWidths } from './routes.js';
import { rootOf } from './html.js';
import { CONTEXT } from './jsonld.js';
import { Images } from './images.js';

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

/** Where a minted IRI is described: its document, the fragment, whether the site has it, the link from the root. */
interface Located {
  doc: string;
  fragment: string;
  has: boolean;
  tail: string;
}

export class SiteContext {
  /** Provenance statements by subject: runs and their plans, agents, reviews, curators (shared by every cluster). */
  readonly prov = new Map<string, Node>();
  widths: ShardWidths = {};
  /** Photographs partners let the pages show (none unless the release publishes their templates). */
  readonly images: Images;
  constructor(readonly info: SiteInfo) {
    this.images = new Images(info.partners.values());
  }

  addProv(st: Statement): void {
    let n = this.prov.get(st.s);
    if (!n) this.prov.set(st.s, (n = new Node(st.s)));
    n.add(st);
  }

  /** Where minted IRIs are described, and whether the site has that document (IRIs repeat: runs, clusters, links). */
  private readonly located = new Map<string, Located | null>();

  /** Document path and fragment of a minted IRI, or null for an outside IRI. */
  locate(x: string): Located | null {
    let at = this.located.get(x);
    if (at !== undefined) return at;
    const rel = relPath(x, this.info.base);
    const route = rel === null ? null : routeOf(rel);
    if (!rel || !route) at = null;
    else {
      const doc = docOf(route, this.widths);
      // every document of the release is in the site, except the datasets of other releases (dcat:previousVersion,
      // the release activity's prov:used): those only when carried over from an earlier site
      const has = route.kind !== 'dataset' || x.startsWith(this.info.dataset) || this.carried.has(doc);
      const fragment = doc === rel ? '' : rel;
      const tail = `${doc.split('/').map(encodeURIComponent).join('/')}.html${fragment ? `#${fragment.split('/').map(encodeURIComponent).join('/')}` : ''}`;
      at = { doc, fragment, has, tail };
    }
    // kept small: the IRIs are slices of the release's text, and each one held keeps its whole chunk of the file alive
    if (this.located.size >= 10_000) this.located.clear();
    this.located.set(x, at);
    return at;
  }

  /**
   * A link from the page of `fromDoc` to the HTML document describing `x` (the IRI itself when it is not minted here).
   */
  href(x: string, fromDoc: string): string {
    const at = this.locate(x);
    if (!at || !at.has) return x;
    return rootOf(fromDoc) + at.tail;
  }

  /** Documents known to be in this site beyond the release's own (carried over from an earlier site). */
  readonly carried = new Set<string>();
  /** Whether the document of a minted IRI is in the site. */
  hasDoc(x: string): boolean {
    return this.locate(x)?.has ?? false;
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
