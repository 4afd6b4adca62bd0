// Evidence stage and link confidence: worked examples for each rule, and a property test that indiscriminate images
// (mount backs, colour charts) added to a generated scenario never merge two artworks.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { weighEvidence, IMAGE_VERDICTS } from '../src/evidence/index.js';
import { link } from '../src/link/index.js';
import { sameConfidence } from '../src/link/confidence.js';
import { pairKey } from '../src/link/types.js';
import { cluster } from '../src/cluster/index.js';
import type { Model } from '../src/model.js';
import { tinyModel, workNo, type TinySpec } from './helpers/model.js';

const linkOf = (m: Model, x: string, y: string) => {
  const ls = link(m);
  const i = ls.byPair.get(pairKey(workNo(m, x), workNo(m, y)));
  assert.ok(i !== undefined, `a link ${x}–${y}`);
  return ls.links[i];
};
const verdictOf = (m: Model, image: string) => {
  const [ref, k] = image.split('#');
  const w = workNo(m, ref);
  const first = m.images.work.indexOf(w);
  return IMAGE_VERDICTS[weighEvidence(m).verdict[first + Number(k ?? 0)]];
};

test('confidence, worked example: one photograph keeps two thirds of its score; each agreeing piece halves the doubt', () => {
  // 0.8 × (1 − 1/3) = 0.5333: proposed at proposeAt 0.5
  assert.equal(sameConfidence(0.8, 0).toFixed(4), '0.5333');
  const one = linkOf(
    tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:1'], matches: [['a:1', 'b:1', 0.8]] }),
    'a:1',
    'b:1',
  );
  assert.equal(one.confidence.toFixed(4), '0.5333');
  assert.equal(one.status, 'proposed');
  // 0.7 × 2/3 = 0.4667: one moderately similar photograph and nothing else goes to review, not into the release
  const lookAlike = linkOf(
    tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:1'], matches: [['a:1', 'b:1', 0.7]] }),
    'a:1',
    'b:1',
  );
  assert.equal(lookAlike.confidence.toFixed(4), '0.4667');
  assert.equal(lookAlike.status, 'candidate');
  assert.equal(lookAlike.held, 'look-alike');
  // a second, different pair of photographs agrees: 0.7 × (1 − 1/6) = 0.5833, proposed
  const two = linkOf(
    tinyModel({
      partners: ['a', 'b'],
      works: [
        { ref: 'a:1', images: 2 },
        { ref: 'b:1', images: 2 },
      ],
      matches: [
        ['a:1#0', 'b:1#0', 0.7],
        ['a:1#1', 'b:1#1', 0.62],
      ],
    }),
    'a:1',
    'b:1',
  );
  assert.equal(two.confidence.toFixed(4), '0.5833');
  assert.equal(two.status, 'proposed');
  // one photo of a matching both photos of b is still one photo on a's side: no agreement counted
  const fan = linkOf(
    tinyModel({
      partners: ['a', 'b'],
      works: ['a:1', { ref: 'b:1', images: 2 }],
      matches: [
        ['a:1', 'b:1#0', 0.7],
        ['a:1', 'b:1#1', 0.68],
      ],
    }),
    'a:1',
    'b:1',
  );
  assert.equal(fan.confidence.toFixed(4), '0.4667');
});

test('confidence: a third work strongly linked to both ends agrees; a third work linked only weakly does not', () => {
  const spec = (third: number): TinySpec => ({
    partners: ['a', 'b', 'c'],
    works: ['a:1', 'b:1', 'c:1'],
    matches: [
      ['a:1', 'b:1', 0.7],
      ['a:1', 'c:1', third],
      ['b:1', 'c:1', third],
    ],
  });
  const strong = linkOf(tinyModel(spec(0.9)), 'a:1', 'b:1'); // 0.9 × 2/3 = 0.6 ≥ 0.5 on their own
  assert.equal(strong.confidence.toFixed(4), '0.5833');
  assert.equal(strong.status, 'proposed');
  const weak = linkOf(tinyModel(spec(0.7)), 'a:1', 'b:1'); // three look-alikes do not vouch for each other
  assert.equal(weak.status, 'candidate');
  assert.equal(weak.held, 'look-alike');
});

