// Spilled SHACL validation on worker threads → the same results and report bytes as validating the whole graph.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import N3 from 'n3';
import { iri } from '../src/namespaces.js';
import { readRdfFile } from '../src/rdf/read.js';
import { validate } from '../src/validate/shacl.js';
import { BoundedValidation, type BoundedOptions } from '../src/validate/bounded.js';
import { writeValidationReport } from '../src/validate/report.js';
import { tempDir } from './helpers/fixture.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const shapes = await readRdfFile(join(root, 'test/fixtures/validate/shapes/links.ttl'));
const { namedNode, literal, quad, blankNode } = N3.DataFactory;
const d = (local: string) => namedNode(`https://concordance.example.org/${local}`);
const cx = (local: string) => namedNode(iri('cx', local));

/**
 * One link with its image match; every 7th has a score above 1, every 11th lacks evidence, every 13th a blank focus.
 */
function linkChunk(i: number): N3.Quad[] {
  const link = i % 13 === 0 ? blankNode(`link${i}`) : d(`link-${i}`);
  const score = i % 7 === 0 ? '1.5' : '0.9';
  const out = [
    quad(link, namedNode(iri('rdf', 'type')), cx('Link')),
    quad(link, cx('subjectWork'), d(`work-a${i}`)),
    quad(link, cx('objectWork'), d(`work-b${i}`)),
    quad(link, cx('relation'), namedNode(iri('owl', 'sameAs'))),
    quad(link, cx('score'), literal(score, namedNode(iri('xsd', 'decimal')))),
  ];
  if (i % 11 !== 0)
    out.push(
      quad(link, namedNode(iri('prov', 'wasDerivedFrom')), d(`match-${i}`)),
      quad(d(`match-${i}`), namedNode(iri('rdf', 'type')), cx('ImageMatch')),
    );
  return out;
}

const chunks = Array.from({ length: 400 }, (_, i) => linkChunk(i));
// Chunk 7 (a violating one) again, as if copied into a neighbour's chunk: its results must not be counted twice.
chunks.push(linkChunk(7));

/** Validates every chunk's quads, spilled from the first triple into 16 buckets unless `opts` says otherwise. */
async function validateChunks(opts: BoundedOptions) {
  const run = new BoundedValidation(shapes, { inMemoryUpTo: 0, buckets: 16, ...opts });
  for (const c of chunks) for (const q of c) run.add(q);
  return run.finish();
}

test('spilled batches on two workers give the same outcome as the whole graph', async () => {
  const whole = await validate(chunks.flat(), shapes);
  const chunked = await validateChunks({ workers: 2, batchTriples: 300 });
  assert.ok(whole.violations > 0 && whole.warnings > 0);
  assert.equal(chunked.violations, whole.violations);
  assert.equal(chunked.warnings, whole.warnings);
  assert.deepEqual(chunked.results, whole.results);
  assert.equal(chunked.conforms, false);
});

test('in-process batches (workers 0, or input smaller than one batch) agree too', async () => {
  const whole = await validate(chunks.flat(), shapes);
  assert.deepEqual((await validateChunks({ workers: 0, batchTriples: 300 })).results, whole.results);
  assert.deepEqual((await validateChunks({ inMemoryUpTo: undefined })).results, whole.results);
});

test('the merged report is written as the same Turtle bytes each time', async () => {
  const tmp = tempDir('concordat-chunked-');
  try {
    await writeValidationReport(join(tmp, 'a.ttl'), await validateChunks({ workers: 2, batchTriples: 300 }));
    await writeValidationReport(join(tmp, 'b.ttl'), await validateChunks({ workers: 2, batchTriples: 700 }));
    const text = readFileSync(join(tmp, 'a.ttl'), 'utf8');
    assert.equal(text, readFileSync(join(tmp, 'b.ttl'), 'utf8'));
    const store = new N3.Store(await readRdfFile(join(tmp, 'a.ttl')));
    const whole = await validate(chunks.flat(), shapes);
    assert.equal(store.getObjects(null, iri('sh', 'result'), null).length, whole.results.length);
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
});

test('a shapes failure inside a worker surfaces as a user error', async () => {
  const bad = [
    ...shapes,
    quad(d('BadShape'), namedNode(iri('sh', 'targetClass')), cx('Link')),
    quad(d('BadShape'), namedNode(iri('sh', 'sparql')), d('query')),
  ];
  // Both engines implement SHACL Core only, so an sh:sparql constraint (SHACL §5) cannot be checked.
  const run = async (engine: BoundedOptions['engine']) => {
    const v = new BoundedValidation(bad, { inMemoryUpTo: 0, buckets: 16, workers: 2, batchTriples: 300, engine });
    for (const c of chunks) for (const q of c) v.add(q);
    return v.finish();
  };
  await assert.rejects(run('builtin'), { name: 'UserError', message: /sh:sparql/ });
  await assert.rejects(run('rdf-validate-shacl'), { name: 'UserError', message: /SPARQLConstraintComponent/ });
});
