// The SHACL gate: units pass through in order while their triples go into bounded validation; the outcome is the
// whole-graph outcome; refused shapes fail before any unit passes; a reader that stops early leaves no spill folder.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readdirSync } from 'node:fs';
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import type { Unit } from '../src/rdf/index.js';
import { shaclGate } from '../src/validate/gate.js';
import { validate } from '../src/validate/shacl.js';
import { tempDir } from './helpers/fixture.js';

const parse = (ttl: string): Quad[] => new N3.Parser().parse(ttl);
const PREFIXES = '@prefix sh: <http://www.w3.org/ns/shacl#> . @prefix ex: <http://example.org/> . ';
/** Every ex:Person needs an ex:name (SHACL §4.2.1 sh:minCount). */
const shapes = parse(
  PREFIXES +
    'ex:PersonShape a sh:NodeShape ; sh:targetClass ex:Person ; sh:property [ sh:path ex:name ; sh:minCount 1 ] .',
);

function units(n: number): Unit[] {
  return Array.from({ length: n }, (_, i) => ({
    kind: 'cluster' as const,
    id: `c${i}`,
    partners: 'all' as const,
    quads: parse(PREFIXES + `ex:p${i} a ex:Person${i % 3 === 0 ? '' : ` ; ex:name "p${i}"`} .`),
  }));
}

async function readAll(gen: AsyncIterable<Unit>): Promise<string[]> {
  const ids: string[] = [];
  for await (const u of gen) ids.push(u.id);
  return ids;
}

for (const workers of [0, 2]) {
  test(`units pass in order and the outcome equals validating their triples as one graph (${workers} workers)`, async () => {
    const us = units(12);
    const gate = shaclGate(shapes, { workers, batchTriples: 5, inMemoryUpTo: 0, buckets: 8 });
    assert.deepEqual(
      await readAll(gate.pass(us)),
      us.map((u) => u.id),
    );
    const outcome = await gate.outcome();
    assert.equal(outcome.conforms, false);
    assert.deepEqual(
      outcome.results.map((r) => r.focusNode),
      ['http://example.org/p0', 'http://example.org/p3', 'http://example.org/p6', 'http://example.org/p9'],
    );
    assert.deepEqual(
      outcome.results,
      (
        await validate(
          us.flatMap((u) => u.quads),
          shapes,
        )
      ).results,
    );
  });
}

test('validate: false passes every unit and gives an empty, conforming outcome', async () => {
  const gate = shaclGate(shapes, { validate: false });
  assert.equal((await readAll(gate.pass(units(4)))).length, 4);
  assert.deepEqual((await gate.outcome()).results, []);
  assert.equal((await gate.outcome()).conforms, true);
});

test('shapes the engine refuses fail when the gate is made, before any unit passes', () => {
  const refused = parse(
    PREFIXES + 'ex:S a sh:NodeShape ; sh:targetClass ex:Person ; sh:sparql [ sh:select "SELECT $this WHERE {}" ] .',
  );
  assert.throws(() => shaclGate(refused, { workers: 0 }), /sparql/i);
});

test('a reader that stops early leaves no spill folder, and the outcome is refused', async () => {
  const parent = tempDir('concordat-gate-');
  const gate = shaclGate(shapes, { workers: 2, batchTriples: 1, inMemoryUpTo: 0, tempParent: parent });
  for await (const u of gate.pass(units(20))) {
    if (u.id === 'c1') assert.equal(readdirSync(parent).length, 1);
    if (u.id === 'c4') break;
  }
  assert.deepEqual(readdirSync(parent), []);
  await assert.rejects(gate.outcome(), /before every unit passed/);
});
