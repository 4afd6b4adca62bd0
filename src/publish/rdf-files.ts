// Units of quads → the release's RDF files (whole and per partner, Turtle / N-Quads / JSON-LD).
import { mkdirSync } from 'node:fs';
import { Worker } from 'node:worker_threads';
import { performance } from 'node:perf_hooks';
import path from 'node:path';
import { TurtleEncoder, nquadsText, turtlePrefixes } from '../rdf/text.js';
import {
  COMPRESSIONS,
  DUMP_FORMATS,
  FORMATS,
  prefixMap,
  type Compression,
  type FormatInfo,
  type WriterKind,
} from '../rdf/formats.js';
import type { Unit } from '../rdf/index.js';
import { JsonLdFile, unitText } from './jsonld.js';
import type { DumpFile, FileWorkerInit, FileWorkerMessage, FileWorkerReply, SlabRecords } from './file-worker.js';
import { Replies } from '../util/replies.js';

/**
 * Shared blocks the unit text is written into for the file worker: size and count (the count bounds what is in flight).
 */
const SLAB = 8 << 20;
const SLABS = 4;

/**
 * A dump format's encoder: the file's opening and closing text, the text between runs, and one unit's text (null:
 * none).
 */
interface DumpEncoder extends Omit<DumpFile, 'extension'> {
  encode(unit: Unit): string | null;
}

/** Writer kind of the format table → its encoder over units (every kind the table names has one). */
const ENCODERS: Record<WriterKind, (info: FormatInfo, prefixes: Record<string, string>) => DumpEncoder> = {
  turtle: (_, prefixes) => {
    const turtle = new TurtleEncoder(prefixes);
    return { head: turtlePrefixes(prefixes), tail: '', separator: '', encode: (u) => turtle.encode(u.quads) };
  },
  nquads: (info) => ({ head: '', tail: '', separator: '', encode: (u) => nquadsText(u.quads, info.graphs) }),
  jsonld: () => ({
    head: JsonLdFile.head,
    tail: JsonLdFile.tail,
    separator: ',\n',
    encode: unitText,
  }),
};

/**
 * The release's RDF writers: `concordance.*` and `partners/<key>.*`. Each unit is turned into Turtle, N-Quads and
 * JSON-LD text once on this thread and its UTF-8 bytes put into a shared block; a worker thread (file-worker.ts)
 * copies them to the whole release and to the slice of every partner the unit touches, hashing each file as it goes
 * and, with a compression, writing each file's compressed copy in the same pass.
 */
export class ReleaseWriter {
  private encoders: DumpEncoder[];
  private worker: Worker;
  private slabs: Buffer[];
  private free: number[];
  /** The block being filled (-1: none), its write position and its unit records. */
  private cur = -1;
  private pos = 0;
  private records: SlabRecords = [];
  private inFlight = 0;
  private readonly replies = new Replies();
  private hashes: Map<string, string> | undefined;
  private readonly all: number[];
  triples = 0;
  /** Milliseconds spent making each dump format's text (in {@link DUMP_FORMATS} order), for the bench. */
  readonly encodeMs: number[] = DUMP_FORMATS.map(() => 0);
  /** Whether units are also copied to per-partner slices. */
  private readonly slices: boolean;
  /**
   * `partnerKeys` null: only the whole release is written (project setting release.partnerDumps false);
   * `compression`: also a compressed copy of every file (project setting release.compress).
   */
  constructor(
    dir: string,
    partnerKeys: string[] | null,
    compression: Compression | null = null,
    prefixes: Record<string, string> = prefixMap(),
  ) {
    this.slices = partnerKeys !== null;
    if (partnerKeys) mkdirSync(path.join(dir, 'partners'), { recursive: true });
    this.encoders = DUMP_FORMATS.map((f) => ENCODERS[FORMATS[f].writer!](FORMATS[f], prefixes));
    const stems = ['concordance', ...(partnerKeys ?? []).map((k) => `partners/${k}`)];
    const shared = Array.from({ length: SLABS }, () => new SharedArrayBuffer(SLAB));
    this.slabs = shared.map((s) => Buffer.from(s));
    this.free = shared.map((_, i) => i);
    const init: FileWorkerInit = {
      targets: stems.map((s) => [s, path.join(dir, ...s.split('/'))]),
      formats: DUMP_FORMATS.map((f, i) => ({
        extension: FORMATS[f].extension,
        head: this.encoders[i].head,
        tail: this.encoders[i].tail,
        separator: this.encoders[i].separator,
      })),
      slabs: shared,
      gzip: compression === 'gzip' ? COMPRESSIONS.gzip.extension : null,
    };
    this.all = stems.map((_, i) => i);
    this.worker = new Worker(new URL('./file-worker.js', import.meta.url), { workerData: init });
    this.worker.on('message', (r: FileWorkerReply) => {
      if ('ack' in r) {
        this.inFlight--;
        if (r.slab !== undefined) this.free.push(r.slab);
      } else if ('hashes' in r) this.hashes = new Map(r.hashes);
      else
        this.replies.fail(
          Object.assign(new Error(`writing the release files: ${r.error}`), {
            code: r.code,
            syscall: r.syscall,
            path: r.path,
          }),
        );
      this.replies.wake();
    });
    this.worker.on('error', (e) => this.replies.fail(e));
    this.worker.on('exit', (code) => this.replies.fail(new Error(`release file writer stopped (exit code ${code})`)));
  }
  private send(m: FileWorkerMessage) {
    this.worker.postMessage(m);
    this.inFlight++;
  }
  /** Hands the block being filled to the worker. */
  private post() {
    if (this.cur < 0) return;
    this.send({ slab: this.cur, records: this.records });
    this.cur = -1;
    this.pos = 0;
    this.records = [];
  }
  async add(unit: Unit): Promise<void> {
    this.triples += unit.quads.length;
    const texts = this.encoders.map((e, i) => {
      const t0 = performance.now();
      const text = e.encode(unit);
      this.encodeMs[i] += performance.now() - t0;
      return text;
    });
    const to =
      unit.partners === 'all' || !this.slices
        ? this.all
        : [0, ...[...unit.partners].sort((a, b) => a - b).map((p) => p + 1)];
    // at most 3 UTF-8 bytes per UTF-16 code unit
    let bound = 0;
    for (const t of texts) bound += 3 * (t?.length ?? 0);
    if (this.pos + bound > SLAB) this.post();
    if (bound > SLAB) {
      this.send({ units: [[texts, to]] });
      return this.replies.until(() => this.inFlight < SLABS);
    }
    if (this.cur < 0) {
      await this.replies.until(() => this.free.length > 0);
      this.cur = this.free.shift()!;
    }
    const b = this.slabs[this.cur];
    for (const t of texts) {
      const len = t === null ? -1 : b.write(t, this.pos);
      this.pos += Math.max(len, 0);
      this.records.push(len);
    }
    this.records.push(to.length, ...to);
  }
  /** Writes what is left, closes every file and returns their SHA-256 hashes (path relative to the release → hex). */
  async close(): Promise<Map<string, string>> {
    this.post();
    await this.replies.until(() => this.inFlight === 0);
    this.worker.postMessage({ end: true } satisfies FileWorkerMessage);
    await this.replies.until(() => this.hashes !== undefined);
    await this.abort();
    return this.hashes!;
  }
  /** Stops the worker (files are left as they are; the release folder is temporary until the build succeeds). */
  async abort(): Promise<void> {
    this.worker.removeAllListeners('exit');
    await this.worker.terminate();
  }
}
