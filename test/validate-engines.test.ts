// The built-in SHACL core engine against rdf-validate-shacl: the demo release, damaged at random (fast-check, seeded),
// must give the same result rows from both, with the project's shapes; and the built-in engine refuses what it does
// not run instead of passing it silently.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { rmSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import N3 from 'n3';
import { iri } from '../src/namespaces.js';
import { build } from '../src/pipeline.js';
import { readRdfFile } from '../src/rdf/read.js';
import { loadShapesFolder } from '../src/validate/files.js';
import { compileShapes, validate } from '../src/validate/shacl.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const { namedNode, literal, blankNode, quad } = N3.DataFactory;
const xsd = (local: string) => namedNode(iri('xsd', local));

const dir = tempDir('concordat-engines-');
await build(path.join(repoRoot, 'demo-data', 'concordance.json'), path.join(dir, 'release'), { validate: false });
const release = await readRdfFile(path.join(dir, 'release', 'concordance.nq'));
const datasetDescription = await readRdfFile(path.join(dir, 'release', 'dataset.ttl'));
rmSync(dir, { recursive: true, force: true });
const data = [...release, ...datasetDescription];
const shapes = (await loadShapesFolder(path.join(repoRoot, 'shapes'))).quads;

/** Replacement objects: wrong datatypes, ill-formed and out-of-range literals, other node kinds. */
const POOL: N3.Quad_Object[] = [
  literal('abc'),
  literal('abc', 'en'),
  literal('1.5', xsd('decimal')),
  literal('-1', xsd('integer')),
  literal('0', xsd('integer')),
  literal('x', xsd('integer')),
  literal('0.5', xsd('double')),
  literal('2020-13-01', xsd('date')),
  literal('2020-02-30T00:00:00', xsd('dateTime')),
  literal('2026-01-01T10:00:00Z', xsd('dateTime')),
  literal('true', xsd('boolean')),
  literal('same'),
  literal('conflict'),
  namedNode(iri('owl', 'sameAs')),
  namedNode(iri('cx', 'Same')),
  namedNode(iri('cx', 'Confirmed')),
  namedNode('https://example.org/elsewhere'),
  blankNode('stray'),
  namedNode(iri('cx', 'ImageMatch')),
  namedNode(iri('prov', 'Person')),
  namedNode(iri('cx', 'Link')),
];

type Damage = { kind: 'drop' | 'replace' | 'add'; at: number; pick: number };

function damaged(damages: Damage[]): N3.Quad[] {
  const out = [...data];
  for (const { kind, at, pick } of damages) {
    const i = at % out.length;
    const q = out[i];
    const object = POOL[pick % POOL.length];
    if (kind === 'drop') out.splice(i, 1);
    else if (kind === 'replace') out[i] = quad(q.subject, q.predicate, object, q.graph);
    else out.push(quad(q.subject, q.predicate, object, q.graph));
  }
  return out;
}

const rowsBy = async (quads: N3.Quad[], engine: 'builtin' | 'rdf-validate-shacl') =>
  (await validate(quads, shapes, { engine })).results;

test('the undamaged demo release: both engines agree, and it conforms', async () => {
  const builtin = await rowsBy(data, 'builtin');
  assert.deepEqual(builtin, await rowsBy(data, 'rdf-validate-shacl'));
  assert.ok(
    builtin.every((r) => r.severity !== iri('sh', 'Violation')),
    JSON.stringify(builtin.slice(0, 2)),
  );
});

test('damaged releases: the built-in engine gives the same result rows as rdf-validate-shacl', async () => {
  const damage = fc.record({
    kind: fc.constantFrom<Damage['kind']>('drop', 'replace', 'add'),
    at: fc.nat(),
    pick: fc.nat(),
  });
  let violations = 0;
  await fc.assert(
    fc.asyncProperty(fc.array(damage, { minLength: 1, maxLength: 12 }), async (damages) => {
      const quads = damaged(damages);
      const builtin = await rowsBy(quads, 'builtin');
      assert.deepEqual(builtin, await rowsBy(quads, 'rdf-validate-shacl'));
      violations += builtin.length;
    }),
    { numRuns: 40, seed: 20261202 },
  );
  assert.ok(violations > 40, `the damage produced results (${violations})`);
});

test('the built-in engine reads the same rows from term ids as from quads', async () => {
  const quads = damaged([
    { kind: 'replace', at: 17, pick: 5 },
    { kind: 'add', at: 400, pick: 1 },
    { kind: 'drop', at: 90, pick: 0 },
  ]);
  const compiled = compileShapes(shapes);
  const ids = quads.flatMap((q) => [q.subject, q.predicate, q.object, q.graph].map((t) => N3.termToId(t)));
  assert.deepEqual(await compiled.rowsOfIds(ids), await compiled.rows(quads));
  assert.ok((await compiled.rows(quads)).length > 0);
});

test('a shapes graph with SHACL-SPARQL is refused by both engines, by the built-in one naming the shape', async () => {
  const sparqlShapes = new N3.Parser().parse(`@prefix sh: <http://www.w3.org/ns/shacl#> .
<urn:x:S> a sh:NodeShape ; sh:targetNode <urn:x:n> ; sh:sparql [ sh:select "SELECT $this WHERE { }" ] .`);
  assert.throws(
    () => compileShapes(sparqlShapes, { shapesLabel: 'extra.ttl' }),
    (err: Error & { problems?: Array<{ file: string; field: string; hint: string }> }) => {
      assert.match(err.message, /sh:sparql/);
      assert.equal(err.problems?.[0].file, 'extra.ttl');
      assert.equal(err.problems?.[0].field, 'urn:x:S');
      assert.match(err.problems![0].hint, /SHACL core/);
      return true;
    },
  );
  // rdf-validate-shacl has no SHACL-SPARQL validator either: it fails when it meets the component
  await assert.rejects(
    validate([quad(namedNode('urn:x:n'), namedNode('urn:x:p'), literal('v'))], sparqlShapes, {
      engine: 'rdf-validate-shacl',
    }),
    /SPARQLConstraintComponent/,
  );
});
