// A shapes graph → what data validating one focus node reads, hop by hop from it (its "footprint"), or why that is
// unbounded: the plan for giving each validation batch exactly the context the shapes need.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import { iri } from '../namespaces.js';
import { readPath, type PathTree } from './paths.js';

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
 * itself through a path) or exceeds {@link MAX_DEPTH}: such shapes are validated on the whole graph. `nestedFocus` names
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
  const at = (d: number) => { while (result.levels.length <= d) result.levels.push(level()); return result.levels[d]; };
  const list = (head: N3.Term): N3.Term[] => {
    const items: N3.Term[] = [];
    for (let n: N3.Term | null = head; n && n.value !== iri('rdf', 'nil') && items.length <= 100_000; n = store.getObjects(n, iri('rdf', 'rest'), null)[0] ?? null) {
      const first = store.getObjects(n, iri('rdf', 'first'), null)[0];
      if (!first) break;
      items.push(first);
    }
    return items;
  };
  let stop = false;
  const unbounded = (why: string) => { result.unbounded ??= why; stop = true; };

  /** Depths the values of `path` are found at, from nodes at `depths` (SHACL §2.3.1), recording each lookup. */
  function walk(path: PathTree, depths: Set<number>, shape: string): Set<number> {
    const out = new Set<number>();
    if (stop) return out;
    if (typeof path === 'string') {
      for (const d of depths) { at(d).out.add(path); at(d).fwd.add(path); out.add(d + 1); }
    } else if ('inverse' in path) {
      if (typeof path.inverse === 'string') {
        for (const d of depths) { at(d).in.add(path.inverse); at(d).inv.add(path.inverse); out.add(d + 1); }
      } else return walk(flip(path.inverse), depths, shape);
    } else if ('sequence' in path) {
      let current = depths;
      for (const step of path.sequence) current = walk(step, current, shape);
      return current;
    } else if ('alternative' in path) {
      for (const alt of path.alternative) for (const d of walk(alt, depths, shape)) out.add(d);
    } else if ('zeroOrOne' in path) {
      for (const d of depths) out.add(d);
      for (const d of walk(path.zeroOrOne, depths, shape)) out.add(d);
    } else unbounded(`${shape} uses a path of any length (sh:zeroOrMorePath or sh:oneOrMorePath)`);
    for (const d of out) if (d > MAX_DEPTH) unbounded(`${shape} reads data more than ${MAX_DEPTH} hops from its focus node`);
    return out;
  }

  const done = new Set<string>();
  const onStack = new Map<string, number>();
  /** Records what validating a node at `depth` against `node` reads (SHACL §3.4), recursing into referenced shapes. */
  function visit(node: N3.Term, depth: number): void {
    const key = ID(node);
    if (stop || done.has(`${key} ${depth}`)) return;
    if (objects(node, 'deactivated').some((t) => t.value === 'true')) return;
    const shallower = onStack.get(key);
    if (shallower !== undefined) {
      // a shape reached from itself: at the same depth it adds nothing; deeper it would go on for ever
      if (shallower < depth) unbounded(`${key} reaches itself through a path, so its reach has no bound`);
      return;
    }
    done.add(`${key} ${depth}`);
    onStack.set(key, depth);
    const pathNode = objects(node, 'path')[0];
    const values = pathNode ? walk(readPath(store, pathNode), new Set([depth]), key) : new Set([depth]);
    for (const d of values) {
      if (objects(node, 'class').length > 0) { at(d).out.add(RDF_TYPE); }
      if (objects(node, 'closed').some((t) => t.value === 'true')) at(d).all = true;
      for (const local of SHAPE_PARAMS) for (const s of objects(node, local)) visit(s, d);
      for (const local of LIST_PARAMS) for (const head of objects(node, local)) for (const s of list(head)) visit(s, d);
      for (const s of objects(node, 'property')) {
        if (pathNode) result.nestedFocus ??= key;
        visit(s, d);
      }
      // sh:qualifiedValueShapesDisjoint: value nodes are also checked against the siblings' qualified shapes
      if (objects(node, 'qualifiedValueShapesDisjoint').some((t) => t.value === 'true')) {
        for (const parent of store.getSubjects(sh('property'), node, null))
          for (const sibling of store.getObjects(parent, sh('property'), null))
            for (const q of objects(sibling, 'qualifiedValueShape')) visit(q, d);
      }
    }
    for (const local of PAIR_PARAMS) for (const p of objects(node, local)) at(depth).out.add(p.value);
    onStack.delete(key);
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
    visit(s, 0);
  }
  // a lookup at the deepest level leads nowhere: drop moves into levels nothing is read at
  for (let d = 0; d < result.levels.length; d++) {
    const next = result.levels[d + 1];
    if (!next || (next.out.size === 0 && !next.all && next.in.size === 0)) { result.levels[d].fwd.clear(); result.levels[d].inv.clear(); }
  }
  while (result.levels.length > 1 && isEmpty(result.levels[result.levels.length - 1])) result.levels.pop();
  return result;
}

function isEmpty(l: Level): boolean {
  return l.out.size === 0 && !l.all && l.in.size === 0;
}

/** The inverse of a path (SHACL §2.3.1.3 applied to a complex path). */
function flip(p: PathTree): PathTree {
  if (typeof p === 'string') return { inverse: p };
  if ('inverse' in p) return p.inverse;
  if ('sequence' in p) return { sequence: [...p.sequence].reverse().map(flip) };
  if ('alternative' in p) return { alternative: p.alternative.map(flip) };
  if ('zeroOrOne' in p) return { zeroOrOne: flip(p.zeroOrOne) };
  if ('zeroOrMore' in p) return { zeroOrMore: flip(p.zeroOrMore) };
  return { oneOrMore: flip(p.oneOrMore) };
}
