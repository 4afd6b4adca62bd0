// Releases over time: stable cluster and link IRIs, merges, splits, retirements, revisions, invalidations, changes
// files.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import { build } from '../src/pipeline.js';
import { readRdfFile } from '../src/rdf/read.js';
import { hash } from '../src/rdf/terms.js';
import { iri } from '../src/namespaces.js';
import { diffReleases } from '../src/history/diff.js';
import { isEmpty } from '../src/history/compare.js';
import { writeTinyProject } from './helpers/releases.js';
import { tempDir } from './helpers/fixture.js';

const BASE = 'https://concordance.example.org/';
const R1 = [
  'a:p1,b:p1,0.9,1',
  'a:p1x,b:p1,0.8,0.9',
  'a:p2,b:p2,0.9,1',
  'a:p3,b:p3,0.9,1',
  'b:p3,c:p3,0.9,1',
  'c:p3,a:p6,0.9,1',
  'a:p4,b:p4,0.9,1',
  'a:p5,b:p5,0.8,1',
];
const R2 = [...R1.filter((r) => !r.startsWith('a:p4')), 'b:p1,a:p2,0.9,1'];
const D2 = ['b:3,c:3,distinct,Test Curator,2026-05-01,look-alike', 'a:5,b:5,same,Test Curator,2026-05-02,'];

const dir = tempDir('concordat-history-');
const rel = (v: string) => path.join(dir, 'releases', v);
const link = (x: string, y: string) => `${BASE}link/${hash(x, y)}`;
const cluster = (id: string) => `${BASE}work/${id}`;
const { namedNode: nn, literal } = N3.DataFactory;
const P = (prefix: Parameters<typeof iri>[0], local: string) => nn(iri(prefix, local));

async function storeOf(version: string): Promise<N3.Store> {
  return new N3.Store(await readRdfFile(path.join(rel(version), 'concordance.nq')));
}
const objects = (s: N3.Store, subject: string, p: N3.NamedNode) =>
  s
    .getObjects(nn(subject), p, null)
    .map((o) => o.value)
    .sort();

const built = (async () => {
  const r1 = await build(writeTinyProject(dir, { version: '1', issued: '2026-01-10', evidence: R1 }), rel('1'));
  const r2 = await build(
    writeTinyProject(dir, { version: '2', issued: '2026-06-01', evidence: R2, decisions: D2 }),
    rel('2'),
    { previous: rel('1') },
  );
  const r3 = await build(
    writeTinyProject(dir, {
      version: '3',
      evidence: R2,
      decisions: [...D2, 'a:1,b:1,distinct,Test Curator,2026-07-01,'],
      previous: 'releases/2',
    }),
    rel('3'),
  );
  return { r1, r2, r3, s1: await storeOf('1'), s2: await storeOf('2'), s3: await storeOf('3') };
})();

test('release 1: five clusters numbered by smallest member, no history files', async () => {
  const { r1 } = await built;
  assert.deepEqual(
    r1.clustering.clusters.map((c) => c.id),
    ['c000001', 'c000002', 'c000003', 'c000004', 'c000005'],
  );
  assert.equal(r1.changes, undefined);
  assert.throws(() => readFileSync(path.join(rel('1'), 'changes.md')));
});

test('merge: the older ID survives, the other is retired with isReplacedBy and owl:deprecated, invalidated by release 2', async () => {
  const { r2, s2 } = await built;
  assert.deepEqual(r2.changes!.clusters.merged, [{ into: 'c000001', from: ['c000001', 'c000002'] }]);
  assert.match(readFileSync(path.join(rel('2'), 'clusters.csv'), 'utf8'), /^c000002,,retired,c000001$/m);
  const c2 = cluster('c000002');
  assert.deepEqual(objects(s2, c2, P('dcterms', 'isReplacedBy')), [cluster('c000001')]);
  assert.deepEqual(objects(s2, c2, P('owl', 'deprecated')), ['true']);
  assert.deepEqual(objects(s2, c2, P('prov', 'wasInvalidatedBy')), [`${BASE}release/2`]);
  assert.deepEqual(objects(s2, c2, P('prov', 'invalidatedAtTime')), ['2026-06-01T00:00:00Z']);
  assert.deepEqual(
    objects(s2, `${BASE}release/2`, P('rdf', 'type')).sort(),
    [iri('cx', 'Release'), iri('prov', 'Activity')].sort(),
  );
});

