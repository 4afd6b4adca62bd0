// SHACL test manifests (the W3C SHACL test suite's format) → runnable cases checked through src/validate/shacl.ts.
// Comparison rules: the suite's own document (w3c/data-shapes, data-shapes-test-suite/index.html, "Validation Reports"
// /
// compliance levels): full compliance = the post-processed report is isomorphic to the expected mf:result graph;
// partial compliance = same sh:conforms.
import assert from 'node:assert/strict';
import { fileURLToPath } from 'node:url';
import N3 from 'n3';
import { iri } from '../../src/namespaces.js';
import { readRdfFile } from '../../src/rdf/read.js';
import { isomorphic } from './isomorphic.js';
import { validate, type ShaclEngine } from '../../src/validate/shacl.js';

const RDF_TYPE = iri('rdf', 'type');
const { namedNode } = N3.DataFactory;

/** Predicates kept in the actual report before comparing (the suite document's post-processing list). */
const KEPT = new Set([
  RDF_TYPE,
  ...[
    'result',
    'conforms',
    'focusNode',
    'resultPath',
    'resultSeverity',
    'sourceConstraint',
    'sourceConstraintComponent',
    'sourceShape',
    'value',
  ].map((l) => iri('sh', l)),
]);

const cache = new Map<string, N3.Quad[]>();
/** Parses a test file once, with its own `file:` URL as base (relative IRIs such as `<>` name the file). */
export async function loadTestFile(url: string): Promise<N3.Quad[]> {
  let quads = cache.get(url);
  if (!quads) {
    quads = await readRdfFile(fileURLToPath(url), { base: url });
    cache.set(url, quads);
  }
  return quads;
}

/** Follows mf:include triples (repeated, not a list) from a manifest to the test files. */
export async function testFiles(manifestUrl: string): Promise<string[]> {
  const store = new N3.Store(await loadTestFile(manifestUrl));
  const includes = store
    .getObjects(namedNode(manifestUrl), iri('mf', 'include'), null)
    .map((t) => t.value)
    .sort();
  if (includes.length === 0) return [manifestUrl];
  const nested = await Promise.all(includes.map(testFiles));
  return nested.flat();
}

function list(store: N3.Store, head: N3.Term): N3.Term[] {
  const out: N3.Term[] = [];
  for (let n = head; n.value !== iri('rdf', 'nil'); n = store.getObjects(n, iri('rdf', 'rest'), null)[0])
    out.push(store.getObjects(n, iri('rdf', 'first'), null)[0]);
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

/**
 * Post-processing of the actual report described by the suite (keep listed predicates, path structures, matching
 * messages).
 */
function postProcess(actual: N3.Quad[], expected: N3.Quad[]): N3.Quad[] {
  const store = new N3.Store(actual);
  const pathNodes: N3.Quad[] = [];
  for (const q of actual) if (q.predicate.value === iri('sh', 'resultPath')) closure(store, q.object, pathNodes);
  const expectedMessages = new Set(
    expected.filter((q) => q.predicate.value === iri('sh', 'resultMessage')).map((q) => N3.termToId(q.object)),
  );
  const kept = actual.filter(
    (q) =>
      KEPT.has(q.predicate.value) ||
      (q.predicate.value === iri('sh', 'resultMessage') && expectedMessages.has(N3.termToId(q.object))),
  );
  return [...kept, ...pathNodes];
}

/** One sht:Validate entry of a manifest file. */
export interface ManifestCase {
  /** The entry's IRI. */
  entry: string;
  /** The test file holding the entry. */
  file: string;
  /** Number of sh:result nodes in the expected report (0 when the data must conform or the engine must fail). */
  expectedResults: number;
  /** Validates and asserts partial and full compliance (or the failure the entry expects). */
  run(): Promise<void>;
}

/**
 * The entries (mf:entries list) of one test file, each ready to run (SHACL test suite: sht:Validate, mf:action,
 * mf:result).
 */
export async function manifestCases(fileUrl: string, engine: ShaclEngine = 'builtin'): Promise<ManifestCase[]> {
  const store = new N3.Store(await loadTestFile(fileUrl));
  const entriesHead = store.getObjects(namedNode(fileUrl), iri('mf', 'entries'), null)[0];
  return (entriesHead ? list(store, entriesHead) : []).map((entry) => {
    const expectedNode = store.getObjects(entry, iri('mf', 'result'), null)[0];
    return {
      entry: entry.value,
      file: fileUrl,
      expectedResults: expectedNode ? store.getObjects(expectedNode, iri('sh', 'result'), null).length : 0,
      async run() {
        assert.ok(
          store.has(
            N3.DataFactory.quad(entry as N3.Quad_Subject, namedNode(RDF_TYPE), namedNode(iri('sht', 'Validate'))),
          ),
          'entry is an sht:Validate',
        );
        const action = store.getObjects(entry, iri('mf', 'action'), null)[0];
        const dataUrl = store.getObjects(action, iri('sht', 'dataGraph'), null)[0].value;
        const shapesUrl = store.getObjects(action, iri('sht', 'shapesGraph'), null)[0].value;
        const data = await loadTestFile(dataUrl);
        const shapes = await loadTestFile(shapesUrl);
        if (expectedNode.value === iri('sht', 'Failure')) {
          await assert.rejects(validate(data, shapes, { engine }));
          return;
        }
        const outcome = await validate(data, shapes, { engine });
        const expected = expectedGraph(store, expectedNode);
        const expectedConforms = store.getObjects(expectedNode, iri('sh', 'conforms'), null)[0].value === 'true';
        const actualConforms =
          outcome.reportQuads.find((q) => q.predicate.value === iri('sh', 'conforms'))!.object.value === 'true';
        assert.equal(actualConforms, expectedConforms, 'partial compliance: sh:conforms');
        const actual = postProcess(outcome.reportQuads, expected);
        assert.ok(
          await isomorphic(actual, expected),
          `full compliance: report isomorphic to the expected one\nactual:\n${new N3.Writer().quadsToString(actual)}\nexpected:\n${new N3.Writer().quadsToString(expected)}`,
        );
      },
    };
  });
}
