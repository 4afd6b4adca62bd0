// A shapes graph → what data validating one focus node reads, hop by hop from it (its "footprint"), or why that is
// unbounded: the plan for giving each validation batch exactly the context the shapes need.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import { iri } from '../namespaces.js';
import { flipPath, readPath, type PathTree } from './paths.js';

const sh = (local: string) => iri('sh', local);
const RDF_TYPE = iri('rdf', 'type');
const ID = N3.termToId as (t: unknown) => string;

/** What is read at the nodes `depth` hops away from a focus node. */
export interface Level {
  /** Predicates whose objects are looked up (`all`: every triple of the node, for sh:closed). */
  out: Set<string>;
  all: boolean;
  /** Predicates whose subjects are looked up (inverse paths, SHACL §2.3.1.3). */
  in: Set<string>;
  /** Forward and inverse predicates leading on to nodes one hop further, where something is read again. */
  fwd: Set<string>;
  inv: Set<string>;
}

/** Deepest footprint planned for; shapes reaching further are validated whole. */
export const MAX_DEPTH = 6;

/**
 * The data a shapes graph reads around each focus node: `levels[0]` at the focus node itself, `levels[k]` at nodes
 * k hops away. `objectsOf` are the sh:targetObjectsOf predicates (the focus node is found through a triple of another
 * subject, SHACL §2.1.3.5). `unbounded` names a shape whose reach has no bound (a `*`/`+` path, a shape reaching
 * itself through a path) or exceeds {@link MAX_DEPTH}: such shapes are validated on the whole graph. `nestedFocus`
 * names
 * a shape whose results have value nodes as focus nodes (sh:property on a property shape, SHACL §4.7.2).
 */
export interface Footprint {
  levels: Level[];
  objectsOf: Set<string>;
  unbounded: string | null;
  nestedFocus: string | null;
}

const level = (): Level => ({ out: new Set(), all: false, in: new Set(), fwd: new Set(), inv: new Set() });

/** Parameters whose values are shapes each value node is checked against (SHACL §4.6, §4.7.1, §4.7.3). */
const SHAPE_PARAMS = ['node', 'not', 'qualifiedValueShape'];
const LIST_PARAMS = ['and', 'or', 'xone'];
/** Parameters comparing the value nodes with the focus node's own values of another predicate (SHACL §4.5). */
const PAIR_PARAMS = ['equals', 'disjoint', 'lessThan', 'lessThanOrEquals'];

