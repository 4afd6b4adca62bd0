// Data quads (as n3 term ids, all graphs merged) → an in-memory index answering what SHACL core asks of a data
// graph: objects and subjects of a predicate, SHACL instances of a class (SHACL §3.2 "SHACL instance"), and paths.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import { iri } from '../../namespaces.js';
import { flipPath, type PathTree } from '../paths.js';
import type { TermId } from './terms.js';

const RDF_TYPE = iri('rdf', 'type');
const RDFS_SUBCLASS_OF = iri('rdfs', 'subClassOf');
const NONE: ReadonlySet<TermId> = new Set();
const ID = N3.termToId as (t: unknown) => string;

type Index = Map<TermId, Map<TermId, Set<TermId>>>;

function add(index: Index, a: TermId, p: TermId, b: TermId): void {
  let byPredicate = index.get(a);
  if (!byPredicate) index.set(a, (byPredicate = new Map()));
  let values = byPredicate.get(p);
  if (!values) byPredicate.set(p, (values = new Set()));
  values.add(b);
}

/** Above this many triples a subject's duplicates are found through a set instead of by scanning. */
const SCAN_LIMIT = 32;

/**
 * A data graph as the union of the given quads' graphs (duplicates collapse: an RDF graph is a set of triples).
 * Each subject keeps its (predicate, object) pairs in one flat array, in first-seen order; rdf:type is indexed by
 * class as it arrives; the inverse index and the per-predicate indexes are built only when a shape asks for them.
 */
export class DataGraph {
  private readonly out = new Map<TermId, TermId[]>();
  private readonly large = new Map<TermId, Set<string>>();
  /** class → subjects with rdf:type it, and class → its direct rdfs:subClassOf subclasses, kept as triples arrive. */
  private readonly typed = new Map<TermId, TermId[]>();
  private readonly subclassed = new Map<TermId, TermId[]>();
  private inverse: Index | null = null;
  private readonly bySubjectPredicate = new Map<TermId, Set<TermId>>();
  private readonly byObjectPredicate = new Map<TermId, Set<TermId>>();
  private readonly superclasses = new Map<TermId, TermId[]>();
  private readonly subclasses = new Map<TermId, TermId[]>();
  /** The triples in first-seen order, flat: [s, p, o, s, p, o, …]. */
  private readonly triples: TermId[] = [];

  /** From flat [s, p, o, g, …] term ids (the validation wire format). */
  static fromIds(ids: readonly TermId[]): DataGraph {
    const graph = new DataGraph();
    for (let i = 0; i < ids.length; i += 4) graph.add(ids[i], ids[i + 1], ids[i + 2]);
    return graph;
  }

  static fromQuads(quads: Iterable<Quad>): DataGraph {
    const graph = new DataGraph();
    for (const q of quads) graph.add(ID(q.subject), ID(q.predicate), ID(q.object));
    return graph;
  }

  private add(s: TermId, p: TermId, o: TermId): void {
    let pairs = this.out.get(s);
    if (!pairs) this.out.set(s, (pairs = []));
    else if (pairs.length < 2 * SCAN_LIMIT) {
      for (let i = 0; i < pairs.length; i += 2) if (pairs[i] === p && pairs[i + 1] === o) return;
    } else {
      let keys = this.large.get(s);
      if (!keys) {
        keys = new Set();
        for (let i = 0; i < pairs.length; i += 2) keys.add(`${pairs[i]}\u0000${pairs[i + 1]}`);
        this.large.set(s, keys);
      }
      const key = `${p}\u0000${o}`;
      if (keys.has(key)) return;
      keys.add(key);
    }
    pairs.push(p, o);
    this.triples.push(s, p, o);
    if (p === RDF_TYPE || p === RDFS_SUBCLASS_OF) {
      const index = p === RDF_TYPE ? this.typed : this.subclassed;
      const members = index.get(o);
      if (members) members.push(s);
      else index.set(o, [s]);
    }
  }

  /** Objects of `s` along `p`, in first-seen order. */
  objects(s: TermId, p: TermId): TermId[] {
    const pairs = this.out.get(s);
    const found: TermId[] = [];
    if (pairs) for (let i = 0; i < pairs.length; i += 2) if (pairs[i] === p) found.push(pairs[i + 1]);
    return found;
  }

  /** Subjects pointing at `o` along `p`. */
  subjects(o: TermId, p: TermId): ReadonlySet<TermId> {
    if (p === RDF_TYPE) return new Set(this.typed.get(o) ?? []);
    if (p === RDFS_SUBCLASS_OF) return new Set(this.subclassed.get(o) ?? []);
    if (!this.inverse) {
      this.inverse = new Map();
      const t = this.triples;
      for (let i = 0; i < t.length; i += 3) add(this.inverse, t[i + 2], t[i + 1], t[i]);
    }
    return this.inverse.get(o)?.get(p) ?? NONE;
  }

