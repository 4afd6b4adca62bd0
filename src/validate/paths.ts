// SHACL property paths: RDF path structure ↔ plain path tree ↔ SPARQL-style text.
import N3 from 'n3';
import { iri } from '../namespaces.js';

/** A SHACL property path as plain data (SHACL §2.3.1); an IRI string is a predicate path. */
export type PathTree =
  | string
  | { inverse: PathTree }
  | { sequence: PathTree[] }
  | { alternative: PathTree[] }
  | { zeroOrMore: PathTree }
  | { oneOrMore: PathTree }
  | { zeroOrOne: PathTree };

type Unary = 'inverse' | 'zeroOrMore' | 'oneOrMore' | 'zeroOrOne';

/** Path predicate local name → tree key, for the single-valued path kinds (SHACL §2.3.1.3–§2.3.1.7). */
const UNARY: ReadonlyArray<[string, Unary]> = [
  ['inversePath', 'inverse'],
  ['zeroOrMorePath', 'zeroOrMore'],
  ['oneOrMorePath', 'oneOrMore'],
  ['zeroOrOnePath', 'zeroOrOne'],
];

/** SPARQL 1.1 Query §9.1 property-path operators for the unary kinds. */
const UNARY_TEXT: Readonly<Record<Unary, [string, string]>> = {
  inverse: ['^', ''],
  zeroOrMore: ['', '*'],
  oneOrMore: ['', '+'],
  zeroOrOne: ['', '?'],
};

const RDF_FIRST = iri('rdf', 'first');
const RDF_REST = iri('rdf', 'rest');
const RDF_NIL = iri('rdf', 'nil');

function one(store: N3.Store, subject: N3.Term, predicate: string): N3.Term | null {
  const objects = store.getObjects(subject, predicate, null);
  return objects.length > 0 ? objects[0] : null;
}

function readList(store: N3.Store, head: N3.Term): N3.Term[] {
  const items: N3.Term[] = [];
  for (let node: N3.Term | null = head; node && node.value !== RDF_NIL; node = one(store, node, RDF_REST)) {
    const first = one(store, node, RDF_FIRST);
    if (!first || items.length > 10_000) break;
    items.push(first);
  }
  return items;
}

/** Reads the path rooted at `node` from `store` into a {@link PathTree} (SHACL §2.3.1). */
export function readPath(store: N3.Store, node: N3.Term): PathTree {
  if (node.termType === 'NamedNode') return node.value;
  if (one(store, node, RDF_FIRST)) return { sequence: readList(store, node).map((n) => readPath(store, n)) };
  const alt = one(store, node, iri('sh', 'alternativePath'));
  if (alt) return { alternative: readList(store, alt).map((n) => readPath(store, n)) };
  for (const [local, key] of UNARY) {
    const inner = one(store, node, iri('sh', local));
    if (inner) return { [key]: readPath(store, inner) } as PathTree;
  }
  return N3.termToId(node);
}

/** Emits the RDF structure of a path (fresh blank nodes labelled `${label}-p1`, `-p2`, …) and returns its root term. */
export function pathQuads(path: PathTree, label: string, out: N3.Quad[]): N3.Term {
  const { namedNode, blankNode, quad } = N3.DataFactory;
  let counter = 0;
  const fresh = () => blankNode(`${label}-p${++counter}`);
  const list = (items: PathTree[]): N3.Term => {
    if (items.length === 0) return namedNode(RDF_NIL);
    const nodes = items.map(() => fresh());
    nodes.forEach((node, i) => {
      out.push(quad(node, namedNode(RDF_FIRST), emit(items[i]) as N3.Quad_Object));
      out.push(quad(node, namedNode(RDF_REST), i + 1 < nodes.length ? nodes[i + 1] : namedNode(RDF_NIL)));
    });
    return nodes[0];
  };
  const emit = (p: PathTree): N3.Term => {
    if (typeof p === 'string') return N3.termFromId(p);
    if ('sequence' in p) return list(p.sequence);
    const node = fresh();
    if ('alternative' in p) {
      out.push(quad(node, namedNode(iri('sh', 'alternativePath')), list(p.alternative) as N3.Quad_Object));
      return node;
    }
    const [local, key] = UNARY.find(([, k]) => k in p)!;
    out.push(quad(node, namedNode(iri('sh', local)), emit((p as Record<Unary, PathTree>)[key]) as N3.Quad_Object));
    return node;
  };
  return emit(path);
}

/** Renders a path in SPARQL 1.1 property-path syntax (Query §9.1), IRIs shown by `show`. */
export function pathText(path: PathTree, show: (iriOrId: string) => string): string {
  if (typeof path === 'string') return show(path);
  if ('sequence' in path) return `(${path.sequence.map((p) => pathText(p, show)).join('/')})`;
  if ('alternative' in path) return `(${path.alternative.map((p) => pathText(p, show)).join('|')})`;
  const key = (Object.keys(UNARY_TEXT) as Unary[]).find((k) => k in path)!;
  const [before, after] = UNARY_TEXT[key];
  return `${before}${pathText((path as Record<Unary, PathTree>)[key], show)}${after}`;
}

/** The inverse of a path (SHACL §2.3.1.3 applied to a complex path). */
export function flipPath(p: PathTree): PathTree {
  if (typeof p === 'string') return { inverse: p };
  if ('inverse' in p) return p.inverse;
  if ('sequence' in p) return { sequence: [...p.sequence].reverse().map(flipPath) };
  if ('alternative' in p) return { alternative: p.alternative.map(flipPath) };
  if ('zeroOrOne' in p) return { zeroOrOne: flipPath(p.zeroOrOne) };
  if ('zeroOrMore' in p) return { zeroOrMore: flipPath(p.zeroOrMore) };
  return { oneOrMore: flipPath(p.oneOrMore) };
}
