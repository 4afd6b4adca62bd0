// Records of shard documents and search postings, appended to spool files by key prefix while the release streams,
// then read back one spool file at a time: the site never holds every link, match or posting at once.
import { closeSync, openSync, readFileSync, writeSync, mkdirSync, existsSync } from 'node:fs';
import path from 'node:path';

const FLUSH = 1 << 16;

/**
 * Append-only files `<dir>/<bucket>`, buffered in memory up to 64 KiB each. A record is its fields' lengths (UTF-16
 * code units, comma-separated, ended by `;`) followed by the fields as they are: nothing is escaped, so the HTML and
 * N-Triples text of a record is written and read back without a JSON round trip.
 */
export class Spool {
  private fds = new Map<string, number>();
  private bufs = new Map<string, string[]>();
  private sizes = new Map<string, number>();
  constructor(private readonly dir: string) {
    mkdirSync(dir, { recursive: true });
  }

  add(bucket: string, record: readonly string[]): void {
    let head = '';
    let size = 0;
    for (let i = 0; i < record.length; i++) {
      head += (i ? ',' : '') + record[i].length;
      size += record[i].length;
    }
    let b = this.bufs.get(bucket);
    if (!b) this.bufs.set(bucket, (b = []));
    b.push(head + ';', ...record);
    const total = (this.sizes.get(bucket) ?? 0) + size + head.length + 1;
    if (total >= FLUSH) this.flush(bucket);
    else this.sizes.set(bucket, total);
  }

  private flush(bucket: string): void {
    const b = this.bufs.get(bucket);
    if (!b?.length) return;
    let fd = this.fds.get(bucket);
    if (fd === undefined) {
      fd = openSync(path.join(this.dir, bucket), 'a');
      this.fds.set(bucket, fd);
    }
    writeSync(fd, b.join(''));
    this.bufs.set(bucket, []);
    this.sizes.set(bucket, 0);
  }

  /** Flushes and closes every file. */
  close(): void {
    for (const k of this.bufs.keys()) this.flush(k);
    for (const fd of this.fds.values()) closeSync(fd);
    this.fds.clear();
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
