/// <reference lib="dom" />
// The demo's site and a site of hostile records in a real browser (Debian's chromium driven by playwright-core):
// every page type renders without console errors and passes axe-core; internal links resolve; search and copy work;
// hostile IDs and titles render as text. Screenshots of each page type go to test-artifacts/site/ (not committed).
import { test, after, before } from 'node:test';
import assert from 'node:assert/strict';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { build } from '../src/pipeline.js';
import { writeSite } from '../src/site/index.js';
import { serveSite } from '../src/serve/index.js';
import { requires } from './helpers/requires.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { demoSitesOnce } from './helpers/site.js';
import { HOSTILE, writeHostileProject } from './helpers/hostile.js';
import type { BrowserContext, Page } from 'playwright-core';

const CHROMIUM = '/usr/bin/chromium';
const skip = requires(existsSync(CHROMIUM), 'chromium not installed at /usr/bin/chromium (apt-get install chromium)');
const ARTIFACTS = path.join(repoRoot, 'test-artifacts', 'site');
const FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

let context: BrowserContext | undefined;
const closers: (() => Promise<void>)[] = [];
before(async () => {
  if (skip) return;
  const { chromium } = await import('playwright-core');
  // a new, empty profile for every run; the browser is Debian's, never downloaded
  context = await chromium.launchPersistentContext(tempDir('concordat-chromium-'), {
    executablePath: CHROMIUM,
    headless: true,
    args: FLAGS,
  });
  mkdirSync(ARTIFACTS, { recursive: true });
});
after(async () => {
  for (const c of closers) await c();
  await context?.close();
});

async function serve(site: string): Promise<string> {
  const s = await serveSite(site, { port: 0, host: '127.0.0.1' });
  closers.push(s.close);
  return s.url.replace(/\/$/, '');
}

/** Opens a page, failing on any console error, uncaught exception or dialog (an alert would mean script injection). */
async function open(url: string): Promise<{ page: Page; errors: string[] }> {
  const page = await context!.newPage();
  const errors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('dialog', (d) => {
    errors.push(`dialog: ${d.message()}`);
    void d.dismiss();
  });
  const r = await page.goto(url);
  assert.equal(r?.status(), 200, url);
  return { page, errors };
}

const AXE = readFileSync(path.join(repoRoot, 'node_modules', 'axe-core', 'axe.min.js'), 'utf8');
/** axe-core's WCAG 2.1 A and AA rules (the automated part of an accessibility check; it cannot judge everything). */
async function axe(page: Page): Promise<string[]> {
  await page.evaluate(AXE);
  const res = await page.evaluate(async () => {
    const r = await (
      globalThis as unknown as {
        axe: {
          run: (
            ctx: unknown,
            opts: unknown,
          ) => Promise<{ violations: { id: string; nodes: { target: string[] }[] }[] }>;
        };
      }
    ).axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
    return r.violations.map(
      (v) =>
        `${v.id}: ${v.nodes
          .map((n) => n.target.join(' '))
          .slice(0, 3)
          .join(', ')}`,
    );
  });
  return res;
}

/** One page of each type in the demo's release 2027.1, by the IRI a reader would look up. */
const PAGE_TYPES: [string, string][] = [
  ['home', '/index.html'],
  ['cluster', '/work/c000001'],
  ['retired-cluster', ''],
  ['claim', '/link/043c4c5af186df74'],
  ['image-match', ''],
  ['curator-review', ''],
  ['run', '/run/matcher-2027-04'],
  ['software', '/agent/lanternfield-matcher/2.0.1'],
  ['curator', '/curator/ilse-marwitz'],
  ['release', '/release/2027.1'],
  ['dataset', '/dataset/2027.1'],
  ['archive', '/dataset/partner/vellmar'],
  ['publisher', '/dataset/publisher'],
  ['graph', '/graph/claims'],
  ['archives', '/partners.html'],
  ['vocabulary', '/vocab/index.html'],
];

test(
  'every page type renders with no console error, passes axe-core (WCAG 2.1 AA rules), and its screenshot is kept',
  { skip },
  async () => {
    const d = await demoSitesOnce();
    const origin = await serve(d.site2);
    const nq = readFileSync(path.join(d.release2, 'concordance.nq'), 'utf8');
    const first = (re: RegExp) => {
      const m = re.exec(nq);
      assert.ok(m, String(re));
      return new URL(m[1]).pathname;
    };
    const fill: Record<string, string> = {
      'retired-cluster': first(/^<([^>]*\/work\/c\d+)> <http:\/\/purl\.org\/dc\/terms\/isReplacedBy>/m),
      'image-match': first(/^<([^>]*\/match\/[0-9a-f]+)> /m),
      'curator-review': first(/^<([^>]*\/review\/[0-9a-f]+)> /m),
    };
    for (const [type, p] of PAGE_TYPES) {
      const { page, errors } = await open(origin + (p || fill[type]));
      assert.deepEqual(errors, [], `${type}: console errors`);
      assert.deepEqual(await axe(page), [], `${type}: accessibility violations`);
      assert.ok((await page.locator('h1').count()) === 1, `${type}: one h1`);
      await page.screenshot({ path: path.join(ARTIFACTS, `${type}.png`), fullPage: true });
      await page.close();
    }
  },
);

