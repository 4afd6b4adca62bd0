// Commands that write refuse to overwrite or mix into what exists: validate --report, init into a used folder.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });

test('validate --report refuses an existing file (exit 2) and leaves it as it was', () => {
  const dir = tempDir('concordat-report-');
  const data = path.join(dir, 'data.ttl');
  const text = '<urn:x:a> <urn:x:b> <urn:x:c> .\n';
  writeFileSync(data, text);
  const r = run('validate', data, '--report', data);
  assert.equal(r.status, 2, r.stderr);
  assert.match(r.stderr, /data\.ttl: --report: already exists \(give a new file name/);
  assert.equal(readFileSync(data, 'utf8'), text);
  assert.equal(run('validate', data, '--report', path.join(dir, 'new.ttl')).status, 0);
});

const cases: { name: string; prepare: (dir: string) => void; error: RegExp }[] = [
  {
    name: 'a release folder',
    prepare: (d) => writeFileSync(path.join(d, 'SHA256SUMS'), ''),
    error: /<folder>: is a release folder/,
  },
  {
    name: "a build's unfinished folder",
    prepare: (d) => writeFileSync(path.join(d, '.concordat-incomplete'), '{}'),
    error: /<folder>: is a release folder/,
  },
  {
    name: 'a folder with other files',
    prepare: (d) => writeFileSync(path.join(d, 'notes.txt'), 'x'),
    error: /<folder>: is not empty \(notes\.txt\)/,
  },
];
for (const c of cases)
  test(`init refuses ${c.name} (exit 2, nothing written)`, () => {
    const dir = tempDir('concordat-init-');
    c.prepare(dir);
    const r = run('init', dir);
    assert.equal(r.status, 2, r.stderr);
    assert.match(r.stderr, c.error);
    assert.equal(run('init', dir).stdout, '');
  });

test('init accepts an empty folder or one holding only empty input folders', () => {
  const dir = tempDir('concordat-init-');
  mkdirSync(path.join(dir, 'catalogues'));
  assert.equal(run('init', dir).status, 0);
});
