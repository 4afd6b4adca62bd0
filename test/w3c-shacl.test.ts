// W3C SHACL core test suite (w3c/data-shapes, data-shapes-test-suite/tests/core) → one test per manifest entry,
// run through src/validate/shacl.ts. Comparison rules: the suite's own document (data-shapes-test-suite/index.html,
// "Validation Reports" / compliance levels): full compliance = the post-processed report is isomorphic to the
// expected mf:result graph; partial compliance = same sh:conforms.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import N3 from 'n3';
import { iri } from '../src/namespaces.js';
import { readRdfFile } from '../src/rdf/read.js';
import { isomorphic } from '../src/rdf/isomorphic.js';
import { validate } from '../src/validate/shacl.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const suite = resolve(root, '../shared/reference/shacl/data-shapes-test-suite/tests');
const coreManifest = resolve(suite, 'core/manifest.ttl');

/** Entries we do not run, with the reason (none at present: all 98 core entries are compared in full). */
const SKIP: Readonly<Record<string, string>> = {};

const RDF_TYPE = iri('rdf', 'type');
const { namedNode } = N3.DataFactory;

/** Predicates kept in the actual report before comparing (the suite document's post-processing list). */
const KEPT = new Set([
  RDF_TYPE,
  ...['result', 'conforms', 'focusNode', 'resultPath', 'resultSeverity', 'sourceConstraint', 'sourceConstraintComponent', 'sourceShape', 'value'].map((l) => iri('sh', l)),
]);

const cache = new Map<string, N3.Quad[]>();
async function load(url: string): Promise<N3.Quad[]> {
  let quads = cache.get(url);
  if (!quads) {
    quads = await readRdfFile(fileURLToPath(url), { base: url });
    cache.set(url, quads);
  }
  return quads;
}

/** Follows mf:include triples (repeated, not a list) from a manifest to the test files. */
async function testFiles(manifestUrl: string): Promise<string[]> {
  const store = new N3.Store(await load(manifestUrl));
  const includes = store.getObjects(namedNode(manifestUrl), iri('mf', 'include'), null).map((t) => t.value).sort();
  if (includes.length === 0) return [manifestUrl];
  const nested = await Promise.all(includes.map(testFiles));
  return nested.flat();
}

function list(store: N3.Store, head: N3.Term): N3.Term[] {
  const out: N3.Term[] = [];
  for (let n = head; n.value !== iri('rdf', 'nil'); n = store.getObjects(n, iri('rdf', 'rest'), null)[0]) out.push(store.getObjects(n, iri('rdf', 'first'), null)[0]);
  return out;
}

/** Blank-node closure below `node` (for sh:resultPath structures). */
function closure(store: N3.Store, node: N3.Term, out: N3.Quad[], seen = new Set<string>()): void {
  if (node.termType !== 'BlankNode' || seen.has(node.value)) return;
  seen.add(node.value);
  for (const q of store.getQuads(node, null, null, null)) {
    out.push(q);
    closure(store, q.object, out, seen);
  }
}

/** The expected graph: triples of the report node, of each sh:result, and the sh:resultPath structures. */
function expectedGraph(store: N3.Store, report: N3.Term): N3.Quad[] {
  const out = store.getQuads(report, null, null, null);
  for (const r of store.getObjects(report, iri('sh', 'result'), null)) {
    const own = store.getQuads(r, null, null, null);
    out.push(...own);
    for (const q of own) if (q.predicate.value === iri('sh', 'resultPath')) closure(store, q.object, out);
  }
  return out.map((q) => N3.DataFactory.quad(q.subject, q.predicate, q.object));
}

/** Post-processing of the actual report described by the suite (keep listed predicates, path structures, matching messages). */
function postProcess(actual: N3.Quad[], expected: N3.Quad[]): N3.Quad[] {
  const store = new N3.Store(actual);
  const pathNodes: N3.Quad[] = [];
  for (const q of actual) if (q.predicate.value === iri('sh', 'resultPath')) closure(store, q.object, pathNodes);
  const expectedMessages = new Set(expected.filter((q) => q.predicate.value === iri('sh', 'resultMessage')).map((q) => N3.termToId(q.object)));
  const kept = actual.filter((q) => KEPT.has(q.predicate.value) || (q.predicate.value === iri('sh', 'resultMessage') && expectedMessages.has(N3.termToId(q.object))));
  return [...kept, ...pathNodes];
}

const absent = existsSync(coreManifest) ? false : 'W3C SHACL test suite not present at ../shared/reference/shacl';
const files = absent ? [] : await testFiles(pathToFileURL(coreManifest).href);

test('the core manifest reaches 98 test files', { skip: absent }, () => {
  // 98 core tests: shared/reference/README.md §1 counts (w3c/data-shapes @ ff9edb9c).
  assert.equal(files.length, 98);
});

for (const fileUrl of files) {
  const store = new N3.Store(await load(fileUrl));
  const entriesHead = store.getObjects(namedNode(fileUrl), iri('mf', 'entries'), null)[0];
  for (const entry of entriesHead ? list(store, entriesHead) : []) {
    const name = fileUrl.slice(pathToFileURL(suite).href.length + 1).replace(/\.ttl$/, '');
    test(`SHACL ${name}`, { skip: SKIP[name] ?? false }, async () => {
      assert.ok(store.has(N3.DataFactory.quad(entry as N3.Quad_Subject, namedNode(RDF_TYPE), namedNode(iri('sht', 'Validate')))), 'entry is an sht:Validate');
      const action = store.getObjects(entry, iri('mf', 'action'), null)[0];
      const dataUrl = store.getObjects(action, iri('sht', 'dataGraph'), null)[0].value;
      const shapesUrl = store.getObjects(action, iri('sht', 'shapesGraph'), null)[0].value;
      const expectedNode = store.getObjects(entry, iri('mf', 'result'), null)[0];
      const data = await load(dataUrl);
      const shapes = await load(shapesUrl);
      if (expectedNode.value === iri('sht', 'Failure')) {
        await assert.rejects(validate(data, shapes));
        return;
      }
      const outcome = await validate(data, shapes);
      const expected = expectedGraph(store, expectedNode);
      const expectedConforms = store.getObjects(expectedNode, iri('sh', 'conforms'), null)[0].value === 'true';
      const actualConforms = outcome.reportQuads.find((q) => q.predicate.value === iri('sh', 'conforms'))!.object.value === 'true';
      assert.equal(actualConforms, expectedConforms, 'partial compliance: sh:conforms');
      const actual = postProcess(outcome.reportQuads, expected);
      assert.ok(await isomorphic(actual, expected), `full compliance: report isomorphic to the expected one\nactual:\n${new N3.Writer().quadsToString(actual)}\nexpected:\n${new N3.Writer().quadsToString(expected)}`);
    });
  }
}
