// Data quads (as n3 term ids, all graphs merged) → an in-memory index answering what SHACL core asks of a data
// graph: objects and subjects of a predicate, SHACL instances of a class (SHACL §3.2 "SHACL instance"), and paths.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import { iri } from '../../namespaces.js';
import type { PathTree } from '../paths.js';
import type { TermId } from './terms.js';

const RDF_TYPE = iri('rdf', 'type');
const RDFS_SUBCLASS_OF = iri('rdfs', 'subClassOf');
const NONE: ReadonlySet<TermId> = new Set();
const ID = N3.termToId as (t: unknown) => string;

type Index = Map<TermId, Map<TermId, Set<TermId>>>;

function add(index: Index, a: TermId, p: TermId, b: TermId): boolean {
  let byPredicate = index.get(a);
  if (!byPredicate) index.set(a, (byPredicate = new Map()));
  let values = byPredicate.get(p);
  if (!values) byPredicate.set(p, (values = new Set()));
  const before = values.size;
  values.add(b);
  return values.size !== before;
}

/** A data graph as the union of the given quads' graphs (duplicates collapse: an RDF graph is a set of triples). */
export class DataGraph {
  private readonly out: Index = new Map();
  private inverse: Index | null = null;
  private bySubjectPredicate: Map<TermId, Set<TermId>> | null = null;
  private byObjectPredicate: Map<TermId, Set<TermId>> | null = null;
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
    if (add(this.out, s, p, o)) this.triples.push(s, p, o);
  }

  /** Objects of `s` along `p`. */
  objects(s: TermId, p: TermId): ReadonlySet<TermId> {
    return this.out.get(s)?.get(p) ?? NONE;
  }

  /** Subjects pointing at `o` along `p`. */
  subjects(o: TermId, p: TermId): ReadonlySet<TermId> {
    if (!this.inverse) {
      this.inverse = new Map();
      const t = this.triples;
      for (let i = 0; i < t.length; i += 3) add(this.inverse, t[i + 2], t[i + 1], t[i]);
    }
    return this.inverse.get(o)?.get(p) ?? NONE;
  }

  /** Every (predicate, objects) of `s`. */
  outgoing(s: TermId): ReadonlyMap<TermId, ReadonlySet<TermId>> {
    return this.out.get(s) ?? new Map();
  }

  /** Subjects of some triple with predicate `p` (SHACL §2.1.3.4). */
  subjectsOf(p: TermId): ReadonlySet<TermId> {
    if (!this.bySubjectPredicate) this.indexPredicates();
    return this.bySubjectPredicate!.get(p) ?? NONE;
  }

  /** Objects of some triple with predicate `p` (SHACL §2.1.3.5). */
  objectsOf(p: TermId): ReadonlySet<TermId> {
    if (!this.byObjectPredicate) this.indexPredicates();
    return this.byObjectPredicate!.get(p) ?? NONE;
  }

  private indexPredicates(): void {
    const subjects = (this.bySubjectPredicate = new Map());
    const objects = (this.byObjectPredicate = new Map());
    const t = this.triples;
    for (let i = 0; i < t.length; i += 3) {
      const p = t[i + 1];
      let s = subjects.get(p);
      if (!s) subjects.set(p, (s = new Set()));
      s.add(t[i]);
      let o = objects.get(p);
      if (!o) objects.set(p, (o = new Set()));
      o.add(t[i + 2]);
    }
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
    for (const type of this.objects(node, RDF_TYPE)) if (type === cls || this.supersOf(type).includes(cls)) return true;
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
    if (typeof path === 'string') return [...this.objects(focus, path)];
    return [...this.walk(new Set([focus]), path)];
  }

  private walk(from: ReadonlySet<TermId>, path: PathTree): Set<TermId> {
    const out = new Set<TermId>();
    if (typeof path === 'string') {
      for (const node of from) for (const o of this.objects(node, path)) out.add(o);
    } else if ('inverse' in path) {
      if (typeof path.inverse === 'string') for (const node of from) for (const s of this.subjects(node, path.inverse)) out.add(s);
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
          if (!seen.has(node)) { seen.add(node); next.add(node); }
        }
        frontier = next;
      }
    }
    return out;
  }

  /** Nodes from which `path` reaches one of `to` (the inverse of a complex path). */
  private inverseWalk(to: ReadonlySet<TermId>, path: PathTree): Set<TermId> {
    const flip = (p: PathTree): PathTree => {
      if (typeof p === 'string') return { inverse: p };
      if ('inverse' in p) return p.inverse;
      if ('sequence' in p) return { sequence: [...p.sequence].reverse().map(flip) };
      if ('alternative' in p) return { alternative: p.alternative.map(flip) };
      if ('zeroOrOne' in p) return { zeroOrOne: flip(p.zeroOrOne) };
      if ('zeroOrMore' in p) return { zeroOrMore: flip(p.zeroOrMore) };
      return { oneOrMore: flip(p.oneOrMore) };
    };
    return this.walk(to, flip(path));
  }
}

/** `start` and everything reachable from it by `next`, breadth first, each once. */
function reach(start: TermId, next: (node: TermId) => Iterable<TermId>): TermId[] {
  const seen = new Set<TermId>([start]);
  const queue = [start];
  for (let i = 0; i < queue.length; i++) for (const n of next(queue[i])) if (!seen.has(n)) { seen.add(n); queue.push(n); }
  return queue;
}