test('every internal link on a sample of pages resolves within the site, fragments included', { skip }, async () => {
  const d = await demoSitesOnce();
  const origin = await serve(d.site2);
  const checked = new Map<string, string>();
  for (const p of [
    '/index.html',
    '/work/c000001.html',
    '/work/c000002.html',
    '/link/0.html',
    '/dataset/2027.1.html',
    '/run/matcher-2027-04.html',
    '/dataset/partner/kessling.html',
    '/vocab/index.html',
    '/partners.html',
  ]) {
    const { page } = await open(origin + p);
    const hrefs = await page.$$eval('a[href]', (as) => as.map((a) => (a as HTMLAnchorElement).href));
    await page.close();
    for (const h of hrefs) {
      const u = new URL(h);
      if (u.origin !== origin || checked.has(u.href)) continue;
      const r = await fetch(u.href.replace(/#.*$/, ''));
      assert.equal(r.status, 200, `${p} → ${h}`);
      const body = await r.text();
      if (u.hash) {
        const id = decodeURIComponent(u.hash.slice(1));
        assert.ok(body.includes(`id="${id}"`), `${p} → ${h}: no element with that id`);
      }
      checked.set(u.href, p);
    }
  }
  assert.ok(checked.size > 50, `only ${checked.size} internal links`);
});

test(
  'search finds a record by its ID and by a word of its title; copy puts the citation on the clipboard',
  { skip },
  async () => {
    const d = await demoSitesOnce();
    const origin = await serve(d.site2);
    await context!.grantPermissions(['clipboard-read', 'clipboard-write'], { origin });
    const { page, errors } = await open(`${origin}/index.html`);
    const search = async (q: string) => {
      await page.evaluate(() => {
        document.getElementById('search-status')!.textContent = '';
      });
      await page.fill('#q', q);
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => /found/.test(document.getElementById('search-status')!.textContent ?? ''));
      return page.$$eval('#results li', (lis) =>
        lis.map((li) => ({ text: li.textContent ?? '', href: (li.querySelector('a') as HTMLAnchorElement).href })),
      );
    };
    const byId = await search('VF 1042');
    assert.ok(
      byId.some((r) => r.text.includes('VF 1042') && r.href.endsWith('/work/c000001.html')),
      JSON.stringify(byId),
    );
    const byWord = await search('Fontclaire');
    assert.ok(
      byWord.some((r) => r.text.includes('Réf. 102')),
      JSON.stringify(byWord),
    );
    const accentless = await search('vierge enfant');
    assert.ok(
      accentless.some((r) => r.text.includes('Vierge à l')),
      JSON.stringify(accentless),
    );
    assert.deepEqual(await search('zzqqxx'), []);
    await page.screenshot({ path: path.join(ARTIFACTS, 'search.png'), fullPage: true });
    // keyboard: the first Tab reaches the skip link, which moves focus to the content
    await page.goto(`${origin}/work/c000001.html`);
    await page.keyboard.press('Tab');
    assert.equal(await page.evaluate(() => document.activeElement?.className), 'skip');
    await page.keyboard.press('Enter');
    assert.equal(await page.evaluate(() => document.activeElement?.id), 'main');
    const button = page.locator('button.copy').first();
    await button.click();
    const copied = await page.evaluate(() => navigator.clipboard.readText());
    const shown = await page.locator(`#${(await button.getAttribute('data-copy')) ?? ''}`).textContent();
    assert.equal(copied, shown);
    assert.match(copied, /show the same work|probably show the same work/);
    assert.deepEqual(errors, []);
    await page.close();
  },
);

test(
  'hostile record IDs and titles render as text: no script runs, no element is injected, bidi marks stay isolated',
  { skip },
  async () => {
    const tmp = tempDir('concordat-hostile-');
    const project = writeHostileProject(path.join(tmp, 'project'));
    await build(project, path.join(tmp, 'release'));
    await writeSite(path.join(tmp, 'release'), path.join(tmp, 'site'));
    const origin = await serve(path.join(tmp, 'site'));
    const clusters = readFileSync(path.join(tmp, 'release', 'clusters.csv'), 'utf8');
    const ids = [...new Set([...clusters.matchAll(/^(c\d+),"?a:/gm)].map((m) => m[1]))];
    assert.ok(ids.length >= 3, clusters);
    const seen = new Set<string>();
    for (const id of ids) {
      const { page, errors } = await open(`${origin}/work/${id}`);
      assert.deepEqual(errors, [], id);
      assert.equal(await page.locator('img').count(), 0, `${id}: an injected img`);
      assert.equal(await page.locator('b').count(), 0, `${id}: injected markup`);
      assert.equal(await page.evaluate(() => document.scripts.length), 1, `${id}: an injected script`);
      const text = await page.locator('main').innerText();
      for (const h of HOSTILE) {
        if (text.includes(h.title)) seen.add(h.title);
        if (text.includes(h.id)) seen.add(h.id);
      }
      assert.notEqual(await page.title(), 'owned', 'a title script ran');
      await page.screenshot({ path: path.join(ARTIFACTS, `hostile-${id}.png`), fullPage: true });
      await page.close();
    }
    for (const h of HOSTILE.slice(0, 4))
      assert.ok(seen.has(h.id) && seen.has(h.title), `not shown as text: ${JSON.stringify(h)}`);
    const { page, errors } = await open(`${origin}/index.html`);
    await page.fill('#q', 'onerror');
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => /found/.test(document.getElementById('search-status')!.textContent ?? ''));
    assert.equal(await page.locator('#results img').count(), 0);
    assert.ok((await page.locator('#results').innerText()).includes('"><img src=x onerror=alert(2)>'));
    assert.deepEqual(errors, []);
    await page.close();
  },
);
