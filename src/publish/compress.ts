// Dump files → gzip-compressed copies beside them (RFC 1952), byte-identical for identical input, hashed as written.
import { createReadStream, createWriteStream } from 'node:fs';
import { createHash } from 'node:crypto';
import { pipeline } from 'node:stream/promises';
import { Transform } from 'node:stream';
import { constants, createGzip } from 'node:zlib';

/**
 * Writes `file` + `.gz` from `file` and returns the SHA-256 (hex) of the compressed bytes. The gzip header Node's zlib
 * writes carries no file name and MTIME 0 (RFC 1952 §2.3.1: "no time stamp is available"), so the same input at the
 * same level gives the same bytes; zlib runs on the thread pool, so several files compress at once.
 */
export async function gzipCopy(file: string, level = constants.Z_DEFAULT_COMPRESSION): Promise<string> {
  const hash = createHash('sha256');
  const tap = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      done(null, chunk);
    },
  });
  await pipeline(
    createReadStream(file, { highWaterMark: 1 << 20 }),
    createGzip({ level, chunkSize: 1 << 16 }),
    tap,
    createWriteStream(`${file}.gz`),
  );
  return hash.digest('hex');
}

/**
 * Compresses every file of `files` (paths relative to `dir`), two at a time (the machine's cores), returning path.gz →
 * hash.
 */
export async function gzipCopies(dir: string, files: string[], parallel = 2): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  let next = 0;
  const worker = async () => {
    while (next < files.length) {
      const f = files[next++];
      out.set(`${f}.gz`, await gzipCopy(`${dir}/${f}`));
    }
  };
  await Promise.all(Array.from({ length: Math.min(parallel, files.length) }, worker));
  return out;
}
