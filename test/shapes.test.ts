// The project's shapes (shapes/concordat.ttl) → checked by the manifest tests in shapes/tests/ (W3C SHACL test suite
// format, same runner as the W3C core suite), for naming, messages, coverage, and against SHACL-for-SHACL.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import N3 from 'n3';
import { iri, NS } from '../src/namespaces.js';
import { readRdfFile } from '../src/rdf/read.js';
import { validate } from '../src/validate/shacl.js';
import { defaultShapesDir, loadShapesFolder } from '../src/validate/files.js';
import { repoRoot } from './helpers/fixture.js';
import { loadTestFile, manifestCases, testFiles, type ManifestCase } from './helpers/shacl-manifest.js';
import { reference } from './helpers/requires.js';

const shapesDir = path.join(repoRoot, 'shapes');
const testsDir = path.join(shapesDir, 'tests');
const shapesFile = path.join(shapesDir, 'concordat.ttl');
const CXS = 'https://w3id.org/concordat/shapes#';
const sh = (local: string) => iri('sh', local);

const files = await testFiles(pathToFileURL(path.join(testsDir, 'manifest.ttl')).href);
const cases: ManifestCase[] = (await Promise.all(files.map((f) => manifestCases(f)))).flat();
const referenceCases: ManifestCase[] = (
  await Promise.all(files.map((f) => manifestCases(f, 'rdf-validate-shacl')))
).flat();

for (const [engine, list] of [
  ['builtin', cases],
  ['rdf-validate-shacl', referenceCases],
] as const)
  for (const c of list) {
    const name = path.basename(c.file, '.ttl');
    test(`shapes/tests/${name} (${engine})`, async () => {
      // Each file holds conforming nodes and at least one violating node (its report cannot be empty).
      assert.ok(c.expectedResults > 0, 'the test has violating examples');
      await c.run();
    });
  }

