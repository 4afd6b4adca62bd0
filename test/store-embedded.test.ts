// Embedded store: loading the fixture release, store folders, graph replacement, named queries, parameter binding,
// outputs.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { readFileSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Parser, Store as N3Store } from 'n3';
import { UserError } from '../src/errors.js';
import { bindParams, sparqlIri, sparqlString } from '../src/store/bind.js';
import { chunkLines } from '../src/store/chunk.js';
import { EmbeddedStore } from '../src/store/embedded.js';
import { sha256 } from '../src/store/folder.js';
import { formatResult } from '../src/store/format.js';
import { blankLabels } from '../src/store/lines.js';
import { readNamedQuery } from '../src/store/named.js';
import { netrcEntry } from '../src/store/netrc.js';
import { loadPlanned, planRelease } from '../src/store/release.js';
import { parseResultsJson } from '../src/store/results.js';
import type { QueryResult, Term } from '../src/store/types.js';
import { FIXTURE, BASE, CX, NAMED_CASES, project, graphDump, fileCounts, secondVersion } from './helpers/store.js';
import { tempDir } from './helpers/fixture.js';

const CLI = fileURLToPath(new URL('../src/cli/main.js', import.meta.url));
const tmp = (): string => tempDir('concordat-store-');

async function loadedFixture(folder?: string): Promise<EmbeddedStore> {
  const store = await EmbeddedStore.open(folder);
  await loadPlanned(store, await planRelease(FIXTURE));
  return store;
}

test('each named graph of concordance.nq is loaded with the same triple count as the file', async () => {
  const store = await loadedFixture();
  const expected = fileCounts(join(FIXTURE, 'concordance.nq'));
  assert.deepEqual(await store.listGraphs(), [...expected.keys()].sort());
  for (const [g, n] of expected) assert.equal(await store.countTriples(g), n, g);
  assert.equal(
    await store.countTriples(),
    [...expected.values()].reduce((a, b) => a + b, 0),
  );
});

test('a store folder reopens with the same graphs and counts; manifest records sha256, release date, source', async () => {
  const dir = tmp();
  try {
    const first = await loadedFixture(dir);
    const counts = new Map<string, number>();
    for (const g of await first.listGraphs()) counts.set(g, await first.countTriples(g));
    const again = await EmbeddedStore.open(dir);
    for (const [g, n] of counts) assert.equal(await again.countTriples(g), n);
    const manifest = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8'));
    for (const [g, e] of Object.entries<{
      file: string;
      sha256: string;
      triples: number;
      loadedAt: string;
      source: string;
    }>(manifest.graphs)) {
      assert.equal(sha256(readFileSync(join(dir, e.file))), e.sha256);
      assert.equal(e.triples, counts.get(g));
      assert.equal(e.loadedAt, '2026-11-02'); // the fixture's dcterms:issued
      assert.match(e.source, /concordance\.nq$/);
    }
    // same release into a second folder: byte-identical files
    const dir2 = tmp();
    await loadedFixture(dir2);
    assert.equal(
      readFileSync(join(dir2, 'manifest.json'), 'utf8').replace(/"source": "[^"]*"/g, ''),
      readFileSync(join(dir, 'manifest.json'), 'utf8').replace(/"source": "[^"]*"/g, ''),
    );
    rmSync(dir2, { recursive: true });
  } finally {
    rmSync(dir, { recursive: true });
  }
});

test('replacing a graph leaves none of the old triples, in memory and after reopening', async () => {
  const dir = tmp();
  try {
    const store = await loadedFixture(dir);
    const g = `${BASE}graph/claims`;
    const before = await graphDump(store, g);
    const v2 = secondVersion();
    await store.loadGraph(g, { format: 'n-triples', text: v2.text, file: 'v2.nt' });
    for (const s of [store, await EmbeddedStore.open(dir)]) {
      const after = await graphDump(s, g);
      assert.deepEqual(after, v2.sorted);
      assert.equal(after.filter((l) => before.includes(l)).length, 0);
    }
    assert.equal(readdirSync(join(dir, 'graphs')).length, 4, 'the old graph file is removed');
  } finally {
    rmSync(dir, { recursive: true });
  }
});

