// Two quad collections → whether they are the same RDF dataset up to blank-node renaming (via rdf-canonize).
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';

/** Minimal view of rdf-canonize (the package ships no types). */
interface Canonize {
  canonize(dataset: Quad[], options: { algorithm: string; maxWorkFactor?: number }): Promise<string>;
}

let api: Promise<Canonize> | null = null;
function canonizer(): Promise<Canonize> {
  const name = 'rdf-canonize';
  api ??= import(name).then((m: { default?: Canonize }) => (m.default ?? m) as Canonize);
  return api;
}

/** Drops duplicate quads (an RDF dataset is a set: RDF 1.1 Concepts §4). */
function distinct(quads: Iterable<Quad>): Quad[] {
  const seen = new Map<string, Quad>();
  const id = (t: Quad['subject'] | Quad['object'] | Quad['graph']) => N3.termToId(t as N3.Term);
  for (const q of quads)
    seen.set(`${id(q.subject)}\u0000${id(q.predicate)}\u0000${id(q.object)}\u0000${id(q.graph)}`, q);
  return [...seen.values()];
}

/**
 * Canonical N-Quads of a dataset (RDF Dataset Canonicalization, RDFC-1.0 §4), given parsed quads so
 * rdf-canonize's own (slow) N-Quads parser is never used. Lines are sorted and unique.
 */
export async function canonicalNQuads(quads: Iterable<Quad>): Promise<string> {
  const { canonize } = await canonizer();
  return canonize(distinct(quads), { algorithm: 'RDFC-1.0', maxWorkFactor: 3 });
}

/** True when the two datasets are isomorphic (RDF 1.1 Concepts §3.6, dataset form §4), by comparing RDFC-1.0 output. */
export async function isomorphic(a: Iterable<Quad>, b: Iterable<Quad>): Promise<boolean> {
  const left = distinct(a);
  const right = distinct(b);
  if (left.length !== right.length) return false;
  const [ca, cb] = await Promise.all([canonicalNQuads(left), canonicalNQuads(right)]);
  return ca === cb;
}
