// A release folder written all-or-nothing: files go to a marked temp sibling folder, renamed into place at the end.
import {
  chmodSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import path from 'node:path';
import { UserError, displayPath } from '../errors.js';
import { describeOwner, ownerRecord, ownerState, readOwner } from '../util/owner.js';
import { removeOnSignal } from '../util/interrupt.js';
import { takeLock } from '../util/lock.js';
import { osUserError } from '../util/os-error.js';

/** Owner record inside every unfinished folder; removed just before the rename, never part of a release. */
export const TEMP_MARKER = '.concordat-incomplete';
/** `.{name}.tmp-XXXXXX`: the temp sibling of the folder `name` (mkdtemp adds six characters). */
const TEMP_NAME = /^\..+\.tmp-[A-Za-z0-9]{6}$/;

/** The folder an unfinished write would rename to `name`, with its owner, if `dir` is one. */
export function unfinishedFolder(dir: string): ReturnType<typeof readOwner> {
  return readOwner(path.join(dir, TEMP_MARKER));
}

/**
 * Removes temp folders in `parent` left by a run that can no longer finish them (killed, power lost): only folders
 * named like ours that hold an owner record whose process is gone. Says so on stderr, one line each.
 */
export function removeStaleTemps(
  parent: string,
  say: (line: string) => void = (l) => process.stderr.write(l + '\n'),
): string[] {
  let names: string[];
  try {
    names = readdirSync(parent);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names.filter((n) => TEMP_NAME.test(n)).sort()) {
    const dir = path.join(parent, name);
    const owner = readOwner(path.join(dir, TEMP_MARKER));
    if (!owner || ownerState(owner) !== 'gone') continue;
    rmSync(dir, { recursive: true, force: true });
    removed.push(dir);
    say(`concordat: removed ${displayPath(dir)}, the unfinished folder of an interrupted ${describeOwner(owner)}`);
  }
  return removed;
}

/** The mode a new folder gets under the process umask (mkdtemp itself always makes 0700). */
const folderMode = (): number => 0o777 & ~process.umask();

/**
 * Runs `write(tempDir)` and renames tempDir to `outDir` only if it succeeds. Refuses an `outDir` that already exists
 * (exit 2): a published release is never overwritten. `outDir` is locked for the whole write (a second run is refused),
 * the temp folder carries an owner record until the rename, and it is removed on failure or on SIGINT/SIGTERM;
 * leftovers of killed runs beside `outDir` are removed first.
 */
export async function writeFolderAtomically<T>(outDir: string, write: (tempDir: string) => Promise<T>): Promise<T> {
  const target = path.resolve(outDir);
  const exists = (): UserError =>
    new UserError({
      file: target,
      line: 0,
      field: '--out',
      message: 'folder already exists',
      hint: 'a release is never overwritten: choose a new folder',
    });
  if (existsSync(target)) throw exists();
  const parent = path.dirname(target);
  for (let up = parent; ; up = path.dirname(up)) {
    if (existsSync(up)) {
      if (!isFolder(up))
        throw new UserError({
          file: up,
          line: 0,
          field: '--out',
          message: 'is a file, so no folder can be made under it',
          hint: 'choose --out in a folder',
        });
      break;
    }
    if (path.dirname(up) === up) break;
  }
  mkdirSync(parent, { recursive: true });
  const lock = takeLock(path.join(parent, `.${path.basename(target)}.lock`), 'build', target, '--out');
  try {
    if (existsSync(target)) throw exists();
    removeStaleTemps(parent);
    const temp = mkdtempSync(path.join(parent, `.${path.basename(target)}.tmp-`));
    const forget = removeOnSignal(temp);
    try {
      chmodSync(temp, folderMode());
      writeFileSync(path.join(temp, TEMP_MARKER), JSON.stringify(ownerRecord('build')) + '\n');
      const result = await write(temp);
      rmSync(path.join(temp, TEMP_MARKER));
      // rename(2) would silently replace an empty folder made at outDir meanwhile: look again just before
      if (existsSync(target)) throw exists();
      try {
        renameSync(temp, target);
      } catch (err) {
        const code = (err as NodeJS.ErrnoException).code;
        if (code === 'EEXIST' || code === 'ENOTEMPTY') throw exists();
        throw err;
      }
      forget();
      return result;
    } catch (e) {
      rmSync(temp, { recursive: true, force: true });
      forget();
      const os = osUserError(e); // disk full, permissions: named at --out when the error names no path
      if (os && !(e as NodeJS.ErrnoException).path)
        throw new UserError({ ...os.problems[0], file: target, field: '--out' }, os.exitCode);
      throw os ?? e;
    }
  } finally {
    lock.release();
  }
}

/** True when `dir` is a folder (for messages that tell a folder from a file). */
export const isFolder = (dir: string): boolean => {
  try {
    return statSync(dir).isDirectory();
  } catch {
    return false;
  }
};