test('split: the old ID stays on the larger (first) part, the other part gets a new ID, never owl:sameAs', async () => {
  const { r2, s2 } = await built;
  assert.deepEqual(r2.changes!.clusters.split, [{ from: 'c000003', into: ['c000003', 'c000006'] }]);
  assert.deepEqual(r2.changes!.clusters.new, ['c000006']);
  const sameAsOnClusters = s2
    .getQuads(null, P('owl', 'sameAs'), null, null)
    .filter((q) => q.subject.value.startsWith(`${BASE}work/`) || q.object.value.startsWith(`${BASE}work/`));
  assert.deepEqual(sameAsOnClusters, []);
  const members = (id: string) => objects(s2, cluster(id), P('cx', 'member'));
  assert.deepEqual(members('c000003'), ['https://a.example.org/work/3', 'https://b.example.org/work/3']);
  assert.deepEqual(members('c000006'), ['https://a.example.org/work/6', 'https://c.example.org/work/3']);
});

test('retirement: a cluster whose only link disappeared is a tombstone with no successor; the link is invalidated', async () => {
  const { r2, s2 } = await built;
  assert.deepEqual(r2.changes!.clusters.retired, [
    { id: 'c000002', replacedBy: ['c000001'] },
    { id: 'c000004', replacedBy: [] },
  ]);
  assert.deepEqual(objects(s2, cluster('c000004'), P('owl', 'deprecated')), ['true']);
  assert.deepEqual(objects(s2, cluster('c000004'), P('dcterms', 'isReplacedBy')), []);
  const gone = link('a:4', 'b:4');
  assert.deepEqual(
    r2.changes!.claims.removed.map((c) => c.link),
    [gone],
  );
  assert.deepEqual(objects(s2, gone, P('prov', 'wasInvalidatedBy')), [`${BASE}release/2`]);
  assert.deepEqual(objects(s2, gone, P('prov', 'invalidatedAtTime')), ['2026-06-01T00:00:00Z']);
  assert.ok(!objects(s2, gone, P('rdf', 'type')).includes(iri('cx', 'Link')), 'a gone link is no current cx:Link');
  const earlier = `${gone}/v/1`;
  assert.deepEqual(objects(s2, earlier, P('cx', 'status')), [iri('cx', 'Proposed')]);
  assert.deepEqual(objects(s2, earlier, P('dcterms', 'isVersionOf')), [gone]);
  assert.deepEqual(
    objects(s2, earlier, P('rdf', 'type')).sort(),
    [iri('cx', 'LinkState'), iri('prov', 'Entity')].sort(),
    'an earlier state is no cx:Link',
  );
  assert.equal(objects(s2, earlier, P('prov', 'wasDerivedFrom')).length, 1, 'the earlier state keeps its image match');
});

test('revision: a proposed link confirmed in release 2 is a revision of its release-1 state; a rejected one is invalidated', async () => {
  const { s1, s2, r2 } = await built;
  const l = link('a:5', 'b:5');
  assert.deepEqual(objects(s1, l, P('cx', 'status')), [iri('cx', 'Proposed')], 'same IRI in both releases');
  assert.deepEqual(objects(s2, l, P('cx', 'status')), [iri('cx', 'Confirmed')]);
  assert.deepEqual(objects(s2, l, P('prov', 'wasRevisionOf')), [`${l}/v/1`]);
  assert.deepEqual(objects(s2, `${l}/v/1`, P('cx', 'relation')), [iri('skos', 'closeMatch')]);
  assert.deepEqual(objects(s2, `${l}/v/1`, P('cx', 'status')), [iri('cx', 'Proposed')]);
  // the earlier state keeps the confidence release 1 published for the link
  const conf1 = objects(s1, l, P('cx', 'confidence'));
  assert.equal(conf1.length, 1);
  assert.deepEqual(objects(s2, `${l}/v/1`, P('cx', 'confidence')), conf1);
  assert.deepEqual(objects(s2, l, P('prov', 'wasInvalidatedBy')), []);
  const rejected = link('b:3', 'c:3');
  assert.deepEqual(objects(s2, rejected, P('cx', 'status')), [iri('cx', 'Rejected')]);
  assert.deepEqual(objects(s2, rejected, P('prov', 'wasInvalidatedBy')), [`${BASE}release/2`]);
  assert.deepEqual(
    r2.changes!.claims.status.map((c) => [c.link, c.before!.status, c.after!.status]).sort(),
    [
      [l, 'proposed', 'confirmed'],
      [rejected, 'proposed', 'rejected'],
    ].sort(),
  );
});

