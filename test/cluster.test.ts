// Cluster stage: link rules worked by hand, components, implied pairs, bridges, stable IDs, registry file, and
// components/bridges checked against graphology and brute force on random graphs.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { writeFileSync, readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { UndirectedGraph } from 'graphology';
import { connectedComponents } from 'graphology-components';
import { link, isClaim } from '../src/link/index.js';
import { pairKey } from '../src/link/types.js';
import {
  cluster,
  readClusterRegistry,
  writeClusterRegistry,
  registryOf,
  type ClusterRegistry,
  type Clustering,
} from '../src/cluster/index.js';
import { workRef, type Model } from '../src/model.js';
import { UserError } from '../src/errors.js';
import { tinyModel, workNo, type TinySpec } from './helpers/model.js';
import { tempDir } from './helpers/fixture.js';

const linkOf = (m: Model, x: string, y: string) => {
  const ls = link(m);
  const i = ls.byPair.get(pairKey(workNo(m, x), workNo(m, y)));
  assert.ok(i !== undefined, `a link ${x}–${y}`);
  return ls.links[i];
};
const refsOf = (m: Model, c: Clustering) =>
  c.clusters.map((k) => [k.id, Array.from(k.members, (w) => workRef(m, w))] as const);
const tmp = () => tempDir('concordat-cluster-');

// ---- link rules (worked by hand) ----

test('link: a later decision row for the same pair wins over an earlier one and over the score', () => {
  const m = tinyModel({
    partners: ['a', 'b'],
    works: ['a:1', 'b:1'],
    matches: [['a:1', 'b:1', 0.95]],
    decisions: [
      ['a:1', 'b:1', 'distinct', 'X'],
      ['b:1', 'a:1', 'same', 'Y', '2026-02-01'],
    ],
  });
  const l = linkOf(m, 'a:1', 'b:1');
  assert.equal(l.status, 'confirmed');
  assert.equal(l.kind, 'same');
  assert.equal(m.decisions[l.decision!].curator, 'Y');
  const m2 = tinyModel({
    partners: ['a', 'b'],
    works: ['a:1', 'b:1'],
    matches: [['a:1', 'b:1', 0.95]],
    decisions: [
      ['a:1', 'b:1', 'same'],
      ['a:1', 'b:1', 'distinct'],
    ],
  });
  assert.equal(linkOf(m2, 'a:1', 'b:1').status, 'rejected');
  assert.equal(cluster(m2, link(m2)).clusters.length, 0, 'a rejected link joins nothing');
});

test('link: a distinct decision on a pair with no image evidence is a rejected same link, not a part link', () => {
  const m = tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:1'], decisions: [['a:1', 'b:1', 'distinct']] });
  const l = linkOf(m, 'a:1', 'b:1');
  assert.equal(l.kind, 'same');
  assert.equal(l.status, 'rejected');
  assert.equal(l.part, undefined);
  assert.equal(l.support, 0);
});

test('link: part direction follows image_a of partial matches; a curator part decision sets it', () => {
  // overlap 0.5 < partOverlapBelow 0.7 and ≥ minOverlap 0.3: a reliable partial match, image_a (b:7) is the detail
  const m = tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:7'], matches: [['b:7', 'a:1', 0.8, 0.5]] });
  const l = linkOf(m, 'a:1', 'b:7');
  assert.equal(l.kind, 'part');
  assert.equal(l.status, 'proposed');
  assert.equal(l.part, workNo(m, 'b:7'));
  assert.equal(cluster(m, link(m)).clusters.length, 0, 'part links do not cluster');
  const m2 = tinyModel({
    partners: ['a', 'b'],
    works: ['a:1', 'b:7'],
    matches: [['b:7', 'a:1', 0.8, 0.5]],
    decisions: [['a:1', 'b:7', 'part']],
  });
  assert.equal(linkOf(m2, 'a:1', 'b:7').part, workNo(m2, 'a:1'), 'work_a of the decision is the part');
});

