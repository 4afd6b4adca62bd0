// The demo's catalogues date in German and French; every record a century or more off its cluster is in conflicts.csv.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { build } from '../src/pipeline.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { centuriesOff, conflictRows } from './helpers/centuries-off.js';

const demo = path.join(repoRoot, 'demo-data');
const tmp = tempDir('concordat-date-conflicts-');
const first = build(path.join(demo, 'concordance.json'), path.join(tmp, '2026.1'));
const second = first.then(() =>
  build(path.join(demo, 'release-2', 'concordance.json'), path.join(tmp, '2027.1'), {
    previous: path.join(tmp, '2026.1'),
  }),
);

const listed = (release: string) => conflictRows(path.join(tmp, release, 'conflicts.csv'));

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
