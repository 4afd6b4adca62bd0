// Link columns: every field of a link goes into its typed array and comes back out unchanged, from the one list of
// fields.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { linkColumns, type LinkValues } from '../src/link/columns.js';
import type { Link } from '../src/link/types.js';

/** Compile-time: the stored fields are exactly the fields of a Link. */
type SameKeys = [keyof Link] extends [keyof LinkValues]
  ? [keyof LinkValues] extends [keyof Link]
    ? true
    : never
  : never;
const sameKeys: SameKeys = true;

/** Images of works 0…9 (coverages are a count of a work's images over these). */
const images = Int32Array.from([3, 2, 2, 4, 1, 5, 2, 3, 1, 6]);

const values: LinkValues[] = [
  {
    a: 0,
    b: 7,
    kind: 'same',
    status: 'confirmed',
    part: undefined,
    support: 3,
    reliableSupport: 2,
    best: 0.93,
    mean: 0.8825,
    maxOverlap: 1,
    confidence: 0.97,
    setAside: 0,
    held: undefined,
    coverageA: 1 / 3,
    coverageB: 2 / 3,
    runs: [0, 2],
    decision: 4,
    matchStart: 0,
  },
  {
    a: 2,
    b: 3,
    kind: 'part',
    status: 'proposed',
    part: 3,
    support: 1,
    reliableSupport: 1,
    best: 0.742,
    mean: 0.742,
    maxOverlap: 0.6,
    confidence: 0.7,
    setAside: 2,
    held: undefined,
    coverageA: 1,
    coverageB: 0.25,
    runs: [1],
    decision: undefined,
    matchStart: 3,
  },
  {
    a: 5,
    b: 9,
    kind: 'related',
    status: 'candidate',
    part: undefined,
    support: 0,
    reliableSupport: 0,
    best: 0,
    mean: 0,
    maxOverlap: 0,
    confidence: 0,
    setAside: 0,
    held: 'split',
    coverageA: 0,
    coverageB: 0,
    runs: [],
    decision: undefined,
    matchStart: 4,
  },
  {
    a: 1,
    b: 6,
    kind: 'same',
    status: 'rejected',
    part: undefined,
    support: 2,
    reliableSupport: 2,
    best: 0.6,
    mean: 0.55,
    maxOverlap: 0.9,
    confidence: 0.5,
    setAside: 1,
    held: 'look-alike',
    coverageA: 0.5,
    coverageB: 0.5,
    runs: [0, 2],
    decision: 0,
    matchStart: 4,
  },
];

test('every field comes back as stored; equal run lists are shared', () => {
  assert.equal(sameKeys, true);
  const c = linkColumns(values.length, images);
  values.forEach((v, i) => c.set(i, v));
  const links = c.records();
  assert.deepEqual(
    links.map((l) => JSON.parse(JSON.stringify(l))),
    JSON.parse(JSON.stringify(values)),
  );
  for (const [i, v] of values.entries())
    for (const k of Object.keys(v) as (keyof LinkValues)[]) assert.deepEqual(links[i][k], v[k], `link ${i} ${k}`);
  assert.equal(links[0].runs, links[3].runs);
  assert.equal(c.runLists.length, 3);
});

test('status changes and holds are seen through the records', () => {
  const c = linkColumns(values.length, images);
  values.forEach((v, i) => c.set(i, v));
  const links = c.records();
  c.setStatus(1, 'confirmed');
  c.hold(0, 'indiscriminate');
  assert.equal(links[1].status, 'confirmed');
  assert.equal(c.statusOf(0), 'candidate');
  assert.deepEqual([links[0].status, links[0].held], ['candidate', 'indiscriminate']);
});

test('a coverage comes back as the very double it was stored as (k of n images, n up to 400)', () => {
  const n = 400;
  const counts = Int32Array.from({ length: n + 1 }, (_, w) => w);
  for (let w = 1; w <= n; w++) {
    const c = linkColumns(w + 1, counts);
    for (let k = 0; k <= w; k++) c.set(k, { ...values[0], a: w, b: k === 0 ? 1 : k, coverageA: k / w, coverageB: 0 });
    const links = c.records();
    for (let k = 0; k <= w; k++) assert.ok(Object.is(links[k].coverageA, k / w), `${k}/${w}`);
  }
});
