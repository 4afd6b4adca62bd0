// The demo's catalogues date in German and French; every record a century or more off its cluster is in conflicts.csv.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { build, type BuildResult } from '../src/pipeline.js';
import { readCsv } from '../src/io/csv-read.js';
import { CONFLICTS_HEADER } from '../src/report/index.js';
import { yearsApart } from '../src/analyse/index.js';
import { dateReader } from '../src/analyse/readings.js';
import { workRef } from '../src/model.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const demo = path.join(repoRoot, 'demo-data');
const tmp = tempDir('concordat-date-conflicts-');
const first = build(path.join(demo, 'concordance.json'), path.join(tmp, '2026.1'));
const second = first.then(() =>
  build(path.join(demo, 'release-2', 'concordance.json'), path.join(tmp, '2027.1'), {
    previous: path.join(tmp, '2026.1'),
  }),
);

async function listed(release: string): Promise<Map<string, Record<string, string>>> {
  const out = new Map<string, Record<string, string>>();
  let header: string[] | undefined;
  for await (const r of readCsv(path.join(tmp, release, 'conflicts.csv'), ',')) {
    if (header === undefined) {
      header = r.fields;
      continue;
    }
    out.set(r.fields[0], Object.fromEntries(header.map((h, i) => [h, r.fields[i]])));
  }
  assert.deepEqual(header, [...CONFLICTS_HEADER]);
  return out;
}

/**
 * Independent of the consensus sweep: every pair of dated records of each cluster, brute force. A record is a century
 * or more off its cluster when at least half of the cluster's other dated records lie 100 years or more from it.
 */
function centuriesOff(r: BuildResult): string[] {
  const read = dateReader(r.model);
  const out: string[] = [];
  for (const c of r.clustering.clusters) {
    const dated = Array.from(c.members).filter((w) => read(w).kind === 'interval');
    for (const w of dated) {
      const others = dated.filter((x) => x !== w);
      const far = others.filter((x) => yearsApart(read(w) as never, read(x) as never) >= 100).length;
      if (others.length > 0 && far * 2 >= others.length) out.push(workRef(r.model, w));
    }
  }
  return out.sort();
}

test('the demo catalogues date in German and French, and every date is read', async () => {
  const kessling = readFileSync(path.join(demo, 'catalogues', 'kessling.csv'), 'utf8');
  const fontclaire = readFileSync(path.join(demo, 'catalogues', 'fontclaire.csv'), 'utf8');
  for (const phrase of [/;um \d{4};/, /;\d{4} bis \d{4};/, /;1\d\. Jh\.;/]) assert.match(kessling, phrase);
  for (const phrase of [/,vers \d{4},/, /,entre \d{4} et \d{4},/, /,X[IVX]+e siècle,/, /,X[IVX]+e s\.,/])
    assert.match(fontclaire, phrase);
  const r = await first;
  const unread = r.model.warnings.filter((w) => /is not a form concordat reads/.test(w.message));
  assert.deepEqual(unread, [], 'no date of release 1 is left unread');
});

test('every record a century or more off its cluster is listed in conflicts.csv (release 1)', async () => {
  const r = await first;
  const off = centuriesOff(r);
  assert.ok(off.length >= 1, 'the demo has records a century or more off');
  const rows = await listed('2026.1');
  for (const ref of off)
    assert.ok(rows.has(ref), `${ref} is a century or more off its cluster but not in conflicts.csv`);
  // the answer key's deliberate conflicts: the record given a later date is listed, with how far apart
  const key = JSON.parse(readFileSync(path.join(demo, 'answer-key.json'), 'utf8')) as {
    dateConflicts: { b: string; dates: string[] }[];
  };
  for (const k of key.dateConflicts) {
    const row = rows.get(k.b);
    assert.ok(row, `${k.b} (${k.dates.join(' vs ')}) is in conflicts.csv`);
    assert.equal(row.date_as_catalogued, k.dates[1]);
    assert.ok(Number(row.years_apart) > 25, `${k.b}: more than the default tolerance apart`);
  }
  // ranked: most years apart first
  const apart = [...rows.values()].map((x) => Number(x.years_apart));
  assert.deepEqual(
    apart,
    [...apart].sort((a, b) => b - a),
  );
});

test("release 2: Brindle's date a century later than its partners' (1530 against 15th century) is listed against the date the other two give", async () => {
  const r = await second;
  const rows = await listed('2027.1');
  for (const ref of centuriesOff(r))
    assert.ok(rows.has(ref), `${ref} is a century or more off its cluster but not in conflicts.csv`);
  const key = JSON.parse(readFileSync(path.join(demo, 'release-2', 'answer-key.json'), 'utf8')) as {
    brindle: { dateConflict: { a: string; b: string } };
  };
  const brindle = key.brindle.dateConflict.b;
  const row = rows.get(brindle);
  assert.ok(row, `${brindle} is in conflicts.csv`);
  assert.match(row.consensus_records, /^2 of 3$/);
  assert.equal(row.years_apart, '30'); // 1530 against 15th century (ordinal at Vellmar: 1401–1500)
});