test('link: matches below minOverlap are evidence but propose nothing', () => {
  const m = tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:1'], matches: [['a:1', 'b:1', 0.99, 0.2]] });
  const l = linkOf(m, 'a:1', 'b:1');
  assert.equal(l.status, 'candidate');
  assert.equal(l.support, 1);
  assert.equal(l.reliableSupport, 0);
  const m2 = tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:1'], matches: [['a:1', 'b:1', 0.99, 0.3]] });
  assert.equal(linkOf(m2, 'a:1', 'b:1').status, 'proposed', 'overlap exactly minOverlap counts');
});

test('link: autoConfirmAt confirms at or above it; proposeAt proposes at or above it', () => {
  // one photograph: confidence = score × 2/3 (src/link/confidence.ts), compared with both thresholds
  const spec = (score: number): TinySpec => ({
    partners: ['a', 'b'],
    works: ['a:1', 'b:1'],
    matches: [['a:1', 'b:1', score]],
    policy: { autoConfirmAt: 0.6 },
  });
  const cases: [number, string][] = [
    [0.9, 'confirmed'],
    [0.89, 'proposed'],
    [0.75, 'proposed'],
    [0.74, 'candidate'],
  ];
  for (const [score, status] of cases)
    assert.equal(linkOf(tinyModel(spec(score)), 'a:1', 'b:1').status, status, `score ${score}`);
});

// ---- components and diagnostics ----

const threeArchives = (): Model =>
  tinyModel({
    partners: ['a', 'b', 'c'],
    works: ['a:1', 'a:2', 'b:1', 'b:2', 'c:1', 'c:2', 'a:9', 'b:9'],
    matches: [
      ['a:1', 'c:1', 0.9],
      ['c:1', 'b:1', 0.8], // a:1 and b:1 meet only through archive c
      ['a:2', 'b:2', 0.95],
      ['b:2', 'c:2', 0.9],
      ['c:2', 'a:2', 0.9], // triangle: no bridge, no implied pair
      ['a:9', 'b:9', 0.4], // candidate: no cluster
    ],
  });

test('clusters are components of ≥ 2 works over confirmed or proposed same links', () => {
  const m = threeArchives();
  const c = cluster(m, link(m));
  assert.deepEqual(refsOf(m, c), [
    ['c000001', ['a:1', 'b:1', 'c:1']],
    ['c000002', ['a:2', 'b:2', 'c:2']],
  ]);
  assert.equal(c.clusterOf[workNo(m, 'a:9')], -1);
  assert.equal(c.clusterOf[workNo(m, 'c:1')], 0);
});

test('implied pairs: a:1–b:1 are joined only through archive c; the triangle implies nothing', () => {
  const m = threeArchives();
  const c = cluster(m, link(m));
  assert.equal(c.implied.count, 1);
  assert.equal(c.impliedTotal, 1);
  assert.deepEqual([workRef(m, c.implied.a[0]), workRef(m, c.implied.b[0])], ['a:1', 'b:1']);
  assert.equal(c.implied.crossPartner[0], 1);
  assert.equal(c.implied.throughThird[0], 1);
});

