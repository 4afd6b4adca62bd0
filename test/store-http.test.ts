// Remote store HTTP behaviour against a local stub server: Basic auth, retries on 5xx and resets, none on 4xx,
// redaction.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { UserError } from '../src/errors.js';
import { RemoteStore } from '../src/store/remote.js';
import { isLoopback } from '../src/store/http.js';
import { networkInterfaces } from 'node:os';

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

/** This machine's first address that is not loopback, for a stub server the client must treat as remote. */
const outside = Object.values(networkInterfaces())
  .flat()
  .find((a) => a && a.family === 'IPv4' && !a.internal)?.address;

async function basicServer(host: string, body: (url: string) => Promise<void>): Promise<Array<string | undefined>> {
  const seen: Array<string | undefined> = [];
  const server = createServer((req, res) => {
    seen.push(req.headers.authorization);
    req.resume();
    if (req.headers.authorization?.startsWith('Basic ')) ok(res);
    else res.writeHead(401, { 'www-authenticate': 'Basic realm="store"' }).end();
  });
  await new Promise<void>((r) => server.listen(0, host, r));
  try {
    await body(`http://${host}:${(server.address() as AddressInfo).port}/sparql`);
  } finally {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  }
  return seen;
}

const BASIC_ENV = { CONCORDAT_STORE_USER: 'curator', CONCORDAT_STORE_PASSWORD: 'open sesame', NETRC: '/nonexistent' };

test(
  'Basic over plain http to another host is refused before the password is sent (RFC 7617 §4: it travels readable)',
  { skip: outside ? false : 'this machine has no IPv4 address besides loopback' },
  async () => {
    const seen = await basicServer(outside!, (url) =>
      assert.rejects(store(url, BASIC_ENV).query('ASK {}'), (e: unknown) => {
        assert.ok(e instanceof UserError && e.exitCode === 1);
        assert.match(
          e.message,
          /asks for Basic authentication over plain http.*CONCORDAT_STORE_ALLOW_BASIC_OVER_HTTP=1/,
        );
        return true;
      }),
    );
    assert.ok(
      seen.every((h) => !h?.startsWith('Basic')),
      'no Basic credentials sent',
    );
    const allowed = await basicServer(outside!, async (url) =>
      assert.deepEqual(await store(url, { ...BASIC_ENV, CONCORDAT_STORE_ALLOW_BASIC_OVER_HTTP: '1' }).query('ASK {}'), {
        kind: 'boolean',
        value: true,
      }),
    );
    assert.ok(
      allowed.some((h) => h?.startsWith('Basic')),
      'sent once allowed',
    );
  },
);

test('loopback hosts are this machine; other names and addresses are not', () => {
  for (const u of [
    'http://127.0.0.1:1/',
    'http://127.8.9.10/',
    'http://[::1]:8890/',
    'http://localhost/',
    'http://a.localhost/',
  ])
    assert.equal(isLoopback(u), true, u);
  for (const u of [
    'http://192.0.2.2/',
    'http://[::ffff:7f00:1]/',
    'http://localhost.example.org/',
    'http://128.0.0.1/',
  ])
    assert.equal(isLoopback(u), false, u);
});

test('a Graph Store that echoes the credentials in its error: the message carries neither user nor password', async () => {
  const env = { CONCORDAT_STORE_USER: 'curator-x', CONCORDAT_STORE_PASSWORD: 'pw-not-shown-7', NETRC: '/nonexistent' };
  await withServer(
    (req, res) =>
      req.headers.authorization
        ? res.writeHead(403).end(`forbidden for ${req.headers.authorization} (curator-x:pw-not-shown-7)`)
        : res.writeHead(401, { 'www-authenticate': 'Basic realm="store"' }).end(),
    async (url) => {
      const s = new RemoteStore({ gsp: url, update: url, query: url }, { env, retries: 0, progress: false });
      await assert.rejects(
        s.loadGraph('urn:test:g', { format: 'n-triples', text: '<urn:a> <urn:b> <urn:c> .\n', file: 'x.nt' }),
        (e: unknown) => {
          assert.ok(e instanceof UserError);
          assert.match(e.message, /Graph Store answered HTTP 403/);
          for (const secret of [
            'pw-not-shown-7',
            'curator-x',
            Buffer.from('curator-x:pw-not-shown-7').toString('base64'),
          ])
            assert.ok(!e.message.includes(secret), secret);
          return true;
        },
      );
    },
  );
});

test('the server dies mid-load: the message says the staging graph could not be checked, never that it was dropped', async () => {
  let server: ReturnType<typeof createServer> | null = null;
  let posts = 0;
  const handler = (req: IncomingMessage, res: ServerResponse): void => {
    req.resume();
    req.on('end', () => {
      if (req.method === 'GET') return void res.writeHead(404).end();
      if (++posts === 1) return void res.writeHead(201).end();
      // the second chunk: the server goes away and answers nothing more
      req.socket.destroy();
      server!.closeAllConnections();
      server!.close();
    });
  };
  server = createServer(handler);
  await new Promise<void>((r) => server!.listen(0, '127.0.0.1', r));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/store`;
  const s = new RemoteStore(
    { gsp: url, update: url, query: url },
    { env: { NETRC: '/nonexistent' }, retries: 1, backoffMs: 5, timeoutMs: 5000, progress: false, chunkTriples: 1 },
  );
  const text = '<urn:a> <urn:b> <urn:c> .\n<urn:a> <urn:b> <urn:d> .\n';
  await assert.rejects(s.loadGraph('urn:test:g', { format: 'n-triples', text, file: 'x.nt' }), (e: unknown) => {
    assert.ok(e instanceof UserError && e.exitCode === 1);
    assert.match(e.message, /no answer \(/);
    assert.match(
      e.message,
      /whether staging graph\(s\) <urn:concordat:staging:[^>]+> were dropped could not be checked/,
    );
    assert.doesNotMatch(e.message, /staging graph was dropped/);
    assert.match(e.message, /<urn:test:g> is unchanged/);
    return true;
  });
});
