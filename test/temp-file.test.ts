// TempFile and writeFileAtomically: the target holds the old bytes or the new ones, and no temp file is left behind.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { TempFile, writeFileAtomically, writeFileAtomicallyAsync } from '../src/io/temp-file.js';
import { tempDir } from './helpers/fixture.js';

const tmp = tempDir('concordat-temp-file-');
after(() => rmSync(tmp, { recursive: true, force: true }));

for (const [name, write] of [
  ['sync', writeFileAtomically],
  ['async', writeFileAtomicallyAsync],
] as const) {
  test(`writeFileAtomically (${name}) replaces a file and leaves only the target`, async () => {
    const dir = path.join(tmp, `replace-${name}`);
    mkdirSync(dir);
    const f = path.join(dir, 'a.txt');
    writeFileSync(f, 'old');
    await write(f, 'new');
    assert.equal(readFileSync(f, 'utf8'), 'new');
    assert.deepEqual(readdirSync(dir), ['a.txt']);
  });

  test(`writeFileAtomically (${name}): a rename that fails leaves the target as it was and no temp file`, async () => {
    const dir = path.join(tmp, `fail-${name}`);
    mkdirSync(path.join(dir, 'target'), { recursive: true });
    writeFileSync(path.join(dir, 'target', 'inside'), 'kept');
    // rename(2) of a file onto a non-empty folder fails (EISDIR)
    await assert.rejects(async () => write(path.join(dir, 'target'), 'new'), /EISDIR|ENOTEMPTY|EEXIST/);
    assert.deepEqual(readdirSync(dir), ['target']);
    assert.equal(readFileSync(path.join(dir, 'target', 'inside'), 'utf8'), 'kept');
  });
}

test('TempFile names its temp beside the target, and discard removes it', () => {
  const f = path.join(tmp, 'b.txt');
  const t = new TempFile(f);
  assert.equal(path.dirname(t.temp), tmp);
  assert.match(path.basename(t.temp), /^b\.txt\.tmp-[0-9a-f]{12}$/);
  writeFileSync(t.temp, 'x');
  t.discard();
  t.discard();
  assert.ok(!readdirSync(tmp).some((n) => n.startsWith('b.txt')));
});
