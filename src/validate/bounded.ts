// Triples pushed one by one + a shapes graph → the whole-graph SHACL outcome in bounded memory: small input validated
// at
// once, large input spilled into hashed buckets each carrying its focus nodes' footprint, batches on worker threads.
import { removeOnSignal } from '../util/interrupt.js';
import { rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import { UserError } from '../errors.js';
import { readBatch, type BatchTask } from './batch.js';
import { Pool } from './pool.js';
import { footprintOf, type Footprint } from './footprint.js';
import { outcomeOf, type ResultRow, type ValidationOutcome } from './report.js';
import { compileShapes, type CompiledShapes, type ValidateOptions } from './shacl.js';
import { Spill, SUBCLASS_LIMIT, type Triple } from './spill.js';
import { makeSpillDir } from './spill-dir.js';
import { encodeQuads } from './wire.js';

/** Options for bounded validation. */
export interface BoundedOptions extends ValidateOptions {
  /** Worker threads (default 2; 0 validates in-process). */
  workers?: number;
  /** Own triples per batch, at most: a bucket holding more is a batch of its own (default 100 000). */
  batchTriples?: number;
  /** Hash buckets the input is spilled into (default: from `expectedTriples`, else 128; see spillBuckets). */
  buckets?: number;
  /**
   * How many triples the input is expected to hold in all, asked once when spilling starts; sets the number of buckets
   * (see spillBuckets) so that a worker's batch stays near `batchTriples` however large the input. Too high an
   * estimate only makes more, smaller buckets (up to MAX_BUCKETS); the outcome is the same for any number.
   */
  expectedTriples?: () => number;
  /** Input of at most this many triples is validated at once without spilling (default: one batch). */
  inMemoryUpTo?: number;
  /** Most triples held at once when the shapes must see the whole graph (default 2M; 400k with rdf-validate-shacl). */
  wholeLimit?: number;
  /** Folder the spill folder is made in (default: the OS temp folder). */
  tempParent?: string;
  /** Names the data in messages (e.g. the files given). */
  dataLabel?: string;
}

/** The outcome, the number of distinct triples validated, and how: at once, or in spilled batches. */
export interface BoundedOutcome extends ValidationOutcome {
  triples: number;
  mode: 'whole' | 'batches';
  /** In mode `batches`: the buckets spilled into and the batches validated. */
  buckets?: number;
  batches?: number;
}

const ID = N3.termToId as (t: unknown) => string;

/**
 * Fewest and most buckets a spill is made with (common practice, no source). Each bucket file buffers up to 64 KiB
 * before it is appended to, so the buffers of 512 buckets hold ≈ 100 MiB at most (measured at 1M works: 1024 buckets
 * held ≈ 0.1 GB more than 128 while the release was written).
 */
export const MIN_BUCKETS = 128;
export const MAX_BUCKETS = 512;

/**
 * Buckets for an input of about `expected` triples: enough that a bucket holds about 80% of `batchTriples` own
 * triples, so a batch is one bucket and no worker is given more than a batch's worth, within MIN_BUCKETS and
 * MAX_BUCKETS. A batch's memory in a worker grows with its triples (≈ 1.3 KB each, measured: a 348k-triple bucket took
 * a worker to 468 MiB, a 100k one to 148 MiB), so at a fixed bucket count it grew with the input.
 */
export function spillBuckets(expected: number, batchTriples: number): number {
  const wanted = Math.ceil((1.25 * expected) / batchTriples);
  return Math.min(MAX_BUCKETS, Math.max(MIN_BUCKETS, Number.isFinite(wanted) ? wanted : MIN_BUCKETS));
}

/** Why the shapes need the whole graph at once, or null when each focus node's footprint is bounded. */
function wholeReason(footprint: Footprint, opts: BoundedOptions): string | null {
  if (footprint.unbounded) return footprint.unbounded;
  if (footprint.nestedFocus && opts.engine === 'rdf-validate-shacl')
    return `${footprint.nestedFocus} nests sh:property in a property shape, whose results rdf-validate-shacl cannot attribute to a batch`;
  return null;
}

/**
 * Validates a data graph given triple by triple (SHACL §3) with exactly the outcome of validating it whole. Above
 * `inMemoryUpTo` triples the input is spilled to a temp folder, bucketed by a hash of the subject, and each bucket is
 * given
 * the context its focus nodes' footprint reaches (see footprint.ts, spill.ts); each batch judges only the focus nodes
 * it
 * owns, so every result is found exactly once. Shapes of unbounded reach are validated whole, up to `wholeLimit`
 * triples,
 * beyond which the input is refused with a UserError naming the limit. The temp folder is removed on every exit.
 */
export class BoundedValidation {
  private readonly footprint: Footprint;
  private readonly whole: string | null;
  private readonly keys = new Set<string>();
  private ids: string[] = [];
  private spill: Spill | null = null;
  private forgetSpill: (() => void) | null = null;
  private dir: string | null = null;
  private refused: UserError | null = null;
  private readonly removeOnExit = () => this.cleanup();
  private readonly compiled: CompiledShapes;

  /** Compiles the shapes at once, so a shapes graph the engine refuses fails before any data is read. */
  constructor(
    private readonly shapes: Quad[],
    private readonly opts: BoundedOptions = {},
  ) {
    this.compiled = compileShapes(shapes, this.options);
    this.footprint = footprintOf(shapes);
    this.whole = wholeReason(this.footprint, opts);
  }

  private get options(): ValidateOptions {
    return { shapesLabel: this.opts.shapesLabel, maxErrors: this.opts.maxErrors, engine: this.opts.engine };
  }

  private get limit(): number {
    return this.opts.wholeLimit ?? (this.opts.engine === 'rdf-validate-shacl' ? 400_000 : 2_000_000);
  }

  /**
   * Adds one triple (named graphs are merged into the data graph, SHACL §1.5). Never throws: a refusal waits for
   * finish().
   */
  add(q: Quad): void {
    if (this.refused) return;
    const t: Triple = [ID(q.subject), ID(q.predicate), ID(q.object)];
    try {
      if (this.spill) return this.spill.add(t);
      const key = `${t[0]}\u0000${t[1]}\u0000${t[2]}`;
      if (this.keys.has(key)) return;
      this.keys.add(key);
      this.ids.push(t[0], t[1], t[2], '');
      if (this.keys.size <= (this.whole ? this.limit : (this.opts.inMemoryUpTo ?? this.target))) return;
      if (this.whole) {
        this.refuse(
          `the shapes must see the whole graph at once (${this.whole}), and the data has more than ${this.limit.toLocaleString('en')} triples, the most validated at once in bounded memory`,
          "validate a smaller part of the data, or bound the shape's reach (e.g. a path of fixed length such as ( ex:p ex:p ) instead of sh:zeroOrMorePath)",
        );
        return;
      }
      this.startSpill();
    } catch (err) {
      if (err instanceof RangeError && err.message === 'subclass')
        this.refuse(
          `the data has more than ${SUBCLASS_LIMIT.toLocaleString('en')} rdfs:subClassOf triples, which every batch needs (SHACL §3.2 SHACL subclass)`,
          'validate the class hierarchy separately from the instance data',
        );
      else throw err;
    }
  }

  private refuse(message: string, hint: string): void {
    this.refused = new UserError({ file: this.opts.dataLabel ?? 'data', line: 0, field: '', message, hint });
    this.ids = [];
    this.keys.clear();
    this.cleanup();
  }

  private startSpill(): void {
    this.dir = makeSpillDir(this.opts.tempParent ?? tmpdir());
    process.once('exit', this.removeOnExit);
    this.forgetSpill = removeOnSignal(this.dir); // SIGINT/SIGTERM: removed and named in the one line printed
    const buckets =
      this.opts.buckets ??
      (this.opts.expectedTriples ? spillBuckets(this.opts.expectedTriples(), this.target) : MIN_BUCKETS);
    this.spill = new Spill(this.dir, buckets, this.footprint);
    for (let i = 0; i < this.ids.length; i += 4) this.spill.add([this.ids[i], this.ids[i + 1], this.ids[i + 2]]);
    this.ids = [];
    this.keys.clear();
  }

  /** Removes the spill folder (idempotent). */
  cleanup(): void {
    if (this.dir) rmSync(this.dir, { recursive: true, force: true });
    this.dir = null;
    this.forgetSpill?.();
    this.forgetSpill = null;
    process.removeListener('exit', this.removeOnExit);
  }

  /** Validates what was added and returns the merged, sorted outcome; the spill folder is removed whatever happens. */
  async finish(): Promise<BoundedOutcome> {
    try {
      if (this.refused) throw this.refused;
      if (!this.spill) {
        const rows = await this.compiled.rowsOfIds(this.ids);
        return { ...outcomeOf(rows), triples: this.keys.size, mode: 'whole' };
      }
      this.spill.gather();
      const { rows, triples, batches } = await this.batches(this.spill);
      return { ...outcomeOf(rows), triples, mode: 'batches', buckets: this.spill.buckets, batches };
    } finally {
      this.cleanup();
    }
  }

  private get target(): number {
    return this.opts.batchTriples ?? 100_000;
  }

  /**
   * Groups consecutive buckets into batches of at most `batchTriples` own triples (a larger bucket alone) and
   * validates each once.
   */
  private async batches(spill: Spill): Promise<{ rows: ResultRow[]; triples: number; batches: number }> {
    const tasks: BatchTask[] = [];
    let owned: number[] = [];
    let size = 0;
    const close = () => {
      if (owned.length) tasks.push({ dir: spill.dir, buckets: spill.buckets, owned, subclass: spill.subclass });
      owned = [];
      size = 0;
    };
    spill.bucketTriples.forEach((n, b) => {
      if (size > 0 && size + n > this.target) close();
      owned.push(b);
      size += n;
    });
    close();
    const rows: ResultRow[] = [];
    let triples = 0;
    const collect = (r: { rows: ResultRow[]; ownTriples?: number }) => {
      for (const row of r.rows) rows.push(row);
      triples += r.ownTriples ?? 0;
    };
    const workers = this.opts.workers ?? 2;
    if (workers === 0) {
      for (const task of tasks) {
        const { ids, ownTriples, owns } = readBatch(task);
        collect({ rows: await this.compiled.rowsOfIds(ids, owns), ownTriples });
      }
      return { rows, triples, batches: tasks.length };
    }
    const pool = new Pool(Math.min(workers, tasks.length), { shapes: encodeQuads(this.shapes), options: this.options });
    try {
      const pending: Promise<void>[] = [];
      let failure: unknown = null;
      for (const task of tasks) {
        const slot = await pool.acquire();
        if (failure) break;
        pending.push(
          pool
            .reply(slot, (id) => ({ id, batch: task }))
            .then(collect, (err) => {
              failure ??= err;
            }),
        );
      }
      await Promise.all(pending);
      if (failure) throw failure;
    } finally {
      await pool.close();
    }
    return { rows, triples, batches: tasks.length };
  }
}
