// The generated nginx rules on a real nginx (Debian's, started on loopback with a temp prefix by this test): every kind
// of minted IRI answers as from `concordat serve` — 303 by Accept, media types, triples of the release — plus headers.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';
import { requires } from './helpers/requires.js';
import { tempDir } from './helpers/fixture.js';
import { demoSitesOnce, checkMintedIris } from './helpers/site.js';

const BASE = 'https://concordance.lanternfield.example.org/';
const NGINX = ['/usr/sbin/nginx', '/usr/bin/nginx'].find((p) => existsSync(p));
const skip = requires(NGINX, 'nginx not installed (apt-get install nginx)');

let proc: ChildProcess | undefined;
after(() => {
  if (proc?.pid) process.kill(proc.pid, 'SIGTERM');
});

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const p = (s.address() as { port: number }).port;
      s.close(() => resolve(p));
    });
  });

/** nginx in the foreground with its own prefix, pid and logs in a temp folder, serving `site` at the root. */
async function startNginx(site: string): Promise<string> {
  const prefix = tempDir('concordat-nginx-');
  for (const d of ['logs', 'tmp']) mkdirSync(path.join(prefix, d));
  const port = await freePort();
  // the site lives in 0700 temp folders: workers run as this test's user (root in CI), else they could not read it
  const user = process.getuid?.() === 0 ? 'user root;' : '';
  const conf = `${user}
worker_processes 1;
daemon off;
pid ${prefix}/nginx.pid;
error_log ${prefix}/logs/error.log warn;
events { worker_connections 64; }
http {
  access_log off;
  client_body_temp_path ${prefix}/tmp/body; proxy_temp_path ${prefix}/tmp/proxy; fastcgi_temp_path ${prefix}/tmp/fastcgi;
  uwsgi_temp_path ${prefix}/tmp/uwsgi; scgi_temp_path ${prefix}/tmp/scgi;
  default_type application/octet-stream;
  include ${site}/nginx-http.conf;
  server {
    listen 127.0.0.1:${port};
    root ${site};
    include ${site}/nginx-server.conf;
  }
}
`;
  writeFileSync(path.join(prefix, 'nginx.conf'), conf);
  const t = spawnSync(NGINX!, ['-t', '-p', prefix, '-c', path.join(prefix, 'nginx.conf')], { encoding: 'utf8' });
  assert.equal(t.status, 0, `nginx -t: ${t.stderr}`);
  proc = spawn(NGINX!, ['-p', prefix, '-c', path.join(prefix, 'nginx.conf')], { stdio: 'ignore' });
  const origin = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 100; i++) {
    try {
      await fetch(origin + '/index.html');
      return origin;
    } catch {
      await new Promise((r) => setTimeout(r, 50));
    }
  }
  throw new Error(`nginx did not start: ${readFileSync(path.join(prefix, 'logs', 'error.log'), 'utf8')}`);
}

test(
  'nginx with the generated rules: every kind of minted IRI, every Accept, 303 to a document holding its triples',
  { skip },
  async () => {
    const d = await demoSitesOnce();
    chmodSync(d.tmp, 0o755);
    const origin = await startNginx(d.site2);
    const n = await checkMintedIris(origin, d.release2, BASE);
    assert.ok(n > 100, `only ${n} checks`);
    const page = await fetch(`${origin}/work/c000001.html`);
    assert.equal(page.headers.get('content-type'), 'text/html; charset=utf-8');
    assert.match(page.headers.get('content-security-policy') ?? '', /default-src 'none'/);
    assert.equal(page.headers.get('x-content-type-options'), 'nosniff');
    const nt = await fetch(`${origin}/work/c000001.nt`);
    assert.equal(nt.headers.get('content-type')?.split(';')[0], 'application/n-triples');
    assert.equal(await nt.text(), readFileSync(path.join(d.site2, 'work', 'c000001.ttl'), 'utf8'));
    const nq = await fetch(`${origin}/releases/2027.1/concordance.nq`);
    assert.equal(nq.status, 200);
    assert.equal(nq.headers.get('content-type'), 'application/n-quads');
    assert.equal((await fetch(`${origin}/work/c999999/../../site.json/..%2f..%2f`)).status >= 400, true);
  },
);
