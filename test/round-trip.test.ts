// The curators' round trip, as a person does it: build, fill some rows of review-queue.csv in a spreadsheet, save it
// the way spreadsheets save (BOM + CRLF with blank rows; ";" with decimal commas), rebuild on the previous release;
// then diff, changes.md, changes.ttl and cite show each decision and who made it.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import N3 from 'n3';
import { readCsv } from '../src/io/csv-read.js';
import { readRdfFile } from '../src/rdf/read.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const tmp = tempDir('concordat-round-trip-');
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', cwd: tmp });
const demo = path.join(tmp, 'demo');
const r1 = path.join(tmp, 'r1');
const r2 = path.join(tmp, 'r2');

/** What curators write into a row of the queue. */
interface Filled {
  verdict: string;
  curator: string;
  date: string;
  note: string;
}
const CURATORS = ['Maren Olofsdóttir', 'https://orcid.org/0000-0002-1825-0097', 'Élodie Varenne'];

/** RFC 4180 cell with a chosen separator: quoted when it holds the separator, a quote, CR or LF. */
const cell = (v: string, sep: string) => (v.includes(sep) || /["\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);
/** Rows as a spreadsheet saves them: UTF-8 with BOM, CRLF after every row. */
const save = (rows: string[][], sep: string) =>
  Buffer.concat([
    Buffer.from([0xef, 0xbb, 0xbf]),
    Buffer.from(rows.map((r) => r.map((c) => cell(c, sep)).join(sep) + '\r\n').join('')),
  ]);

const trip = (async () => {
  cpSync(path.join(repoRoot, 'demo-data'), demo, {
    recursive: true,
    filter: (f) => !f.includes(`${path.sep}releases`),
  });
  const b1 = run('build', path.join(demo, 'concordance.json'), '--out', r1);
  assert.equal(b1.status, 0, b1.stderr);
  const rows: string[][] = [];
  for await (const r of readCsv(path.join(r1, 'review-queue.csv'), ',')) rows.push(r.fields);
  const header = rows[0];
  const col = (name: string) => header.indexOf(name);
  const body = rows.slice(1);
  // decide the first five proposed links; everything else stays blank, as curators leave it
  const proposed = body.filter((r) => r[col('status')] === 'proposed' && r[col('link')]).slice(0, 5);
  assert.equal(proposed.length, 5, 'the demo queue has proposed links to decide');
  const verdicts = ['same', 'distinct', 'related', 'part', 'same'];
  const decided = new Map<string, Filled & { link: string; a: string; b: string }>();
  proposed.forEach((r, i) => {
    const f: Filled = {
      verdict: verdicts[i],
      curator: CURATORS[i % CURATORS.length],
      date: `2027-01-0${i + 1}`,
      note: `looked at the photos, row ${i}`,
    };
    r[col('verdict')] = i === 0 ? 'Same' : f.verdict; // a capital letter, as people type
    r[col('curator')] = f.curator;
    r[col('decided_on')] = f.date;
    r[col('note')] = f.note;
    decided.set(r[col('link')], { ...f, link: r[col('link')], a: r[0], b: r[1] });
  });
  const [first, second] = [proposed.slice(0, 3), proposed.slice(3)];
  const untouched = body.filter((r) => !proposed.includes(r));
  // sheet A: comma-separated, BOM + CRLF, with blank rows (separators only, and an empty line)
  const blank = header.map(() => '');
  writeFileSync(
    path.join(demo, 'decisions', 'queue-a.csv'),
    Buffer.concat([save([header, ...first, blank, ...untouched.slice(0, 40), blank], ','), Buffer.from('\r\n')]),
  );
  // sheet B: ";"-separated with decimal commas in every number column, BOM + CRLF
  const decimal = new Set(['score', 'pair_scores', 'pair_overlaps'].map(col));
  const commas = (r: string[]) => r.map((c, i) => (decimal.has(i) ? c.replace(/(\d)\.(\d)/g, '$1,$2') : c));
  writeFileSync(
    path.join(demo, 'decisions', 'queue-b.csv'),
    save([header, ...[...second, ...untouched.slice(40)].map(commas)], ';'),
  );
  const p = JSON.parse(readFileSync(path.join(demo, 'concordance.json'), 'utf8'));
  p.decisions.push('decisions/queue-a.csv', 'decisions/queue-b.csv');
  p.release = { ...p.release, version: '2026.2', issued: '2027-01-15' };
  writeFileSync(path.join(demo, 'concordance-2.json'), JSON.stringify(p, null, 2));
  return { decided, undecided: untouched.length };
})();

test('check reads both sheets: the decisions, and the rows nobody decided counted and skipped', async () => {
  const { decided, undecided } = await trip;
  const r = run('check', path.join(demo, 'concordance-2.json'), '--json');
  assert.equal(r.status, 0, r.stderr);
  const j = JSON.parse(r.stdout);
  assert.equal(j.decisionRowsWithoutVerdict, undecided);
  const base = JSON.parse(run('check', path.join(demo, 'concordance.json'), '--json').stdout);
  assert.equal(j.decisions, base.decisions + decided.size);
});

const built = (async () => {
  await trip;
  const b = run('build', path.join(demo, 'concordance-2.json'), '--out', r2, '--previous', r1);
  assert.equal(b.status, 0, b.stderr);
})();

/** The name a changes line or a citation uses for a curator: the name, or the IRI when that is all there is. */
const shown = (c: string) => (c.startsWith('https://') ? `<${c}>` : c);

test('diff names each decision, its curator, date and verdict', async () => {
  const { decided } = await trip;
  await built;
  const d = run('diff', r1, r2, '--json');
  assert.equal(d.status, 0, d.stderr);
  const changes = JSON.parse(d.stdout);
  const all = [...changes.claims.added, ...changes.claims.status, ...changes.claims.kind];
  for (const f of decided.values()) {
    const c = all.find((x: { link: string }) => x.link === f.link);
    assert.ok(c, `${f.a} – ${f.b} changed`);
    assert.equal(c.by.kind, 'curator');
    assert.equal(c.by.name ?? c.by.curator, f.curator);
    assert.equal(c.by.date, f.date);
    assert.equal(c.by.verdict, f.verdict);
    assert.equal(c.after.status, f.verdict === 'distinct' ? 'rejected' : 'confirmed');
    assert.equal(c.before.status, 'proposed');
    if (f.verdict === 'part') assert.equal(c.after.subject, f.a, 'work_a is part of work_b');
  }
  const text = run('diff', r1, r2).stdout;
  assert.equal(text, readFileSync(path.join(r2, 'changes.md'), 'utf8'), 'diff prints changes.md');
});

test('changes.md has one line per decision reading before → after and who decided', async () => {
  const { decided } = await trip;
  await built;
  const md = readFileSync(path.join(r2, 'changes.md'), 'utf8');
  const AFTER: Record<string, RegExp> = {
    same: /→ same work \(confirmed/,
    distinct: /→ distinct works \(rejected\)/,
    related: /→ related works \(confirmed/,
    part: /→ `[^`]+` is part of `[^`]+` \(confirmed/,
  };
  for (const f of decided.values()) {
    const lines = md.split('\n').filter((l) => l.includes(`<${f.link}>`));
    assert.equal(lines.length, 1, f.link);
    assert.match(lines[0], /: probably the same work \(proposed, score [\d.]+\) → /);
    assert.match(lines[0], AFTER[f.verdict]);
    assert.ok(lines[0].includes(`decided by ${shown(f.curator)} on ${f.date} (verdict ${f.verdict})`), lines[0]);
  }
});

test('changes.ttl names the review and the curator behind each decided change', async () => {
  const { decided } = await trip;
  await built;
  const store = new N3.Store(await readRdfFile(path.join(r2, 'changes.ttl')));
  const objects = (s: string, p: string) =>
    store.getObjects(N3.DataFactory.namedNode(s), N3.DataFactory.namedNode(p), null).map((o) => o.value);
  for (const f of decided.values()) {
    const reviews = objects(f.link, 'http://www.w3.org/ns/prov#wasGeneratedBy');
    assert.equal(reviews.length, 1, f.link);
    const [person] = objects(reviews[0], 'http://www.w3.org/ns/prov#wasAssociatedWith');
    assert.ok(person);
    assert.deepEqual(objects(reviews[0], 'http://purl.org/dc/terms/date'), [f.date]);
    if (f.curator.startsWith('https://')) assert.equal(person, f.curator);
    else assert.deepEqual(objects(person, 'http://www.w3.org/2000/01/rdf-schema#label'), [f.curator]);
  }
});

test('cite shows each decision with its curator, date, verdict and note, in text and CSL-JSON', async () => {
  const { decided } = await trip;
  await built;
  for (const f of decided.values()) {
    const t = run('cite', f.link, '--release', r2);
    assert.equal(t.status, 0, t.stderr);
    const who = f.curator;
    assert.ok(
      t.stdout.includes(`${f.verdict === 'distinct' ? 'as judged by' : 'confirmed by'} ${who} on ${f.date}`),
      t.stdout,
    );
    assert.ok(t.stdout.includes(`verdict ${f.verdict}, note "${f.note}"`), t.stdout);
    const [item] = JSON.parse(run('cite', f.link, '--release', r2, '--format', 'csl-json').stdout);
    assert.equal(item.URL, f.link);
    assert.deepEqual(item.curator, [{ literal: who }]);
    assert.equal(item.custom.decided, f.date);
  }
});
