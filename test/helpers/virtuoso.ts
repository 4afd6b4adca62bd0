// The test Virtuoso (.ci/run starts it): endpoints, credentials, a client, and one test file at a time on the server.
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { RemoteStore, STAGING_PREFIX, type Endpoints, type RemoteHooks } from '../../src/store/remote.js';
import { requires } from './requires.js';

export const VT = process.env.CONCORDAT_TEST_VIRTUOSO;
export const skipVirtuoso = requires(
  VT,
  'set CONCORDAT_TEST_VIRTUOSO=http://127.0.0.1:28890 (a running Virtuoso, see .ci/run)',
);

/** Virtuoso's endpoints (Graph Store and Update behind HTTP Digest, Query anonymous), per Virtuoso 7's manual. */
export const VT_ENDPOINTS: Endpoints = VT
  ? { gsp: `${VT}/sparql-graph-crud-auth`, update: `${VT}/sparql-auth`, query: `${VT}/sparql` }
  : { query: '' };
export const VT_ARGS = VT
  ? ['--endpoint', VT_ENDPOINTS.gsp!, '--update', VT_ENDPOINTS.update!, '--query-endpoint', VT_ENDPOINTS.query]
  : [];
export const VT_ENV = {
  CONCORDAT_STORE_USER: process.env.CONCORDAT_TEST_VIRTUOSO_USER ?? 'dba',
  CONCORDAT_STORE_PASSWORD: process.env.CONCORDAT_TEST_VIRTUOSO_PASSWORD ?? 'dba',
};

export const virtuoso = (hooks?: RemoteHooks, chunkTriples?: number, endpoints = VT_ENDPOINTS): RemoteStore =>
  new RemoteStore(endpoints, {
    env: VT_ENV,
    hooks,
    chunkTriples,
    retries: 1,
    backoffMs: 50,
    timeoutMs: 60_000,
    progress: false,
  });

/** Graphs the tests make: the fixture's and the demo's concordances, scratch graphs, staging graphs. */
const TEST_GRAPH = /^(https:\/\/concordance\.([a-z]+\.)?example\.org\/|urn:test:)/;
export const isTestGraph = (g: string): boolean => TEST_GRAPH.test(g) || g.startsWith(STAGING_PREFIX);

/** Drops every graph the tests make, so a test file starts from a server that holds none of them. */
export async function clearTestGraphs(): Promise<void> {
  const s = virtuoso();
  for (const g of (await s.listGraphs()).filter(isTestGraph)) await s.dropGraph(g);
}

const LOCK = path.join(tmpdir(), 'concordat-test-virtuoso.lock');

/**
 * Holds the server for this test file until the process exits (test files run in parallel, and the named queries
 * read every graph of the server), then clears the tests' graphs. A lock of a process that is gone is taken over.
 */
export async function holdVirtuoso(): Promise<void> {
  if (!VT) return;
  for (;;) {
    try {
      mkdirSync(LOCK);
      writeFileSync(path.join(LOCK, 'pid'), String(process.pid));
      break;
    } catch {
      let pid = 0;
      try {
        pid = Number(readFileSync(path.join(LOCK, 'pid'), 'utf8'));
        process.kill(pid, 0);
      } catch (err) {
        if (pid && (err as NodeJS.ErrnoException).code === 'ESRCH') rmSync(LOCK, { recursive: true, force: true });
      }
      await sleep(200);
    }
  }
  process.on('exit', () => rmSync(LOCK, { recursive: true, force: true }));
  await clearTestGraphs();
}
