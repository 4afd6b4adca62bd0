// W3C RDF 1.1 Turtle, N-Triples and N-Quads test suites (w3c/rdf-tests, rdf/rdf11/) → one test per manifest entry,
// read with src/rdf/read.ts and written back with src/rdf/serialize.ts. Pass rules: the suites' manifests
// (rdft:Test*Eval = isomorphic to mf:result; *PositiveSyntax = parses; *NegativeSyntax = rejected), with
// language tags compared case-insensitively (RDF 1.1 Concepts §3.3: tags are case-insensitive).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync, rmSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import N3 from 'n3';
import { iri } from '../src/namespaces.js';
import { readRdfFile } from '../src/rdf/read.js';
import { writeQuads, FORMATS, type RdfFormat } from '../src/rdf/serialize.js';
import { isomorphic } from './helpers/isomorphic.js';
import { reference } from './helpers/requires.js';
import { tempDir } from './helpers/fixture.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const rdf11 = resolve(root, '../shared/reference/rdf-tests/rdf/rdf11');

/**
 * Entries not run, by suite/test name, with the reason. Empty: n3 2.13 rejects all negative tests, including the
 * lone-surrogate escapes (turtle-syntax-bad-numeric-escape-01..10) that older n3 releases accepted.
 */
const SKIP: Readonly<Record<string, string>> = {};

interface Suite {
  folder: string;
  /** Formats a positive input is written back in before it is read again. */
  writeAs: RdfFormat[];
}

const SUITES: Suite[] = [
  { folder: 'rdf-turtle', writeAs: ['turtle', 'ntriples'] },
  { folder: 'rdf-n-triples', writeAs: ['ntriples', 'turtle'] },
  { folder: 'rdf-n-quads', writeAs: ['nquads'] },
];

const { quad, literal } = N3.DataFactory;

/** Lower-cases language tags so isomorphism ignores their case. */
function foldLanguage(quads: N3.Quad[]): N3.Quad[] {
  return quads.map((q) =>
    q.object.termType === 'Literal' && q.object.language
      ? quad(q.subject, q.predicate, literal(q.object.value, q.object.language.toLowerCase()), q.graph)
      : q,
  );
}

function list(store: N3.Store, head: N3.Term): N3.Term[] {
  const out: N3.Term[] = [];
  for (let n = head; n.value !== iri('rdf', 'nil'); n = store.getObjects(n, iri('rdf', 'rest'), null)[0])
    out.push(store.getObjects(n, iri('rdf', 'first'), null)[0]);
  return out;
}

const tmp = tempDir('concordat-rdf-syntax-');
let counter = 0;

/** Writes `quads` in each format with our writer, reads them back, and checks each against `expected`. */
async function roundTrip(quads: N3.Quad[], formats: RdfFormat[], expected: N3.Quad[]): Promise<void> {
  for (const format of formats) {
    const out = join(tmp, `out-${++counter}${FORMATS[format].extension}`);
    await writeQuads(out, format, quads);
    const again = await readRdfFile(out);
    assert.ok(await isomorphic(foldLanguage(again), foldLanguage(expected)), `${format} round trip is isomorphic`);
  }
}

for (const suite of SUITES) {
  const manifestPath = join(rdf11, suite.folder, 'manifest.ttl');
  const absent = reference(
    existsSync(manifestPath),
    `W3C RDF test suite not present at ../shared/reference/rdf-tests/rdf/rdf11/${suite.folder}`,
  );
  if (absent) {
    test(`${suite.folder} suite`, { skip: absent }, () => {});
    continue;
  }
  const manifestUrl = pathToFileURL(manifestPath).href;
  const store = new N3.Store(await readRdfFile(manifestPath));
  const self = N3.DataFactory.namedNode(manifestUrl);
  const assumedBase = store.getObjects(self, iri('mf', 'assumedTestBase'), null)[0]?.value;
  const entries = list(store, store.getObjects(self, iri('mf', 'entries'), null)[0]);

  // Counts: shared/reference/README.md §2 (w3c/rdf-tests @ ad541a5f): 313 Turtle, 70 N-Triples, 87 N-Quads entries.
  test(`${suite.folder} manifest entries`, () => {
    assert.equal(
      entries.length,
      ({ 'rdf-turtle': 313, 'rdf-n-triples': 70, 'rdf-n-quads': 87 } as Record<string, number>)[suite.folder],
    );
  });

  for (const entry of entries) {
    const type = store.getObjects(entry, iri('rdf', 'type'), null)[0].value.slice(iri('rdft', '').length);
    const actionPath = fileURLToPath(store.getObjects(entry, iri('mf', 'action'), null)[0].value);
    const resultTerm = store.getObjects(entry, iri('mf', 'result'), null)[0];
    const name = `${suite.folder}/${store.getObjects(entry, iri('mf', 'name'), null)[0].value}`;
    const base = assumedBase ? assumedBase + basename(actionPath) : undefined;
    test(`${name} (${type})`, { skip: SKIP[name] ?? false }, async () => {
      if (type.endsWith('NegativeSyntax') || type.endsWith('NegativeEval')) {
        await assert.rejects(readRdfFile(actionPath, { base }), { name: 'UserError' });
        return;
      }
      const parsed = await readRdfFile(actionPath, { base });
      if (type.endsWith('Eval')) {
        const expected = await readRdfFile(fileURLToPath(resultTerm.value));
        assert.ok(await isomorphic(foldLanguage(parsed), foldLanguage(expected)), 'parse is isomorphic to mf:result');
        await roundTrip(parsed, suite.writeAs, expected);
      } else {
        await roundTrip(parsed, suite.writeAs, parsed);
      }
    });
  }
}

test('clean up', () => rmSync(tmp, { recursive: true, force: true }));
