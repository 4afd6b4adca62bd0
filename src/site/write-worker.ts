// Worker thread: the site's documents (path and text) → files, so creating and writing hundreds of thousands of
// files (kernel time) runs beside the main thread's reading and rendering.
import { parentPort } from 'node:worker_threads';
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** To the worker: files to write (absolute paths; file i is bytes ends[i - 1] (or 0) to ends[i]), or the end. */
export type WriteMessage = { paths: string[]; ends: number[]; bytes: ArrayBuffer } | { end: true };
/** From the worker: a batch written, everything written, or the first error (then nothing more is written). */
export type WriteReply = { ack: true } | { done: true } | { error: string; code?: string; path?: string };

const made = new Set<string>();
let failed = false;
parentPort!.on('message', (m: WriteMessage) => {
  if ('end' in m) {
    parentPort!.postMessage({ done: true } satisfies WriteReply);
    return;
  }
  if (failed) return;
  try {
    const bytes = new Uint8Array(m.bytes);
    for (let i = 0; i < m.paths.length; i++) {
      const file = m.paths[i];
      const dir = path.dirname(file);
      if (!made.has(dir)) {
        mkdirSync(dir, { recursive: true });
        made.add(dir);
      }
      writeFileSync(file, bytes.subarray(i ? m.ends[i - 1] : 0, m.ends[i]));
    }
    parentPort!.postMessage({ ack: true } satisfies WriteReply);
  } catch (e) {
    failed = true;
    const err = e as NodeJS.ErrnoException;
    parentPort!.postMessage({ error: err.message, code: err.code, path: err.path } satisfies WriteReply);
  }
});
