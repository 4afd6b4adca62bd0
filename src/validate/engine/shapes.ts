// A shapes graph (SHACL §2) → compiled shapes: targets, path, severity, messages and one checker per constraint
// component. Parameters of SHACL-SPARQL and SHACL Advanced Features are refused with a UserError, never ignored.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import { UserError } from '../../errors.js';
import { iri } from '../../namespaces.js';
import { readPath, type PathTree } from '../paths.js';
import { COMPONENTS, type Checker, type ShapeRef } from './constraints.js';
import type { TermId } from './terms.js';

const sh = (local: string) => iri('sh', local);
const RDF_TYPE = iri('rdf', 'type');
const ID = N3.termToId as (t: unknown) => string;

/** One compiled shape (SHACL §2.1 node shape, §2.3 property shape). */
export interface Shape {
  id: TermId;
  /** The property path; null for a node shape. */
  path: PathTree | null;
  severity: string;
  /** sh:message literals as term ids, sorted. */
  messages: string[];
  deactivated: boolean;
  targets: Targets;
  checks: Array<{ component: string; check: Checker }>;
}

/** SHACL §2.1.3 targets of one shape. */
export interface Targets {
  nodes: TermId[];
  classes: TermId[];
  subjectsOf: TermId[];
  objectsOf: TermId[];
}

/** Parameters no core checker reads, and that the engine does not run: refused (SHACL-SPARQL §5–§6, SHACL-AF). */
const REFUSED = [
  'sparql',
  'target',
  'rule',
  'condition',
  'expression',
  'targetValidator',
  'validator',
  'nodeValidator',
  'propertyValidator',
];

export interface CompiledGraph {
  /** Shapes that have at least one target (the starting points of validation, SHACL §3.1). */
  targeted: Shape[];
}

/** Compiles every shape reachable from a target or a shape parameter; `label` names the shapes source in errors. */
export function compileShapesGraph(quads: Iterable<Quad>, label: string): CompiledGraph {
  const store = quads instanceof N3.Store ? quads : new N3.Store([...quads] as N3.Quad[]);
  const cache = new Map<string, Shape>();
  const objects = (node: N3.Term, local: string) => store.getObjects(node, sh(local), null);
  const one = (node: N3.Term, local: string): N3.Term | null => objects(node, local)[0] ?? null;
  const fail = (node: N3.Term, message: string, hint: string): never => {
    throw new UserError({ file: label, line: 0, field: ID(node), message, hint });
  };

  /** Whether a shape is itself an rdfs:Class (then it has an implicit class target, SHACL §2.1.3.3). */
  const isClass = (node: N3.Term) => store.getQuads(node, RDF_TYPE, iri('rdfs', 'Class'), null).length > 0;
  const list = (head: N3.Term): N3.Term[] => {
    const items: N3.Term[] = [];
    for (
      let n: N3.Term | null = head;
      n && n.value !== iri('rdf', 'nil');
      n = store.getObjects(n, iri('rdf', 'rest'), null)[0] ?? null
    ) {
      const first = store.getObjects(n, iri('rdf', 'first'), null)[0];
      if (!first)
        fail(
          head,
          'a SHACL list is not well-formed (a node without rdf:first)',
          'check the list syntax ( … ) in the shapes file',
        );
      items.push(first);
      if (items.length > 100_000) fail(head, 'a SHACL list does not end', 'check the list syntax');
    }
    return items;
  };

  const ref = (node: N3.Term): ShapeRef => {
    let resolved: Shape | null = null;
    return { get: () => (resolved ??= compile(node)), id: ID(node) };
  };

  function compile(node: N3.Term): Shape {
    const key = ID(node);
    const known = cache.get(key);
    if (known) return known;
    for (const local of REFUSED) {
      if (objects(node, local).length > 0) {
        fail(
          node,
          `the shape uses sh:${local}, which is not SHACL core: SHACL-SPARQL and SHACL Advanced Features are not run`,
          'express the rule with SHACL core constraints (SHACL §4), e.g. sh:pattern, sh:in, sh:class, sh:qualifiedValueShape',
        );
      }
    }
    const pathNode = one(node, 'path');
    const shape: Shape = {
      id: key,
      path: pathNode ? readPath(store, pathNode) : null,
      severity: one(node, 'severity')?.value ?? sh('Violation'),
      messages: objects(node, 'message').map(ID).sort(),
      deactivated: one(node, 'deactivated')?.value === 'true',
      targets: {
        nodes: objects(node, 'targetNode').map(ID),
        classes: [
          ...objects(node, 'targetClass').map(ID),
          // implicit class target (SHACL §2.1.3.3): the shape is itself an rdfs:Class
          ...(isClass(node) ? [key] : []),
        ],
        subjectsOf: objects(node, 'targetSubjectsOf').map(ID),
        objectsOf: objects(node, 'targetObjectsOf').map(ID),
      },
      checks: [],
    };
    cache.set(key, shape);
    for (const component of COMPONENTS) {
      const values = objects(node, component.parameter);
      for (const value of values) {
        const check = component.compile({
          node,
          value,
          shape,
          one: (local) => one(node, local),
          list,
          ref,
          siblings: () => siblingsOf(node),
          propertyPredicates: () => propertyPredicates(node),
        });
        if (check) shape.checks.push({ component: sh(`${component.name}ConstraintComponent`), check });
      }
    }
    return shape;
  }

  /** sh:qualifiedValueShape values of the sibling property shapes (SHACL §4.7.3, sh:qualifiedValueShapesDisjoint). */
  function siblingsOf(node: N3.Term): ShapeRef[] {
    const out: ShapeRef[] = [];
    for (const parent of store.getSubjects(sh('property'), node, null)) {
      for (const sibling of store.getObjects(parent, sh('property'), null)) {
        if (sibling.equals(node)) continue;
        for (const q of store.getObjects(sibling, sh('qualifiedValueShape'), null)) out.push(ref(q));
      }
    }
    return out;
  }

  /** Predicate paths of a shape's own sh:property shapes. */
  function propertyPredicates(node: N3.Term): string[] {
    return objects(node, 'property').flatMap((p) =>
      objects(p, 'path')
        .filter((t) => t.termType === 'NamedNode')
        .map((t) => t.value),
    );
  }

  const starts = new Map<string, N3.Term>();
  for (const local of ['targetNode', 'targetClass', 'targetSubjectsOf', 'targetObjectsOf']) {
    for (const s of store.getSubjects(sh(local), null, null)) starts.set(ID(s), s);
  }
  for (const type of ['NodeShape', 'PropertyShape']) {
    for (const s of store.getSubjects(RDF_TYPE, sh(type), null)) {
      if (isClass(s)) starts.set(ID(s), s);
      compile(s); // checked for refused parameters even when nothing targets it
    }
  }
  const targeted = [...starts.keys()].sort().map((k) => compile(starts.get(k)!));
  return { targeted };
}