const shapes = new N3.Store(await readRdfFile(shapesFile));
const objectsOf = (s: N3.Term, p: string) => shapes.getObjects(s, p, null);
const propertyShapes = shapes.getSubjects(sh('path'), null, null);
const nodeShapes = shapes.getSubjects(iri('rdf', 'type'), sh('NodeShape'), null);
const local = (t: N3.Term) => t.value.replace(/^.*[#/]/, '');

/**
 * Members of every sh:or list, and sh:qualifiedValueShape values: reported only through the shape that holds them
 * (SHACL §4.6.3, §4.7.3).
 */
const nested = new Set<string>();
for (const q of shapes.getQuads(null, sh('or'), null, null))
  for (let n: N3.Term = q.object; n.value !== iri('rdf', 'nil'); n = objectsOf(n, iri('rdf', 'rest'))[0])
    nested.add(N3.termToId(objectsOf(n, iri('rdf', 'first'))[0]));
for (const q of shapes.getQuads(null, sh('qualifiedValueShape'), null, null)) nested.add(N3.termToId(q.object));

/**
 * Shape parameter → the constraint component it belongs to (SHACL §4; qualifiedMinCount reported as QualifiedMinCount).
 */
const COMPONENTS: Record<string, string> = {
  class: 'Class',
  datatype: 'Datatype',
  nodeKind: 'NodeKind',
  minCount: 'MinCount',
  maxCount: 'MaxCount',
  minExclusive: 'MinExclusive',
  minInclusive: 'MinInclusive',
  maxExclusive: 'MaxExclusive',
  maxInclusive: 'MaxInclusive',
  minLength: 'MinLength',
  maxLength: 'MaxLength',
  pattern: 'Pattern',
  languageIn: 'LanguageIn',
  uniqueLang: 'UniqueLang',
  equals: 'Equals',
  disjoint: 'Disjoint',
  lessThan: 'LessThan',
  lessThanOrEquals: 'LessThanOrEquals',
  not: 'Not',
  and: 'And',
  or: 'Or',
  xone: 'Xone',
  node: 'Node',
  qualifiedMinCount: 'QualifiedMinCount',
  qualifiedMaxCount: 'QualifiedMaxCount',
  closed: 'Closed',
  hasValue: 'HasValue',
  in: 'In',
};
const componentsOf = (shape: N3.Term) =>
  Object.entries(COMPONENTS)
    .filter(([p]) => objectsOf(shape, sh(p)).length > 0)
    .map(([, c]) => sh(c + 'ConstraintComponent'));

test('every property shape is named cxs:<Class>-<property>, so sh:sourceShape is never a blank node', () => {
  assert.ok(propertyShapes.length > 50, 'the shapes file has its property shapes');
  for (const s of propertyShapes) {
    assert.equal(s.termType, 'NamedNode', `property shape on ${objectsOf(s, sh('path'))[0]?.value} is a blank node`);
    const owner = shapes.getSubjects(sh('property'), s, null)[0] ?? shapes.getSubjects(iri('rdf', 'first'), s, null)[0];
    assert.ok(owner, `${s.value} is used by a node shape`);
    const prop = local(objectsOf(s, sh('path'))[0]);
    assert.match(
      s.value,
      new RegExp(`^${CXS.replace(/[.#/]/g, '\\$&')}[A-Z][A-Za-z]*-${prop}(-[A-Za-z]+)?$`),
      `${s.value} names its path ${prop}`,
    );
  }
  for (const s of nodeShapes) assert.equal(s.termType, 'NamedNode');
});

test('every shape that carries a constraint has one sh:message in English', () => {
  let checked = 0;
  for (const s of [...propertyShapes, ...nodeShapes]) {
    if (componentsOf(s).length === 0) continue;
    const messages = objectsOf(s, sh('message'));
    assert.equal(messages.length, 1, `${s.value}: one sh:message`);
    assert.equal((messages[0] as N3.Literal).language, 'en');
    checked++;
  }
  assert.ok(checked > 60);
});

test('every constraint of every named shape is broken by some violating example in shapes/tests/', async () => {
  const reported = new Set<string>();
  for (const f of files) {
    const store = new N3.Store(await loadTestFile(f));
    for (const r of store.getSubjects(iri('rdf', 'type'), sh('ValidationResult'), null))
      reported.add(
        `${store.getObjects(r, sh('sourceShape'), null)[0].value} ${store.getObjects(r, sh('sourceConstraintComponent'), null)[0].value}`,
      );
  }
  const missing: string[] = [];
  let total = 0;
  for (const s of [...propertyShapes, ...nodeShapes]) {
    if (nested.has(N3.termToId(s))) continue;
    for (const c of componentsOf(s)) {
      total++;
      if (!reported.has(`${s.value} ${c}`)) missing.push(`${local(s)} ${c.slice(NS.sh.length)}`);
    }
  }
  assert.deepEqual(missing, [], 'constraints without a violating example');
  assert.ok(total > 100, `${total} constraints covered`);
});

test('the default shapes loader reads shapes/*.ttl only, never the test files in shapes/tests/', async () => {
  const testTtl = readdirSync(testsDir).filter((f) => f.endsWith('.ttl'));
  assert.ok(testTtl.length > 1, 'shapes/tests/ holds .ttl files, so the check means something');
  const loaded = await loadShapesFolder(defaultShapesDir());
  const expected = readdirSync(shapesDir, { withFileTypes: true })
    .filter((d) => d.isFile() && d.name.endsWith('.ttl'))
    .map((d) => path.join(shapesDir, d.name))
    .sort();
  assert.deepEqual(
    loaded.files.map((f) => path.resolve(f)),
    expected,
  );
  assert.ok(loaded.files.every((f) => !path.resolve(f).startsWith(testsDir + path.sep)));
  // No manifest vocabulary leaked into the shapes graph.
  assert.ok(loaded.quads.every((q) => !q.predicate.value.startsWith(NS.mf) && !q.object.value.startsWith(NS.sht)));
});

const shaclShacl = path.resolve(repoRoot, '../shared/reference/w3c-vocab/shacl/shacl-shacl.ttl');
test(
  'the shapes graph conforms to SHACL-for-SHACL',
  { skip: reference(existsSync(shaclShacl), 'shacl-shacl.ttl not present at ../shared/reference/w3c-vocab/shacl') },
  async () => {
    // SHACL Rec 2017 Appendix C "SHACL Shapes to Validate Shapes Graphs" (w3.org/ns/shacl-shacl, stored copy).
    const outcome = await validate(shapes, await readRdfFile(shaclShacl));
    assert.deepEqual(
      outcome.results.map((r) => `${r.focusNode} ${r.component}`),
      [],
    );
  },
);
