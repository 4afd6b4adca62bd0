/// <reference lib="dom" />
// Photographs on the site: shown only for a partner with an imageView template that sets showImages, loaded from the
// partner's server (here one on loopback), never copied into the site; the Content-Security-Policy names that server.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync, readdirSync, readFileSync, writeFileSync, openSync, readSync, closeSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import path from 'node:path';
import { deflateSync } from 'node:zlib';
import { build } from '../src/pipeline.js';
import { writeSite } from '../src/site/index.js';
import { serveSite } from '../src/serve/index.js';
import { load } from '../src/load/index.js';
import { requires } from './helpers/requires.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { demoSitesOnce } from './helpers/site.js';

const CHROMIUM = '/usr/bin/chromium';
const closers: (() => Promise<void> | void)[] = [];
after(async () => {
  for (const c of closers) await c();
});

/** A 2×2 grey PNG (PNG specification §5: signature, IHDR, IDAT, IEND; CRC-32 per chunk). */
function png(): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (b: Buffer) => {
    let c = 0xffffffff;
    for (const x of b) c = crcTable[(c ^ x) & 0xff] ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const c = Buffer.alloc(4);
    c.writeUInt32BE(crc(body));
    return Buffer.concat([len, body, c]);
  };
  const ihdr = Buffer.from([0, 0, 0, 2, 0, 0, 0, 2, 8, 0, 0, 0, 0]); // 2×2, 8-bit greyscale
  const raw = Buffer.from([0, 128, 128, 0, 128, 128]); // filter byte 0 per row
  return Buffer.concat([
    Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A partner's image server on loopback: any /bilder/<id>.png answers a PNG; every path asked for is recorded. */
async function imageServer(): Promise<{ origin: string; asked: string[] }> {
  const asked: string[] = [];
  const body = png();
  const server: Server = createServer((req, res) => {
    asked.push(req.url ?? '');
    if (/^\/bilder\/[^/]+\.png$/.test(req.url ?? '')) res.writeHead(200, { 'content-type': 'image/png' }).end(body);
    else res.writeHead(404).end();
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  closers.push(() => new Promise<void>((r) => server.close(() => r())));
  const a = server.address();
  return { origin: `http://127.0.0.1:${typeof a === 'object' && a ? a.port : 0}`, asked };
}

/** The demo's release-1 project in a temp folder, paths made absolute, with changes to some partners. */
function demoProject(dir: string, partnerChanges: Record<string, Record<string, unknown>>): string {
  const src = path.join(repoRoot, 'demo-data');
  const p = JSON.parse(readFileSync(path.join(src, 'concordance.json'), 'utf8'));
  const abs = (f: string) => path.resolve(src, f);
  const out = {
    ...p,
    partners: p.partners.map((x: { key: string; catalogue: { file: string } }) => ({
      ...x,
      ...partnerChanges[x.key],
      catalogue: { ...x.catalogue, file: abs(x.catalogue.file) },
    })),
    evidence: p.evidence.map((e: { file: string }) => ({ ...e, file: abs(e.file) })),
    decisions: p.decisions.map((d: string | { file: string }) =>
      typeof d === 'string' ? abs(d) : { ...d, file: abs(d.file) },
    ),
    gold: p.gold ? abs(p.gold) : undefined,
  };
  const file = path.join(dir, 'concordance.json');
  writeFileSync(file, JSON.stringify(out));
  return file;
}

const htmlFiles = (dir: string): string[] =>
  readdirSync(dir, { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && e.name.endsWith('.html') && !path.join(e.parentPath, e.name).includes('/releases/'))
    .map((e) => path.join(e.parentPath, e.name));

let shown: Promise<{ site: string; origin: string; asked: string[] }> | undefined;
/** A site of the demo's release 1 in which kessling shows its photographs from a loopback server. */
function siteWithImages() {
  shown ??= (async () => {
    const img = await imageServer();
    const dir = tempDir('concordat-site-images-');
    const project = demoProject(dir, {
      kessling: { imageView: `${img.origin}/bilder/{image}.png`, showImages: true },
    });
    await build(project, path.join(dir, 'release'));
    await writeSite(path.join(dir, 'release'), path.join(dir, 'site'));
    return { site: path.join(dir, 'site'), origin: img.origin, asked: img.asked };
  })();
  return shown;
}

test('images: shown for the partner that allows it, from its imageView URL, with the photograph named in alt text; no other partner', async () => {
  const { site, origin } = await siteWithImages();
  const dataset = readFileSync(path.join(path.dirname(site), 'release', 'dataset.ttl'), 'utf8');
  assert.match(dataset, /cx:imageViewTemplate "http:\/\/127\.0\.0\.1:\d+\/bilder\/\{image\}\.png"/);
  // vellmar has an imageView (a viewer page for the review queue) but does not allow the site to show photographs
  assert.equal((dataset.match(/cx:imageViewTemplate/g) ?? []).length, 1);
  assert.ok(!dataset.includes('vellmar.example.org/viewer'), 'an imageView without showImages is not published');
  let images = 0,
    kesslingCells = 0;
  for (const f of htmlFiles(site)) {
    const text = readFileSync(f, 'utf8');
    for (const m of text.matchAll(/<img src="([^"]*)" alt="([^"]*)"/g)) {
      images++;
      assert.match(m[1], new RegExp(`^${origin}/bilder/[^/]+\\.png$`), f);
      assert.match(m[2], /^Photograph .+, /, f);
    }
    // every kessling photograph in an evidence cell comes with its image; no other partner's does
    for (const m of text.matchAll(
      /<td>(?:<a href="[^"]*" rel="external"><img [^>]*><\/a> )?(https:\/\/[^<]*)<\/td>/g,
    )) {
      const kessling = m[1].startsWith('https://kessling.example.org/id/aufnahme/');
      if (kessling) kesslingCells++;
      assert.equal(m[0].includes('<img '), kessling, `${path.relative(site, f)}: ${m[1]}`);
    }
  }
  assert.ok(images > 10, `only ${images} images`);
  assert.ok(kesslingCells > 10, `only ${kesslingCells} kessling photographs in evidence tables`);
});

test('images: no image bytes in the site — no image files, no data: URLs, only references to the partner server', async () => {
  const { site } = await siteWithImages();
  const MAGIC: [string, number[]][] = [
    ['PNG', [0x89, 0x50, 0x4e, 0x47]],
    ['JPEG', [0xff, 0xd8, 0xff]],
    ['GIF', [0x47, 0x49, 0x46, 0x38]],
    ['WebP/RIFF', [0x52, 0x49, 0x46, 0x46]],
  ];
  let files = 0;
  for (const e of readdirSync(site, { withFileTypes: true, recursive: true })) {
    if (!e.isFile()) continue;
    const f = path.join(e.parentPath, e.name);
    files++;
    assert.ok(!/\.(png|jpe?g|gif|webp|tiff?|avif)$/i.test(e.name), f);
    const head = Buffer.alloc(4);
    const fd = openSync(f, 'r');
    readSync(fd, head, 0, 4, 0);
    closeSync(fd);
    for (const [name, magic] of MAGIC)
      assert.ok(!magic.every((b, i) => head[i] === b), `${path.relative(site, f)} starts like a ${name} file`);
    if (/\.(html|css|js|jsonld|ttl)$/.test(e.name)) assert.ok(!readFileSync(f, 'utf8').includes('data:image'), f);
  }
  assert.ok(files > 100);
});

test('images: the Content-Security-Policy of serve and of the generated rules allows the partner server, and only it', async () => {
  const { site, origin } = await siteWithImages();
  const s = await serveSite(site, { port: 0, host: '127.0.0.1' });
  closers.push(s.close);
  const r = await fetch(`${s.url.replace(/\/$/, '')}/index.html`);
  const csp = r.headers.get('content-security-policy') ?? '';
  assert.match(csp, new RegExp(`img-src 'self' ${origin.replace(/\./g, '\\.')};`));
  for (const f of ['nginx-server.conf', 'apache.htaccess'])
    assert.ok(readFileSync(path.join(site, f), 'utf8').includes(`img-src 'self' ${origin};`), f);
  // the demo's own site: no partner allows images, so no <img> at all and images from the site only
  const d = await demoSitesOnce();
  for (const f of htmlFiles(d.site2)) assert.ok(!readFileSync(f, 'utf8').includes('<img'), f);
  assert.ok(readFileSync(path.join(d.site2, 'nginx-server.conf'), 'utf8').includes("img-src 'self';"));
});

test('images: showImages without an imageView template is an error naming the field', async () => {
  const dir = tempDir('concordat-show-images-');
  const project = demoProject(dir, { fontclaire: { showImages: true } });
  await assert.rejects(load(project), (e: Error & { problems?: { field: string; message: string }[] }) => {
    assert.ok(
      e.problems?.some((p) => /showImages/.test(p.field) && /needs an imageView/.test(p.message)),
      JSON.stringify(e.problems),
    );
    return true;
  });
});

const skip = requires(existsSync(CHROMIUM), 'chromium not installed at /usr/bin/chromium (apt-get install chromium)');
test(
  'images in a real browser: every image on a cluster page loads from the partner server, no console error',
  { skip },
  async () => {
    const { site, origin, asked } = await siteWithImages();
    const s = await serveSite(site, { port: 0, host: '127.0.0.1' });
    closers.push(s.close);
    const withImages = htmlFiles(path.join(site, 'work')).find((f) => readFileSync(f, 'utf8').includes('<img '))!;
    assert.ok(withImages, 'a cluster page with images');
    const { chromium } = await import('playwright-core');
    const context = await chromium.launchPersistentContext(tempDir('concordat-chromium-'), {
      executablePath: CHROMIUM,
      headless: true,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking'],
    });
    closers.push(() => context.close());
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(e.message));
    const url = `${s.url.replace(/\/$/, '')}/${path.relative(site, withImages)}`;
    assert.equal((await page.goto(url))?.status(), 200);
    // open the evidence so lazy images come into view, then wait for each to finish loading
    await page.evaluate(() => document.querySelectorAll('details').forEach((d) => (d.open = true)));
    const loaded = await page.evaluate(async () => {
      const imgs = Array.from(document.querySelectorAll('img'));
      for (const i of imgs) i.scrollIntoView();
      await Promise.all(
        imgs.map((i) =>
          i.complete
            ? null
            : new Promise((r) => {
                i.addEventListener('load', r);
                i.addEventListener('error', r);
              }),
        ),
      );
      await Promise.all(imgs.map((i) => i.decode().catch(() => null)));
      return imgs.map((i) => ({ src: i.currentSrc, width: i.naturalWidth }));
    });
    assert.ok(loaded.length > 0);
    for (const i of loaded) {
      assert.ok(i.src.startsWith(`${origin}/bilder/`), i.src);
      assert.equal(i.width, 2, `${i.src} did not load`);
    }
    assert.ok(
      asked.some((p) => p.startsWith('/bilder/')),
      'the browser asked the partner server',
    );
    assert.deepEqual(errors, []);
  },
);
