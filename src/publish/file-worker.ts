// Worker thread: runs of release text (one per unit and format) → the release's RDF files, fanned out to the whole
// release and each partner slice, written in large blocks and SHA-256-hashed on the way (FIPS 180-4).
import { parentPort, workerData } from 'node:worker_threads';
import { closeSync, openSync, writeSync } from 'node:fs';
import { createHash, type Hash } from 'node:crypto';

/** What the worker is started with: one target per output stem, and the text that opens/closes each format. */
export interface FileWorkerInit {
  /** Per target: [relative path stem (e.g. `partners/a`), absolute path stem]. */
  targets: [string, string][];
  ttlHead: string;
  jsonHead: string;
  jsonTail: string;
  /** Shared blocks the main thread fills with unit text (see {@link SlabRecords}). */
  slabs: SharedArrayBuffer[];
}

/**
 * Per unit in a filled slab, in order: Turtle byte length, N-Quads byte length, JSON-LD byte length (-1: no nodes),
 * number of targets, then the target numbers. The bytes themselves follow each other from the slab's start.
 */
export type SlabRecords = number[];

/** One unit's text: Turtle, N-Quads and JSON-LD node run (`null` when it has no nodes), and its target numbers. */
export type UnitText = [ttl: string, nq: string, json: string | null, targets: number[]];

/** Messages to the worker: a batch of units, or the end. */
export type FileWorkerMessage = { units: UnitText[] } | { slab: number; records: SlabRecords } | { end: true };
/** Replies: a message done (and its slab free again), the files closed with their hashes (relative path → hex), or an error. */
export type FileWorkerReply = { ack: true; slab?: number } | { hashes: [string, string][] } | { error: string; code?: string; syscall?: string; path?: string };

const BLOCK = 1 << 20;

/** One output file: a reused block buffer, written synchronously (this thread does nothing else) and hashed. */
class BlockFile {
  private readonly fd: number;
  private readonly buf = Buffer.allocUnsafeSlow(BLOCK);
  private pos = 0;
  private readonly hash: Hash = createHash('sha256');
  constructor(readonly rel: string, file: string) {
    this.fd = openSync(file, 'w');
  }
  put(b: Buffer): void {
    if (this.pos + b.length > BLOCK) this.flush();
    if (b.length > BLOCK) this.out(b);
    else this.pos += b.copy(this.buf, this.pos);
  }
  private out(b: Buffer): void {
    this.hash.update(b);
    for (let off = 0; off < b.length; ) off += writeSync(this.fd, b, off, b.length - off);
  }
  private flush(): void {
    if (this.pos) this.out(this.buf.subarray(0, this.pos));
    this.pos = 0;
  }
  close(): [string, string] {
    this.flush();
    closeSync(this.fd);
    return [this.rel, this.hash.digest('hex')];
  }
}

interface Target {
  ttl: BlockFile;
  nq: BlockFile;
  json: BlockFile;
  /** No JSON-LD node written yet (no separator before the next run). */
  jsonFirst: boolean;
}

const init = workerData as FileWorkerInit;
const SEPARATOR = Buffer.from(',\n');
const targets: Target[] = init.targets.map(([rel, abs]) => {
  const t: Target = { ttl: new BlockFile(`${rel}.ttl`, `${abs}.ttl`), nq: new BlockFile(`${rel}.nq`, `${abs}.nq`), json: new BlockFile(`${rel}.jsonld`, `${abs}.jsonld`), jsonFirst: true };
  t.ttl.put(Buffer.from(init.ttlHead, 'utf8'));
  t.json.put(Buffer.from(init.jsonHead, 'utf8'));
  return t;
});

const slabs = init.slabs.map((s) => Buffer.from(s));

function writeSlab(slab: number, records: SlabRecords): void {
  const b = slabs[slab];
  let off = 0;
  for (let r = 0; r < records.length; ) {
    const lt = records[r++], ln = records[r++], lj = records[r++], n = records[r++];
    const ttl = b.subarray(off, (off += lt));
    const nq = b.subarray(off, (off += ln));
    const json = lj < 0 ? null : b.subarray(off, (off += lj));
    writeBytes(ttl, nq, json, records.slice(r, (r += n)));
  }
}

function writeUnit([ttl, nq, json, to]: UnitText): void {
  writeBytes(Buffer.from(ttl, 'utf8'), Buffer.from(nq, 'utf8'), json === null ? null : Buffer.from(json, 'utf8'), to);
}

function writeBytes(ttl: Buffer, nq: Buffer, json: Buffer | null, to: number[]): void {
  for (const i of to) {
    const t = targets[i];
    t.ttl.put(ttl);
    t.nq.put(nq);
    if (json) {
      if (!t.jsonFirst) t.json.put(SEPARATOR);
      t.jsonFirst = false;
      t.json.put(json);
    }
  }
}

function close(): [string, string][] {
  const tail = Buffer.from(init.jsonTail, 'utf8');
  const hashes: [string, string][] = [];
  for (const t of targets) {
    t.json.put(tail);
    hashes.push(t.ttl.close(), t.nq.close(), t.json.close());
  }
  return hashes;
}

parentPort!.on('message', (m: FileWorkerMessage) => {
  try {
    if ('units' in m) {
      for (const u of m.units) writeUnit(u);
      parentPort!.postMessage({ ack: true } satisfies FileWorkerReply);
    } else if ('slab' in m) {
      writeSlab(m.slab, m.records);
      parentPort!.postMessage({ ack: true, slab: m.slab } satisfies FileWorkerReply);
    } else parentPort!.postMessage({ hashes: close() } satisfies FileWorkerReply);
  } catch (e) {
    const { code, syscall, path } = (e ?? {}) as NodeJS.ErrnoException; // an OS error keeps its errno for the message
    parentPort!.postMessage({ error: e instanceof Error ? e.message : String(e), code, syscall, path } satisfies FileWorkerReply);
  }
});