test('a load with a syntax error names file and line and leaves the graph as it was', async () => {
  const store = await loadedFixture();
  const g = `${BASE}graph/claims`;
  const before = await graphDump(store, g);
  const graphsBefore = await store.listGraphs();
  const text = `<urn:x:a> <urn:x:b> "ok" .\n\n<urn:x:a> <urn:x:b> .\n`;
  await assert.rejects(
    store.loadGraph(g, { format: 'n-triples', text, file: 'bad.nt' }),
    (e: unknown) => e instanceof UserError && e.problems[0].file === 'bad.nt' && e.problems[0].line === 3,
  );
  assert.deepEqual(await graphDump(store, g), before);
  assert.deepEqual(await store.listGraphs(), graphsBefore, 'no staging graph is left');
  await assert.rejects(store.loadGraph('urn:x:new', { format: 'n-triples', text, file: 'bad.nt' }), UserError);
  assert.deepEqual(await store.listGraphs(), graphsBefore, 'an absent graph stays absent');
});

test('--partner loads the slice into {base}graph/partner/{key}; --graph puts the whole release into one graph', async () => {
  const store = await EmbeddedStore.open();
  const [p] = await loadPlanned(store, await planRelease(FIXTURE, { partner: 'harbour' }));
  assert.equal(p.graph, `${BASE}graph/partner/harbour`);
  assert.equal(p.triples, fileCounts(join(FIXTURE, 'partners', 'harbour.nq'), true).get('')!);
  const [all] = await loadPlanned(store, await planRelease(FIXTURE, { graph: 'urn:x:everything' }));
  assert.equal(all.triples, fileCounts(join(FIXTURE, 'concordance.nq'), true).get('')!);
  await assert.rejects(planRelease(FIXTURE, { partner: 'nobody' }), /partners in this release: harbour/);
});

for (const c of NAMED_CASES) {
  test(`named query ${c.name} ${JSON.stringify(c.params)} returns the rows the fixture implies`, async () => {
    const store = await loadedFixture();
    assert.deepEqual(project(await store.query(bindParams(await readNamedQuery(c.name), c.params))), c.rows);
  });
}

// Hostile values: SPARQL 1.1 Query §19.8 [139] IRIREF excludes <>"{}|^`\ and #x00-#x20; [156]/[160] for strings.
const HOSTILE: Array<[string, string]> = [
  ['closing bracket', 'https://x.example/a>'],
  ['double quote', 'https://x.example/a"b'],
  ['newline', 'https://x.example/a\nb'],
  ['injection', 'https://x.example/a} ; DROP ALL'],
  ['space', 'https://x.example/a b'],
  ['relative IRI', 'work/1'],
];
for (const [label, value] of HOSTILE) {
  test(`an IRI parameter with ${label} is refused`, async () => {
    const q = await readNamedQuery('cluster-members');
    assert.throws(
      () => bindParams(q, { cluster: value }),
      (e: unknown) => e instanceof UserError && e.problems[0].field === 'cluster',
    );
  });
}

const STRINGS: Array<[string, string]> = [
  ['x>y', '"x>y"'],
  ['say "hi"', '"say \\"hi\\""'],
  ['a\nb', '"a\\nb"'],
  ['} ; DROP ALL', '"} ; DROP ALL"'],
  ['back\\slash\ttab\r', '"back\\\\slash\\ttab\\r"'],
];
for (const [value, literal] of STRINGS) {
  test(`a string parameter ${JSON.stringify(value)} becomes the literal ${literal} and stays inert`, async () => {
    assert.equal(sparqlString(value), literal);
    const q = `# param label: string\nSELECT ?s WHERE { GRAPH ?g { ?s <${CX}partner> ?label } }`;
    const store = await loadedFixture();
    const r = await store.query(bindParams(q, { label: value }));
    assert.deepEqual(r, { kind: 'bindings', vars: ['s'], rows: [] });
    assert.equal(
      await store.countTriples(),
      [...fileCounts(join(FIXTURE, 'concordance.nq')).values()].reduce((a, b) => a + b, 0),
    );
  });
}

