// The dataset document's extra part: title, publisher, licence, version, previous version, downloads with sizes and
// checksums, VoID linksets as a table (DCAT 3 §6.6, §6.8; VoID §5).
import { html, text, type Safe } from '../html.js';
import { curie, type SiteContext } from '../context.js';

const size = (n?: number) =>
  n === undefined || Number.isNaN(n)
    ? ''
    : n < 1024
      ? `${n} B`
      : n < 1 << 20
        ? `${(n / 1024).toFixed(1)} KiB`
        : n < 1 << 30
          ? `${(n / (1 << 20)).toFixed(1)} MiB`
          : `${(n / (1 << 30)).toFixed(2)} GiB`;

export function datasetSummary(ctx: SiteContext, doc: string): Safe {
  const i = ctx.info;
  const partnerName = (x?: string) => [...i.partners.values()].find((p) => p.iri === x)?.name ?? x ?? '';
  return html`<dl class="facts">
<dt>Title</dt><dd>${text(i.title)}</dd>
${i.description ? html`<dt>Description</dt><dd>${text(i.description)}</dd>` : ''}
<dt>Publisher</dt><dd>${i.publisher ? html`${i.publisher.homepage ? html`<a href="${i.publisher.homepage}">${text(i.publisher.name ?? i.publisher.iri)}</a>` : text(i.publisher.name ?? i.publisher.iri)}` : html`<span class="none">not given</span>`}</dd>
<dt>Licence</dt><dd>${i.licence ? html`<a href="${i.licence}" rel="license">${i.licence}</a>` : html`<span class="none">not given</span>`}</dd>
<dt>Version</dt><dd>${i.version}${i.issued ? html`, issued <time datetime="${i.issued}">${i.issued}</time>` : ''}</dd>
<dt>Previous version</dt><dd>${i.previous ? html`<a href="${ctx.href(i.previous, doc)}">${i.previous}</a>` : html`<span class="none">none: the first release</span>`}</dd>
</dl>
<section aria-labelledby="downloads"><h2 id="downloads">Downloads</h2>
<table><thead><tr><th scope="col">File</th><th scope="col">Media type</th><th scope="col" class="num">Size</th><th scope="col">SHA-256</th></tr></thead><tbody>
${i.files.map(
  (
    f,
  ) => html`<tr id="${decodeURIComponent(f.iri.slice(i.base.length))}"><td>${f.url ? html`<a href="${f.file ? `${'../'.repeat(doc.split('/').length - 1)}releases/${encodeURIComponent(i.version)}/${f.file.split('/').map(encodeURIComponent).join('/')}` : f.url}" download>${f.file ?? f.url}</a>` : (f.title ?? '')}</td><td>${f.mediaType?.replace(/^.*media-types\//, '') ?? ''}</td><td class="num">${size(f.byteSize)}</td><td><code class="hash">${f.sha256 ?? ''}</code></td></tr>
`,
)}</tbody></table></section>
<section aria-labelledby="linksets"><h2 id="linksets">Linksets</h2>
<table><thead><tr><th scope="col">Linkset</th><th scope="col">From</th><th scope="col">To</th><th scope="col">Predicate</th><th scope="col" class="num">Triples</th></tr></thead><tbody>
${i.linksets.map(
  (
    l,
  ) => html`<tr><td>${text(l.title ?? l.iri)}</td><td>${partnerName(l.subjects)}</td><td>${partnerName(l.objects)}</td><td>${l.predicate ? curie(l.predicate) : ''}</td><td class="num">${Number.isNaN(l.triples) ? '' : l.triples}</td></tr>
`,
)}</tbody></table></section>`;
}
