// Test helper: copies a fixture project into a temp folder and applies edits, so each bad-input case starts clean.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** Repo root, from dist/test/helpers/ or test/helpers/. */
export const repoRoot = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '..',
  '..',
  ...(import.meta.url.includes('/dist/') ? ['..'] : []),
);
export const fixtures = path.join(repoRoot, 'test', 'fixtures');

const made: string[] = [];
process.on('exit', () => {
  for (const dir of made) rmSync(dir, { recursive: true, force: true });
});

/** A fresh temp folder (`<prefix>XXXXXX` in the OS temp folder), removed when the test process exits. */
export function tempDir(prefix: string): string {
  const dir = mkdtempSync(path.join(tmpdir(), prefix));
  made.push(dir);
  return dir;
}

export type Edit = string | Buffer | ((text: string) => string | Buffer) | null;

/** Copies `fixtures/<name>` to a fresh temp folder, applies edits (file → new content, transform, or null = delete). */
export function fixtureCopy(name: string, edits: Record<string, Edit> = {}): string {
  const dir = tempDir('concordat-test-');
  cpSync(path.join(fixtures, name), dir, { recursive: true });
  for (const [file, edit] of Object.entries(edits)) {
    const p = path.join(dir, file);
    if (edit === null) writeFileSync(p, '');
    else if (typeof edit === 'function') writeFileSync(p, edit(readFileSync(p, 'utf8')));
    else writeFileSync(p, edit);
  }
  return dir;
}

/** Edits concordance.json as an object. */
export const json = (f: (o: any) => void) => (text: string) => {
  const o = JSON.parse(text);
  f(o);
  return JSON.stringify(o, null, 2);
};
