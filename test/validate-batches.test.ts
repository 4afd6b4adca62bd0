// Chunked SHACL over a release: small batches judge each node once, in the chunk that owns it.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { build } from '../src/pipeline.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const project = path.join(repoRoot, 'demo-data', 'concordance.json');

test('the demo release conforms in 300-quad batches on two workers, with the same report as in one batch', async () => {
  const dir = tempDir('concordat-batches-');
  const small = await build(project, path.join(dir, 'small'), { validationBatch: 300, workers: 2 });
  const whole = await build(project, path.join(dir, 'whole'), { validationBatch: 1e9, workers: 0 });
  assert.equal(small.publish.validation.violations, 0, JSON.stringify(small.publish.validation.results.slice(0, 3)));
  assert.equal(small.publish.validation.warnings, whole.publish.validation.warnings);
  assert.equal(
    readFileSync(path.join(dir, 'small', 'validation.ttl'), 'utf8'),
    readFileSync(path.join(dir, 'whole', 'validation.ttl'), 'utf8'),
  );
});

test('a violation inside one unit is still found when batches are small', async () => {
  const dir = tempDir('concordat-batches-');
  // shapes that demand something no link has: every link must fail, in whichever batch it lands
  const { cpSync, writeFileSync } = await import('node:fs');
  const shapes = path.join(dir, 'shapes');
  cpSync(path.join(repoRoot, 'shapes', 'concordat.ttl'), path.join(shapes, 'concordat.ttl'));
  writeFileSync(
    path.join(shapes, 'extra.ttl'),
    `@prefix sh: <http://www.w3.org/ns/shacl#> .
@prefix cx: <https://w3id.org/concordat/vocab#> .
<urn:x:LinkNeedsNote> a sh:NodeShape ; sh:targetClass cx:Link ;
  sh:property [ sh:path cx:note ; sh:minCount 1 ; sh:message "test: a note is required" ] .
`,
  );
  const err = await build(project, path.join(dir, 'out'), {
    validationBatch: 300,
    workers: 2,
    shapesDir: shapes,
  }).catch((e) => e);
  assert.equal(err.exitCode, 1);
  assert.match(err.message, /test: a note is required/);
});

test('build with --shacl-engine rdf-validate-shacl publishes the same validation report as the built-in engine', async () => {
  const dir = tempDir('concordat-batches-');
  await build(project, path.join(dir, 'builtin'), { validationBatch: 2000, workers: 2 });
  await build(project, path.join(dir, 'reference'), {
    validationBatch: 2000,
    workers: 2,
    shaclEngine: 'rdf-validate-shacl',
  });
  const report = (name: string) => readFileSync(path.join(dir, name, 'validation.ttl'), 'utf8');
  assert.equal(report('reference'), report('builtin'));
  assert.match(report('builtin'), /sh:conforms/);
});

test("a project shape reaching two hops (a link's run or review, then its label) gives in 300-triple batches the whole-graph result", async () => {
  const dir = tempDir('concordat-batches-');
  const { cpSync, writeFileSync } = await import('node:fs');
  const { readRdfFile } = await import('../src/rdf/read.js');
  const { loadShapesFolder } = await import('../src/validate/files.js');
  const { validate } = await import('../src/validate/shacl.js');
  const shapes = path.join(dir, 'shapes');
  cpSync(path.join(repoRoot, 'shapes', 'concordat.ttl'), path.join(shapes, 'concordat.ttl'));
  writeFileSync(
    path.join(shapes, 'extra.ttl'),
    `@prefix sh: <http://www.w3.org/ns/shacl#> .
@prefix cx: <https://w3id.org/concordat/vocab#> .
@prefix prov: <http://www.w3.org/ns/prov#> .
@prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .
<urn:x:LinkActivityNamed> a sh:NodeShape ; sh:targetClass cx:Link ; sh:property <urn:x:LinkActivityNamed-agentLabel> .
<urn:x:LinkActivityNamed-agentLabel> sh:path ( prov:wasGeneratedBy prov:wasAssociatedWith rdfs:label ) ; sh:minCount 1 ; sh:severity sh:Warning ;
  sh:message "test: the activity's agent is named" .
`,
  );
  const out = path.join(dir, 'out');
  const built = await build(project, out, { validationBatch: 300, workers: 2, shapesDir: shapes });
  const data = [
    ...(await readRdfFile(path.join(out, 'concordance.nq'))),
    ...(await readRdfFile(path.join(out, 'dataset.ttl'))),
  ];
  const whole = await validate(data, (await loadShapesFolder(shapes)).quads);
  assert.ok(whole.warnings > 0 && whole.warnings < 1000, `some links lack a named agent (${whole.warnings})`);
  assert.deepEqual(built.publish.validation.results, whole.results);
});