/** Works out the footprint of every shape the engines start from (SHACL §3.1: shapes with targets). */
export function footprintOf(shapes: Iterable<Quad>): Footprint {
  const store = shapes instanceof N3.Store ? shapes : new N3.Store([...shapes] as N3.Quad[]);
  const objects = (node: N3.Term, local: string) => store.getObjects(node, sh(local), null);
  const result: Footprint = { levels: [level()], objectsOf: new Set(), unbounded: null, nestedFocus: null };
  const at = (d: number) => {
    while (result.levels.length <= d) result.levels.push(level());
    return result.levels[d];
  };
  const list = (head: N3.Term): N3.Term[] => {
    const items: N3.Term[] = [];
    for (
      let n: N3.Term | null = head;
      n && n.value !== iri('rdf', 'nil') && items.length <= 100_000;
      n = store.getObjects(n, iri('rdf', 'rest'), null)[0] ?? null
    ) {
      const first = store.getObjects(n, iri('rdf', 'first'), null)[0];
      if (!first) break;
      items.push(first);
    }
    return items;
  };
  let stop = false;
  const unbounded = (why: string) => {
    result.unbounded ??= why;
    stop = true;
  };

  /**
   * Where a path leads: a depth, and `commit`, which records the moves that lead there. Moves are recorded only when
   * something is read at the node they reach, so a value that is only compared (sh:datatype, sh:in, …) costs no
   * context.
   */
  type Pos = { depth: number; commit: () => void };
  const reached = (from: Pos, move: 'fwd' | 'inv', p: string): Pos => {
    let done = false;
    return {
      depth: from.depth + 1,
      commit: () => {
        if (!done) {
          done = true;
          from.commit();
          at(from.depth)[move].add(p);
        }
      },
    };
  };

  /** The positions the values of `path` are found at from `from` (SHACL §2.3.1), recording each lookup. */
  function walk(path: PathTree, from: Pos[], shape: string): Pos[] {
    if (stop) return [];
    let out: Pos[] = [];
    if (typeof path === 'string') {
      for (const f of from) {
        at(f.depth).out.add(path);
        f.commit();
        out.push(reached(f, 'fwd', path));
      }
    } else if ('inverse' in path) {
      if (typeof path.inverse !== 'string') return walk(flipPath(path.inverse), from, shape);
      for (const f of from) {
        at(f.depth).in.add(path.inverse);
        f.commit();
        out.push(reached(f, 'inv', path.inverse));
      }
    } else if ('sequence' in path) {
      out = from;
      for (const step of path.sequence) out = walk(step, out, shape);
    } else if ('alternative' in path) {
      for (const alt of path.alternative) out.push(...walk(alt, from, shape));
    } else if ('zeroOrOne' in path) {
      out = [...from, ...walk(path.zeroOrOne, from, shape)];
    } else unbounded(`${shape} uses a path of any length (sh:zeroOrMorePath or sh:oneOrMorePath)`);
    if (out.some((p) => p.depth > MAX_DEPTH) || out.length > 10_000) {
      unbounded(`${shape} reads data more than ${MAX_DEPTH} hops from its focus node`);
      return [];
    }
    return out;
  }

  /** Per (shape, depth) visited: whether validating a node there reads anything at or beyond it. */
  const done = new Map<string, boolean>();
  const onStack = new Map<string, number>();
  /** Records what validating the node at `pos` against shape `node` reads (SHACL §3.4), recursing into referenced
   *  shapes; returns whether anything is read at or beyond `pos` (then its moves are committed). */
  function visit(node: N3.Term, pos: Pos): void {
    const key = ID(node);
    if (stop || objects(node, 'deactivated').some((t) => t.value === 'true')) return;
    const memo = done.get(`${key} ${pos.depth}`);
    if (memo !== undefined) {
      if (memo) pos.commit();
      return;
    }
    const shallower = onStack.get(key);
    if (shallower !== undefined) {
      // a shape reached from itself: at the same depth it reads nothing new (its node is kept, to be safe: what the
      // outer visit reads is not known yet); deeper it would go on for ever
      if (shallower < pos.depth) unbounded(`${key} reaches itself through a path, so its reach has no bound`);
      pos.commit();
      return;
    }
    onStack.set(key, pos.depth);
    let reads = false;
    const probe: Pos = {
      depth: pos.depth,
      commit: () => {
        reads = true;
        pos.commit();
      },
    };
    const read = (p: Pos, what: (l: Level) => void) => {
      what(at(p.depth));
      p.commit();
    };
    const pathNode = objects(node, 'path')[0];
    const values = pathNode ? walk(readPath(store, pathNode), [probe], key) : [probe];
    for (const v of values) {
      if (objects(node, 'class').length > 0) read(v, (l) => l.out.add(RDF_TYPE));
      if (objects(node, 'closed').some((t) => t.value === 'true'))
        read(v, (l) => {
          l.all = true;
        });
      for (const local of SHAPE_PARAMS) for (const s of objects(node, local)) visit(s, v);
      for (const local of LIST_PARAMS) for (const head of objects(node, local)) for (const s of list(head)) visit(s, v);
      for (const s of objects(node, 'property')) {
        if (pathNode) result.nestedFocus ??= key;
        visit(s, v);
      }
      // sh:qualifiedValueShapesDisjoint: value nodes are also checked against the siblings' qualified shapes
      if (objects(node, 'qualifiedValueShapesDisjoint').some((t) => t.value === 'true')) {
        for (const parent of store.getSubjects(sh('property'), node, null))
          for (const sibling of store.getObjects(parent, sh('property'), null))
            for (const q of objects(sibling, 'qualifiedValueShape')) visit(q, v);
      }
    }
    for (const local of PAIR_PARAMS) for (const p of objects(node, local)) read(probe, (l) => l.out.add(p.value));
    onStack.delete(key);
    done.set(`${key} ${pos.depth}`, reads);
  }

  const starts = new Map<string, N3.Term>();
  for (const local of ['targetNode', 'targetClass', 'targetSubjectsOf', 'targetObjectsOf'])
    for (const s of store.getSubjects(sh(local), null, null)) starts.set(ID(s), s);
  for (const type of ['NodeShape', 'PropertyShape'])
    for (const s of store.getSubjects(RDF_TYPE, sh(type), null))
      if (store.getQuads(s, RDF_TYPE, iri('rdfs', 'Class'), null).length > 0) starts.set(ID(s), s);
  for (const [, s] of [...starts].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) {
    if (objects(s, 'deactivated').some((t) => t.value === 'true')) continue;
    for (const p of objects(s, 'targetObjectsOf')) result.objectsOf.add(p.value);
    // targetClass and the implicit class target read the focus node's own rdf:type (level 0 holds every own triple)
    visit(s, { depth: 0, commit: () => undefined });
  }
  while (result.levels.length > 1 && isEmpty(result.levels[result.levels.length - 1])) result.levels.pop();
  return result;
}

function isEmpty(l: Level): boolean {
  return l.out.size === 0 && !l.all && l.in.size === 0;
}
