// Statements of concordance.nq, in file order → documents: cluster units (with their links and matches), link,
// match and review entries, and the statements of every other document.
import { iri } from '../namespaces.js';
import type { Statement } from './nquads.js';
import { relPath, routeOf, type DocKind } from './routes.js';

/** A resource described in a shard document (link with its earlier states, image match, curator review). */
export interface Entry {
  kind: 'link' | 'match' | 'review';
  /** The hash in its IRI (names its shard). */
  hash: string;
  iri: string;
  statements: Statement[];
}
export interface LinkEntry extends Entry {
  kind: 'link';
  matches: Entry[];
}
/** A cluster document: the cluster (or tombstone), its pair nodes, partner works, claims; and its links. */
export interface ClusterUnit {
  doc: string;
  iri: string;
  statements: Statement[];
  links: LinkEntry[];
}

export interface GroupSink {
  cluster(u: ClusterUnit): void;
  /** A link not inside a cluster (or an earlier state of a gone one), with its matches. */
  strayLink(l: LinkEntry): void;
  /** A curator review, or an image match outside any link entry, with all its statements. */
  entry(e: Entry): void;
  /** A statement of a document of its own (runs, agents, curators, releases, dataset, partners, graphs). */
  own(doc: string, kind: DocKind, st: Statement): void;
}

const MEMBER = iri('cx', 'member');
const SUBJECT_WORK = iri('cx', 'subjectWork');
/** Predicates whose outside object is then described in the same document as the subject. */
const OWNING = new Set([
  MEMBER,
  SUBJECT_WORK,
  iri('cx', 'objectWork'),
  iri('cx', 'workA'),
  iri('cx', 'workB'),
  iri('prov', 'wasAssociatedWith'),
  iri('prov', 'wasAttributedTo'),
]);

type Target =
  { t: 'cluster' } | { t: 'link'; e: LinkEntry } | { t: 'entry'; e: Entry } | { t: 'own'; doc: string; kind: DocKind };

/**
 * Groups a release's statements as the RDF stage writes them: a unit per cluster (the cluster, its pair nodes, its
 * works, its links, their image matches), one per stray link, plus shared provenance and the dataset. A statement
 * whose subject is no minted IRI (a partner's work) goes with the document whose resource names it nearby, else with
 * the next document (a stray link's works come just before it).
 */
export class Grouper {
  private cluster: (ClusterUnit & { members: Set<string> }) | null = null;
  private link: LinkEntry | null = null;
  private match: Entry | null = null;
  private review: Entry | null = null;
  private pending: Statement[] = [];
  private refs = new Map<string, Target>();
  /** A review or match outside any link, handed on when the next resource starts. */
  private loose: Entry | null = null;
  constructor(
    private readonly base: string,
    private readonly sink: GroupSink,
  ) {}

  /** The route of the last subject (a subject's statements come together in the file). */
  private lastS = '';
  private lastRoute: ReturnType<typeof routeOf> = null;

  push(st: Statement): void {
    if (st.s !== this.lastS) {
      const rel = relPath(st.s, this.base);
      this.lastRoute = rel === null ? null : routeOf(rel);
      this.lastS = st.s;
    }
    const route = this.lastRoute;
    if (!route) {
      let to = this.refs.get(st.s) ?? (this.cluster?.members.has(st.s) ? ({ t: 'cluster' } as Target) : undefined);
      // an entry already handed on cannot take more statements: the statement waits for the next document
      if (
        to &&
        ((to.t === 'link' && to.e !== this.link) || (to.t === 'entry' && to.e !== this.loose && to.e !== this.match))
      )
        to = undefined;
      if (to) this.add(to, st);
      else this.pending.push(st);
      return;
    }
    let to: Target;
    if (this.loose && this.loose.hash !== route.key) this.closeEntry();
    switch (route.kind) {
      case 'cluster':
        if (this.cluster?.doc !== route.key) {
          this.closeCluster();
          this.cluster = { doc: route.key, iri: this.base + route.key, statements: [], links: [], members: new Set() };
          this.refs.clear();
        } else this.closeLink();
        to = { t: 'cluster' };
        if (st.p === MEMBER && st.o.kind === 'iri') this.cluster.members.add(st.o.value);
        break;
      case 'link': {
        if (this.link?.hash !== route.key) {
          this.closeLink();
          this.link = {
            kind: 'link',
            hash: route.key,
            iri: `${this.base}link/${route.key}`,
            statements: [],
            matches: [],
          };
        }
        this.match = null;
        to = { t: 'link', e: this.link };
        break;
      }
      case 'match':
      case 'review': {
        const k = route.kind;
        let e = k === 'match' ? this.match : this.review;
        if (e?.hash !== route.key) {
          this.closeEntry();
          e = { kind: k, hash: route.key, iri: st.s, statements: [] };
          if (k === 'review') {
            this.closeLink();
            this.review = e;
            this.loose = e;
          } else {
            this.match = e;
            if (this.link) this.link.matches.push(e);
            else this.loose = e;
          }
        }
        to = { t: 'entry', e };
        break;
      }
      default:
        this.closeLink();
        to = { t: 'own', doc: route.key, kind: route.kind };
    }
    if (this.pending.length) {
      const p = this.pending;
      this.pending = [];
      for (const x of p) this.add(to, x);
    }
    this.add(to, st);
    if (OWNING.has(st.p) && st.o.kind === 'iri' && relPath(st.o.value, this.base) === null) {
      if (this.refs.size > 50_000) this.refs.clear();
      this.refs.set(st.o.value, to);
    }
  }

  private closeEntry(): void {
    if (this.loose) this.sink.entry(this.loose);
    this.loose = null;
    this.review = null;
    if (!this.link) this.match = null;
  }

  private add(to: Target, st: Statement): void {
    if (to.t === 'cluster') this.cluster!.statements.push(st);
    else if (to.t === 'link' || to.t === 'entry') to.e.statements.push(st);
    else this.sink.own(to.doc, to.kind, st);
  }

  private closeLink(): void {
    const l = this.link;
    if (!l) return;
    this.link = null;
    this.match = null;
    const c = this.cluster;
    const inside =
      c !== null && l.statements.some((s) => s.p === SUBJECT_WORK && s.o.kind === 'iri' && c.members.has(s.o.value));
    if (inside) c.links.push(l);
    else this.sink.strayLink(l);
  }

  private closeCluster(): void {
    this.closeLink();
    if (!this.cluster) return;
    const { members: _, ...unit } = this.cluster;
    this.cluster = null;
    this.sink.cluster(unit);
  }

  /**
   * Flushes what is still open; statements no document took go to the last document (there is none in a release we
   * write).
   */
  end(): Statement[] {
    this.closeEntry();
    this.closeCluster();
    const left = this.pending;
    this.pending = [];
    return left;
  }
}
