// Records of shard documents and search postings, appended to spool files by key prefix while the release streams,
// then read back one spool file at a time: the site never holds every link, match or posting at once.
import { closeSync, openSync, readFileSync, writeSync, mkdirSync, existsSync } from 'node:fs';
import path from 'node:path';

const FLUSH = 1 << 16;

/** Append-only files `<dir>/<bucket>`, buffered in memory up to 64 KiB each; one JSON array per line. */
export class Spool {
  private fds = new Map<string, number>();
  private bufs = new Map<string, string[]>();
  private sizes = new Map<string, number>();
  constructor(private readonly dir: string) {
    mkdirSync(dir, { recursive: true });
  }

  add(bucket: string, record: unknown[]): void {
    const line = JSON.stringify(record) + '\n';
    let b = this.bufs.get(bucket);
    if (!b) this.bufs.set(bucket, (b = []));
    b.push(line);
    const size = (this.sizes.get(bucket) ?? 0) + line.length;
    if (size >= FLUSH) this.flush(bucket);
    else this.sizes.set(bucket, size);
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
  read(bucket: string): unknown[][] {
    const f = path.join(this.dir, bucket);
    if (!existsSync(f)) return [];
    return readFileSync(f, 'utf8')
      .split('\n')
      .filter((l) => l.length)
      .map((l) => JSON.parse(l) as unknown[]);
  }
}
