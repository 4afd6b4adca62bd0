// concordat serve on the demo's sites: every kind of minted IRI by Accept (303, media type, triples of the release),
// headers, methods, path traversal, downloads; concordat site's own guarantees (every statement in one document,
// byte-identical output, never overwriting).
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, readdirSync, statSync, symlinkSync, writeFileSync, rmSync } from 'node:fs';
import { build } from '../src/pipeline.js';
import path from 'node:path';
import { request } from 'node:http';
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { serveSite } from '../src/serve/index.js';
import { writeSite } from '../src/site/index.js';
import { negotiate } from '../src/site/negotiate.js';
import { readSiteInfo } from '../src/site/info.js';
import { demoSitesOnce, checkMintedIris, triplesBySubject } from './helpers/site.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const BASE = 'https://concordance.lanternfield.example.org/';
const servers: { close: () => Promise<void> }[] = [];
after(async () => {
  for (const s of servers) await s.close();
});
async function start(site: string) {
  const s = await serveSite(site, { port: 0, host: '127.0.0.1' });
  servers.push(s);
  return s.url.replace(/\/$/, '');
}

test('serve: every kind of minted IRI of release 2027.1, with every Accept, answers 303 to a document holding its triples', async () => {
  const d = await demoSitesOnce();
  const origin = await start(d.site2);
  const n = await checkMintedIris(origin, d.release2, BASE);
  assert.ok(n > 100, `only ${n} checks`);
});

test('serve: the same for release 2026.1 (a first release: no earlier states, no tombstones)', async () => {
  const d = await demoSitesOnce();
  const origin = await start(d.site1);
  assert.ok((await checkMintedIris(origin, d.release1, BASE)) > 100);
});

test('site: every statement of concordance.nq is in exactly one document (.ttl files hold the triples once; release 2026.1, no earlier site)', async () => {
  const d = await demoSitesOnce();
  const want = new Map<string, number>();
  for (const line of readFileSync(path.join(d.release1, 'concordance.nq'), 'utf8').split('\n').filter(Boolean)) {
    const t = line.replace(/ <[^>]*> \.$/, ' .');
    want.set(t, (want.get(t) ?? 0) + 1);
  }
  const got = new Map<string, number>();
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, e.name);
      if (e.isDirectory()) {
        if (!['releases', 'vocab'].includes(e.name)) walk(p);
      } else if (e.name.endsWith('.ttl'))
        for (const l of readFileSync(p, 'utf8').split('\n').filter(Boolean)) got.set(l, (got.get(l) ?? 0) + 1);
    }
  };
  walk(d.site1);
  assert.deepEqual([...got].sort(), [...want].sort());
});

/** One digest of every file's path and bytes under a folder. */
function digest(dir: string): string {
  const h = createHash('sha256');
  const walk = (x: string) => {
    for (const e of readdirSync(x, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
      const p = path.join(x, e.name);
      if (e.isDirectory()) walk(p);
      else h.update(path.relative(dir, p) + '\0').update(readFileSync(p));
    }
  };
  walk(dir);
  return h.digest('hex');
}

test('site: same release → byte-identical site, written in 1, 2 or 3 threads; an existing folder is never overwritten', async () => {
  const d = await demoSitesOnce();
  const want = digest(d.site2);
  for (const parts of [1, 2, 3]) {
    const again = path.join(d.tmp, `site-again-${parts}`);
    const s = await writeSite(d.release2, again, { previous: d.site1, parts });
    assert.equal(digest(again), want, `${parts} thread(s)`);
    assert.ok(s.documents > 100, `${s.documents} documents`);
  }
  await assert.rejects(writeSite(d.release2, path.join(d.tmp, 'site-again-1')), /already exists/);
});

function raw(
  origin: string,
  p: string,
  method = 'GET',
  headers: Record<string, string> = {},
): Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: string }> {
  const u = new URL(origin);
  return new Promise((resolve, reject) => {
    const req = request({ host: u.hostname, port: u.port, path: p, method, headers }, (res) => {
      let body = '';
      res
        .setEncoding('utf8')
        .on('data', (c) => (body += c))
        .on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body }));
    });
    req.on('error', reject).end();
  });
}

