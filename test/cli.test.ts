// The built CLI end to end: help, check on the demo project, bad input with exit 2 and nothing on stdout.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { existsSync } from 'node:fs';
import { repoRoot, fixtureCopy } from './helpers/fixture.js';
import { CITE_FORMAT_NAMES } from '../src/cli/cite.js';
import { CITE_FORMATS } from '../src/cite/index.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', cwd: repoRoot });

test('--help lists every command', () => {
  const r = run('--help');
  assert.equal(r.status, 0);
  for (const c of ['check', 'build', 'validate', 'load', 'query', 'sweep', 'diff', 'cite', 'init', 'add-partner'])
    assert.match(r.stdout, new RegExp(`\\n  ${c} `));
});

test('cite --format choices are the formats the cite stage knows', () => {
  assert.deepEqual([...CITE_FORMAT_NAMES].sort(), Object.keys(CITE_FORMATS).sort());
});

test('check on the demo project exits 0 with a per-partner summary; --json is machine-readable', () => {
  const r = run('check', 'demo-data/concordance.json');
  assert.equal(r.status, 0, r.stderr);
  assert.match(r.stdout, /vellmar\s+\d+\s+\d+/);
  const j = JSON.parse(run('check', 'demo-data/concordance.json', '--json').stdout);
  assert.equal(j.partners.length, 3);
  assert.ok(j.partners.every((p: { works: number; images: number }) => p.works > 0 && p.images >= p.works));
  assert.ok(j.evidence.rows > 0 && j.decisions > 0 && j.goldPairs > 0);
});

test('a project folder stands for its concordance.json (what init writes); a folder without one is named in the error', () => {
  const dir = fixtureCopy('load/base');
  const r = run('check', dir, '--json');
  assert.equal(r.status, 0, r.stderr);
  assert.ok(JSON.parse(r.stdout).partners.length > 0);
  const empty = run('check', path.join(dir, 'evidence'));
  assert.equal(empty.status, 2);
  assert.match(empty.stderr, /evidence[/\\]concordance\.json/);
  assert.doesNotMatch(empty.stderr, /\n\s+at /);
});

test('check on bad input: exit 2, file:line: field: message (hint) on stderr, nothing on stdout', () => {
  const dir = fixtureCopy('load/base', { 'evidence/run1.csv': (t) => t + 'alpha:a-3,beta:n3,1.7,1\n' });
  const r = run('check', path.join(dir, 'concordance.json'));
  assert.equal(r.status, 2);
  assert.equal(r.stdout, '');
  assert.match(r.stderr, /evidence\/run1\.csv:6: score: score "1\.7" is not a number in \[0,1\] \(.+\)/);
  assert.doesNotMatch(r.stderr, /at .*\.js:\d+/, 'no stack trace');
});

test('build refuses an existing folder with exit 2 and leaves it untouched', () => {
  const r = run('build', 'demo-data/concordance.json', '--out', 'test');
  assert.equal(r.status, 2);
  assert.match(r.stderr, /folder already exists/);
});

test('check warns about an image pair a run lists twice, and the link counts it once', async () => {
  const dir = fixtureCopy('load/base', { 'evidence/run1.csv': (t) => t + 'beta:n1,alpha:a-1,0.50,0.9\n' });
  const r = run('check', path.join(dir, 'concordance.json'));
  assert.equal(r.status, 0, r.stderr);
  assert.match(
    r.stdout,
    /evidence\/run1\.csv:6: image_b: this image pair and run were already listed on line 2 \(counted once/,
  );
  const { load } = await import('../src/load/index.js');
  const { link } = await import('../src/link/index.js');
  const { model } = await load(path.join(dir, 'concordance.json'));
  const l = link(model).links.find((x) => x.support > 0 && model.works[x.a].id === 'A 1')!;
  assert.equal(l.support, 1);
  assert.equal(l.mean, 0.91);
});

test('query --store on a folder with no loaded release: exit 2, nothing created', () => {
  const missing = path.join(fixtureCopy('load/base'), 'no-store');
  const r = run('query', '--store', missing, 'ASK { ?s ?p ?o }');
  assert.equal(r.status, 2);
  assert.match(r.stderr, /holds no loaded release \(load one first/);
  assert.equal(existsSync(missing), false);
});