test('implied pairs: a cross-partner pair with a path inside its two archives is not "through a third"', () => {
  // claims a:1–b:1, b:1–a:2, a:2–c:1 (a:1–a:2 only a candidate): one cluster of four, three implied pairs
  const m = tinyModel({
    partners: ['a', 'b', 'c'],
    works: ['a:1', 'a:2', 'b:1', 'c:1'],
    matches: [
      ['a:1', 'b:1', 0.9],
      ['b:1', 'a:2', 0.9],
      ['a:2', 'c:1', 0.9],
      ['a:1', 'a:2', 0.2],
    ],
  });
  const c = cluster(m, link(m));
  const got = new Map<string, [number, number]>();
  for (let i = 0; i < c.implied.count; i++)
    got.set(`${workRef(m, c.implied.a[i])} ${workRef(m, c.implied.b[i])}`, [
      c.implied.crossPartner[i],
      c.implied.throughThird[i],
    ]);
  assert.deepEqual(Object.fromEntries(got), {
    'a:1 a:2': [0, 0], // same archive: the candidate a:1–a:2 link (score 0.2) is no claim
    'a:1 c:1': [1, 1], // inside archives a and c, a:1 and c:1 are not joined (a:1–a:2 needs b:1)
    'b:1 c:1': [1, 1], // inside b and c: b:1 and c:1 are not joined
  });
  // with a direct a:1–a:2 claim, a:1 reaches c:1 within archives a and c
  const m2 = tinyModel({
    partners: ['a', 'b', 'c'],
    works: ['a:1', 'a:2', 'b:1', 'c:1'],
    matches: [
      ['a:1', 'b:1', 0.9],
      ['b:1', 'a:2', 0.9],
      ['a:2', 'c:1', 0.9],
      ['a:1', 'a:2', 0.9],
    ],
  });
  const c2 = cluster(m2, link(m2));
  const i = [...Array(c2.implied.count).keys()].find(
    (k) => workRef(m2, c2.implied.a[k]) === 'a:1' && workRef(m2, c2.implied.b[k]) === 'c:1',
  )!;
  assert.equal(c2.implied.throughThird[i], 0);
});

test('bridges: the tail of a triangle is a bridge, the triangle edges are not', () => {
  const m = tinyModel({
    partners: ['a', 'b', 'c'],
    works: ['a:1', 'b:1', 'c:1', 'a:2', 'b:2'],
    matches: [
      ['a:1', 'b:1', 0.9],
      ['b:1', 'c:1', 0.9],
      ['c:1', 'a:1', 0.9],
      ['c:1', 'a:2', 0.9],
      ['a:2', 'b:2', 0.9],
    ],
  });
  const ls = link(m);
  const c = cluster(m, ls, undefined, { coherence: false });
  const bridges = Array.from(
    c.bridges,
    (i, k) => `${workRef(m, ls.links[i].a)}–${workRef(m, ls.links[i].b)} ${c.bridgeMinSide[k]}`,
  ).sort();
  assert.deepEqual(bridges, ['a:2–b:2 1', 'a:2–c:1 2'], 'a:2–c:1 joins {a:2, b:2} to the triangle: smaller side 2');
});

test('bridges: the one link of a two-work cluster is not listed', () => {
  const m = tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:1'], matches: [['a:1', 'b:1', 0.9]] });
  assert.equal(cluster(m, link(m)).bridges.length, 0);
});

test('bridges on a path of 60 000 works: every edge, no call-stack overflow', () => {
  const n = 60000;
  const works = Array.from({ length: n }, (_, i) => `${i % 2 ? 'b' : 'a'}:${i}`);
  const matches = works.slice(1).map((w, i) => [works[i], w, 0.9] as [string, string, number]);
  const m = tinyModel({ partners: ['a', 'b'], works, matches });
  const c = cluster(m, link(m), undefined, { coherence: false });
  assert.equal(c.clusters.length, 1);
  assert.equal(c.bridges.length, n - 1);
  assert.equal(
    c.bridgeMinSide.reduce((x, y) => Math.max(x, y), 0),
    n / 2,
    'the middle link halves the path',
  );
  assert.equal(c.clusters[0].oversized, true);
  assert.equal(c.implied.count, 0, 'too large to list pairwise');
  assert.equal(c.impliedTotal, (n * (n - 1)) / 2 - (n - 1));
});

test('oversized: more members than 2 × partners by default; the threshold is an option', () => {
  const works = ['a:1', 'a:2', 'a:3', 'b:1', 'b:2'];
  const m = tinyModel({
    partners: ['a', 'b'],
    works,
    matches: works.slice(1).map((w, i) => [works[i], w, 0.9] as [string, string, number]),
  });
  const plain = { coherence: false };
  assert.equal(cluster(m, link(m), undefined, plain).oversizeAt, 4);
  assert.equal(cluster(m, link(m), undefined, plain).clusters[0].oversized, true, '5 members > 4');
  assert.equal(cluster(m, link(m), undefined, { ...plain, oversizeAt: 5 }).clusters[0].oversized, false);
});

