// A release folder written all-or-nothing: files go to a temp sibling folder, renamed into place at the end.
import { existsSync, mkdirSync, mkdtempSync, renameSync, rmSync } from 'node:fs';
import path from 'node:path';
import { UserError } from '../errors.js';

/**
 * Runs `write(tempDir)` and renames tempDir to `outDir` only if it succeeds. Refuses an `outDir` that already exists
 * (exit 2): a published release is never overwritten. On failure the temp folder is removed.
 */
export async function writeFolderAtomically<T>(outDir: string, write: (tempDir: string) => Promise<T>): Promise<T> {
  const target = path.resolve(outDir);
  if (existsSync(target))
    throw new UserError({ file: target, line: 0, field: '--out', message: 'folder already exists', hint: 'a release is never overwritten: choose a new folder' });
  mkdirSync(path.dirname(target), { recursive: true });
  const temp = mkdtempSync(path.join(path.dirname(target), `.${path.basename(target)}.tmp-`));
  try {
    const result = await write(temp);
    renameSync(temp, target);
    return result;
  } catch (e) {
    rmSync(temp, { recursive: true, force: true });
    throw e;
  }
}
