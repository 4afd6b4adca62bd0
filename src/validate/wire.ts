// Quads ↔ flat arrays of n3 term ids, and the message types exchanged with validation worker threads.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import type { Problem } from '../errors.js';
import type { BatchTask } from './batch.js';
import type { ResultRow } from './report.js';
import type { ValidateOptions } from './shacl.js';

/** What each worker starts with: the shapes graph and the validation options. */
export interface WorkerInit {
  shapes: string[];
  options: ValidateOptions;
}

/** One batch of data to validate: its term ids as one JSON array text (one string clones far faster than many), or
 *  spilled bucket files the worker reads itself. */
export type WorkerTask = { id: number; quads: string } | { id: number; batch: BatchTask };

/**
 * A worker's answer: rows (and, for a spilled batch, its distinct own triples), a user error's problems, or a bug's
 * stack.
 */
export type WorkerReply =
  | { id: number; rows: ResultRow[]; ownTriples?: number }
  | { id: number; problems: Problem[] }
  | { id: number; error: string };

const ID = N3.termToId as (t: unknown) => string;

/** Quads → [s, p, o, g, s, p, o, g, …] term ids (cheap to clone between threads). */
export function encodeQuads(quads: Iterable<Quad>): string[] {
  const out: string[] = [];
  for (const q of quads) out.push(ID(q.subject), ID(q.predicate), ID(q.object), ID(q.graph));
  return out;
}

/** Inverse of {@link encodeQuads}. */
export function decodeQuads(ids: string[]): N3.Quad[] {
  const out: N3.Quad[] = new Array(ids.length / 4);
  for (let i = 0; i < ids.length; i += 4) {
    out[i / 4] = N3.DataFactory.quad(
      N3.termFromId(ids[i]) as N3.Quad_Subject,
      N3.termFromId(ids[i + 1]) as N3.Quad_Predicate,
      N3.termFromId(ids[i + 2]) as N3.Quad_Object,
      N3.termFromId(ids[i + 3]) as N3.Quad_Graph,
    );
  }
  return out;
}
