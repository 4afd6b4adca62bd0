// Worker thread: the site's documents (path and text) → files, so creating and writing hundreds of thousands of
// files (kernel time) runs beside the main thread's reading and rendering.
import { parentPort } from 'node:worker_threads';
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** To the worker: files to write (absolute path, text), or the end. */
export type WriteMessage = { files: [string, string][] } | { end: true };
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
    for (const [file, text] of m.files) {
      const dir = path.dirname(file);
      if (!made.has(dir)) {
        mkdirSync(dir, { recursive: true });
        made.add(dir);
      }
      writeFileSync(file, text);
    }
    parentPort!.postMessage({ ack: true } satisfies WriteReply);
  } catch (e) {
    failed = true;
    const err = e as NodeJS.ErrnoException;
    parentPort!.postMessage({ error: err.message, code: err.code, path: err.path } satisfies WriteReply);
  }
});
