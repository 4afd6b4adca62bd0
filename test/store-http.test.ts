// Remote store HTTP behaviour against a local stub server: Basic auth, retries on 5xx and resets, none on 4xx,
// redaction.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { UserError } from '../src/errors.js';
import { RemoteStore } from '../src/store/remote.js';

type Handler = (req: IncomingMessage, res: ServerResponse, n: number) => void;

/** Runs `body` against a stub SPARQL endpoint; returns the requests' Authorization headers. */
async function withServer(handler: Handler, body: (url: string) => Promise<void>): Promise<Array<string | undefined>> {
  const seen: Array<string | undefined> = [];
  const server = createServer((req, res) => {
    seen.push(req.headers.authorization);
    req.resume();
    req.on('end', () => handler(req, res, seen.length));
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  try {
    await body(`http://127.0.0.1:${(server.address() as AddressInfo).port}/sparql`);
  } finally {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  }
  return seen;
}

const ASK_TRUE = '{"head":{},"boolean":true}';
const ok = (res: ServerResponse): void => {
  res.writeHead(200, { 'content-type': 'application/sparql-results+json' }).end(ASK_TRUE);
};
const store = (url: string, env: NodeJS.ProcessEnv = { NETRC: '/nonexistent' }): RemoteStore =>
  new RemoteStore({ query: url }, { env, retries: 2, backoffMs: 5, timeoutMs: 5000, progress: false });

test('Basic auth (RFC 7617 §2) is used when the challenge names it', async () => {
  const env = { CONCORDAT_STORE_USER: 'curator', CONCORDAT_STORE_PASSWORD: 'open sesame' };
  const expected = `Basic ${Buffer.from('curator:open sesame').toString('base64')}`;
  const seen = await withServer(
    (req, res) =>
      req.headers.authorization === expected
        ? ok(res)
        : res.writeHead(401, { 'www-authenticate': 'Basic realm="store"' }).end(),
    async (url) => assert.deepEqual(await store(url, env).query('ASK {}'), { kind: 'boolean', value: true }),
  );
  assert.equal(seen.at(-1), expected);
});

test('a 5xx answer and a reset connection are retried with backoff; the query then succeeds', async () => {
  const seen = await withServer(
    (req, res, n) => {
      if (n === 1) res.writeHead(503).end('busy');
      else if (n === 2) req.socket.destroy();
      else ok(res);
    },
    async (url) => assert.deepEqual(await store(url).query('ASK {}'), { kind: 'boolean', value: true }),
  );
  assert.equal(seen.length, 3);
});

test('a 4xx answer is not retried and becomes a user error (400: exit 2)', async () => {
  const seen = await withServer(
    (_req, res) => res.writeHead(400).end('syntax error'),
    async (url) =>
      assert.rejects(
        store(url).query('ASK {}'),
        (e: unknown) => e instanceof UserError && e.exitCode === 2 && /HTTP 400/.test(e.message),
      ),
  );
  assert.equal(seen.length, 1);
});

test('retries are bounded, and the password never appears in the message even if the server echoes it', async () => {
  const secret = 'echo-me-not-42';
  const seen = await withServer(
    (_req, res) => res.writeHead(500).end(`internal error for password ${secret}`),
    async (url) =>
      assert.rejects(
        store(url, { CONCORDAT_STORE_USER: 'u', CONCORDAT_STORE_PASSWORD: secret }).query('ASK {}'),
        (e: unknown) => {
          assert.ok(e instanceof UserError && e.exitCode === 1);
          assert.match(e.message, /HTTP 500/);
          assert.ok(!e.message.includes(secret));
          return true;
        },
      ),
  );
  assert.equal(seen.length, 3, 'one try plus two retries');
});

test('a URL carrying a password and half-set credentials are refused before any request', async () => {
  const { openStore } = await import('../src/store/open.js');
  await assert.rejects(openStore({ query: 'http://u:pw@127.0.0.1:1/sparql' }), /carries a password/);
  assert.throws(
    () => store('http://127.0.0.1:1/sparql', { CONCORDAT_STORE_USER: 'u' }),
    /CONCORDAT_STORE_PASSWORD: is not set/,
  );
});