test("confidence: part links keep their best score; curators' decisions keep winning over a held link", () => {
  const part = linkOf(
    tinyModel({ partners: ['a', 'b'], works: ['a:1', 'b:7'], matches: [['b:7', 'a:1', 0.7, 0.5]] }),
    'a:1',
    'b:7',
  );
  assert.equal(part.kind, 'part');
  assert.equal(part.confidence, 0.7);
  assert.equal(part.status, 'proposed');
  const decided = linkOf(
    tinyModel({
      partners: ['a', 'b'],
      works: ['a:1', 'b:1'],
      matches: [['a:1', 'b:1', 0.6]],
      decisions: [['a:1', 'b:1', 'same']],
    }),
    'a:1',
    'b:1',
  );
  assert.equal(decided.status, 'confirmed');
  assert.equal(decided.held, undefined);
});

/**
 * `artworks` artworks of three records each (a photo of the painting each, all three matching). With `dense`, the
 * nine records of the first three artworks also have a mount back scan and the nine scans all match each other;
 * otherwise one record of each of the first nine artworks has one, and each scan matches its four nearest in a ring
 * (offsets ±1 and ±3), as a nearest-neighbour matcher reports look-alike scans: few triangles.
 */
function mountBacks(hubBound: number | null, artworks = 3, dense = true): Model {
  const works: { ref: string; images: number }[] = [];
  const matches: [string, string, number][] = [];
  const partners = ['a', 'b', 'c'];
  const backs: string[] = [];
  for (let art = 1; art <= artworks; art++) {
    partners.forEach((p, k) => {
      const back = dense ? art <= 3 : art <= 9 && k === art % 3;
      works.push({ ref: `${p}:${art}`, images: back ? 2 : 1 });
      if (back) backs.push(`${p}:${art}#1`);
    });
    matches.push(
      [`a:${art}#0`, `b:${art}#0`, 0.9],
      [`b:${art}#0`, `c:${art}#0`, 0.9],
      [`a:${art}#0`, `c:${art}#0`, 0.9],
    );
  }
  for (let i = 0; i < backs.length; i++)
    for (let j = i + 1; j < backs.length; j++)
      if (dense || [1, 3, 6, 8].includes(j - i)) matches.push([backs[i], backs[j], 0.95]);
  return tinyModel({ partners, works, matches, policy: { indiscriminateAbove: hubBound } });
}

test('hub: a mount back matching more works than one artwork can have is indiscriminate; its matches link nothing', () => {
  const m = mountBacks(null); // 3 partners: bound 6; every mount back matches the 8 other works
  assert.equal(verdictOf(m, 'a:1#1'), 'hub');
  assert.equal(verdictOf(m, 'a:1#0'), 'discriminating');
  const w = weighEvidence(m);
  assert.equal(w.hubAbove, 6);
  assert.equal(w.indiscriminate.length, 9);
  assert.equal(w.rowsSetAside, 36);
  const l = linkOf(m, 'a:1', 'b:2'); // only the mount backs in common
  assert.equal(l.status, 'candidate');
  assert.equal(l.held, 'indiscriminate');
  assert.equal(l.setAside, 1);
  assert.equal(l.support, 1, 'the row stays evidence of the link');
  const c = cluster(m, link(m));
  assert.equal(c.clusters.length, 3, 'three artworks, three clusters');
  assert.ok(c.clusters.every((k) => k.members.length === 3));
});

