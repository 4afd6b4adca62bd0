// A stream of self-contained quad chunks (a cluster with its links, evidence and provenance) → one merged
// SHACL outcome, validated in batches on worker threads so memory stays flat.
import { Worker } from 'node:worker_threads';
import type { Quad } from '@rdfjs/types';
import { UserError } from '../errors.js';
import { compileShapes, type ValidateOptions } from './shacl.js';
import { outcomeOf, RowMerger, type ResultRow, type ValidationOutcome } from './report.js';
import { encodeQuads, type WorkerInit, type WorkerReply, type WorkerTask } from './wire.js';

export { writeValidationReport } from './report.js';

/** Options for chunked validation. */
export interface ChunkedOptions extends ValidateOptions {
  /** Worker threads (default 2; 0 validates in-process). */
  workers?: number;
  /** Chunks are gathered into batches of at least this many quads (default 20 000). Input smaller than
   *  one batch is validated in-process, since starting workers would cost more than it saves. */
  batchQuads?: number;
}

interface Slot {
  worker: Worker;
  settle?: (reply: WorkerReply | Error) => void;
}

/** A fixed set of workers, each validating one batch at a time. */
export class Pool {
  private readonly slots: Slot[] = [];
  private readonly free: Slot[] = [];
  private readonly waiting: Array<(slot: Slot) => void> = [];
  private nextId = 0;

  constructor(size: number, init: WorkerInit) {
    for (let i = 0; i < size; i++) {
      const slot: Slot = { worker: new Worker(new URL('./worker.js', import.meta.url), { workerData: init, resourceLimits: { maxYoungGenerationSizeMb: 16, maxOldGenerationSizeMb: 1024 } }) };
      slot.worker.on('message', (reply: WorkerReply) => slot.settle?.(reply));
      slot.worker.on('error', (err) => slot.settle?.(err));
      slot.worker.on('exit', (code) => slot.settle?.(new Error(`validation worker exited with code ${code}`)));
      this.slots.push(slot);
      this.free.push(slot);
    }
  }

  /** Resolves with a free worker (waits while all are busy, which throttles the reader). */
  acquire(): Promise<Slot> {
    const slot = this.free.pop();
    return slot ? Promise.resolve(slot) : new Promise((resolve) => this.waiting.push(resolve));
  }

  /** Runs one batch on an acquired worker and frees it afterwards. */
  run(slot: Slot, quads: string): Promise<ResultRow[]> {
    return this.reply(slot, (id) => ({ id, quads })).then((r) => r.rows);
  }

  /** Sends one task on an acquired worker, frees it afterwards and resolves with its rows. */
  reply(slot: Slot, task: (id: number) => WorkerTask): Promise<{ rows: ResultRow[]; ownTriples?: number }> {
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      slot.settle = (reply) => {
        slot.settle = undefined;
        const next = this.waiting.shift();
        if (next) next(slot);
        else this.free.push(slot);
        if (reply instanceof Error) reject(reply);
        else if ('rows' in reply && reply.id === id) resolve(reply);
        else if ('problems' in reply) reject(new UserError(reply.problems));
        else reject(new Error('error' in reply ? reply.error : 'validation worker answered out of turn'));
      };
      slot.worker.postMessage(task(id));
    });
  }

  async close(): Promise<void> {
    for (const slot of this.slots) slot.settle = undefined;
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }
}

/**
 * Validates chunks of a data graph (SHACL §3) and merges their results into one outcome. Each chunk must carry
 * everything its shapes look at (typed copies of the nodes it points to, so sh:class resolves). Chunks are
 * gathered into batches and sent to `workers` threads; results are merged (see RowMerger) and sorted, so the
 * outcome does not depend on thread timing.
 */
/**
 * A chunk to validate: its own quads, plus context quads (e.g. rdf:type copies of shared nodes it points to) that let
 * sh:class checks resolve. Results whose focus node is described only by context are dropped: that node is validated
 * in full in the chunk that owns it.
 */
export interface ValidationChunk {
  quads: Quad[];
  context?: Quad[];
}

/** Drops rows about nodes a batch holds only as context. */
function ownRows(rows: ResultRow[], foreign: Set<string>): ResultRow[] {
  return foreign.size ? rows.filter((r) => !foreign.has(r.focusNode)) : rows;
}

export async function validateChunks(
  chunks: Iterable<Quad[] | ValidationChunk> | AsyncIterable<Quad[] | ValidationChunk>,
  shapes: Quad[],
  opts: ChunkedOptions = {},
): Promise<ValidationOutcome> {
  const workers = opts.workers ?? 2;
  const batchQuads = opts.batchQuads ?? 20_000;
  const options = { shapesLabel: opts.shapesLabel, maxErrors: opts.maxErrors, engine: opts.engine };
  const merger = new RowMerger();
  let pool: Pool | null = null;
  const pending: Promise<void>[] = [];
  let failure: unknown = null;
  let batch: Quad[] = [];
  let owned = new Set<string>();
  let contextSubjects = new Set<string>();
  const foreignOf = () => new Set([...contextSubjects].filter((x) => !owned.has(x)));

  let local: ReturnType<typeof compileShapes> | null = null;
  const inProcess = async (quads: Quad[], foreign: Set<string>) => merger.add(ownRows(await (local ??= compileShapes(shapes, options)).rows(quads), foreign));
  const dispatch = async (quads: Quad[], foreign: Set<string>) => {
    if (workers === 0) return inProcess(quads, foreign);
    pool ??= new Pool(workers, { shapes: encodeQuads(shapes), options });
    const slot = await pool.acquire();
    if (failure) return;
    pending.push(pool.run(slot, JSON.stringify(encodeQuads(quads))).then((rows) => merger.add(ownRows(rows, foreign)), (err) => { failure ??= err; }));
  };

  try {
    for await (const chunk of chunks) {
      const { quads, context = [] } = Array.isArray(chunk) ? { quads: chunk } : chunk;
      // quads come grouped by subject: a set operation only when the subject changes
      let last = '';
      for (const q of quads) {
        batch.push(q);
        if (q.subject.value !== last) owned.add((last = q.subject.value));
      }
      for (const q of context) { batch.push(q); contextSubjects.add(q.subject.value); }
      if (batch.length >= batchQuads) {
        await dispatch(batch, foreignOf());
        batch = [];
        owned = new Set();
        contextSubjects = new Set();
        if (failure) break;
      }
    }
    if (!failure && batch.length > 0) await (pool ? dispatch(batch, foreignOf()) : inProcess(batch, foreignOf()));
    await Promise.all(pending);
  } finally {
    await (pool as Pool | null)?.close();
  }
  if (failure) throw failure;
  return outcomeOf(merger);
}
