// Remote store against a real Virtuoso (started by .ci/run): counts, same answers as the embedded store, atomic
// replace.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { UserError } from '../src/errors.js';
import { bindParams } from '../src/store/bind.js';
import { EmbeddedStore } from '../src/store/embedded.js';
import { formatResult } from '../src/store/format.js';
import { readNamedQuery } from '../src/store/named.js';
import { RemoteStore, STAGING_PREFIX, type RemoteHooks } from '../src/store/remote.js';
import { loadPlanned, planRelease } from '../src/store/release.js';
import { BASE, FIXTURE, NAMED_CASES, fileCounts, graphDump, secondVersion } from './helpers/store.js';
import { holdVirtuoso, skipVirtuoso, virtuoso, VT, VT_ENDPOINTS, VT_ENV } from './helpers/virtuoso.js';
import { tempDir } from './helpers/fixture.js';

const URL_BASE = VT;
const skip = skipVirtuoso;
const CLI = fileURLToPath(new URL('../src/cli/main.js', import.meta.url));
const ENDPOINTS = VT_ENDPOINTS;
const ENV = VT_ENV;
const remote = virtuoso;
await holdVirtuoso();
const scratchGraph = (): string => `${BASE}test/graph-${randomBytes(4).toString('hex')}`;
const V1 = readFileSync(join(FIXTURE, 'concordance.nq'), 'utf8');

/** A graph holding the fixture's provenance graph (blank nodes included), for the failure cases. */
async function seeded(store: RemoteStore): Promise<{ graph: string; before: string[] }> {
  const graph = scratchGraph();
  const prov = V1.split('\n')
    .filter((l) => l.endsWith('<https://concordance.example.org/graph/provenance> .'))
    .join('\n');
  await store.loadGraph(graph, { format: 'n-quads', text: prov, file: 'provenance.nq' });
  return { graph, before: await graphDump(store, graph) };
}

async function assertUnchanged(store: RemoteStore, graph: string, before: string[]): Promise<void> {
  assert.deepEqual(await graphDump(store, graph), before, 'target graph unchanged');
  const stagings = (await store.listGraphs()).filter((g) => g.startsWith(STAGING_PREFIX));
  assert.deepEqual(stagings, [], 'no staging graph left');
  await store.dropGraph(graph);
}

test('the fixture release loads into Virtuoso with per-graph counts equal to the dump', { skip }, async () => {
  const store = remote();
  const done = await loadPlanned(store, await planRelease(FIXTURE));
  const expected = fileCounts(join(FIXTURE, 'concordance.nq'));
  assert.deepEqual(new Map(done.map((d) => [d.graph, d.triples])), expected);
  for (const [g, n] of expected) assert.equal(await store.countTriples(g), n, g);
});

test('named queries give the same rows from Virtuoso and from the embedded store', { skip }, async () => {
  const store = remote();
  await loadPlanned(store, await planRelease(FIXTURE));
  const embedded = await EmbeddedStore.open();
  await loadPlanned(embedded, await planRelease(FIXTURE));
  for (const c of NAMED_CASES) {
    const q = bindParams(await readNamedQuery(c.name), c.params);
    const [a, b] = [await store.query(q), await embedded.query(q)];
    assert.equal(formatResult(a, 'tsv'), formatResult(b, 'tsv'), `${c.name} ${JSON.stringify(c.params)}`);
    assert.equal(a.kind === 'bindings' ? a.rows.length : -1, c.rows.length);
  }
});

test('replacing a graph with a second version leaves none of the old triples', { skip }, async () => {
  const store = remote();
  const { graph, before } = await seeded(store);
  const v2 = secondVersion();
  await store.loadGraph(graph, { format: 'n-triples', text: v2.text, file: 'v2.nt' });
  const after = await graphDump(store, graph);
  assert.deepEqual(after, v2.sorted);
  assert.equal(after.filter((l) => before.includes(l)).length, 0);
  await store.dropGraph(graph);
});

