// A group of spilled buckets → the flat term ids of its data graph (own triples, context, subclass triples) and the
// test for which focus nodes the group owns; read by a worker thread or in-process.
import { bucketOf, fileOf, readLines, type Triple } from './spill.js';

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

/** Reads a batch's files: own triples first (counted once each), then context and subclass triples. */
export function readBatch(task: BatchTask): BatchData {
  const ids: string[] = [];
  // a triple's line is the same bytes wherever it was read, and it lies in its subject's bucket only: distinct lines
  // per bucket are distinct triples
  for (const b of task.owned)
    for (const t of readLines<Triple>(fileOf(task.dir, 'own', b), true)) ids.push(t[0], t[1], t[2], '');
  const ownTriples = ids.length / 4;
  for (const b of task.owned)
    for (const t of readLines<Triple>(fileOf(task.dir, 'ctx', b))) ids.push(t[0], t[1], t[2], '');
  for (const t of task.subclass) ids.push(t[0], t[1], t[2], '');
  const owned = new Set(task.owned);
  return { ids, ownTriples, owns: (node) => owned.has(bucketOf(node, task.buckets)) };
}