// ---- stable IDs ----

const reg = (active: Record<string, string[]>, retired: [string, string[]][] = []): ClusterRegistry => ({
  active: new Map(Object.entries(active)),
  retired: retired.map(([id, replacedBy]) => ({ id, replacedBy })),
});
const chain = (...refs: string[]): [string, string, number][] => refs.slice(1).map((r, i) => [refs[i], r, 0.9]);
const allWorks = ['a:1', 'a:2', 'a:3', 'a:9', 'b:1', 'b:2', 'b:3', 'b:9', 'c:1', 'c:5', 'c:9'];
const clustered = (matches: [string, string, number][], previous?: ClusterRegistry) => {
  const m = tinyModel({ partners: ['a', 'b', 'c'], works: allWorks, matches });
  const c = cluster(m, link(m), previous);
  return { ids: Object.fromEntries(refsOf(m, c).map(([id, refs]) => [id, refs.join(' ')])), retired: c.retired };
};

test("first release: IDs in order of each cluster's smallest member reference", () => {
  const r = clustered([...chain('c:5', 'b:3'), ...chain('b:2', 'a:2'), ...chain('a:1', 'b:1')]);
  assert.deepEqual(r.ids, { c000001: 'a:1 b:1', c000002: 'a:2 b:2', c000003: 'b:3 c:5' });
  assert.deepEqual(r.retired, []);
});

test('merge with equal overlap: the older ID survives, the other is retired and replaced by it', () => {
  const prev = reg({ c000001: ['a:1', 'b:1'], c000002: ['a:2', 'b:2'], c000003: ['b:3', 'c:5'] });
  const r = clustered([...chain('a:1', 'b:1', 'a:2', 'b:2'), ...chain('b:3', 'c:5')], prev);
  assert.deepEqual(r.ids, { c000001: 'a:1 a:2 b:1 b:2', c000003: 'b:3 c:5' });
  assert.deepEqual(r.retired, [{ id: 'c000002', replacedBy: ['c000001'] }]);
});

test('merge with unequal overlap: the ID with more former members survives even if newer', () => {
  const prev = reg({ c000001: ['a:1', 'b:1'], c000002: ['a:2', 'b:2', 'c:1'] });
  const r = clustered(chain('a:1', 'b:1', 'a:2', 'b:2', 'c:1'), prev);
  assert.deepEqual(r.ids, { c000002: 'a:1 a:2 b:1 b:2 c:1' });
  assert.deepEqual(r.retired, [{ id: 'c000001', replacedBy: ['c000002'] }]);
});

test('split: the old ID goes to the largest part, the other part gets the next new ID', () => {
  const prev = reg({ c000001: ['a:1', 'a:9', 'b:1', 'b:9', 'c:1'] }, [['c000004', ['c000001']]]);
  const r = clustered([...chain('a:9', 'b:9'), ...chain('a:1', 'b:1', 'c:1')], prev);
  assert.deepEqual(
    r.ids,
    { c000001: 'a:1 b:1 c:1', c000005: 'a:9 b:9' },
    'c000005: after the highest ID ever issued (a tombstone)',
  );
  assert.deepEqual(r.retired, [{ id: 'c000004', replacedBy: ['c000001'] }], 'the tombstone is carried forward');
});

test('retirement: an old cluster whose members are all unclustered is retired with no successor', () => {
  const prev = reg({ c000001: ['a:1', 'b:1'], c000002: ['b:3', 'c:5'] });
  const r = clustered(chain('a:1', 'b:1'), prev);
  assert.deepEqual(r.ids, { c000001: 'a:1 b:1' });
  assert.deepEqual(r.retired, [{ id: 'c000002', replacedBy: [] }]);
});

test('split into equal parts: the part with the smaller first member keeps the ID', () => {
  const prev = reg({ c000003: ['a:1', 'a:2', 'b:1', 'b:2'] });
  const r = clustered([...chain('b:2', 'a:2'), ...chain('b:1', 'a:1')], prev);
  assert.deepEqual(r.ids, { c000003: 'a:1 b:1', c000004: 'a:2 b:2' });
});

