// Records of shard documents and search postings, appended to spool files by key prefix while the release streams,
// then read back one spool file at a time: the site never holds every link, match or posting at once.
import { closeSync, openSync, readFileSync, writeSync, mkdirSync, existsSync } from 'node:fs';
import path from 'node:path';

/** Bytes buffered per spool file before it is appended to disk. */
const FLUSH = 1 << 16;

interface Bucket {
  buf: Buffer;
  used: number;
  fd?: number;
}

/**
 * Append-only files `<dir>/<bucket>`, buffered up to 64 KiB each. A record is its fields' lengths (UTF-16 code units,
 * comma-separated, ended by `;`) followed by the fields as they are: nothing is escaped, so the HTML and N-Triples text
 * of a record is written and read back without a JSON round trip. Records are encoded into the bucket's bytes at once:
 * a buffered string would keep alive the whole chunk of the release it was sliced from until the bucket is flushed.
 */
export class Spool {
  private buckets = new Map<string, Bucket>();
  constructor(private readonly dir: string) {
    mkdirSync(dir, { recursive: true });
  }

  add(bucket: string, record: readonly string[]): void {
    let head = '';
    let worst = 0;
    for (let i = 0; i < record.length; i++) {
      head += (i ? ',' : '') + record[i].length;
      worst += record[i].length * 3; // UTF-8 bytes per UTF-16 code unit, at most
    }
    head += ';';
    worst += head.length;
    let b = this.buckets.get(bucket);
    if (!b) this.buckets.set(bucket, (b = { buf: Buffer.allocUnsafe(FLUSH), used: 0 }));
    if (b.used + worst > FLUSH) this.flush(bucket, b);
    if (worst > FLUSH) {
      // a record larger than the buffer goes straight to the file
      writeSync(this.fd(bucket, b), head + record.join(''));
      return;
    }
    b.used += b.buf.write(head, b.used);
    for (const field of record) b.used += b.buf.write(field, b.used);
  }

  private fd(bucket: string, b: Bucket): number {
    return (b.fd ??= openSync(path.join(this.dir, bucket), 'a'));
  }

  private flush(bucket: string, b: Bucket): void {
    if (!b.used) return;
    const fd = this.fd(bucket, b);
    let at = 0;
    while (at < b.used) at += writeSync(fd, b.buf, at, b.used - at);
    b.used = 0;
  }

  /** Flushes and closes every file. */
  close(): void {
    for (const [k, b] of this.buckets) {
      this.flush(k, b);
      if (b.fd !== undefined) closeSync(b.fd);
      b.fd = undefined;
    }
  }

  /** The records of one bucket (none if it was never written). */
  read(bucket: string): string[][] {
    const f = path.join(this.dir, bucket);
    if (!existsSync(f)) return [];
    const text = readFileSync(f, 'utf8');
    const out: string[][] = [];
    let i = 0;
    while (i < text.length) {
      const semi = text.indexOf(';', i);
      if (semi < 0) throw new Error(`site: spool file ${f} is cut short`);
      const lengths = text.slice(i, semi).split(',').map(Number);
      i = semi + 1;
      const rec: string[] = [];
      for (const n of lengths) {
        rec.push(text.slice(i, i + n));
        i += n;
      }
      if (i > text.length) throw new Error(`site: spool file ${f} is cut short`);
      out.push(rec);
    }
    return out;
  }
}