test('suspect: an image far above the usual number of matched works whose matched works do not match each other is set aside', () => {
  // four matched works each: no hub (bound 6), but an outlier (median 2, MAD 0). b:1's scan matches those of c:2, b:4,
  // a:6 and
  // c:8 (ring offsets ±1, ±3); of those six pairs of works only b:4–a:6 match (neighbours on the ring): 1/6; none of
  // the four shares a row with b:1 through other photographs
  const m = mountBacks(null, 12, false);
  const w = weighEvidence(m);
  assert.equal(w.suspectFrom, 4, 'median 2, MAD 0: suspects from max(4, 2)');
  const back = m.images.work.indexOf(workNo(m, 'b:1')) + 1;
  assert.equal(w.stats.works[back], 4);
  assert.equal(w.stats.triangles[back].toFixed(3), '0.167');
  assert.equal(w.stats.corroborated[back], 0);
  assert.equal(verdictOf(m, 'b:1#1'), 'uncorroborated');
  assert.equal(cluster(m, link(m)).clusters.length, 12, 'twelve artworks, twelve clusters');
  // the same images in a dense clique are no suspects by triangles (the records of one artwork look like that too):
  // with more of them than an artwork has records, the hub rule takes them
  assert.equal(verdictOf(mountBacks(null, 12, true), 'a:1#1'), 'hub');
});

test('role: an image the catalogue calls a verso or a chart links nothing, whatever its score', () => {
  const m = tinyModel({
    partners: ['a', 'b'],
    works: [
      { ref: 'a:1', images: 2 },
      { ref: 'b:1', images: 2 },
    ],
    matches: [['a:1#1', 'b:1#1', 0.99]],
    roles: { 'a:1#1': 'chart', 'a:1#0': 'artwork' },
  });
  assert.equal(verdictOf(m, 'a:1#1'), 'role');
  assert.equal(verdictOf(m, 'b:1#1'), 'discriminating');
  const l = linkOf(m, 'a:1', 'b:1');
  assert.equal(l.status, 'candidate');
  assert.equal(l.held, 'indiscriminate');
});

// ---- property: indiscriminate images never merge two artworks ----

/** Artworks of 1–4 records over 4 partners, 1–3 photos a record, true matches between photos of one artwork. */
const scenario = fc.record({
  artworks: fc.array(fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 1, maxLength: 4 }), {
    minLength: 2,
    maxLength: 12,
  }),
  photos: fc.array(fc.integer({ min: 1, max: 3 }), { minLength: 48, maxLength: 48 }),
  scores: fc.array(fc.double({ min: 0.3, max: 0.99, noNaN: true }), { minLength: 200, maxLength: 200 }),
  junk: fc.array(fc.tuple(fc.integer({ min: 9, max: 40 }), fc.nat()), { minLength: 1, maxLength: 3 }),
});

test('adding indiscriminate images (each matching more works than an artwork has records) never merges two artworks (fast-check, seeded)', () => {
  fc.assert(
    fc.property(scenario, ({ artworks, photos, scores, junk }) => {
      const partners = ['a', 'b', 'c', 'd'];
      const works: { ref: string; images: number }[] = [];
      const artOf: number[] = [];
      artworks.forEach((parts, art) =>
        parts.forEach((p, k) => {
          works.push({ ref: `${partners[p]}:${art}-${k}`, images: photos[works.length % photos.length] });
          artOf.push(art);
        }),
      );
      const matches: TinySpec['matches'] = [];
      let s = 0;
      for (let x = 0; x < works.length; x++)
        for (let y = x + 1; y < works.length; y++)
          if (artOf[x] === artOf[y])
            matches.push([`${works[x].ref}#0`, `${works[y].ref}#0`, scores[s++ % scores.length]]);
      // each junk set: one more scan (a mount back, a chart) on more records than one artwork has, all matching each
      // other
      const sets = junk
        .map(([size, start]) =>
          Array.from({ length: Math.min(size, works.length) }, (_, k) => (start + k) % works.length),
        )
        .filter((set) => set.length - 1 > 2 * partners.length); // each scan matches the other set.length − 1 works
      const backs = sets.map((set) => set.map((w) => `${works[w].ref}#${works[w].images++}`));
      for (const set of backs)
        for (let x = 0; x < set.length; x++)
          for (let y = x + 1; y < set.length; y++) matches.push([set[x], set[y], 0.97]);
      const m = tinyModel({ partners, works, matches });
      const c = cluster(m, link(m));
      for (const k of c.clusters) {
        const arts = new Set(Array.from(k.members, (w) => artOf[w]));
        assert.equal(arts.size, 1, `cluster ${k.id} mixes artworks ${[...arts].join(', ')}`);
      }
    }),
    { numRuns: 150, seed: 20261203 },
  );
});

