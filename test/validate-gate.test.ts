// The SHACL gate: units pass through in order while validated on the side; failures stop the stream instead of hanging it.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import type { Unit } from '../src/rdf/index.js';
import { shaclGate, chunkOf } from '../src/validate/gate.js';
import { validateChunks } from '../src/validate/chunked.js';

const parse = (ttl: string): Quad[] => new N3.Parser().parse(ttl);
const PREFIXES = '@prefix sh: <http://www.w3.org/ns/shacl#> . @prefix ex: <http://example.org/> . ';
/** Every ex:Person needs an ex:name (SHACL §4.2.1 sh:minCount). */
const shapes = parse(PREFIXES + 'ex:PersonShape a sh:NodeShape ; sh:targetClass ex:Person ; sh:property [ sh:path ex:name ; sh:minCount 1 ] .');

function units(n: number): Unit[] {
  return Array.from({ length: n }, (_, i) => ({
    kind: 'cluster' as const, id: `c${i}`, partners: 'all' as const,
    quads: parse(PREFIXES + `ex:p${i} a ex:Person${i % 3 === 0 ? '' : ` ; ex:name "p${i}"`} .`),
  }));
}

async function readAll(gen: AsyncIterable<Unit>): Promise<string[]> {
  const ids: string[] = [];
  for await (const u of gen) ids.push(u.id);
  return ids;
}

for (const workers of [0, 2]) {
  test(`units pass in order and the outcome equals validating the same chunks directly (${workers} workers)`, async () => {
    const us = units(12);
    const gate = shaclGate(shapes, { workers, batchQuads: 5 });
    assert.deepEqual(await readAll(gate.pass(us)), us.map((u) => u.id));
    const outcome = await gate.outcome();
    const direct = await validateChunks(us.map((u) => chunkOf(u, new Map())), shapes, { workers, batchQuads: 5 });
    assert.equal(outcome.conforms, false);
    assert.deepEqual(outcome.results.map((r) => r.focusNode), ['http://example.org/p0', 'http://example.org/p3', 'http://example.org/p6', 'http://example.org/p9']);
    assert.deepEqual(outcome, direct);
  });
}

test('validate: false passes every unit and gives an empty, conforming outcome', async () => {
  const gate = shaclGate(shapes, { validate: false });
  assert.equal((await readAll(gate.pass(units(4)))).length, 4);
  assert.deepEqual((await gate.outcome()).results, []);
  assert.equal((await gate.outcome()).conforms, true);
});

test('a validator that fails makes the stream throw its error instead of waiting forever', async () => {
  const refused = parse(PREFIXES + 'ex:S a sh:NodeShape ; sh:targetClass ex:Person ; sh:sparql [ sh:select "SELECT $this WHERE {}" ] .');
  const gate = shaclGate(refused, { workers: 0, batchQuads: 1 });
  await assert.rejects(readAll(gate.pass(units(50))), /sparql/i);
  await assert.rejects(gate.outcome(), /sparql/i);
});

test('a reader that stops early ends validation too (the outcome settles)', async () => {
  const gate = shaclGate(shapes, { workers: 2, batchQuads: 1 });
  for await (const u of gate.pass(units(20))) if (u.id === 'c4') break;
  const outcome = await gate.outcome();
  assert.deepEqual(outcome.results.map((r) => r.focusNode), ['http://example.org/p0', 'http://example.org/p3']);
});