test("dataset: previousVersion is the previous release's dataset IRI read from its dataset.ttl", async () => {
  const { s2, s3 } = await built;
  assert.deepEqual(objects(s2, `${BASE}dataset/2`, P('dcat', 'previousVersion')), [`${BASE}dataset/1`]);
  assert.deepEqual(objects(s3, `${BASE}dataset/3`, P('dcat', 'previousVersion')), [`${BASE}dataset/2`]);
  assert.equal(s2.countQuads(nn(`${BASE}dataset/2`), P('dcat', 'version'), literal('2'), null), 1);
});

test('release 3: tombstones carried with their recorded invalidation; an undated release invalidates without a time', async () => {
  const { s3, r3 } = await built;
  assert.deepEqual(objects(s3, cluster('c000004'), P('prov', 'wasInvalidatedBy')), [`${BASE}release/2`]);
  assert.deepEqual(objects(s3, cluster('c000002'), P('prov', 'invalidatedAtTime')), ['2026-06-01T00:00:00Z']);
  assert.match(readFileSync(path.join(rel('3'), 'clusters.csv'), 'utf8'), /^c000004,,retired,$/m);
  const l = link('a:1', 'b:1');
  assert.deepEqual(objects(s3, l, P('prov', 'wasInvalidatedBy')), [`${BASE}release/3`]);
  assert.deepEqual(objects(s3, l, P('prov', 'invalidatedAtTime')), []);
  assert.deepEqual(objects(s3, `${BASE}release/3`, P('prov', 'endedAtTime')), []);
  assert.deepEqual(r3.changes!.clusters.retired, []);
  assert.equal(
    objects(s3, `${l}/v/2`, P('cx', 'status'))[0],
    iri('cx', 'Proposed'),
    'earlier states come from the previous release only',
  );
});

test('changes.md equals `diff` of the two folders; diff of a release with itself is empty', async () => {
  await built;
  const { changesMarkdown } = await import('../src/history/markdown.js');
  assert.equal(
    changesMarkdown(await diffReleases(rel('1'), rel('2'))),
    readFileSync(path.join(rel('2'), 'changes.md'), 'utf8'),
  );
  for (const v of ['1', '2', '3'])
    assert.ok(isEmpty(await diffReleases(rel(v), rel(v))), `release ${v} against itself`);
  assert.ok(!isEmpty(await diffReleases(rel('2'), rel('3'))));
});

test('changes.ttl holds exactly the history quads that are also in concordance.nq', async () => {
  const { s2 } = await built;
  const ttl = await readRdfFile(path.join(rel('2'), 'changes.ttl'));
  assert.ok(ttl.length > 0);
  for (const q of ttl)
    assert.equal(s2.countQuads(q.subject, q.predicate, q.object, null), 1, `${q.subject.value} ${q.predicate.value}`);
});

test('the same inputs give byte-identical history files', async () => {
  await built;
  const again = path.join(dir, 'again');
  await build(path.join(dir, 'concordance-2.json'), again, { previous: rel('1') });
  for (const f of ['changes.md', 'changes.ttl', 'concordance.nq', 'SHA256SUMS'])
    assert.equal(readFileSync(path.join(again, f), 'utf8'), readFileSync(path.join(rel('2'), f), 'utf8'), f);
});

test('a release with the same version as its previous one is refused before anything is written', async () => {
  await built;
  const file = writeTinyProject(path.join(dir, 'same'), { version: '2', evidence: R2 });
  await assert.rejects(
    build(file, path.join(dir, 'same-out'), { previous: rel('2') }),
    /release\.version: "2" is also the version of the previous release/,
  );
  assert.throws(() => readFileSync(path.join(dir, 'same-out', 'SHA256SUMS')));
});
