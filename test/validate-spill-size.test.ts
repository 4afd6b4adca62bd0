// The spill's size follows the input: buckets from the expected triples so batches stay near their target; batches
// hold at most the target; a bucket file is read line by line, each distinct line once.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import N3 from 'n3';
import { BoundedValidation, MAX_BUCKETS, MIN_BUCKETS, spillBuckets } from '../src/validate/bounded.js';
import { eachLine } from '../src/validate/spill.js';
import { shaclGate } from '../src/validate/gate.js';
import { validate } from '../src/validate/shacl.js';
import type { Unit } from '../src/rdf/index.js';
import { tempDir } from './helpers/fixture.js';

const { namedNode, literal, quad } = N3.DataFactory;
/** Every subject of urn:x:p needs a urn:x:name (SHACL §4.2.1 sh:minCount). */
const shapes = new N3.Parser().parse(
  `@prefix sh: <http://www.w3.org/ns/shacl#> .
<urn:x:S> a sh:NodeShape ; sh:targetSubjectsOf <urn:x:p> ; sh:property [ sh:path <urn:x:name> ; sh:minCount 1 ] .`,
);
/** Node i points at node i+1; every third node has no name. */
const data = (n: number) =>
  Array.from({ length: n }, (_, i) => [
    quad(namedNode(`urn:x:n${i}`), namedNode('urn:x:p'), namedNode(`urn:x:n${i + 1}`)),
    ...(i % 3 === 0 ? [] : [quad(namedNode(`urn:x:n${i}`), namedNode('urn:x:name'), literal(`n${i}`))]),
  ]).flat();

test('buckets: about 80% of a batch each, within the bounds', () => {
  assert.equal(spillBuckets(40_000_000, 100_000), 500);
  assert.equal(spillBuckets(4_400_000, 100_000), MIN_BUCKETS);
  assert.equal(spillBuckets(1e9, 100_000), MAX_BUCKETS);
  assert.equal(spillBuckets(Number.NaN, 100_000), MIN_BUCKETS);
});

test('with the expected size given, the spill makes that many buckets and no batch exceeds its target', async () => {
  const quads = data(900); // 1,500 triples
  const run = new BoundedValidation(shapes, {
    inMemoryUpTo: 0,
    workers: 0,
    batchTriples: 20,
    expectedTriples: () => 1_500,
    tempParent: tempDir('concordat-spill-size-'),
  });
  quads.forEach((q) => run.add(q));
  const outcome = await run.finish();
  assert.equal(outcome.mode, 'batches');
  assert.equal(outcome.buckets, spillBuckets(1_500, 20));
  assert.equal(outcome.buckets, 128);
  // 1,500 own triples in batches of at most 20 (a bucket of more than 20 would be a batch of its own: none here)
  assert.ok(outcome.batches! >= 1_500 / 20, `${outcome.batches} batches`);
  assert.deepEqual(outcome.results, (await validate(quads, shapes)).results);
  assert.equal(outcome.violations, 300);
});

test("the gate sizes the spill from the units seen so far and the stream's unit count", async () => {
  const quads = data(3_000);
  const units: Unit[] = Array.from({ length: 100 }, (_, u) => ({
    kind: 'cluster' as const,
    id: `c${u}`,
    partners: 'all' as const,
    quads: quads.slice(u * 50, (u + 1) * 50),
  }));
  // 50 triples a unit, 100 units: 5,000 expected; batches of 20 → 313 buckets
  const gate = shaclGate(shapes, { workers: 0, batchTriples: 20, inMemoryUpTo: 40, units: units.length });
  for await (const u of gate.pass(units)) assert.ok(u.id);
  const outcome = (await gate.outcome()) as Awaited<ReturnType<BoundedValidation['finish']>>;
  assert.equal(outcome.buckets, spillBuckets(5_000, 20));
  assert.equal(outcome.buckets, 313);
  assert.deepEqual(outcome.results, (await validate(quads, shapes)).results);
});

test('a bucket file is read line by line: in order, repeats once when asked, newlines in values kept', () => {
  const dir = tempDir('concordat-spill-lines-');
  const file = join(dir, 'own-0.jsonl');
  const lines = [
    ['a', 'b\nc', 'd'],
    ['e', 'f', 'g'],
    ['a', 'b\nc', 'd'],
    ['h', 'i', '"j"'],
  ];
  writeFileSync(file, lines.map((l) => JSON.stringify(l) + '\n').join(''));
  const all: string[][] = [];
  eachLine<string[]>(file, (t) => all.push(t));
  assert.deepEqual(all, lines);
  const distinct: string[][] = [];
  eachLine<string[]>(file, (t) => distinct.push(t), true);
  assert.deepEqual(distinct, [lines[0], lines[1], lines[3]]);
  let none = 0;
  eachLine(join(dir, 'missing.jsonl'), () => none++);
  assert.equal(none, 0);
});