test('parameters: variables in comments, strings and IRIs are left alone; missing and unknown names are refused', () => {
  const q = '# param w: iri\nSELECT ?x WHERE { ?x <urn:x:p?w=1> "?w" . ?x ?p ?w } # ?w';
  assert.equal(
    bindParams(q, { w: 'urn:x:1' }),
    '# param w: iri\nSELECT ?x WHERE { ?x <urn:x:p?w=1> "?w" . ?x ?p <urn:x:1> } # ?w',
  );
  assert.throws(() => bindParams(q, {}), /missing value for parameter "w"/);
  assert.throws(() => bindParams(q, { w: 'urn:x:1', v: '2' }), /declares no parameter "v"/);
  assert.equal(
    sparqlIri('https://harbour.example.org/id/work/H%20101'),
    '<https://harbour.example.org/id/work/H%20101>',
  );
});

test('ASK prints true/false, CONSTRUCT prints N-Triples, updates are refused', async () => {
  const store = await loadedFixture();
  assert.equal(formatResult(await store.query(`ASK { ?c a <${CX}Cluster> }`), 'table'), 'true\n');
  assert.equal(formatResult(await store.query(`ASK { ?c a <${CX}Nothing> }`), 'json'), '{"head":{},"boolean":false}\n');
  const nt = formatResult(
    await store.query(`CONSTRUCT { ?c a <${CX}Cluster> } WHERE { ?c a <${CX}Cluster> }`),
    'table',
  );
  assert.equal(new Parser({ format: 'N-Triples' }).parse(nt).length, 2);
  await assert.rejects(store.query('DROP ALL'), /DROP is an update/);
});

test('results formats: CSV (CRLF, RFC 4180 quoting), TSV (Turtle terms), JSON reads back unchanged', async () => {
  const rows: Record<string, Term>[] = [
    { a: { type: 'uri', value: 'urn:x:1' }, b: { type: 'literal', value: 'x, "y"\nz', lang: 'en' } },
    { a: { type: 'literal', value: '3', datatype: 'http://www.w3.org/2001/XMLSchema#integer' } },
  ];
  const r: QueryResult = { kind: 'bindings', vars: ['a', 'b'], rows };
  // SPARQL 1.1 Query Results CSV and TSV Formats (W3C Rec 2013), CSV and TSV sections
  assert.equal(formatResult(r, 'csv'), 'a,b\r\nurn:x:1,"x, ""y""\nz"\r\n3,\r\n');
  assert.equal(formatResult(r, 'tsv'), '?a\t?b\n<urn:x:1>\t"x, \\"y\\"\\nz"@en\n3\t\n');
  assert.deepEqual(parseResultsJson(formatResult(r, 'json'), 't'), r);
});

test('SPARQL JSON with the old "typed-literal" type parses as a typed literal', () => {
  // SPARQL Query Results JSON Format, W3C Working Group Note 2007 §2.2 ("typed-literal"), still sent by some servers
  const r = parseResultsJson(
    '{"head":{"vars":["n","b"]},"results":{"bindings":[{"n":{"type":"typed-literal","datatype":"http://www.w3.org/2001/XMLSchema#integer","value":"7"},"b":{"type":"bnode","value":"nodeID://b1"}}]}}',
    't',
  );
  assert.deepEqual(r, {
    kind: 'bindings',
    vars: ['n', 'b'],
    rows: [
      {
        n: { type: 'literal', value: '7', datatype: 'http://www.w3.org/2001/XMLSchema#integer' },
        b: { type: 'bnode', value: 'b0' },
      },
    ],
  });
});

