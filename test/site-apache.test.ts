// The generated Apache httpd rules on a real Apache (Debian's apache2, started on loopback by this test with its own
// ServerRoot): apache.htaccess as the site's .htaccess answers every kind of minted IRI as `concordat serve` does —
// 303 by Accept, media types, triples of the release — with the same headers.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { chmodSync, copyFileSync, existsSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';
import { requires } from './helpers/requires.js';
import { tempDir } from './helpers/fixture.js';
import { demoSitesOnce, checkMintedIris } from './helpers/site.js';

const BASE = 'https://concordance.lanternfield.example.org/';
const APACHE = ['/usr/sbin/apache2', '/usr/sbin/httpd'].find((p) => existsSync(p));
const MODULES = ['/usr/lib/apache2/modules', '/usr/lib64/httpd/modules'].find((p) => existsSync(p));
const skip = requires(APACHE && MODULES, 'Apache httpd not installed (apt-get install apache2)');

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

/**
 * Apache in the foreground (-DFOREGROUND) with a ServerRoot, pid and logs in a temp folder, serving `site` at the root
 * with AllowOverride All, and only the modules the rules name (mod_rewrite, mod_headers, mod_mime, mod_dir).
 */
async function startApache(site: string): Promise<{ origin: string; log: string }> {
  const root = tempDir('concordat-apache-');
  chmodSync(root, 0o755);
  const port = await freePort();
  // started as root, Apache's workers run as another user (Debian's www-data), which reads the site
  const user = process.getuid?.() === 0 ? 'User www-data\nGroup www-data' : '';
  const mod = (name: string, file: string) => `LoadModule ${name}_module ${MODULES}/mod_${file}.so`;
  const conf = `ServerRoot ${root}
DefaultRuntimeDir ${root}
PidFile ${root}/httpd.pid
${mod('mpm_event', 'mpm_event')}
${mod('authz_core', 'authz_core')}
${mod('mime', 'mime')}
${mod('dir', 'dir')}
${mod('rewrite', 'rewrite')}
${mod('headers', 'headers')}
${user}
Listen 127.0.0.1:${port}
ServerName 127.0.0.1
ErrorLog ${root}/error.log
LogLevel warn
TypesConfig /dev/null
DocumentRoot ${site}
<Directory ${site}>
  AllowOverride All
  Require all granted
</Directory>
`;
  const file = path.join(root, 'httpd.conf');
  writeFileSync(file, conf);
  const t = spawnSync(APACHE!, ['-t', '-f', file], { encoding: 'utf8' });
  assert.equal(t.status, 0, `apache2 -t: ${t.stderr}`);
  proc = spawn(APACHE!, ['-DFOREGROUND', '-f', file], { stdio: 'ignore' });
  const origin = `http://127.0.0.1:${port}`;
  const log = path.join(root, 'error.log');
  for (let i = 0; i < 200; i++) {
    try {
      await fetch(origin + '/index.html');
      return { origin, log };
    } catch {
      await new Promise((r) => setTimeout(r, 50));
    }
  }
  throw new Error(`Apache did not start: ${existsSync(log) ? readFileSync(log, 'utf8') : 'no log'}`);
}

test(
  'Apache httpd with apache.htaccess: every kind of minted IRI, every Accept, 303 to a document holding its triples',
  { skip },
  async () => {
    const d = await demoSitesOnce();
    chmodSync(d.tmp, 0o755);
    // as the site's README says: the rules file copied into the site folder as .htaccess
    copyFileSync(path.join(d.site2, 'apache.htaccess'), path.join(d.site2, '.htaccess'));
    const { origin, log } = await startApache(d.site2);
    const n = await checkMintedIris(origin, d.release2, BASE);
    assert.ok(n > 100, `only ${n} checks`);
    const page = await fetch(`${origin}/work/c000001.html`);
    assert.equal(page.headers.get('content-type'), 'text/html; charset=utf-8');
    assert.match(page.headers.get('content-security-policy') ?? '', /default-src 'none'/);
    assert.equal(page.headers.get('x-content-type-options'), 'nosniff');
    assert.match(page.headers.get('cache-control') ?? '', /max-age=\d+/);
    const see = await fetch(`${origin}/work/c000001`, { headers: { accept: 'text/turtle' }, redirect: 'manual' });
    assert.equal(see.status, 303);
    assert.equal(see.headers.get('vary'), 'Accept');
    const nt = await fetch(`${origin}/work/c000001.nt`);
    assert.equal(nt.headers.get('content-type')?.split(';')[0], 'application/n-triples');
    assert.equal(await nt.text(), readFileSync(path.join(d.site2, 'work', 'c000001.ttl'), 'utf8'));
    const nq = await fetch(`${origin}/releases/2027.1/concordance.nq`);
    assert.equal(nq.status, 200);
    assert.equal(nq.headers.get('content-type'), 'application/n-quads');
    assert.equal((await fetch(`${origin}/nothing-here`)).status, 404);
    assert.ok(
      !/\[(?:core|rewrite|headers):(?:error|alert)\]/.test(readFileSync(log, 'utf8')),
      readFileSync(log, 'utf8'),
    );
  },
);
