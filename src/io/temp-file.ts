// A file written all-or-nothing: bytes go to a temp file beside the target, renamed onto it only when complete.
import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { rename, writeFile } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { removeOnSignal } from '../util/interrupt.js';

/**
 * The one mechanism behind every file concordat writes in place: write to `temp` (`<target>.tmp-<12 hex>`, in the
 * same folder so the rename stays on one file system), then `commit()`: POSIX rename(2) replaces the target in one
 * step, so a reader sees the old file or the new one, never half of one. `discard()` removes the temp file and
 * leaves the target untouched.
 */
export class TempFile {
  readonly temp: string;
  constructor(readonly target: string) {
    this.temp = `${target}.tmp-${randomBytes(6).toString('hex')}`;
  }
  commit(): void {
    renameSync(this.temp, this.target);
  }
  /** Removes the temp file; best effort, since it runs while another error is on its way out and must not hide it. */
  discard(): void {
    try {
      rmSync(this.temp, { force: true });
    } catch {
      // the error being handled matters more than a temp file that could not be removed
    }
  }
}

/**
 * Writes `data` to `file` all-or-nothing (see {@link TempFile}); on failure the temp file is removed and the error
 * rethrown.
 */
export function writeFileAtomically(file: string, data: string | Uint8Array): void {
  const t = new TempFile(file);
  try {
    writeFileSync(t.temp, data);
    t.commit();
  } catch (e) {
    t.discard();
    throw e;
  }
}

/**
 * {@link writeFileAtomically} without blocking the event loop while the bytes are written; a SIGINT or SIGTERM while
 * it waits removes the temp file (src/util/interrupt.ts).
 */
export async function writeFileAtomicallyAsync(file: string, data: string | Uint8Array): Promise<void> {
  const t = new TempFile(file);
  const forget = removeOnSignal(t.temp);
  try {
    await writeFile(t.temp, data);
    await rename(t.temp, t.target);
  } catch (e) {
    t.discard();
    throw e;
  } finally {
    forget();
  }
}
