// concordat init and add-partner: starter project, delimiter sniffing, column proposals on the demo exports,
// confirmation.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { initProject } from '../src/setup/starter.js';
import { proposePartner, writePartner } from '../src/setup/partner.js';
import { sniffDelimiter } from '../src/setup/sniff.js';
import { proposeColumns } from '../src/setup/columns.js';
import { loadProjectFile } from '../src/load/project.js';
import { load } from '../src/load/index.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const demo = path.join(repoRoot, 'demo-data');
const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const run = (...args: string[]) =>
  spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', stdio: ['pipe', 'pipe', 'pipe'] });
const fresh = () => tempDir('concordat-setup-');
const formatted = (file: string) => {
  const text = readFileSync(file, 'utf8');
  assert.equal(text, JSON.stringify(JSON.parse(text), null, 2) + '\n', 'written as JSON.stringify(…, null, 2)');
  return JSON.parse(text);
};

/** The demo's own partner blocks: release 1 (three archives) and Brindle from release 2. */
const expected = [
  ...JSON.parse(readFileSync(path.join(demo, 'concordance.json'), 'utf8')).partners.map((p: any) => ({
    ...p,
    dir: demo,
  })),
  ...JSON.parse(readFileSync(path.join(demo, 'release-2', 'concordance.json'), 'utf8'))
    .partners.filter((p: any) => p.key === 'brindle')
    .map((p: any) => ({ ...p, dir: path.join(demo, 'release-2') })),
];

test('init: starter concordance.json and empty input folders; a second init refuses', () => {
  const dir = path.join(fresh(), 'proj');
  assert.deepEqual(initProject(dir), ['concordance.json', 'catalogues/', 'evidence/', 'decisions/']);
  const p = formatted(path.join(dir, 'concordance.json'));
  assert.deepEqual(p.partners, []);
  for (const f of ['catalogues', 'evidence', 'decisions']) assert.ok(statSync(path.join(dir, f)).isDirectory());
  const again = run('init', dir);
  assert.equal(again.status, 2);
  assert.match(again.stderr, /already exists/);
});

test('delimiter sniffing: tab, semicolon, comma; quoted delimiters do not count', () => {
  const cases: [string, string][] = [
    ['a\tb\tc', '\t'],
    ['a;b;"c,d,e"', ';'],
    ['"x;y;z",b', ','],
    ['single', ','],
  ];
  for (const [line, d] of cases) assert.equal(sniffDelimiter(line), d, JSON.stringify(line));
});

test("add-partner proposes the demo project's delimiter and column mapping for all four exports", async () => {
  const dir = fresh();
  initProject(dir);
  const file = path.join(dir, 'concordance.json');
  assert.equal(expected.length, 4);
  for (const p of expected) {
    const proposal = await proposePartner(file, { key: p.key, catalogue: path.join(p.dir, p.catalogue.file) });
    const cat = proposal.block.catalogue as { delimiter: string; columns: Record<string, string> };
    assert.equal(cat.delimiter, p.catalogue.delimiter, `${p.key} delimiter`);
    assert.deepEqual(cat.columns, p.catalogue.columns, `${p.key} columns`);
    writePartner(proposal);
  }
  const written = formatted(file);
  assert.deepEqual(
    written.partners.map((p: any) => p.key),
    expected.map((p) => p.key),
  );
  assert.equal(written.title, `${path.basename(dir)} concordance`, 'other fields kept');
  const project = loadProjectFile(file);
  assert.equal(project.partners.length, 4);
  const { model } = await load(file);
  assert.ok(model.works.length > 250, 'the written blocks load the exports');
});

test('column proposal by values alone: repeated IDs are works, unique ones images, years are dates', () => {
  const header = ['A', 'B', 'C'];
  const rows = [
    ['W-1', 'P-10', 'ca. 1480'],
    ['W-1', 'P-11', 'ca. 1480'],
    ['W-2', 'P-12', '1475'],
    ['W-3', 'P-13', '15th century'],
  ];
  assert.deepEqual(proposeColumns(header, rows).columns, { work: 'A', image: 'B', date: 'C' });
});

test('add-partner keeps other content, refuses a duplicate key, and writes nothing without --yes off a terminal', () => {
  const dir = fresh();
  initProject(dir);
  const file = path.join(dir, 'concordance.json');
  const before = readFileSync(file, 'utf8');
  const cat = path.join(demo, 'catalogues', 'kessling.csv');
  const noYes = run('add-partner', file, '--key', 'kessling', '--catalogue', cat);
  assert.equal(noYes.status, 2);
  assert.match(noYes.stderr, /--yes/);
  assert.match(noYes.stdout, /work {3}← "Inventarnummer"/);
  assert.equal(readFileSync(file, 'utf8'), before);
  const ok = run('add-partner', file, '--key', 'kessling', '--catalogue', cat, '--name', 'Kessling Photothek', '--yes');
  assert.equal(ok.status, 0, ok.stderr);
  const after = formatted(file);
  assert.deepEqual({ ...after, partners: [] }, JSON.parse(before));
  assert.equal(after.partners[0].name, 'Kessling Photothek');
  const dup = run('add-partner', file, '--key', 'kessling', '--catalogue', cat, '--yes');
  assert.equal(dup.status, 2);
  assert.match(dup.stderr, /already in the project/);
  assert.ok(!existsSync(file + '.tmp'));
});
