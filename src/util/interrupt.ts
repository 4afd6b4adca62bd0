// SIGINT/SIGTERM → what the command started on disk is removed, one line on stderr, exit 130/143 (128 + signal number).
import { rmSync } from 'node:fs';
import { displayPath } from '../errors.js';

/** Paths to remove if the process is interrupted, in the order they were made. */
const started = new Map<number, string>();
let next = 0;

/**
 * Registers a temp folder, temp file or lock to remove when a signal stops the command; returns the function that
 * forgets it again (call it once the path was renamed into place or removed by the normal path).
 */
export function removeOnSignal(p: string): () => void {
  const id = next++;
  started.set(id, p);
  return () => {
    started.delete(id);
  };
}

/** Exit status of a process ended by a signal, as shells report it (POSIX: 128 + signal number). */
export const SIGNAL_EXIT = { SIGINT: 130, SIGTERM: 143 } as const;

const removeNow = (paths: string[]): void => {
  for (const p of paths)
    try {
      // worker threads may still be creating files inside a folder: retry on ENOTEMPTY/EBUSY
      rmSync(p, { recursive: true, force: true, maxRetries: 5, retryDelay: 20 });
    } catch {
      // left for the next run: temp folders carry an owner record and are removed once their owner is gone
    }
};

/** Passes after the first, 50 ms apart (common practice, no source: time for a queued write on a busy machine). */
const REMOVE_PASSES = 4;

/**
 * Removes every registered path, newest first, then again after each of {@link REMOVE_PASSES} short waits: a file write
 * already queued in libuv's thread pool (or a worker thread's) can create its file just after a pass, later still on a
 * loaded machine, so the main thread blocks (no JS of the command runs meanwhile) and removes again, ~200 ms in all.
 */
export function removeStarted(): string[] {
  const paths = [...started.values()].reverse();
  started.clear();
  removeNow(paths);
  for (let pass = 0; pass < REMOVE_PASSES; pass++) {
    Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 50);
    removeNow(paths);
  }
  return paths;
}

/** Work to undo elsewhere (a remote store's staging graphs) when a signal stops the command; each says what it did. */
const undo = new Map<number, () => Promise<string>>();

/**
 * Registers asynchronous clean-up (e.g. dropping a remote store's staging graphs) to run when a signal stops the
 * command; the function resolves with what it verified, for the one line printed. Returns the function that forgets
 * it.
 */
export function undoOnSignal(fn: () => Promise<string>): () => void {
  const id = next++;
  undo.set(id, fn);
  return () => {
    undo.delete(id);
  };
}

let stoppedBy: keyof typeof SIGNAL_EXIT | null = null;

/** Whether a signal is stopping the command: the command's own error, if any, is then not printed. */
export const stopping = (): boolean => stoppedBy !== null;

/** How long asynchronous clean-up may take before the process exits anyway (common practice, no source). */
export const UNDO_LIMIT_MS = 20_000;

async function undoAll(): Promise<string[]> {
  const fns = [...undo.values()].reverse();
  undo.clear();
  const notes: string[] = [];
  for (const fn of fns) notes.push(await fn().catch((err: unknown) => `clean-up failed: ${(err as Error).message}`));
  return notes.filter(Boolean);
}

let installed = false;

/**
 * Installs the handlers once per process. A signal stops the command, removes what it had started (temp folders,
 * temp files, locks; staging graphs of a remote store, for at most {@link UNDO_LIMIT_MS}) and exits 130 (SIGINT) or
 * 143 (SIGTERM) after one line saying so. A second signal during the remote clean-up exits at once, saying so.
 */
export function exitCleanlyOnSignals(): void {
  if (installed) return;
  installed = true;
  for (const signal of Object.keys(SIGNAL_EXIT) as (keyof typeof SIGNAL_EXIT)[]) {
    process.on(signal, () => {
      if (stoppedBy) {
        process.stderr.write(`concordat: stopped by ${signal} during clean-up; what was not yet undone is left\n`);
        process.exit(SIGNAL_EXIT[signal]);
      }
      stoppedBy = signal;
      const temps = [...started.values()].filter((p) => !/\.lock$/.test(p));
      removeStarted();
      const what = temps.length ? `; removed ${temps.map(displayPath).join(', ')}` : '';
      const finish = (notes: string[]): never => {
        process.stderr.write(`concordat: stopped by ${signal}${what}${notes.map((n) => `; ${n}`).join('')}\n`);
        process.exit(SIGNAL_EXIT[signal]);
      };
      if (undo.size === 0) finish([]);
      const limit = setTimeout(
        () => finish([`clean-up did not finish within ${UNDO_LIMIT_MS / 1000} s; what it had not undone is left`]),
        UNDO_LIMIT_MS,
      );
      void undoAll().then((notes) => {
        clearTimeout(limit);
        finish(notes);
      });
    });
  }
}
