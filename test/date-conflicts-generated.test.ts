// A generated consortium with misdated records (bench/generate.ts): every record centuries off its cluster, and every
// record the answer key says was misdated, is listed in conflicts.csv.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { build } from '../src/pipeline.js';
import { workRef } from '../src/model.js';
import { dateReader } from '../src/analyse/readings.js';
import { generateProject } from '../bench/generate.js';
import { tempDir } from './helpers/fixture.js';
import { centuriesOff, conflictRows } from './helpers/centuries-off.js';

test('generated, 2,000 works with 2% misdated records: every record centuries off its cluster is in conflicts.csv', async () => {
  const tmp = tempDir('concordat-conflicts-generated-');
  const gen = await generateProject(path.join(tmp, 'project'), {
    works: 2000,
    partners: 5,
    seed: 314,
    partnerDumps: false,
    rates: { misdated: 0.02 },
  });
  const r = await build(gen.projectFile, path.join(tmp, 'release'), { validate: false });
  const rows = await conflictRows(path.join(tmp, 'release', 'conflicts.csv'));
  const off = centuriesOff(r);
  assert.ok(off.length >= 10, `${off.length} records a century or more off their cluster`);
  for (const ref of off) assert.ok(rows.has(ref), `${ref} is a century or more off its cluster but not listed`);
  // the answer key's misdated records (one to three centuries off their artwork): listed wherever the release puts
  // them in a cluster beside another dated record
  const misdated = readFileSync(gen.answerKey, 'utf8')
    .split('\n')
    .slice(1)
    .filter((line) => line.endsWith(',1'))
    .map((line) => line.slice(0, line.indexOf(',')));
  const read = dateReader(r.model);
  const clusterOf = new Map(Array.from(r.model.works.keys(), (w) => [workRef(r.model, w), r.clustering.clusterOf[w]]));
  let checked = 0;
  for (const ref of misdated) {
    const c = clusterOf.get(ref)!;
    if (c < 0) continue;
    const others = Array.from(r.clustering.clusters[c].members).filter(
      (w) => workRef(r.model, w) !== ref && read(w).kind === 'interval',
    );
    if (others.length === 0) continue;
    checked++;
    assert.ok(rows.has(ref), `misdated ${ref} is not in conflicts.csv`);
  }
  assert.ok(checked >= 10, `${checked} misdated records in clusters checked`);
});