// ---- registry file ----

test('clusters.csv round-trips: written registry reads back to the same registry', async () => {
  const m = tinyModel({
    partners: ['a', 'b', 'c'],
    works: allWorks,
    matches: [...chain('a:1', 'b:1', 'c:1'), ...chain('a:9', 'b:9')],
  });
  const prev = reg({ c000001: ['a:1', 'a:9', 'b:1', 'b:9', 'c:1'], c000002: ['b:3', 'c:5'] }, [
    ['c000004', ['c000001', 'c000002']],
  ]);
  const c = cluster(m, link(m), prev);
  const file = path.join(tmp(), 'clusters.csv');
  await writeClusterRegistry(file, m, c);
  const text = readFileSync(file, 'utf8');
  // written for spreadsheets by default (UTF-8 with BOM, CRLF; RFC 4180 §2.1) and read back in that form
  assert.equal(text.split('\r\n')[0], '\uFEFFcluster,work,status,replaced_by');
  assert.ok(text.includes('c000004,,retired,c000001\r\nc000004,,retired,c000002\r\n'));
  assert.ok(text.includes('c000002,,retired,\r\n'));
  assert.deepEqual(await readClusterRegistry(file), registryOf(m, c));
});

test('readClusterRegistry: bad rows are refused with file, line and field', async () => {
  const dir = tmp();
  const cases: [string, number, string, RegExp][] = [
    ['cluster,work,status,replaced_by\nc000001,a:1,active,\nc000001,a:2,actve,\n', 3, 'status', /unknown status/],
    ['cluster,work,status,replaced_by\nX1,a:1,active,\n', 2, 'cluster', /not a cluster ID/],
    [
      'cluster,work,status,replaced_by\nc000001,a:1,active,\nc000002,a:1,active,\n',
      3,
      'work',
      /already a member of c000001/,
    ],
    [
      'cluster,work,status,replaced_by\nc000001,a:1,active,\nc000001,,retired,c000002\n',
      3,
      'cluster',
      /both active and retired/,
    ],
    ['cluster,work,status,replaced_by\nc000001,,active,\n', 2, 'work', /not a work reference/],
    ['cluster,work,status\n', 0, '', /^$/],
  ];
  for (const [text, line, field, message] of cases) {
    const file = path.join(dir, `c${line}${field}.csv`);
    writeFileSync(file, text);
    if (line === 0) {
      assert.deepEqual(
        await readClusterRegistry(file),
        { active: new Map(), retired: [] },
        'a header alone is an empty registry',
      );
      continue;
    }
    await assert.rejects(readClusterRegistry(file), (e: unknown) => {
      assert.ok(e instanceof UserError);
      assert.equal(e.problems[0].file, file);
      assert.equal(e.problems[0].line, line);
      assert.equal(e.problems[0].field, field);
      assert.match(e.problems[0].message, message);
      return true;
    });
  }
});

// ---- random graphs ----

/** A random tiny project: 2–40 works over 3 archives, random matches and a few decisions. */
const randomSpec = fc.integer({ min: 2, max: 40 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    edges: fc.array(
      fc.tuple(fc.nat(n - 1), fc.nat(n - 1), fc.constantFrom(0.2, 0.55, 0.7, 0.9, 1), fc.constantFrom(1, 1, 0.5, 0.1)),
      { maxLength: 60, size: 'max' },
    ),
    decisions: fc.array(
      fc.tuple(
        fc.nat(n - 1),
        fc.nat(n - 1),
        fc.constantFrom('same', 'part', 'related', 'distinct') as fc.Arbitrary<'same'>,
      ),
      { maxLength: 5 },
    ),
  }),
);
const build = ({
  n,
  edges,
  decisions,
}: {
  n: number;
  edges: [number, number, number, number][];
  decisions: [number, number, 'same'][];
}) => {
  const ref = (i: number) => `${'abc'[i % 3]}:${i}`;
  return tinyModel({
    partners: ['a', 'b', 'c'],
    works: Array.from({ length: n }, (_, i) => ref(i)),
    matches: edges.filter(([x, y]) => x !== y).map(([x, y, s, o]) => [ref(x), ref(y), s, o]),
    decisions: decisions.filter(([x, y]) => x !== y).map(([x, y, v]) => [ref(x), ref(y), v]),
  });
};

