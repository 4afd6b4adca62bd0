// Report stage: RFC 4180 CSV cells, formula neutralisation where spreadsheets read, a filled-in review queue loading
// as a decisions file, and byte-identical report files from two runs.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { csvCell, csvLine, neutralise } from '../src/io/csv-write.js';
import { link } from '../src/link/index.js';
import { cluster, readClusterRegistry, registryOf } from '../src/cluster/index.js';
import { analyse } from '../src/analyse/index.js';
import { writeReports, REPORT_FILES, REVIEW_HEADER, CONFLICTS_HEADER } from '../src/report/index.js';
import { readCsv } from '../src/io/csv-read.js';
import { loadDecisions } from '../src/load/decisions.js';
import { load } from '../src/load/index.js';
import { derive } from '../src/pipeline.js';
import { ProblemList } from '../src/errors.js';
import type { Decision, Model } from '../src/model.js';
import { tinyModel } from './helpers/model.js';
import { fixtureCopy, tempDir } from './helpers/fixture.js';
import { Namer } from '../src/rdf/index.js';
import { loadVocabMap } from '../src/rdf/vocab-map.js';

const namerOf = (m: Model) => new Namer(m, loadVocabMap(undefined).iris);

const tmp = () => tempDir('concordat-report-');

test('CSV cells: RFC 4180 quoting (comma, quote, CR, LF) and LF record ends', () => {
  // RFC 4180 §2.6: fields with line breaks, double quotes or commas are enclosed in double quotes;
  // §2.7: a double quote inside is escaped by another double quote
  const cases: [string, string][] = [
    ['plain', 'plain'],
    ['a,b', '"a,b"'],
    ['say "hi"', '"say ""hi"""'],
    ['two\nlines', '"two\nlines"'],
    ['cr\r', '"cr\r"'],
    ['', ''],
  ];
  for (const [input, expected] of cases) assert.equal(csvCell(input), expected, JSON.stringify(input));
  assert.equal(csvLine(['a', 'b,c']), 'a,"b,c"\n');
});

test('CSV neutralisation: cells starting with = + - @ get a leading apostrophe, others are untouched', () => {
  // formula-injection guard (common practice, no source)
  const cases: [string, string][] = [
    ['=HYPERLINK("http://x.example/","x")', '\'=HYPERLINK("http://x.example/","x")'],
    ['+1', "'+1"],
    ['-500/-401', "'-500/-401"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['Madonna = Maria', 'Madonna = Maria'],
    ["'quoted", "'quoted"],
    ['', ''],
  ];
  for (const [input, expected] of cases) assert.equal(neutralise(input), expected, input);
  assert.equal(csvLine(['=1', '=1'], [false, true]), "=1,'=1\n");
  assert.equal(csvLine(['=a,b'], [true]), `"'=a,b"\n`, 'neutralised, then quoted');
});

/** A tiny project touching every report section: conflicts, implied pairs, a bridge, gold, hostile titles. */
function richModel(): Model {
  return tinyModel({
    partners: [{ key: 'a', convention: 'ordinal' }, { key: 'b', convention: 'iso' }, 'c'],
    works: [
      { ref: 'a:1', title: '=HYPERLINK("http://evil.example/","Madonna")', date: '1475' },
      { ref: 'b:1', title: 'Thronende Madonna, "klein"\nzweite Zeile', date: '1520' },
      { ref: 'c:1', title: '@Madonna', date: '15th century' },
      { ref: 'a:2', title: '+Saint', date: '-0500/-0401' },
      { ref: 'b:2', title: '-Saint', date: '-0300' },
      { ref: 'c:2', title: 'Saint', date: '' },
      { ref: 'b:3', title: 'Detail', date: '' },
      { ref: 'a:4', title: 'Alone', date: '1600' },
      { ref: 'b:4', title: 'Alone too', date: '1601' },
    ],
    matches: [
      ['a:1', 'c:1', 0.91],
      ['c:1', 'b:1', 0.8],
      ['a:2', 'b:2', 0.9],
      ['b:2', 'c:2', 0.85],
      ['c:2', 'b:3', 0.8],
      ['a:4', 'b:4', 0.52],
      ['b:3', 'a:4', 0.7, 0.5],
    ],
    decisions: [['a:4', 'b:4', 'same', 'https://orcid.org/0000-0002-1825-0097', '2026-11-02']],
    gold: [
      ['a:1', 'b:1'],
      ['a:2', 'c:2'],
      ['a:4', 'c:1'],
    ],
  });
}

async function reportInto(m: Model): Promise<{ dir: string; files: string[] }> {
  const ls = link(m);
  const c = cluster(m, ls);
  const dir = tmp();
  return { dir, files: await writeReports(dir, m, ls, c, analyse(m, ls, c), namerOf(m)) };
}

test('report files: neutralised spreadsheet cells, untouched references; CSV files with BOM and CRLF, the rest without', async () => {
  const { dir, files } = await reportInto(richModel());
  assert.deepEqual(
    files.map((f) => path.basename(f)),
    [...REPORT_FILES],
  );
  for (const f of files) {
    const bytes = readFileSync(f);
    const csv = f.endsWith('.csv');
    assert.equal(
      bytes.subarray(0, 3).equals(Buffer.from([0xef, 0xbb, 0xbf])),
      csv,
      `${path.basename(f)}: ${csv ? 'a' : 'no'} BOM`,
    );
    // RFC 4180 §2.1: each record ends with CRLF; a line break inside a quoted cell is content
    const outside = bytes.toString('utf8').replace(/"(?:[^"]|"")*"/g, '');
    if (csv) assert.ok(!/[^\r]\n/.test(outside) && outside.endsWith('\r\n'), `${path.basename(f)}: CRLF record ends`);
    else assert.ok(!outside.includes('\r'), `${path.basename(f)}: LF only`);
  }
  const queue = readFileSync(path.join(dir, 'review-queue.csv'), 'utf8');
  assert.equal(queue.slice(1).split('\r\n')[0], REVIEW_HEADER.join(','));
  assert.ok(queue.includes(`"'=HYPERLINK(""http://evil.example/"",""Madonna"")"`), 'title neutralised and quoted');
  assert.ok(queue.includes(`,'@Madonna,`));
  const conflicts = readFileSync(path.join(dir, 'conflicts.csv'), 'utf8');
  assert.equal(conflicts.slice(1).split('\r\n')[0], CONFLICTS_HEADER.join(','));
  // b:2 (-0300) and a:2 (-0500/-0401) are 101 years apart, a pair with no majority: each listed against the other
  assert.ok(
    conflicts.includes(",'-0300,'-300,'-0500/-0401,'-500/-401,1 of 2 (tie: no majority),101,its cluster,"),
    'dates as catalogued and intervals read neutralised',
  );
  const registry = readFileSync(path.join(dir, 'clusters.csv'), 'utf8');
  assert.ok(!registry.includes("'"), 'clusters.csv is never neutralised');
});

