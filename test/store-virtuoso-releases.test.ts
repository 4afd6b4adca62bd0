// A real SPARQL server (Virtuoso, see .ci/run) that had the demo's release 1, its partner slice and release 2 loaded
// holds exactly release 2, and every named query gives report.md's figures; loads that fail or are stopped leave the
// previous release whole and say what they verified.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawn, spawnSync } from 'node:child_process';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { UserError } from '../src/errors.js';
import { loadRelease, planRelease } from '../src/store/release.js';
import { STAGING_PREFIX } from '../src/store/remote.js';
import { repoRoot } from './helpers/fixture.js';
import { fileCounts } from './helpers/store.js';
import { demoReleases, twoReleaseChecks } from './helpers/two-releases.js';
import { holdVirtuoso, isTestGraph, skipVirtuoso, virtuoso, VT_ARGS, VT_ENV } from './helpers/virtuoso.js';

await holdVirtuoso();

twoReleaseChecks({
  name: 'Virtuoso',
  skip: skipVirtuoso,
  where: () => VT_ARGS,
  open: async () => virtuoso(),
  env: VT_ENV,
  graphs: async (s) => (await s.listGraphs()).filter(isTestGraph),
});

const { skip } = { skip: skipVirtuoso };
const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const DCAT = 'http://www.w3.org/ns/dcat#';

/** The store's graphs of the tests with their triple counts, and the release versions their datasets state. */
async function snapshot(): Promise<{ counts: Map<string, number>; versions: string[] }> {
  const s = virtuoso();
  const counts = new Map<string, number>();
  for (const g of (await s.listGraphs()).filter(isTestGraph)) counts.set(g, await s.countTriples(g));
  const r = await s.query(`SELECT DISTINCT ?v WHERE { GRAPH ?g { ?d a <${DCAT}Dataset> ; <${DCAT}version> ?v } }`);
  const versions = r.kind === 'bindings' ? r.rows.map((row) => row.v.value).sort() : [];
  return { counts, versions };
}

/** Release 2 as the two-release checks left it: its four graphs, with the file's counts; no staging graph. */
async function holdsRelease2(): Promise<void> {
  const { r2 } = await demoReleases();
  const { counts, versions } = await snapshot();
  assert.deepEqual(counts, fileCounts(path.join(r2, 'concordance.nq')));
  assert.deepEqual(versions, ['2027.1']);
}

test(
  'a release load that fails at its third graph replaces no graph and drops the two staged before',
  { skip },
  async () => {
    await holdsRelease2();
    const { r1 } = await demoReleases();
    let calls = 0;
    const failing = virtuoso({
      chunkBody: (_i, body) => (++calls === 3 ? `${body}<urn:x:broken> not N-Triples\n` : body),
    });
    await assert.rejects(loadRelease(failing, await planRelease(r1)), (e: unknown) => {
      assert.ok(e instanceof UserError && e.exitCode === 1);
      assert.match(e.message, /chunk 1 of 1 refused \(HTTP \d+\)/);
      assert.match(e.message, /the staging graph was dropped; <[^>]+> is unchanged/);
      assert.match(
        e.message,
        /no graph of the release was replaced \(2 graph\(s\) staged before it: 2 staging graphs were dropped\)/,
      );
      return true;
    });
    await holdsRelease2();
  },
);

test(
  'a replace request the server carries out only in part: the message names exactly what was replaced and what not',
  { skip },
  async () => {
    const { r1, r2 } = await demoReleases();
    const plan = await planRelease(r1);
    // the request holds one MOVE per graph, in plan order, then the drops: keep the first MOVE only
    const partial = virtuoso({ moveUpdate: (u) => u.split(' ;\n')[0] });
    const [first, ...rest] = plan.map((p) => p.graph);
    await assert.rejects(loadRelease(partial, plan), (e: unknown) => {
      assert.ok(e instanceof UserError && e.exitCode === 1);
      assert.match(e.message, /the replace request was answered, but the store does not hold what was sent/);
      assert.match(e.message, new RegExp(`replaced <${first}>;`));
      for (const g of rest)
        assert.match(
          e.message,
          new RegExp(
            `<${g}> was not replaced \\(it holds \\d+ triples, as before; its new content was still staged\\)`,
          ),
        );
      assert.match(e.message, /3 staging graphs were dropped/);
      return true;
    });
    // the store is as the message says: the first graph from release 1, the others from release 2, no staging graph
    const { counts } = await snapshot();
    const [one, two] = [fileCounts(path.join(r1, 'concordance.nq')), fileCounts(path.join(r2, 'concordance.nq'))];
    assert.deepEqual(counts, new Map([...two].map(([g, n]) => [g, g === first ? one.get(g)! : n])));
    await loadRelease(virtuoso(), await planRelease(r2));
    await holdsRelease2();
  },
);

interface Run {
  code: number | null;
  stderr: string;
}

/** Runs `concordat load` into Virtuoso and sends `signal` as soon as a staging graph exists on the server. */
async function loadStopped(release: string, signal: NodeJS.Signals): Promise<Run> {
  const child = spawn(process.execPath, [cli, 'load', release, ...VT_ARGS], {
    env: { ...process.env, ...VT_ENV },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr.on('data', (d) => (stderr += d));
  let done = false;
  const ended = new Promise<Run>((resolve) =>
    child.on('close', (code) => {
      done = true;
      resolve({ code, stderr });
    }),
  );
  const s = virtuoso();
  while (!done && !(await s.listGraphs()).some((g) => g.startsWith(STAGING_PREFIX))) await sleep(5);
  if (!done) child.kill(signal);
  return ended;
}

for (const [signal, code] of [
  ['SIGINT', 130],
  ['SIGTERM', 143],
] as const)
  test(
    `a load stopped by ${signal} while it uploads: exit ${code}, one line, staging graphs dropped, release 2 whole`,
    { skip },
    async () => {
      const { r1 } = await demoReleases();
      const r = await loadStopped(r1, signal);
      assert.equal(r.code, code, r.stderr);
      assert.equal(r.stderr.trim().split('\n').length, 1, r.stderr);
      assert.match(
        r.stderr,
        new RegExp(
          `^concordat: stopped by ${signal}; (the staging graph was dropped|\\d+ staging graphs were dropped)\\n$`,
        ),
      );
      await holdsRelease2();
    },
  );

test('a load killed by SIGKILL leaves its staging graph; the next load removes it and says so', { skip }, async () => {
  const { r2 } = await demoReleases();
  const r = await loadStopped(r2, 'SIGKILL');
  assert.equal(r.code, null);
  const left = (await virtuoso().listGraphs()).filter((g) => g.startsWith(STAGING_PREFIX));
  assert.ok(left.length > 0, 'a staging graph was left');
  // a staging graph of a load on another host: named and left alone
  const foreign = `${STAGING_PREFIX}elsewhere.example:4242:none:0123456789ab`;
  await virtuoso().loadGraph(foreign, { format: 'n-triples', text: '<urn:test:a> <urn:test:b> "c" .\n', file: 'x.nt' });
  const next = spawnSync(process.execPath, [cli, 'load', r2, ...VT_ARGS], {
    encoding: 'utf8',
    env: { ...process.env, ...VT_ENV },
  });
  assert.equal(next.status, 0, next.stderr);
  for (const g of left) assert.match(next.stderr, new RegExp(`removed <${g}>, the staging graph of a stopped load`));
  assert.match(next.stderr, new RegExp(`left <${foreign}>, a staging graph: its load ran on host elsewhere.example`));
  await virtuoso().dropGraph(foreign);
  await holdsRelease2();
});
