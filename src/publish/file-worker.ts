// Worker thread: runs of release text (one per unit and format) → the release's RDF files, fanned out to the whole
// release and each partner slice, written in large blocks, SHA-256-hashed on the way (FIPS 180-4) and, when asked,
// gzip-compressed in the same pass (RFC 1952).
import { parentPort, workerData } from 'node:worker_threads';
import { closeSync, openSync, writeSync } from 'node:fs';
import { once } from 'node:events';
import { createHash, type Hash } from 'node:crypto';
import { createGzip, type Gzip } from 'node:zlib';

/** One dump format as the worker writes it: extension, the text that opens and closes a file, the text between runs. */
export interface DumpFile {
  extension: string;
  head: string;
  tail: string;
  /** Put between two runs of text in one file (JSON-LD: `,\n` between node lists). */
  separator: string;
}

/** What the worker is started with: one target per output stem, the dump formats, and the shared blocks. */
export interface FileWorkerInit {
  /** Per target: [relative path stem (e.g. `partners/a`), absolute path stem]. */
  targets: [string, string][];
  /** The dump formats, in the order of each unit's texts. */
  formats: DumpFile[];
  /** Shared blocks the main thread fills with unit text (see {@link SlabRecords}). */
  slabs: SharedArrayBuffer[];
  /** Extension of a gzip-compressed copy written beside every file (`.gz`), or null for none. */
  gzip: string | null;
}

/**
 * Per unit in a filled slab, in order: the byte length of its text in each format (-1: nothing to write, not even a
 * separator), number of targets, then the target numbers. The bytes themselves follow each other from the slab's start.
 */
export type SlabRecords = number[];

/** One unit's text per format (`null`: nothing to write) and its target numbers. */
export type UnitText = [texts: (string | null)[], targets: number[]];

/** Messages to the worker: a batch of units, or the end. */
export type FileWorkerMessage = { units: UnitText[] } | { slab: number; records: SlabRecords } | { end: true };
/**
 * Replies: a message done (and its slab free again), the files closed with their hashes (relative path → hex), or an
 * error.
 */
export type FileWorkerReply =
  | { ack: true; slab?: number }
  | { hashes: [string, string][] }
  | { error: string; code?: string; syscall?: string; path?: string };

const BLOCK = 1 << 20;

/**
 * A gzip-compressed copy of one file, fed the file's bytes as they are written. Node's zlib writes a header with no
 * file name and MTIME 0 (RFC 1952 §2.3.1: "no time stamp is available"), and deflate's output depends on the bytes
 * alone, not on how they are split into writes, so the copy is byte-identical to compressing the finished file.
 * Compression runs on the libuv thread pool while this thread goes on writing.
 */
class GzipCopy {
  private readonly fd: number;
  private readonly hash: Hash = createHash('sha256');
  private readonly gz: Gzip = createGzip({ chunkSize: 1 << 16 });
  private failure: Error | null = null;
  private readonly ended: Promise<unknown>;
  constructor(
    readonly rel: string,
    file: string,
  ) {
    this.fd = openSync(file, 'w');
    this.gz.on('data', (c: Buffer) => {
      this.hash.update(c);
      for (let off = 0; off < c.length;) off += writeSync(this.fd, c, off, c.length - off);
    });
    this.gz.on('error', (e) => (this.failure ??= e));
    this.ended = once(this.gz, 'end');
  }
  /** Takes a copy of `b` (the caller reuses its buffers). */
  write(b: Buffer): void {
    this.gz.write(Buffer.from(b));
  }
  /** Resolves once what was written so far is compressed (bounds the memory held by pending blocks). */
  async drained(): Promise<void> {
    if (this.failure) throw this.failure;
    if (this.gz.writableNeedDrain) await once(this.gz, 'drain');
  }
  async close(): Promise<[string, string]> {
    this.gz.end();
    await this.ended;
    if (this.failure) throw this.failure;
    closeSync(this.fd);
    return [this.rel, this.hash.digest('hex')];
  }
}