test('serve: nothing outside the site folder, whatever the path (dot segments, encoded, doubled slashes, NUL, symbolic links)', async () => {
  const d = await demoSitesOnce();
  const outside = path.join(d.tmp, 'secret.txt');
  writeFileSync(outside, 'SECRET-OUTSIDE');
  const site = path.join(d.tmp, 'site-traversal');
  await writeSite(d.release1, site);
  symlinkSync(outside, path.join(site, 'assets', 'link.css'));
  symlinkSync(d.tmp, path.join(site, 'up'));
  const origin = await start(site);
  const rel = path.relative('/', outside);
  for (const p of [
    '/../secret.txt',
    '/%2e%2e/secret.txt',
    '/%2E%2E%2Fsecret.txt',
    '/assets/..%2f..%2fsecret.txt',
    `/..%2f..%2f..%2f..%2f..%2f${rel}`,
    `//${rel}`,
    '/assets/link.css',
    '/up/secret.txt',
    '/index.html%00.txt',
    '/work/..%5c..%5csecret.txt',
    `/${'..%2f'.repeat(12)}etc/passwd`,
  ]) {
    const r = await raw(origin, p);
    assert.ok([400, 404].includes(r.status), `${p}: ${r.status}`);
    assert.ok(!r.body.includes('SECRET-OUTSIDE') && !r.body.includes('root:'), p);
  }
});

test('serve: headers — media types, Vary, caching, ETag/304, CSP and nosniff; HEAD; 405 for other methods; 406 when nothing offered is acceptable', async () => {
  const d = await demoSitesOnce();
  const origin = await start(d.site2);
  const page = await raw(origin, '/work/c000001.html');
  assert.equal(page.status, 200);
  assert.equal(page.headers['content-type'], 'text/html; charset=utf-8');
  assert.match(String(page.headers['content-security-policy']), /default-src 'none'.*script-src 'self'/);
  assert.equal(page.headers['x-content-type-options'], 'nosniff');
  assert.match(String(page.headers['cache-control']), /max-age=\d+/);
  assert.equal(
    (await raw(origin, '/work/c000001.html', 'GET', { 'if-none-match': String(page.headers.etag) })).status,
    304,
  );
  const head = await raw(origin, '/work/c000001.html', 'HEAD');
  assert.equal(head.status, 200);
  assert.equal(head.body, '');
  assert.equal((await raw(origin, '/work/c000001', 'POST')).status, 405);
  assert.equal((await raw(origin, '/work/c000001', 'DELETE')).status, 405);
  const no = await raw(origin, '/work/c000001', 'GET', { accept: 'image/png' });
  assert.equal(no.status, 406);
  assert.equal((await raw(origin, '/work/c999999', 'GET', { accept: 'text/turtle' })).status, 404);
  assert.equal((await raw(origin, '/nothing-here')).status, 404);
});

test('serve: downloads named by the dataset are served under releases/<version>/ byte for byte', async () => {
  const d = await demoSitesOnce();
  const origin = await start(d.site2);
  const files = (await readSiteInfo(d.release2)).files.map((f) => f.file!).filter(Boolean);
  assert.ok(files.includes('concordance.nq'));
  for (const f of files) {
    const r = await fetch(`${origin}/releases/2027.1/${f}`);
    assert.equal(r.status, 200, f);
    assert.equal(Buffer.from(await r.arrayBuffer()).equals(readFileSync(path.join(d.release2, f))), true, f);
  }
  const t = await fetch(`${origin}/releases/2027.1/concordance.nq`);
  assert.equal(t.headers.get('content-type'), 'application/n-quads');
});

test('negotiation: q-values and specificity decide (RFC 9110 §12.5.1); HTML for no header and */*', () => {
  const table: [string | undefined, string | null][] = [
    [undefined, '.html'],
    ['*/*', '.html'],
    ['text/turtle', '.ttl'],
    ['application/ld+json', '.jsonld'],
    ['application/json', '.jsonld'],
    ['text/html;q=0.5, text/turtle', '.ttl'],
    ['text/turtle;q=0.2, application/ld+json;q=0.9', '.jsonld'],
    ['text/*', '.html'],
    ['application/n-triples', '.nt'],
    ['text/turtle;q=0, */*;q=0.1', '.html'],
    ['image/png', null],
    ['application/xhtml+xml', '.html'],
    ['text/html, application/xhtml+xml, application/xml;q=0.9, */*;q=0.8', '.html'],
  ];
  for (const [accept, ext] of table) assert.equal(negotiate(accept)?.ext ?? null, ext, String(accept));
});