// ---- coherent clusters ----

test('coherent clusters: a chain longer than one artwork can be is cut at its weakest link; the cut link is held for review', () => {
  // three partners: at most 6 members; seven works chained by single photographs, the weakest 0.9 × 2/3 = 0.6 in the
  // middle
  const works = ['a:1', 'b:1', 'c:1', 'a:2', 'b:2', 'c:2', 'a:3'];
  const scores = [0.99, 0.98, 0.97, 0.9, 0.96, 0.95];
  const m = tinyModel({
    partners: ['a', 'b', 'c'],
    works,
    matches: scores.map((s, i) => [works[i], works[i + 1], s] as [string, string, number]),
  });
  const ls = link(m);
  const c = cluster(m, ls);
  assert.deepEqual(
    c.clusters.map((k) => Array.from(k.members, (w) => m.works[w].partner + ':' + m.works[w].id).length),
    [4, 3],
  );
  const cut = ls.links[c.cut[0]];
  assert.equal(c.cut.length, 1);
  assert.deepEqual(
    [cut.a, cut.b].map((w) => workNo(m, works[3]) === w || workNo(m, works[4]) === w),
    [true, true],
    'the 0.9 link a:2–b:2',
  );
  assert.equal(cut.status, 'candidate');
  assert.equal(cut.held, 'split');
  assert.deepEqual(c.splits, [{ works: 7, clusters: ['c000001', 'c000002'], alone: 0, cutLinks: 1 }]);
  assert.equal(c.before.largest, 7);
});

test("coherent clusters: a weak bridge between two groups is cut; a strong one and a curator's same stay", () => {
  const spec = (bridge: number, decided = false): TinySpec => ({
    partners: ['a', 'b', 'c'],
    works: ['a:1', 'b:1', 'c:1', 'a:2'],
    matches: [
      ['a:1', 'b:1', 0.95],
      ['c:1', 'a:2', 0.95],
      ['b:1', 'c:1', bridge],
    ],
    decisions: decided ? [['b:1', 'c:1', 'same']] : [],
  });
  const sizes = (s: TinySpec) => {
    const m = tinyModel(s);
    return cluster(m, link(m)).clusters.map((k) => k.members.length);
  };
  assert.deepEqual(sizes(spec(0.85)), [2, 2], '0.85 × 2/3 = 0.567 < 0.6: cut');
  assert.deepEqual(sizes(spec(0.9)), [4], '0.9 × 2/3 = 0.6: kept');
  assert.deepEqual(sizes(spec(0.85, true)), [4], 'a curator said same');
});

test('coherent clusters: stable IDs through a split: the old ID stays on the part with most former members', () => {
  const works = ['a:1', 'b:1', 'c:1', 'a:2', 'b:2', 'c:2', 'a:3'];
  const m = tinyModel({
    partners: ['a', 'b', 'c'],
    works,
    matches: works.slice(1).map((w, i) => [works[i], w, i === 3 ? 0.9 : 0.97] as [string, string, number]),
  });
  const previous = { active: new Map([['c000007', works]]), retired: [] };
  const c = cluster(m, link(m), previous);
  assert.deepEqual(
    c.clusters.map((k) => [k.id, k.members.length]),
    [
      ['c000007', 4],
      ['c000008', 3],
    ],
  );
  assert.deepEqual(c.retired, []);
});
