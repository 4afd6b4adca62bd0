// The benchmark's project generator at a tiny scale: deterministic bytes, and its output passes the load stage.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { generateProject, Rng } from '../bench/generate.js';
import { load } from '../src/load/index.js';
import { tempDir } from './helpers/fixture.js';

const files = (dir: string): string[] =>
  readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((d) => d.isFile())
    .map((d) => path.relative(dir, path.join(d.parentPath, d.name)))
    .sort();

test('same seed and scale give byte-identical projects; another seed differs', async (t) => {
  const root = tempDir('concordat-gen-');
  t.after(() => rmSync(root, { recursive: true, force: true }));
  const opts = { works: 200, partners: 4, seed: 7 };
  await generateProject(path.join(root, 'a'), opts);
  await generateProject(path.join(root, 'b'), opts);
  await generateProject(path.join(root, 'c'), { ...opts, seed: 8 });
  const names = files(path.join(root, 'a'));
  assert.deepEqual(names, files(path.join(root, 'b')));
  assert.ok(names.length >= 4 + 4, 'project file, four catalogues, evidence, decisions, gold');
  for (const f of names)
    assert.ok(
      readFileSync(path.join(root, 'a', f)).equals(readFileSync(path.join(root, 'b', f))),
      `${f} differs between two runs`,
    );
  const ev = (d: string) => readFileSync(path.join(root, d, 'evidence', 'run.csv'));
  assert.ok(!ev('a').equals(ev('c')), 'a different seed gives different evidence');
});

test('the generated project loads: every work, photo and evidence row is accepted', async (t) => {
  const root = tempDir('concordat-gen-');
  t.after(() => rmSync(root, { recursive: true, force: true }));
  const summary = await generateProject(root, { works: 200, partners: 5, seed: 3 });
  const { model, stats } = await load(summary.projectFile);
  assert.equal(model.works.length, 200);
  assert.equal(model.images.count, summary.images);
  assert.equal(stats.evidenceRows, summary.evidenceRows);
  assert.equal(model.decisions.length, summary.decisions);
  assert.equal(model.gold.length, summary.gold);
  assert.equal(model.project.partners.length, 5);
  const perWork = summary.evidenceRows / 200;
  assert.ok(perWork > 5 && perWork < 15, `about 10 evidence rows per work, got ${perWork}`);
});

test('the generator draws from [0,1) and repeats its sequence for a seed', () => {
  const a = new Rng(42),
    b = new Rng(42);
  for (let i = 0; i < 1000; i++) {
    const x = a.next();
    assert.equal(x, b.next());
    assert.ok(x >= 0 && x < 1);
  }
});
