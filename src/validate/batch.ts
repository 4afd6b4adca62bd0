// A group of spilled buckets → the flat term ids of its data graph (own triples, context, subclass triples) and the
// test for which focus nodes the group owns; read by a worker thread or in-process.
import { bucketOf, eachLine, fileOf, type Triple } from './spill.js';

/** One validation batch: the buckets it owns, out of how many, and where their files are. */
export interface BatchTask {
  dir: string;
  buckets: number;
  owned: number[];
  /** rdfs:subClassOf triples of the whole input (term ids). */
  subclass: Triple[];
}

/** What a batch reads: [s, p, o, g, …] term ids (default graph), the number of distinct own triples, and ownership. */
export interface BatchData {
  ids: string[];
  ownTriples: number;
  owns(node: string): boolean;
}

/**
 * Reads a batch's files: own triples first (counted once each), then context and subclass triples. A predicate's id
 * is kept once however many triples name it, and a subject's once for a run of its triples (the spill writes a
 * subject's triples one after the other): fewer copies of the same text held while the batch is validated.
 */
export function readBatch(task: BatchTask): BatchData {
  const ids: string[] = [];
  const predicates = new Map<string, string>();
  let subject = '';
  const add = (t: Triple) => {
    if (t[0] === subject) t[0] = subject;
    else subject = t[0];
    let p = predicates.get(t[1]);
    if (p === undefined) predicates.set(t[1], (p = t[1]));
    ids.push(t[0], p, t[2], '');
  };
  // a triple's line is the same bytes wherever it was read, and it lies in its subject's bucket only: distinct lines
  // per bucket are distinct triples
  for (const b of task.owned) eachLine<Triple>(fileOf(task.dir, 'own', b), add, true);
  const ownTriples = ids.length / 4;
  for (const b of task.owned) eachLine<Triple>(fileOf(task.dir, 'ctx', b), add);
  for (const t of task.subclass) ids.push(t[0], t[1], t[2], '');
  const owned = new Set(task.owned);
  return { ids, ownTriples, owns: (node) => owned.has(bucketOf(node, task.buckets)) };
}