test('vocabulary: vocab/cx.ttl is the shipped vocabulary and vocab/index.html lists every term', async () => {
  const d = await demoSitesOnce();
  assert.equal(
    readFileSync(path.join(d.site2, 'vocab', 'cx.ttl'), 'utf8'),
    readFileSync(path.join(repoRoot, 'vocab-map', 'cx.ttl'), 'utf8'),
  );
  const page = readFileSync(path.join(d.site2, 'vocab', 'index.html'), 'utf8');
  for (const m of readFileSync(path.join(repoRoot, 'vocab-map', 'cx.ttl'), 'utf8').matchAll(/^cx:(\w+) a /gm))
    assert.ok(page.includes(`id="${m[1]}"`), m[1]);
});

test('site CLI: prints where it wrote the site and how to serve it; --json; exit 2 for a folder that is not a release', () => {
  const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
  const tmp = tempDir('concordat-site-cli-');
  const bad = spawnSync(process.execPath, [cli, 'site', tmp, '--out', path.join(tmp, 'x')], { encoding: 'utf8' });
  assert.equal(bad.status, 2);
  assert.match(bad.stderr, /not a release folder/);
  void triplesBySubject;
  void statSync;
});

/**
 * A project file of release 2 in a temp folder, every path in it made absolute: the test writes nothing into the
 * repository (tests run in parallel processes and read demo-data/).
 */
function projectElsewhere(dir: string, changes: Record<string, unknown>): string {
  const src = path.join(repoRoot, 'demo-data', 'release-2');
  const p = JSON.parse(readFileSync(path.join(src, 'concordance.json'), 'utf8'));
  const abs = (f: string) => path.resolve(src, f);
  const out = {
    ...p,
    partners: p.partners.map((x: { catalogue: { file: string } }) => ({
      ...x,
      catalogue: { ...x.catalogue, file: abs(x.catalogue.file) },
    })),
    evidence: p.evidence.map((e: { file: string }) => ({ ...e, file: abs(e.file) })),
    decisions: p.decisions.map((d: string | { file: string }) =>
      typeof d === 'string' ? abs(d) : { ...d, file: abs(d.file) },
    ),
    gold: p.gold ? abs(p.gold) : undefined,
    ...changes,
  };
  const file = path.join(dir, 'concordance.json');
  writeFileSync(file, JSON.stringify(out));
  return file;
}

test('a link IRI from any earlier release resolves: release 3 no longer describes links gone in release 2, its site keeps them from the earlier sites', async () => {
  const d = await demoSitesOnce();
  const dir = tempDir('concordat-release-3-');
  const p3 = projectElsewhere(dir, { previous: undefined, release: { version: '2028.1', issued: '2028-05-31' } });
  const release3 = path.join(d.tmp, 'releases', '2028.1');
  await build(p3, release3, { previous: d.release2 });
  const site3 = path.join(d.tmp, 'site', '2028.1');
  await writeSite(release3, site3, { previous: d.site2, parts: 2 });
  // the same site in one thread: the claims kept from earlier sites do not depend on which part spooled what
  const site3one = path.join(d.tmp, 'site', '2028.1-one');
  await writeSite(release3, site3one, { previous: d.site2, parts: 1 });
  assert.equal(digest(site3one), digest(site3));
  const linksOf = (release: string) =>
    new Set(
      [
        ...readFileSync(path.join(release, 'concordance.nq'), 'utf8').matchAll(/^<(https:[^>]*\/link\/[0-9a-f]+)> /gm),
      ].map((m) => m[1]),
    );
  const in1 = linksOf(d.release1),
    in2 = linksOf(d.release2),
    in3 = linksOf(release3);
  const gone = [...in1].filter((l) => !in3.has(l));
  assert.ok(gone.length > 0, 'the demo has links of release 1 that release 3 no longer describes');
  // every link IRI any of the three releases minted, not only the gone ones
  const every = [...new Set([...in1, ...in2, ...in3])].sort();
  const origin = await start(site3);
  // one request per connection (connection: close): no reuse of a socket the server may be closing under load
  const resolve = async (p: string, accept: string) => {
    const see = await raw(origin, p, 'GET', { accept, connection: 'close' });
    assert.equal(see.status, 303, `${p} ${accept}`);
    const at = new URL(String(see.headers.location), origin + '/').pathname;
    const doc = await raw(origin, at, 'GET', { accept, connection: 'close' });
    assert.equal(doc.status, 200, `${p} ${accept} → ${at}`);
    return doc.body;
  };
  for (const l of every) {
    for (const accept of ['text/html', 'text/turtle']) {
      const body = await resolve(new URL(l).pathname, accept);
      // described once: an earlier site's record of a claim this release still describes is dropped (one section;
      // no statement about the claim twice)
      if (accept === 'text/html') {
        const sections = body.split(`id="link/${l.replace(/^.*\//, '')}"`).length - 1;
        assert.equal(sections, 1, `${l}: ${sections} sections`);
      } else {
        const own = body.split('\n').filter((x) => x.startsWith(`<${l}> `));
        assert.equal(new Set(own).size, own.length, `${l}: a statement twice`);
      }
      assert.ok(
        accept === 'text/html'
          ? body.includes(`id="link/${l.replace(/^.*\//, '')}"`)
          : body.includes(`<${l}> <http://www.w3.org/1999/02/22-rdf-syntax-ns#type>`),
        `${l} ${accept}: the document describes it`,
      );
    }
  }
  // and the earlier releases' datasets and downloads are there too
  for (const v of ['2026.1', '2027.1'])
    assert.ok((await resolve(`/dataset/${v}`, 'text/turtle')).includes(`/dataset/${v}> `), v);
  assert.equal((await raw(origin, '/releases/2026.1/concordance.nq', 'GET', { connection: 'close' })).status, 200);
  rmSync(dir, { recursive: true, force: true });
});