/** One output file: a reused block buffer, written synchronously, hashed, and copied to its gzip stream if any. */
class BlockFile {
  private readonly fd: number;
  private readonly buf = Buffer.allocUnsafeSlow(BLOCK);
  private pos = 0;
  private readonly hash: Hash = createHash('sha256');
  readonly gz: GzipCopy | null;
  constructor(
    readonly rel: string,
    file: string,
    gzip: string | null,
  ) {
    this.fd = openSync(file, 'w');
    this.gz = gzip === null ? null : new GzipCopy(rel + gzip, file + gzip);
  }
  put(b: Buffer): void {
    if (this.pos + b.length > BLOCK) this.flush();
    if (b.length > BLOCK) this.out(b);
    else this.pos += b.copy(this.buf, this.pos);
  }
  private out(b: Buffer): void {
    this.hash.update(b);
    for (let off = 0; off < b.length;) off += writeSync(this.fd, b, off, b.length - off);
    this.gz?.write(b);
  }
  private flush(): void {
    if (this.pos) this.out(this.buf.subarray(0, this.pos));
    this.pos = 0;
  }
  /** Closes the file and its gzip copy; their hashes (relative path → hex). */
  async close(): Promise<[string, string][]> {
    this.flush();
    closeSync(this.fd);
    const own: [string, string] = [this.rel, this.hash.digest('hex')];
    return this.gz ? [own, await this.gz.close()] : [own];
  }
}

/** One output file of one target, and whether a run of text was written to it yet (no separator before the first). */
interface Output {
  file: BlockFile;
  first: boolean;
}

const init = workerData as FileWorkerInit;
const formats = init.formats.map((f) => ({
  head: Buffer.from(f.head, 'utf8'),
  tail: Buffer.from(f.tail, 'utf8'),
  separator: Buffer.from(f.separator, 'utf8'),
}));
const targets: Output[][] = init.targets.map(([rel, abs]) =>
  init.formats.map((f, i) => {
    const file = new BlockFile(`${rel}${f.extension}`, `${abs}${f.extension}`, init.gzip);
    if (formats[i].head.length) file.put(formats[i].head);
    return { file, first: true };
  }),
);

const slabs = init.slabs.map((s) => Buffer.from(s));

function writeSlab(slab: number, records: SlabRecords): void {
  const b = slabs[slab];
  let off = 0;
  const texts: (Buffer | null)[] = new Array(formats.length);
  for (let r = 0; r < records.length;) {
    for (let f = 0; f < formats.length; f++) {
      const len = records[r++];
      texts[f] = len < 0 ? null : b.subarray(off, (off += len));
    }
    const n = records[r++];
    writeBytes(texts, records.slice(r, (r += n)));
  }
}

function writeUnit([texts, to]: UnitText): void {
  writeBytes(
    texts.map((t) => (t === null ? null : Buffer.from(t, 'utf8'))),
    to,
  );
}

function writeBytes(texts: (Buffer | null)[], to: number[]): void {
  for (const i of to) {
    const t = targets[i];
    for (let f = 0; f < texts.length; f++) {
      const text = texts[f];
      if (text === null) continue;
      const out = t[f];
      if (!out.first && formats[f].separator.length) out.file.put(formats[f].separator);
      out.first = false;
      out.file.put(text);
    }
  }
}

async function close(): Promise<[string, string][]> {
  const hashes: [string, string][] = [];
  for (const t of targets)
    for (const [f, out] of t.entries()) {
      if (formats[f].tail.length) out.file.put(formats[f].tail);
      hashes.push(...(await out.file.close()));
    }
  return hashes;
}

/** Waits until every gzip copy has compressed what it was given (a no-op without gzip). */
async function drained(): Promise<void> {
  for (const t of targets) for (const out of t) await out.file.gz?.drained();
}

async function handle(m: FileWorkerMessage): Promise<void> {
  try {
    if ('units' in m) {
      for (const u of m.units) writeUnit(u);
      await drained();
      parentPort!.postMessage({ ack: true } satisfies FileWorkerReply);
    } else if ('slab' in m) {
      writeSlab(m.slab, m.records);
      parentPort!.postMessage({ ack: true, slab: m.slab } satisfies FileWorkerReply);
      await drained();
    } else parentPort!.postMessage({ hashes: await close() } satisfies FileWorkerReply);
  } catch (e) {
    const { code, syscall, path } = (e ?? {}) as NodeJS.ErrnoException; // an OS error keeps its errno for the message
    parentPort!.postMessage({
      error: e instanceof Error ? e.message : String(e),
      code,
      syscall,
      path,
    } satisfies FileWorkerReply);
  }
}

// messages are handled one after the other: a later one waits until the gzip copies have taken the earlier one's bytes
let queue = Promise.resolve();
parentPort!.on('message', (m: FileWorkerMessage) => {
  queue = queue.then(() => handle(m));
});