test('upload chunks respect the size limit and keep statements of one blank node together', () => {
  const lines = [
    '<urn:a> <urn:p> _:x .',
    '<urn:b> <urn:p> "1" .',
    '_:x <urn:q> _:y .',
    '<urn:c> <urn:p> "2" .',
    '_:y <urn:r> "_:z ." .',
    '<urn:d> <urn:p> "3" .',
  ];
  const chunks = chunkLines(lines, 2);
  assert.deepEqual(chunks.flat().sort(), [...lines].sort());
  const holder = chunks.find((c) => c.includes('_:x <urn:q> _:y .'))!;
  for (const l of ['<urn:a> <urn:p> _:x .', '_:y <urn:r> "_:z ." .']) assert.ok(holder.includes(l), l);
  for (const c of chunks) if (!c.some((l) => blankLabels(l).length)) assert.ok(c.length <= 2);
  assert.deepEqual(blankLabels('_:y <urn:r> "_:z ." .'), ['_:y']);
});

test('netrc: the entry for the host wins, "default" is the fallback', () => {
  const text =
    'machine other.example login a password b\nmachine store.example login curator password s3cret\ndefault login anon password x\n';
  assert.deepEqual(netrcEntry(text, 'store.example'), { login: 'curator', password: 's3cret' });
  assert.deepEqual(netrcEntry(text, 'unknown.example'), { login: 'anon', password: 'x' });
  assert.equal(netrcEntry('machine a login b password c', 'z'), null);
});

test('CLI: load into a store folder, then query it by name (exit codes and stdout)', () => {
  const dir = tmp();
  try {
    const load = spawnSync(process.execPath, [CLI, 'load', FIXTURE, '--store', dir, '--json'], { encoding: 'utf8' });
    assert.equal(load.status, 0, load.stderr);
    const report = JSON.parse(load.stdout);
    assert.deepEqual(
      new Map(report.graphs.map((g: { graph: string; triples: number }) => [g.graph, g.triples])),
      fileCounts(join(FIXTURE, 'concordance.nq')),
    );
    const q = spawnSync(
      process.execPath,
      [
        CLI,
        'query',
        '--store',
        dir,
        '--named',
        'cluster-members',
        '--param',
        `cluster=${BASE}work/1`,
        '--format',
        'csv',
      ],
      { encoding: 'utf8' },
    );
    assert.equal(q.status, 0, q.stderr);
    assert.equal(q.stdout.split('\r\n').filter(Boolean).length, 1 + 3);
    const hostile = spawnSync(
      process.execPath,
      [
        CLI,
        'query',
        '--store',
        dir,
        '--named',
        'cluster-members',
        '--param',
        'cluster=https://x.example/a> } DROP ALL',
      ],
      { encoding: 'utf8' },
    );
    assert.equal(hostile.status, 2);
    assert.match(hostile.stderr, /cluster: the IRI contains/);
    const ask = spawnSync(process.execPath, [CLI, 'query', '--store', dir, `ASK { ?s a <${CX}Nothing> }`], {
      encoding: 'utf8',
    });
    assert.deepEqual([ask.status, ask.stdout], [0, 'false\n'], ask.stderr);
    // partner:work where an IRI is expected: no rows, and a note saying how the value was read
    const short = (value: string) =>
      spawnSync(process.execPath, [CLI, 'query', '--store', dir, '--named', 'cluster-members', '--param', value], {
        encoding: 'utf8',
      });
    const s1 = short('cluster=alpha:a-1');
    assert.equal(s1.status, 0, s1.stderr);
    assert.match(s1.stderr, /note: no rows; --param cluster=alpha:a-1 was read as an IRI of scheme "alpha:"/);
    assert.doesNotMatch(short('cluster=https://x.example/nothing').stderr, /note:/);
  } finally {
    rmSync(dir, { recursive: true });
  }
});

test('fixture sanity: the hand-written release parses as N-Quads with an independent parser', () => {
  const quads = new N3Store(
    new Parser({ format: 'N-Quads' }).parse(readFileSync(join(FIXTURE, 'concordance.nq'), 'utf8')),
  );
  assert.equal(quads.getGraphs(null, null, null).length, 4);
});
