// The demo's two releases: the changes of release 2027.1 against 2026.1 match the generator's answer key.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { build } from '../src/pipeline.js';
import { readClusterRegistry } from '../src/cluster/index.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const demo = path.join(repoRoot, 'demo-data');
const key = JSON.parse(readFileSync(path.join(demo, 'release-2', 'answer-key.json'), 'utf8'));
const tmp = tempDir('concordat-demo-history-');
const pair = (x: string, y: string) => [x, y].sort().join(' | ');

const built = (async () => {
  await build(path.join(demo, 'concordance.json'), path.join(tmp, '2026.1'));
  return build(path.join(demo, 'release-2', 'concordance.json'), path.join(tmp, '2027.1'), {
    previous: path.join(tmp, '2026.1'),
  });
})();

test('merges: each merged cluster holds both former clusters named by the answer key', async () => {
  const r = await built;
  const c = r.changes!;
  assert.equal(c.clusters.merged.length, key.counts.merges);
  const reg = await readClusterRegistry(path.join(tmp, '2027.1', 'clusters.csv'));
  const clusterOf = new Map<string, string>();
  for (const [id, refs] of reg.active) for (const w of refs) clusterOf.set(w, id);
  for (const m of key.merges) {
    const ids = new Set((m.joins as string[][]).flat().map((w) => clusterOf.get(w)));
    assert.equal(ids.size, 1, JSON.stringify(m.joins));
    assert.ok(c.clusters.merged.some((x) => x.into === [...ids][0]));
  }
  for (const m of c.clusters.merged)
    assert.ok(
      c.clusters.retired.some((x) => m.from.includes(x.id) && x.replacedBy[0] === m.into),
      'the other ID is retired into the survivor',
    );
});

test("split: the curator's distinct splits one cluster into the two sides of the answer key", async () => {
  const r = await built;
  const c = r.changes!;
  assert.equal(c.clusters.split.length, key.counts.splits);
  const reg = await readClusterRegistry(path.join(tmp, '2027.1', 'clusters.csv'));
  const clusterOf = new Map<string, string>();
  for (const [id, refs] of reg.active) for (const w of refs) clusterOf.set(w, id);
  const sides = (key.splits[0].sides as string[][]).map((s) => new Set(s.map((w) => clusterOf.get(w))));
  for (const s of sides) assert.equal(s.size, 1);
  assert.deepEqual([...sides[0], ...sides[1]].sort(), [...c.clusters.split[0].into].sort());
});

test('claims: confirmed after being proposed, disappeared, and the overridden decision, as in the answer key', async () => {
  const c = (await built).changes!;
  const status = (from: string, to: string) =>
    c.claims.status
      .filter((x) => x.before!.status === from && x.after!.status === to)
      .map((x) => pair(x.subject, x.object))
      .sort();
  assert.deepEqual(
    status('proposed', 'confirmed'),
    (key.confirmedFromProposed as string[][]).map(([x, y]) => pair(x, y)).sort(),
  );
  assert.deepEqual(
    c.claims.removed.map((x) => pair(x.subject, x.object)).sort(),
    (key.disappeared as string[][]).map(([x, y]) => pair(x, y)).sort(),
  );
  const [x, y] = key.overriddenDecision.pair as string[];
  assert.deepEqual(status('confirmed', 'rejected'), [pair(x, y)]);
  assert.ok(c.partners.brindle.added >= key.counts.newSameLinks - 1, "Brindle's links are new");
});
