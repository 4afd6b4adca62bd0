// Pages that are not documents of the release: home with search, archives, the vocabulary, not-found; and the assets.
import { copyFileSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import N3 from 'n3';
import { html, page, text } from '../html.js';
import { NS } from '../../namespaces.js';
import type { SiteContext } from '../context.js';
import type { Statement } from '../nquads.js';
import type { DocKind } from '../routes.js';

const here = path.dirname(fileURLToPath(import.meta.url));
/** The shipped vocabulary (vocab-map/cx.ttl) and the page assets (src/site/assets, copied as they are). */
export const VOCAB_FILE = path.resolve(here, '..', '..', '..', '..', 'vocab-map', 'cx.ttl');
export const ASSETS_DIR = path.resolve(here, '..', '..', '..', '..', 'src', 'site', 'assets');
export const ASSETS = ['site.css', 'site.js', 'icon.svg'];

export function writeStaticPages(
  ctx: SiteContext,
  dir: string,
  own: Map<string, { kind: DocKind; statements: Statement[] }>,
): void {
  const i = ctx.info;
  const put = (doc: string, body: string) => {
    const f = path.join(dir, `${doc}.html`);
    mkdirSync(path.dirname(f), { recursive: true });
    writeFileSync(f, body);
  };
  const datasetDoc = decodeURIComponent(i.dataset.slice(i.base.length));
  put(
    'index',
    page({
      doc: 'index',
      title: i.title,
      siteTitle: i.title,
      alternates: false,
      licence: i.licence,
      main: html`
${i.description ? html`<p class="lead">${text(i.description)}</p>` : ''}
<p>Which catalogue records in which archives show the same artwork, how sure that is, on what evidence, and who said so. Release ${i.version}${i.issued ? html` of <time datetime="${i.issued}">${i.issued}</time>` : ''}; see <a href="${datasetDoc}.html">the dataset</a> for downloads and licence.</p>
<section aria-labelledby="search-h" class="search"><h2 id="search-h">Find a record</h2>
<form role="search" id="search" action="#" data-index="search/">
<label for="q">Record number or words of its title</label>
<input id="q" name="q" type="search" autocomplete="off" spellcheck="false" required minlength="2">
<button type="submit">Search</button>
</form>
<p id="search-status" role="status" aria-live="polite" class="aside">Search needs JavaScript; without it, browse the <a href="partners.html">archives</a> or the <a href="${datasetDoc}.html">downloads</a>.</p>
<ol id="results" class="results"></ol>
</section>`,
    }),
  );
  put(
    'partners',
    page({
      doc: 'partners',
      title: 'Archives',
      siteTitle: i.title,
      alternates: false,
      licence: i.licence,
      main: html`
<ul class="cards">${[...i.partners.values()].sort((a, b) => (a.name < b.name ? -1 : 1)).map((p) => html`<li><a href="${decodeURIComponent(p.iri.slice(i.base.length))}.html">${text(p.name)}</a>${p.homepage ? html` — <a href="${p.homepage}" rel="external">${p.homepage}</a>` : ''}</li>`)}</ul>`,
    }),
  );
  put(
    'dataset',
    page({
      doc: 'dataset',
      title: 'Dataset',
      siteTitle: i.title,
      alternates: false,
      licence: i.licence,
      main: html`<p>This site shows release <a href="${datasetDoc}.html">${i.version}</a>.</p>`,
    }),
  );
  put(
    '404',
    page({
      doc: '404',
      title: 'Not found',
      siteTitle: i.title,
      alternates: false,
      licence: i.licence,
      main: html`<p>Nothing is published at this address. Identifiers of this concordance begin with <code>${i.base}</code>; try the <a href="/index.html">search</a>.</p>`,
    }),
  );
  writeVocabulary(ctx, dir);
  mkdirSync(path.join(dir, 'assets'), { recursive: true });
  for (const a of ASSETS) copyFileSync(path.join(ASSETS_DIR, a), path.join(dir, 'assets', a));
  void own;
}

/** vocab/cx.ttl as shipped, and vocab/index.html: every term with its label and comment, anchored by local name. */
function writeVocabulary(ctx: SiteContext, dir: string): void {
  const ttl = readFileSync(VOCAB_FILE, 'utf8');
  mkdirSync(path.join(dir, 'vocab'), { recursive: true });
  writeFileSync(path.join(dir, 'vocab', 'cx.ttl'), ttl);
  const quads = new N3.Parser({ format: 'text/turtle' }).parse(ttl);
  const terms = new Map<string, Map<string, string[]>>();
  for (const q of quads) {
    if (!q.subject.value.startsWith(NS.cx) || q.subject.value === NS.cx) continue;
    let m = terms.get(q.subject.value);
    if (!m) terms.set(q.subject.value, (m = new Map()));
    const k = q.predicate.value.replace(/^.*[#/]/, '');
    m.set(k, [...(m.get(k) ?? []), q.object.value]);
  }
  const names = [...terms.keys()].sort();
  writeFileSync(
    path.join(dir, 'vocab', 'index.html'),
    page({
      doc: 'vocab/index',
      title: 'The concordat vocabulary',
      siteTitle: ctx.info.title,
      alternates: false,
      licence: ctx.info.licence,
      main: html`
<p>Namespace <code>${NS.cx}</code>. As Turtle: <a href="cx.ttl" type="text/turtle">cx.ttl</a>.</p>
<dl class="terms">${names.map((t) => {
        const m = terms.get(t)!;
        const local = t.slice(NS.cx.length);
        return html`<dt id="${local}"><code>cx:${local}</code> ${m.get('label')?.[0] ? html`— ${m.get('label')![0]}` : ''}</dt><dd>${m.get('comment')?.[0] ?? ''}${
          m.get('type')
            ? html` <span class="dt">(${m
                .get('type')!
                .map((x) => x.replace(/^.*[#/]/, ''))
                .join(', ')})</span>`
            : ''
        }</dd>`;
      })}</dl>`,
    }),
  );
}
