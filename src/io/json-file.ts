// JSON project files ↔ objects: read with line-aware errors, written as JSON.stringify(…, null, 2) atomically.
import { readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { UserError } from '../errors.js';

/** Writes `value` as JSON.stringify(value, null, 2) plus a final LF: temp file beside it, then rename. */
export function writeJsonFile(file: string, value: unknown): void {
  const tmp = `${file}.tmp-${randomBytes(6).toString('hex')}`;
  try {
    writeFileSync(tmp, JSON.stringify(value, null, 2) + '\n');
    renameSync(tmp, file);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
}

/** Reads a JSON object (BOM tolerated); a syntax error or a non-object is a UserError naming the file. */
export function readJsonObject(file: string): Record<string, unknown> {
  let text: string;
  try {
    text = readFileSync(file, 'utf8').replace(/^\uFEFF/, '');
  } catch (e) {
    throw new UserError({ file, line: 0, field: '', message: `cannot read project file (${(e as NodeJS.ErrnoException).code ?? e})`, hint: 'give the path to concordance.json, e.g. from concordat init' });
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw new UserError({ file, line: 0, field: '', message: `JSON syntax error: ${(e as Error).message}`, hint: 'run concordat check on it' });
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw new UserError({ file, line: 1, field: '', message: 'the project file is not a JSON object', hint: 'start from concordat init' });
  return value as Record<string, unknown>;
}