test('cluster pages cite as `concordat cite --brief <cluster IRI>` does: the plain-text citation is the same text', async () => {
  const d = await demoSitesOnce();
  const { cite, CITE_FORMATS } = await import('../src/cite/index.js');
  const ids = readdirSync(path.join(d.site2, 'work'))
    .filter((f) => /^c\d+\.html$/.test(f))
    .map((f) => f.slice(0, -5))
    .slice(0, 25);
  let compared = 0;
  for (const id of ids) {
    const page = readFileSync(path.join(d.site2, 'work', `${id}.html`), 'utf8');
    const m = /<pre id="cite-text"[^>]*>([^]*?)<\/pre>/.exec(page);
    if (!m) continue;
    const shown = m[1]
      .replace(/&lt;/g, '<')
      .replace(/&gt;/g, '>')
      .replace(/&quot;/g, '"')
      .replace(/&#39;/g, "'")
      .replace(/&amp;/g, '&');
    const expected = await CITE_FORMATS.text({
      ...(await cite(`${BASE}work/${id}`, { release: d.release2 })),
      brief: true,
    });
    assert.equal(shown, expected, id);
    compared++;
  }
  assert.ok(compared >= 10, `only ${compared} clusters compared`);
});

test('cluster pages list their date conflicts: each cited conflict is a row with both records and their dates', async () => {
  const d = await demoSitesOnce();
  const { cite } = await import('../src/cite/index.js');
  const nq = readFileSync(path.join(d.release2, 'concordance.nq'), 'utf8');
  const clusters = [
    ...new Set(
      [...nq.matchAll(/^<([^>]*\/work\/[^/>]+)> <https:\/\/w3id.org\/concordat\/vocab#hasDateConflict> /gm)].map(
        (m) => m[1],
      ),
    ),
  ];
  assert.ok(clusters.length >= 2, `only ${clusters.length} clusters with date conflicts in the demo`);
  let rows = 0;
  for (const cluster of clusters) {
    const c = await cite(cluster, { release: d.release2 });
    const page = readFileSync(path.join(d.site2, `${new URL(cluster).pathname.slice(1)}.html`), 'utf8');
    assert.ok(page.includes('<h2 id="conflicts">Date conflicts</h2>'), cluster);
    for (const x of c.conflicts ?? []) {
      const id = new URL(x.iri).pathname.slice(1);
      const row = new RegExp(`<tr id="${id}">(.*?)</tr>`).exec(page);
      assert.ok(row, `${cluster}: no row for ${id}`);
      const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/"/g, '&quot;');
      for (const w of [x.a, x.b]) {
        assert.ok(row[1].includes(`<bdi>${esc(w.ref.slice(w.partner.length + 1))}</bdi>`), `${id}: ${w.ref}`);
        assert.ok(row[1].includes(`<bdi>${esc(w.date ?? '')}</bdi>`), `${id}: ${w.date}`);
      }
      assert.ok(
        row[1].indexOf(x.a.ref.slice(x.a.partner.length + 1)) < row[1].indexOf(x.b.ref.slice(x.b.partner.length + 1)) ||
          x.a.ref === x.b.ref,
        id,
      );
      rows++;
    }
  }
  assert.ok(rows >= 2, `only ${rows} conflict rows`);
});
