// A release folder → verified complete (SHA256SUMS present, every listed file there with its hash) or a clear refusal.
import { createHash } from 'node:crypto';
import { createReadStream, existsSync, readdirSync, statSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { UserError, EXIT } from '../errors.js';
import { unfinishedFolder } from '../io/atomic.js';
import { describeOwner } from '../util/owner.js';

export const CHECKSUMS = 'SHA256SUMS';
/**
 * One line of `sha256sum` output in text mode: 64 hex digits, two spaces, the path (GNU coreutils manual, "sha256sum").
 */
const LINE = /^([0-9a-f]{64}) [ *](.+)$/;

/** Every file under `dir`, as paths relative to it with "/" separators, sorted. */
function filesUnder(dir: string): string[] {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.relative(dir, path.join(e.parentPath, e.name)).split(path.sep).join('/'))
    .sort();
}

async function sha256Of(file: string): Promise<string> {
  const h = createHash('sha256');
  for await (const chunk of createReadStream(file)) h.update(chunk as Buffer);
  return h.digest('hex');
}

/**
 * Refuses anything that is not a complete release: the unfinished folder of a build (its owner record), a folder
 * without SHA256SUMS, a listed file that is missing or whose SHA-256 differs, and any of `needed` not listed.
 * Returns the listed paths. Every file is read once (I/O bound: about as long as reading the release); with
 * `hashNeededOnly` only the `needed` ones (the others are still checked to exist, and no unlisted file may be there).
 */
export async function verifyRelease(
  folder: string,
  needed: string[],
  opts: { hashNeededOnly?: boolean } = {},
): Promise<string[]> {
  const bad = (file: string, line: number, message: string, hint: string): UserError =>
    new UserError({ file, line, field: '', message, hint }, EXIT.badInput);
  const owner = unfinishedFolder(folder);
  if (owner)
    throw bad(
      folder,
      0,
      `is the unfinished folder of ${describeOwner(owner)}, not a release`,
      'load the folder the build renamed it to; a stopped build leaves no release',
    );
  const sums = path.join(folder, CHECKSUMS);
  if (!existsSync(sums))
    throw bad(
      sums,
      0,
      `is missing, so ${folder} is not a complete release`,
      'load a folder written by concordat build (it ends with SHA256SUMS)',
    );
  const text = await readFile(sums, 'utf8').catch((err: NodeJS.ErrnoException) => {
    throw bad(sums, 0, `cannot be read (${err.code ?? err.message})`, 'the release is damaged: build it again');
  });
  const listed: string[] = [];
  const lines = text.split('\n');
  for (let i = 0; i < lines.length; i++) {
    if (lines[i] === '' && i === lines.length - 1) break;
    const m = LINE.exec(lines[i]);
    const rel = m?.[2] ?? '';
    if (!m || path.isAbsolute(rel) || rel.split('/').includes('..'))
      throw bad(
        sums,
        i + 1,
        'is not a "<sha256>  <path>" line inside the release',
        'the release is damaged: build it again',
      );
    const file = path.join(folder, rel);
    if (!statSync(file, { throwIfNoEntry: false })?.isFile())
      throw bad(
        sums,
        i + 1,
        `lists ${rel}, which is missing`,
        'the release is incomplete: build it again or copy it whole',
      );
    if ((!opts.hashNeededOnly || needed.includes(rel)) && (await sha256Of(file)) !== m[1])
      throw bad(
        file,
        0,
        `SHA-256 differs from ${CHECKSUMS} line ${i + 1}`,
        'the file was changed or cut short: build the release again or copy it whole',
      );
    listed.push(rel);
  }
  const unlisted = filesUnder(folder).filter((f) => f !== CHECKSUMS && !listed.includes(f));
  if (unlisted.length)
    throw bad(
      path.join(folder, unlisted[0]),
      0,
      `is not listed in ${CHECKSUMS}${unlisted.length > 1 ? ` (nor are ${unlisted.length - 1} more files)` : ''}`,
      `${CHECKSUMS} is cut short or the release was changed after it was built: build it again or copy it whole`,
    );
  for (const n of needed)
    if (!listed.includes(n))
      throw bad(sums, 0, `does not list ${n}`, 'the release is incomplete or was changed after it was built');
  return listed;
}