test('clusters equal graphology connectedComponents (size ≥ 2) over same claims, on random graphs', () => {
  fc.assert(
    fc.property(randomSpec, (spec) => {
      const m = build(spec);
      const ls = link(m);
      const g = new UndirectedGraph();
      m.works.forEach((_, w) => g.addNode(String(w)));
      for (const l of ls.links) if (l.kind === 'same' && isClaim(l)) g.addEdge(String(l.a), String(l.b));
      const expected = connectedComponents(g)
        .filter((c) => c.length >= 2)
        .map((c) =>
          c
            .map(Number)
            .sort((x, y) => x - y)
            .join(' '),
        )
        .sort();
      const got = cluster(m, ls, undefined, { coherence: false })
        .clusters.map((c) =>
          Array.from(c.members)
            .sort((x, y) => x - y)
            .join(' '),
        )
        .sort();
      assert.deepEqual(got, expected);
    }),
    { numRuns: 200 },
  );
});

test('bridges, implied pairs and "through a third archive" equal brute force on random graphs', () => {
  fc.assert(
    fc.property(randomSpec, (spec) => {
      const m = build(spec);
      const ls = link(m);
      const c = cluster(m, ls, undefined, { coherence: false });
      const edges = ls.links.map((l, i) => [l, i] as const).filter(([l]) => l.kind === 'same' && isClaim(l));
      const componentsWithout = (skip: number, keep: (w: number) => boolean = () => true) => {
        const g = new UndirectedGraph();
        m.works.forEach((_, w) => {
          if (keep(w)) g.addNode(String(w));
        });
        for (const [l, i] of edges) if (i !== skip && keep(l.a) && keep(l.b)) g.addEdge(String(l.a), String(l.b));
        const label = new Map<number, number>();
        connectedComponents(g).forEach((comp, k) => comp.forEach((w) => label.set(Number(w), k)));
        return label;
      };
      const all = componentsWithout(-1);
      const bridges: string[] = [];
      for (const [l, i] of edges) {
        const without = componentsWithout(i);
        const size = (label: Map<number, number>, w: number) =>
          [...label.values()].filter((x) => x === label.get(w)).length;
        if (without.get(l.a) !== without.get(l.b) && size(all, l.a) >= 3)
          bridges.push(`${i} ${Math.min(size(without, l.a), size(without, l.b))}`);
      }
      assert.deepEqual(
        Array.from(c.bridges, (i, k) => `${i} ${c.bridgeMinSide[k]}`),
        bridges,
      );

      const expected: string[] = [];
      for (const k of c.clusters) {
        const mem = Array.from(k.members);
        for (let i = 0; i < mem.length; i++)
          for (let j = i + 1; j < mem.length; j++) {
            const [x, y] = [mem[i], mem[j]];
            const li = ls.byPair.get(pairKey(x, y));
            if (li !== undefined && ls.links[li].kind === 'same' && isClaim(ls.links[li])) continue;
            const px = m.works[x].partner,
              py = m.works[y].partner;
            const inTwo = componentsWithout(-1, (w) => m.works[w].partner === px || m.works[w].partner === py);
            const third = px !== py && inTwo.get(x) !== inTwo.get(y);
            expected.push(`${x} ${y} ${px !== py ? 1 : 0} ${third ? 1 : 0}`);
          }
        assert.ok(mem.every((w) => all.get(w) === all.get(mem[0])));
      }
      const got = Array.from(
        { length: c.implied.count },
        (_, i) => `${c.implied.a[i]} ${c.implied.b[i]} ${c.implied.crossPartner[i]} ${c.implied.throughThird[i]}`,
      );
      assert.deepEqual(got, expected);
      assert.equal(c.impliedTotal, c.implied.count);
    }),
    { numRuns: 150 },
  );
});
