// Pieces several pages share: a work's name, a claim's relation and status, who asserted it and when, a match table.
import { html, text, type Safe } from '../html.js';
import { refOfWorkIri } from '../../history/names.js';
import { V, curie, type Node, type SiteContext } from '../context.js';
import { iri as nsIri } from '../../namespaces.js';

const REVIEW = nsIri('cx', 'CuratorReview');

export interface WorkView {
  iri: string;
  partner: string;
  partnerName: string;
  id: string;
  title?: string;
  date?: string;
  page?: string;
}

/**
 * A partner work from its statements: partner key and name, record ID (decoded after the partner's URI space), title,
 * date, record page.
 */
export function workView(ctx: SiteContext, iri: string, n: Node | undefined): WorkView {
  const partner = n?.one(V.partner) ?? partnerOf(ctx, iri);
  const p = ctx.info.partners.get(partner);
  const ref = refOfWorkIri(iri, partner, p?.uriSpace);
  return {
    iri,
    partner,
    partnerName: p?.name ?? partner,
    id: ref.startsWith(`${partner}:`) ? ref.slice(partner.length + 1) : ref,
    title: n?.one(V.title),
    date: n?.one(V.dateAsCatalogued),
    page: n?.one(V.page),
  };
}

/** The partner whose URI space holds a work IRI (a work described in another document), or '' for none. */
function partnerOf(ctx: SiteContext, iri: string): string {
  let best = '',
    len = 0;
  for (const p of ctx.info.partners.values())
    if (p.uriSpace && p.uriSpace.length > len && iri.startsWith(p.uriSpace)) [best, len] = [p.key, p.uriSpace.length];
  return best;
}

/** "Partner ID" with the title: how a record is named in claims. */
export const workName = (w: WorkView) =>
  html`<span class="work"><span class="archive">${w.partnerName}</span> <span class="recid">${text(w.id)}</span>${w.title ? html` <span class="title">“${text(w.title)}”</span>` : ''}</span>`;

const STATUS_WORDS: Record<string, string> = { Confirmed: 'confirmed', Proposed: 'proposed', Rejected: 'rejected' };
/** The status word of a cx:status IRI, shown with a class so its colour never carries the meaning alone. */
export function status(x: string | undefined): Safe {
  const w = x ? (STATUS_WORDS[x.replace(/^.*#/, '')] ?? curie(x)) : 'unknown';
  return html`<span class="status status-${w}">${w}</span>`;
}

/** Who or what asserted a link and when: the curator review (curator, date) or the match runs (software, start). */
export function assertion(ctx: SiteContext, link: Node, doc: string): Safe {
  const parts: Safe[] = [];
  for (const g of link.all(V.generatedBy)) {
    const n = ctx.prov.get(g);
    const review = n?.all(V.type).includes(REVIEW);
    const curator = review ? n?.one(V.associatedWith) : undefined;
    const when = n?.one(V.endedAt) ?? n?.one(V.date) ?? n?.one(V.startedAt);
    const who = curator
      ? html`<a href="${ctx.href(curator, doc)}">${text(ctx.label(curator))}</a> (curator review <a href="${ctx.href(g, doc)}">${g.replace(/^.*\//, '')}</a>)`
      : html`<a href="${ctx.href(g, doc)}">${text(ctx.label(g))}</a>`;
    parts.push(html`${who}${when ? html`, <time datetime="${when}">${when}</time>` : ''}`);
  }
  return parts.length
    ? html`${parts.map((p, i) => html`${i ? '; ' : ''}${p}`)}`
    : html`<span class="none">not recorded</span>`;
}

/**
 * The image pairs behind a link: photograph A and B, score, overlap (the run is named once, under the table). Cells
 * carry no classes: the stylesheet sets IRIs and numbers by column (`.evidence td:nth-child(…)`), once for all rows.
 */
export function matchTable(ctx: SiteContext, matches: Node[], doc: string, caption: string): Safe {
  if (!matches.length) return html`<p>No image-match evidence.</p>`;
  const runs = [...new Set(matches.map((m) => m.one(V.generatedBy)).filter((x): x is string => !!x))];
  return html`<table class="evidence">
<caption>${caption}</caption>
<thead><tr><th scope="col">Match</th><th scope="col">Photograph A</th><th scope="col">Photograph B</th><th scope="col" class="num">Score</th><th scope="col" class="num">Overlap</th></tr></thead>
<tbody>
${matches.map(
  (
    m,
  ) => html`<tr><td><a href="${ctx.href(m.iri, doc)}">${m.iri.slice(-6)}</a></td><td>${photo(ctx, m.one(V.sourceImage))}</td><td>${photo(ctx, m.one(V.targetImage))}</td><td>${m.one(V.score)}</td><td>${m.one(V.overlap)}</td></tr>
`,
)}</tbody>
</table>
${runs.length ? html`<p class="small">Matched by ${runs.map((r, i) => html`${i ? ', ' : ''}<a href="${ctx.href(r, doc)}">${text(ctx.label(r))}</a>`)}.</p>` : ''}`;
}

/**
 * A photograph's cell: its IRI, and the image itself from the partner's server where the partner lets pages show it
 * (`showImages` in the project; the site holds no image bytes).
 */
export function photo(ctx: SiteContext, iri: string | undefined): Safe | string {
  if (iri === undefined) return '';
  const shown = ctx.images.any ? ctx.images.view(iri) : undefined;
  if (!shown) return iri;
  return html`<a href="${shown.url}" rel="external"><img src="${shown.url}" alt="Photograph ${shown.id}, ${shown.partner.name}" loading="lazy" decoding="async" height="96"></a> ${iri}`;
}

/** Every statement of a node as a definition list (the generic view of a resource). */
export function statementList(ctx: SiteContext, n: Node, doc: string): Safe {
  return html`<dl class="statements">
${[...n.by].map(
  ([p, sts]) => html`<dt><a href="${ctx.href(p, doc)}">${curie(p)}</a></dt>
${sts.map(
  (
    st,
  ) => html`<dd>${st.o.kind === 'iri' ? html`<a href="${ctx.href(st.o.value, doc)}">${text(st.o.value.startsWith(ctx.info.base) ? ctx.label(st.o.value) : curie(st.o.value))}</a>` : st.o.kind === 'bnode' ? html`<code>_:${st.o.value}</code>` : html`${text(st.o.value)}${st.o.datatype ? html` <span class="dt">${curie(st.o.datatype)}</span>` : ''}${st.o.language ? html` <span class="dt">@${st.o.language}</span>` : ''}`}</dd>
`,
)}`,
)}</dl>`;
}
