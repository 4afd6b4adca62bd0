// A stream of triples + a footprint → bucket files in a temp folder: each bucket's own triples (subjects hashed to it)
// and the context its focus nodes' footprint reaches, gathered hop by hop through request files (an external join).
import { appendFileSync, readFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import { iri } from '../namespaces.js';
import type { Footprint } from './footprint.js';
import { isLiteral } from './engine/terms.js';

/** A triple as three n3 term ids. */
export type Triple = [string, string, string];

const SUBCLASS_OF = iri('rdfs', 'subClassOf');
/** Bytes buffered per file before it is appended to (common practice, no source). */
const FLUSH_BYTES = 1 << 16;

/** FNV-1a 32-bit over UTF-16 code units (FNV, IETF draft-eastlake-fnv §2): a node id → its bucket. */
export function bucketOf(id: string, buckets: number): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < id.length; i++) {
    h ^= id.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0) % buckets;
}

/** File kinds of one bucket: own triples, context triples, own triples looked up beyond level 0 (by subject) and
 *  triples pointing at its nodes (by object, for inverse paths), requests of round k. */
export type FileKind = 'own' | 'ctx' | 'look' | 'inv' | `req${number}`;
export const fileOf = (dir: string, kind: FileKind, bucket: number) => join(dir, `${kind}-${bucket}.jsonl`);

/** Appends JSON lines to many files through per-file buffers. */
class Appender {
  private readonly buffers = new Map<string, string[]>();
  private readonly sizes = new Map<string, number>();
  write(file: string, line: string): void {
    let buffer = this.buffers.get(file);
    if (!buffer) this.buffers.set(file, (buffer = []));
    buffer.push(line);
    const size = (this.sizes.get(file) ?? 0) + line.length;
    if (size > FLUSH_BYTES) this.flushOne(file);
    else this.sizes.set(file, size);
  }
  private flushOne(file: string): void {
    const buffer = this.buffers.get(file);
    if (buffer?.length) appendFileSync(file, buffer.join(''));
    this.buffers.set(file, []);
    this.sizes.set(file, 0);
  }
  flush(): void {
    for (const file of this.buffers.keys()) this.flushOne(file);
  }
}

/**
 * Passes each line of a JSON-lines file written by {@link Appender} (each line an array) to `fn`, parsed, in file
 * order; a missing file has none. With `distinct`, a repeated line is passed once. Lines are parsed one at a time, so
 * besides the file's text only the current line's values are held (parsing the whole file as one array held the text
 * three times over and every line's array at once).
 */
export function eachLine<T>(file: string, fn: (value: T) => void, distinct = false): void {
  if (!existsSync(file)) return;
  const text = readFileSync(file, 'utf8');
  const seen = distinct ? new Set<string>() : null;
  // raw newlines only separate lines: JSON escapes those inside strings
  for (let start = 0; start < text.length;) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const line = text.slice(start, end);
    start = end + 1;
    if (seen) {
      if (seen.has(line)) continue;
      seen.add(line);
    }
    fn(JSON.parse(line) as T);
  }
}

/** The lines of a JSON-lines file as an array (see {@link eachLine}). */
export function readLines<T>(file: string, distinct = false): T[] {
  const out: T[] = [];
  eachLine<T>(file, (value) => out.push(value), distinct);
  return out;
}

/** Requests remembered to skip repeats (common practice, no source: a bounded set, cleared when full). */
const RECENT_REQUESTS = 50_000;

/** Limits that bound memory; exceeding one is refused with a message naming it. */
export const SUBCLASS_LIMIT = 100_000;

/**
 * Spills triples into `buckets` bucket files under `dir` (SHACL §3: a focus node's results depend only on the data its
 * shapes read, so a bucket holding its focus nodes' footprint validates them exactly as the whole graph would).
 */
export class Spill {
  private readonly out = new Appender();
  /** rdfs:subClassOf triples, given to every batch (SHACL §3.2 "SHACL subclass" reads them anywhere in the graph). */
  readonly subclass: Triple[] = [];
  readonly bucketTriples: number[];
  private readonly deeperIn: Set<string>;
  private readonly deeperOut: Set<string> | 'all';
  private readonly paths = new Map<FileKind, string[]>();
  constructor(
    readonly dir: string,
    readonly buckets: number,
    readonly footprint: Footprint,
  ) {
    this.bucketTriples = new Array<number>(buckets).fill(0);
    const deeper = footprint.levels.slice(1);
    this.deeperIn = new Set(deeper.flatMap((l) => [...l.in]));
    this.deeperOut = deeper.some((l) => l.all) ? 'all' : new Set(deeper.flatMap((l) => [...l.out]));
  }

