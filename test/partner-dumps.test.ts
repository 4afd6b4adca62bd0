// release.partnerDumps false → a release with only the whole dumps: no partners/ folder, no partner distributions in
// dataset.ttl or SHA256SUMS, the same whole dumps as with slices, and `load --partner` saying there are no slices.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { build } from '../src/pipeline.js';
import { fixtureCopy, json, repoRoot, tempDir } from './helpers/fixture.js';

const withSlices = fixtureCopy('load/base');
const without = fixtureCopy('load/base', {
  'concordance.json': json((o) => {
    o.release = { version: '0', ...o.release, partnerDumps: false };
  }),
});
const out = tempDir('concordat-partner-dumps-');
await build(path.join(withSlices, 'concordance.json'), path.join(out, 'with'));
await build(path.join(without, 'concordance.json'), path.join(out, 'without'));
const read = (which: string, file: string) => readFileSync(path.join(out, which, file), 'utf8');

test('with partnerDumps false there is no partners/ folder and nothing points at one', () => {
  assert.ok(existsSync(path.join(out, 'with', 'partners')), 'the default writes slices');
  assert.ok(!existsSync(path.join(out, 'without', 'partners')));
  assert.doesNotMatch(read('without', 'SHA256SUMS'), /partners\//);
  assert.doesNotMatch(read('without', 'dataset.ttl'), /partners\//);
  assert.match(read('with', 'dataset.ttl'), /partners\//);
});

test('the whole release is the same with and without slices, but for the distributions its description lists', () => {
  const graphs = (which: string) => {
    const lines = read(which, 'concordance.nq').split('\n');
    return {
      data: lines.filter((l) => !l.endsWith('/graph/dataset> .')),
      dataset: lines.filter((l) => l.endsWith('/graph/dataset> .')),
    };
  };
  const a = graphs('with');
  const b = graphs('without');
  assert.equal(b.data.join('\n'), a.data.join('\n'));
  assert.ok(b.dataset.length < a.dataset.length);
  assert.deepEqual(
    a.dataset.filter((l) => !b.dataset.includes(l)).filter((l) => !/partners[-/]|void#triples|distribution/.test(l)),
    [],
  );
});

test('load --partner on a release without slices exits 2 and says so', () => {
  const main = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
  const r = spawnSync(
    process.execPath,
    [main, 'load', path.join(out, 'without'), '--store', path.join(out, 'store'), '--partner', 'alpha'],
    { encoding: 'utf8' },
  );
  assert.equal(r.status, 2, r.stderr);
  assert.match(r.stderr, /no such partner slice in the release \(the release has no partners\/ folder\)/);
});