const UNCHANGED = /the staging graph was dropped; <[^>]+> is unchanged/;
const FAILURES: Array<[string, RemoteHooks, RegExp, RegExp]> = [
  [
    'a chunk the server refuses',
    { chunkBody: (i, body) => (i === 1 ? `${body}<urn:x:broken> this is not N-Triples\n` : body) },
    /chunk 2 of 3 refused/,
    UNCHANGED,
  ],
  [
    'a staging count that differs from the dump',
    { expectedTriples: (n) => n + 1 },
    /staging graph holds \d+ triples, the file has \d+/,
    UNCHANGED,
  ],
  [
    'a MOVE the server refuses',
    { moveUpdate: (u) => u.replace('MOVE SILENT GRAPH', 'MOVE SILENT GRAPHH') },
    /update refused \(HTTP \d+\)/,
    /no graph was replaced; <[^>]+> was not replaced \(it holds \d+ triples, as before; its new content was still staged\); the staging graph was dropped/,
  ],
];
for (const [label, hooks, message, state] of FAILURES) {
  test(`a load that fails with ${label} leaves the previous graph intact`, { skip }, async () => {
    const store = remote();
    const { graph, before } = await seeded(store);
    const v2 = secondVersion();
    const failing = remote(hooks, 1); // one triple per chunk, so the load fails midway
    await assert.rejects(
      failing.loadGraph(graph, { format: 'n-triples', text: v2.text, file: 'v2.nt' }),
      (e: unknown) => {
        assert.ok(e instanceof UserError && e.exitCode === 1);
        assert.match(e.message, message);
        assert.match(e.message, state);
        return true;
      },
    );
    await assertUnchanged(store, graph, before);
  });
}

test('uploads sent to a wrong Graph Store URL fail and leave the previous graph intact', { skip }, async () => {
  const store = remote();
  const { graph, before } = await seeded(store);
  const wrong = remote(undefined, undefined, { ...ENDPOINTS, gsp: `${URL_BASE}/no-such-graph-store` });
  await assert.rejects(
    wrong.loadGraph(graph, { format: 'n-triples', text: secondVersion().text, file: 'v2.nt' }),
    /refused \(HTTP 404\)/,
  );
  await assertUnchanged(store, graph, before);
});

test('wrong credentials: exit 1, a clear message, and the password appears nowhere', { skip }, () => {
  const secret = `pw-${randomBytes(8).toString('hex')}`;
  const args = [
    CLI,
    'load',
    FIXTURE,
    '--endpoint',
    ENDPOINTS.gsp!,
    '--update',
    ENDPOINTS.update!,
    '--query-endpoint',
    ENDPOINTS.query,
  ];
  const r = spawnSync(process.execPath, args, {
    encoding: 'utf8',
    env: { ...process.env, CONCORDAT_STORE_USER: 'dba', CONCORDAT_STORE_PASSWORD: secret, NETRC: '/nonexistent' },
  });
  assert.equal(r.status, 1, r.stderr);
  assert.match(r.stderr, /refused the credentials from CONCORDAT_STORE_USER\/CONCORDAT_STORE_PASSWORD \(HTTP 401\)/);
  assert.ok(!r.stdout.includes(secret) && !r.stderr.includes(secret));
});

test('no credentials at all: exit 1 and a hint naming the environment variables', { skip }, () => {
  const env: NodeJS.ProcessEnv = { ...process.env, NETRC: '/nonexistent', HOME: '/nonexistent' };
  delete env.CONCORDAT_STORE_USER;
  delete env.CONCORDAT_STORE_PASSWORD;
  const r = spawnSync(
    process.execPath,
    [
      CLI,
      'load',
      FIXTURE,
      '--endpoint',
      ENDPOINTS.gsp!,
      '--update',
      ENDPOINTS.update!,
      '--query-endpoint',
      ENDPOINTS.query,
    ],
    { encoding: 'utf8', env },
  );
  assert.equal(r.status, 1);
  assert.match(r.stderr, /asks for credentials \(HTTP 401\).*CONCORDAT_STORE_USER/);
});

test('credentials from a netrc file matched by host', { skip }, async () => {
  const { writeFileSync, rmSync } = await import('node:fs');
  const dir = tempDir('concordat-netrc-');
  try {
    writeFileSync(
      join(dir, 'netrc'),
      `machine elsewhere.example login x password y\nmachine ${new URL(URL_BASE!).hostname} login ${ENV.CONCORDAT_STORE_USER} password ${ENV.CONCORDAT_STORE_PASSWORD}\n`,
    );
    const store = new RemoteStore(ENDPOINTS, { env: { NETRC: join(dir, 'netrc') }, retries: 0, progress: false });
    const graph = scratchGraph();
    const loaded = await store.loadGraph(graph, { format: 'n-triples', text: secondVersion().text, file: 'v2.nt' });
    assert.equal(loaded.triples, secondVersion().sorted.length);
    await store.dropGraph(graph);
  } finally {
    rmSync(dir, { recursive: true });
  }
});