  /** Every (predicate, object) pair of `s`, flat: [p, o, p, o, …]. */
  pairs(s: TermId): readonly TermId[] {
    return this.out.get(s) ?? [];
  }

  /** Subjects of some triple with predicate `p` (SHACL §2.1.3.4). */
  subjectsOf(p: TermId): ReadonlySet<TermId> {
    return this.byPredicate(p, this.bySubjectPredicate, 0);
  }

  /** Objects of some triple with predicate `p` (SHACL §2.1.3.5). */
  objectsOf(p: TermId): ReadonlySet<TermId> {
    return this.byPredicate(p, this.byObjectPredicate, 2);
  }

  private byPredicate(p: TermId, cache: Map<TermId, Set<TermId>>, offset: 0 | 2): ReadonlySet<TermId> {
    let nodes = cache.get(p);
    if (!nodes) {
      nodes = new Set();
      const t = this.triples;
      for (let i = 0; i < t.length; i += 3) if (t[i + 1] === p) nodes.add(t[i + offset]);
      cache.set(p, nodes);
    }
    return nodes;
  }

  /** `cls` and every class it is an rdfs:subClassOf of, transitively (SHACL §3.2 "SHACL subclass"). */
  private supersOf(cls: TermId): TermId[] {
    let supers = this.superclasses.get(cls);
    if (!supers) {
      supers = reach(cls, (c) => this.objects(c, RDFS_SUBCLASS_OF));
      this.superclasses.set(cls, supers);
    }
    return supers;
  }

  /** Whether `node` is a SHACL instance of `cls`: rdf:type some SHACL subclass of it (SHACL §3.2). */
  isInstance(node: TermId, cls: TermId): boolean {
    const pairs = this.out.get(node);
    if (!pairs) return false;
    for (let i = 0; i < pairs.length; i += 2) {
      if (pairs[i] === RDF_TYPE && (pairs[i + 1] === cls || this.supersOf(pairs[i + 1]).includes(cls))) return true;
    }
    return false;
  }

  /** Every SHACL instance of `cls` (SHACL §2.1.3.2), in first-seen order of classes, then of nodes. */
  instancesOf(cls: TermId): TermId[] {
    let subs = this.subclasses.get(cls);
    if (!subs) {
      subs = reach(cls, (c) => this.subjects(c, RDFS_SUBCLASS_OF));
      this.subclasses.set(cls, subs);
    }
    const out = new Set<TermId>();
    for (const c of subs) for (const node of this.subjects(c, RDF_TYPE)) out.add(node);
    return [...out];
  }

  /** Value nodes of `path` from `focus` (SHACL §2.3.1), without duplicates. */
  pathValues(focus: TermId, path: PathTree): TermId[] {
    if (typeof path === 'string') return this.objects(focus, path);
    return [...this.walk(new Set([focus]), path)];
  }

  private walk(from: ReadonlySet<TermId>, path: PathTree): Set<TermId> {
    const out = new Set<TermId>();
    if (typeof path === 'string') {
      for (const node of from) for (const o of this.objects(node, path)) out.add(o);
    } else if ('inverse' in path) {
      if (typeof path.inverse === 'string')
        for (const node of from) for (const s of this.subjects(node, path.inverse)) out.add(s);
      else return this.inverseWalk(from, path.inverse);
    } else if ('sequence' in path) {
      let current: ReadonlySet<TermId> = from;
      for (const step of path.sequence) current = this.walk(current, step);
      return current as Set<TermId>;
    } else if ('alternative' in path) {
      for (const alt of path.alternative) for (const node of this.walk(from, alt)) out.add(node);
    } else if ('zeroOrOne' in path) {
      for (const node of from) out.add(node);
      for (const node of this.walk(from, path.zeroOrOne)) out.add(node);
    } else {
      const inner = 'zeroOrMore' in path ? path.zeroOrMore : path.oneOrMore;
      if ('zeroOrMore' in path) for (const node of from) out.add(node);
      let frontier: ReadonlySet<TermId> = from;
      const seen = new Set<TermId>();
      while (frontier.size > 0) {
        const next = new Set<TermId>();
        for (const node of this.walk(frontier, inner)) {
          out.add(node);
          if (!seen.has(node)) {
            seen.add(node);
            next.add(node);
          }
        }
        frontier = next;
      }
    }
    return out;
  }

  /** Nodes from which `path` reaches one of `to` (the inverse of a complex path). */
  private inverseWalk(to: ReadonlySet<TermId>, path: PathTree): Set<TermId> {
    return this.walk(to, flipPath(path));
  }
}

/** `start` and everything reachable from it by `next`, breadth first, each once. */
function reach(start: TermId, next: (node: TermId) => Iterable<TermId>): TermId[] {
  const seen = new Set<TermId>([start]);
  const queue = [start];
  for (let i = 0; i < queue.length; i++)
    for (const n of next(queue[i]))
      if (!seen.has(n)) {
        seen.add(n);
        queue.push(n);
      }
  return queue;
}