  /** The file of a kind and bucket (names made once). */
  private file(kind: FileKind, bucket: number): string {
    let names = this.paths.get(kind);
    if (!names)
      this.paths.set(kind, (names = Array.from({ length: this.buckets }, (_, b) => fileOf(this.dir, kind, b))));
    return names[bucket];
  }

  /**
   * Files one triple: to its subject's bucket, as context of its object's bucket where level 0 reads it, and as
   * requests.
   */
  add(t: Triple): void {
    const [s, p, o] = t;
    const line = JSON.stringify(t) + '\n';
    const bs = bucketOf(s, this.buckets);
    this.out.write(this.file('own', bs), line);
    this.bucketTriples[bs]++;
    if (this.deeperOut !== 'all' && this.deeperOut.has(p)) this.out.write(this.file('look', bs), line);
    const l0 = this.footprint.levels[0];
    const bo =
      l0.in.has(p) || this.footprint.objectsOf.has(p) || this.deeperIn.has(p) || l0.inv.has(p) || l0.fwd.has(p)
        ? bucketOf(o, this.buckets)
        : -1;
    if (l0.in.has(p) || this.footprint.objectsOf.has(p)) this.out.write(this.file('ctx', bo), line);
    if (this.deeperIn.has(p)) this.out.write(this.file('inv', bo), line);
    if (l0.fwd.has(p) && this.leadsTo(1, o)) this.request(1, o, bo, bs);
    if (l0.inv.has(p)) this.request(1, s, bs, bo);
    if (p === SUBCLASS_OF) {
      if (this.subclass.length >= SUBCLASS_LIMIT) throw new RangeError('subclass');
      this.subclass.push(t);
    }
  }

  /** Recent requests, to write a shared node's request (a run every link points to) once per batch of requests. */
  private recent = new Set<string>();

  /** Asks bucket `holder` to send what level `depth` reads of `node` to bucket `to`. */
  private request(depth: number, node: string, holder: number, to: number): void {
    const line = JSON.stringify([node, to]) + '\n';
    const key = depth + line;
    if (this.recent.has(key)) return;
    if (this.recent.size >= RECENT_REQUESTS) this.recent = new Set();
    this.recent.add(key);
    this.out.write(this.file(`req${depth}`, holder), line);
  }

  /** Whether a node reached at `depth` can have anything read there (a literal has no triples of its own). */
  private leadsTo(depth: number, node: string): boolean {
    const l = this.footprint.levels[depth];
    return l !== undefined && (!isLiteral(node) || l.in.size > 0);
  }

  /**
   * Answers the requests of every round (SHACL §2.3.1 paths followed hop by hop): each bucket in turn indexes its own
   * triples and the triples pointing at its nodes, and sends the triples each requested node has at that level to the
   * requesting bucket's context, with requests for the next hop.
   */
  gather(): void {
    this.out.flush();
    const levels = this.footprint.levels;
    for (let k = 1; k < levels.length; k++) {
      const level = levels[k];
      for (let c = 0; c < this.buckets; c++) {
        const requests = readLines<[string, number]>(this.file(`req${k}`, c));
        if (requests.length === 0) continue;
        const bySubject = new Map<string, Triple[]>();
        const byObject = new Map<string, Triple[]>();
        eachLine<Triple>(this.file(this.deeperOut === 'all' ? 'own' : 'look', c), (t) => push(bySubject, t[0], t));
        if (level.in.size > 0) eachLine<Triple>(this.file('inv', c), (t) => push(byObject, t[2], t));
        const answered = new Set<string>();
        for (const [n, b] of requests) {
          const key = `${b} ${n}`;
          if (answered.has(key)) continue;
          answered.add(key);
          for (const t of bySubject.get(n) ?? []) {
            if (!level.all && !level.out.has(t[1])) continue;
            this.out.write(this.file('ctx', b), JSON.stringify(t) + '\n');
            if (level.fwd.has(t[1]) && this.leadsTo(k + 1, t[2]))
              this.request(k + 1, t[2], bucketOf(t[2], this.buckets), b);
          }
          for (const t of byObject.get(n) ?? []) {
            if (!level.in.has(t[1])) continue;
            this.out.write(this.file('ctx', b), JSON.stringify(t) + '\n');
            if (level.inv.has(t[1])) this.request(k + 1, t[0], bucketOf(t[0], this.buckets), b);
          }
        }
      }
      this.out.flush();
    }
  }
}

function push<T>(map: Map<string, T[]>, key: string, value: T): void {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
}