test('release.csv "plain": the same CSV files with LF and no BOM, and clusters.csv reads back either way', async () => {
  const m = richModel();
  const sheet = await reportInto(m);
  m.project.release.csv = 'plain';
  const plain = await reportInto(m);
  for (const name of ['review-queue.csv', 'conflicts.csv', 'clusters.csv']) {
    const a = readFileSync(path.join(sheet.dir, name), 'utf8'),
      b = readFileSync(path.join(plain.dir, name), 'utf8');
    assert.ok(!b.startsWith('\uFEFF') && !b.replace(/"(?:[^"]|"")*"/g, '').includes('\r'), `${name}: plain`);
    assert.equal(a.slice(1).replace(/\r\n/g, '\n'), b, `${name}: same records`);
  }
  const c = cluster(m, link(m));
  for (const dir of [sheet.dir, plain.dir])
    assert.deepEqual(await readClusterRegistry(path.join(dir, 'clusters.csv')), registryOf(m, c));
});

test('a filled-in review queue is a valid decisions file (read by header name, extra columns ignored)', async () => {
  const m = richModel();
  const { dir } = await reportInto(m);
  const queueFile = path.join(dir, 'review-queue.csv');
  const rows: string[][] = [];
  for await (const r of readCsv(queueFile, ',')) rows.push(r.fields);
  assert.equal(rows[0][4], 'decided_on');
  assert.ok(rows.length > 3, 'the queue has rows');
  const filled = rows.map((r, i) =>
    i === 0 ? r : [r[0], r[1], i % 2 ? 'same' : 'distinct', 'Jo Curator', '2026-12-01', `row ${i}`, ...r.slice(6)],
  );
  const file = path.join(dir, 'filled.csv');
  writeFileSync(file, filled.map((r) => csvLine(r)).join(''));
  const keys = m.project.partners.map((p) => p.key);
  const out: Decision[] = [];
  const problems = new ProblemList();
  await loadDecisions(
    { file },
    { keys, byKey: new Map(keys.map((k, i) => [k, i])), index: m.workIndex },
    out,
    problems,
  );
  assert.deepEqual(problems.items, []);
  assert.equal(out.length, rows.length - 1);
  out.forEach((d, i) => {
    const r = rows[i + 1];
    assert.equal(`${keys[m.works[d.a].partner]}:${m.works[d.a].id}`, r[0]);
    assert.equal(`${keys[m.works[d.b].partner]}:${m.works[d.b].id}`, r[1]);
    assert.equal(d.verdict, (i + 1) % 2 ? 'same' : 'distinct');
  });
});

test('two runs write byte-identical report files', async () => {
  const one = await reportInto(richModel());
  const two = await reportInto(richModel());
  for (const name of REPORT_FILES)
    assert.equal(readFileSync(path.join(one.dir, name), 'utf8'), readFileSync(path.join(two.dir, name), 'utf8'), name);
  const json = readFileSync(path.join(one.dir, 'report.json'), 'utf8');
  const md = readFileSync(path.join(one.dir, 'report.md'), 'utf8');
  for (const text of [json, md]) {
    assert.ok(!text.includes(one.dir) && !text.includes(tmpdir()), 'no absolute paths');
    assert.ok(!/\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(text), 'no clock time');
  }
});

test('end to end from a project folder: loaded model → reports, clusters.csv reads back as the registry', async () => {
  const project = path.join(fixtureCopy('load/base'), 'concordance.json');
  const texts: string[][] = [];
  for (let run = 0; run < 2; run++) {
    const { model } = await load(project);
    const { links, clustering } = await derive(model);
    const dir = tmp();
    const files = await writeReports(dir, model, links, clustering, analyse(model, links, clustering), namerOf(model));
    texts.push(files.map((f) => readFileSync(f, 'utf8')));
    assert.deepEqual(await readClusterRegistry(path.join(dir, 'clusters.csv')), registryOf(model, clustering));
    const report = JSON.parse(readFileSync(path.join(dir, 'report.json'), 'utf8'));
    assert.equal(report.agreement.goldPairs, 2);
    assert.equal(report.clusters.count, clustering.clusters.length);
  }
  assert.deepEqual(texts[0], texts[1]);
});
