// Sweep: the threshold range, precision/recall/F1 per proposeAt worked by hand, and `concordat sweep` end to end.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { sweep, sweepValues, sweepTable } from '../src/analyse/index.js';
import { UserError } from '../src/errors.js';
import { tinyModel } from './helpers/model.js';
import { fixtureCopy, json, repoRoot } from './helpers/fixture.js';

test('sweepValues: inclusive range without floating-point drift; bad ranges are refused naming the option', () => {
  const v = sweepValues(0.3, 0.95, 0.05);
  assert.equal(v.length, 14);
  assert.equal(v[0], 0.3);
  assert.equal(v[13], 0.95);
  assert.equal(v[1], 0.35, 'not 0.35000000000000003');
  assert.deepEqual(sweepValues(0.5, 0.5, 0.1), [0.5]);
  const bad: [number, number, number, string][] = [
    [0.5, 0.4, 0.1, '--from'],
    [-0.1, 0.5, 0.1, '--from'],
    [0.1, 1.5, 0.1, '--to'],
    [0.1, 0.5, 0, '--step'],
    [0.1, 0.5, NaN, '--step'],
  ];
  for (const [from, to, step, field] of bad)
    assert.throws(
      () => sweepValues(from, to, step),
      (e: unknown) => e instanceof UserError && e.problems[0].field === field,
      `${from} ${to} ${step}`,
    );
});

test('sweep: precision, recall and F1 per proposeAt, worked by hand', () => {
  // gold: a:1–b:1, a:2–b:2, a:3–b:3. Evidence: a:1–b:1 0.9, a:2–b:2 0.6, a:3–b:3 0.4, a:1–b:2 0.7 (wrong), one
  // photograph each: confidence = score × 2/3 (src/link/confidence.ts): 0.6, 0.4, 0.267, 0.467
  const m = tinyModel({
    partners: ['a', 'b'],
    works: ['a:1', 'a:2', 'a:3', 'b:1', 'b:2', 'b:3'],
    matches: [
      ['a:1', 'b:1', 0.9],
      ['a:2', 'b:2', 0.6],
      ['a:3', 'b:3', 0.4],
      ['a:1', 'b:2', 0.7],
    ],
    gold: [
      ['a:1', 'b:1'],
      ['a:2', 'b:2'],
      ['a:3', 'b:3'],
    ],
  });
  const rows = sweep(m, [0.2, 0.3, 0.45, 0.5, 0.65]);
  const got = rows.map((r) => [r.proposeAt, r.claimedPairs, r.found, r.precision, r.recall]);
  assert.deepEqual(got, [
    // all four links proposed; a:1–b:2 (0.467) is the only link between {a:1,b:1} and {a:2,b:2}, a weak bridge, and
    // is cut (src/cluster/coherence.ts): clusters {a:1,b:1}, {a:2,b:2}, {a:3,b:3}
    [0.2, 3, 3, 1, 1],
    // a:3–b:3 drops out
    [0.3, 2, 2, 1, 2 / 3],
    // a:2–b:2 drops out: {a:1,b:1,b:2}: 3 pairs, 1 gold
    [0.45, 3, 1, 1 / 3, 1 / 3],
    // only a:1–b:1
    [0.5, 1, 1, 1, 1 / 3],
    [0.65, 0, 0, null, 0],
  ]);
  assert.equal(rows[3].f1, (2 * 1 * (1 / 3)) / (1 + 1 / 3));
  assert.equal(rows[4].f1, null, 'precision undefined when nothing is claimed');
  const table = sweepTable(rows).split('\n');
  assert.match(table[0], /^proposeAt +precision +recall +F1/);
  assert.match(table[1], /^ +0\.20 +100\.0% +100\.0% +100\.0%/);
  assert.equal(new Set(table.slice(0, 5).map((l) => l.length)).size, 1, 'aligned columns');
  assert.throws(() => sweep(tinyModel({ partners: ['a'], works: ['a:1'] }), [0.5]), UserError);
});

const cli = (args: string[]) =>
  spawnSync(process.execPath, [path.join(repoRoot, 'dist', 'src', 'cli', 'main.js'), ...args], { encoding: 'utf8' });

test('concordat sweep prints a table or JSON; exit 2 without gold or with a bad range', () => {
  const project = path.join(fixtureCopy('load/base'), 'concordance.json');
  const r = cli(['sweep', project, '--from', '0.4', '--to', '0.6', '--step', '0.1']);
  assert.equal(r.stderr, '');
  assert.equal(r.status, 0);
  const lines = r.stdout.trimEnd().split('\n');
  assert.equal(lines.length, 4);
  assert.match(lines[1], /^ +0\.40 /);
  const j = cli(['sweep', project, '--from', '0.4', '--to', '0.6', '--step', '0.1', '--json']);
  assert.equal(j.status, 0);
  const rows = JSON.parse(j.stdout);
  assert.deepEqual(
    rows.map((x: { proposeAt: number }) => x.proposeAt),
    [0.4, 0.5, 0.6],
  );
  // the fixture's gold pair alpha:A 1–beta:B1 is confirmed by a curator: found at every threshold
  assert.ok(rows.every((x: { found: number }) => x.found >= 1));

  const noGold = path.join(
    fixtureCopy('load/base', { 'concordance.json': json((o) => delete o.gold) }),
    'concordance.json',
  );
  const g = cli(['sweep', noGold]);
  assert.equal(g.status, 2);
  assert.match(g.stderr, /gold: the project has no gold concordance pairs/);
  const b = cli(['sweep', project, '--step', '0']);
  assert.equal(b.status, 2);
  assert.match(b.stderr, /option '--step <score>' argument '0' is invalid/);
});
