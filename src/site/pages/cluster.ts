// A cluster unit → the page of one artwork: records by archive, the claims between them with their evidence, date
// conflicts, earlier versions of the claims, and the citation with copy buttons.
import { html, page, text, type Safe } from '../html.js';
import { V, Node, nodesOf, curie, type SiteContext } from '../context.js';
import type { ClusterUnit } from '../group.js';
import { CITATION_FORMATS, clusterCitation } from '../citation.js';
import { assertion, matchTable, status, workName, workView, type WorkView } from './parts.js';

/** Archive key and record ID: the records table above gives titles and dates. */
const shortName = (w: WorkView) => html`${w.partner} <bdi class="recid">${w.id}</bdi>`;

const relOf = (x: string) => x.replace(/^.*?\/(work\/)/, '$1');

/** The HTML of a cluster's document (`work/<id>.html`). */
export function clusterPage(ctx: SiteContext, u: ClusterUnit): string {
  const all = [...u.statements];
  for (const l of u.links) {
    for (const s of l.statements) all.push(s);
    for (const m of l.matches) for (const s of m.statements) all.push(s);
  }
  const nodes = nodesOf(all);
  const c = nodes.get(u.iri) ?? new Node(u.iri);
  const id = u.doc.replace(/^work\//, '');
  const replaced = c.all(V.replacedBy);
  const retired = c.one(V.deprecated) === 'true' || replaced.length > 0;
  const works = c.all(V.member).map((w) => workView(ctx, w, nodes.get(w)));
  const byWork = new Map(works.map((w) => [w.iri, w]));
  const wv = (x: string | undefined) => (x ? (byWork.get(x) ?? workView(ctx, x, nodes.get(x))) : undefined);
  const title = retired
    ? `Retired cluster ${id}`
    : `Artwork ${id}${works.find((w) => w.title)?.title ? `: ${works.find((w) => w.title)!.title}` : ''}`;

  const sections: Safe[] = [];
  if (retired) {
    sections.push(html`<section aria-labelledby="retired"><h2 id="retired">Retired identifier</h2>
<p>This cluster identifier is no longer in use${c.one(V.invalidatedBy) ? html` since <a href="${ctx.href(c.one(V.invalidatedBy)!, u.doc)}">${text(ctx.label(c.one(V.invalidatedBy)!))}</a>` : ''}. ${replaced.length ? html`Its records are now in: ${replaced.map((r, i) => html`${i ? ', ' : ''}<a href="${ctx.href(r, u.doc)}" rel="successor-version">${r.replace(/^.*\//, '')}</a>`)}.` : 'None of its records is in a cluster now.'}</p></section>`);
  }
  if (works.length) sections.push(recordsSection(ctx, works, u.doc));
  const links = u.links
    .map((l) => ({ entry: l, node: nodes.get(l.iri) }))
    .filter((x): x is { entry: typeof x.entry; node: Node } => !!x.node);
  if (links.length)
    sections.push(
      claimsSection(
        ctx,
        links.map((l) => l.node),
        wv,
        u.doc,
      ),
      evidenceSection(
        ctx,
        links.map((l) => l.node),
        nodes,
        wv,
        u.doc,
      ),
    );
  const conflicts = c
    .all(V.hasDateConflict)
    .map((x) => nodes.get(x))
    .filter((x): x is Node => !!x);
  if (conflicts.length) sections.push(conflictSection(conflicts, wv));
  const implied = c
    .all(V.impliedPair)
    .map((x) => nodes.get(x))
    .filter((x): x is Node => !!x);
  if (implied.length) sections.push(impliedSection(implied, wv));
  const earlier = [...nodes.values()].filter((n) => n.one(V.isVersionOf));
  if (earlier.length) sections.push(earlierSection(ctx, earlier, wv, u.doc));
  const citation = clusterCitation(
    ctx,
    u.iri,
    all,
    links.map((l) => l.node.iri),
  );
  if (citation) sections.push(citeSection(citation));
  return page({
    doc: u.doc,
    title,
    siteTitle: ctx.info.title,
    alternates: true,
    iri: u.iri,
    anchor: u.doc,
    main: html`${sections}`,
    licence: ctx.info.licence,
  });
}

function recordsSection(ctx: SiteContext, works: WorkView[], doc: string): Safe {
  const groups = new Map<string, WorkView[]>();
  for (const w of works) {
    const g = groups.get(w.partnerName);
    if (g) g.push(w);
    else groups.set(w.partnerName, [w]);
  }
  const names = [...groups.keys()].sort();
  return html`<section aria-labelledby="records"><h2 id="records">Records in ${names.length} archive${names.length === 1 ? '' : 's'}</h2>
${names.map(
  (name) => html`<h3>${name}</h3>
<table class="records"><thead><tr><th scope="col">Record</th><th scope="col">Title</th><th scope="col">Date as catalogued</th><th scope="col">Archive's record</th></tr></thead><tbody>
${groups.get(name)!.map(
  (
    w,
  ) => html`<tr id="${w.iri}"><td class="recid">${text(w.id)}</td><td>${text(w.title)}</td><td>${text(w.date)}</td><td>${w.page ? html`<a href="${w.page}" rel="external">record page</a>` : html`<span class="none">none given</span>`}</td></tr>
`,
)}</tbody></table>`,
)}
<p class="aside">Partner pages: ${names.map((n, i) => {
    const p = [...ctx.info.partners.values()].find((x) => x.name === n);
    return html`${i ? ', ' : ''}${p ? html`<a href="${ctx.href(p.iri, doc)}">${n}</a>` : n}`;
  })}.</p>
</section>`;
}

function claimsSection(ctx: SiteContext, links: Node[], wv: (x?: string) => WorkView | undefined, doc: string): Safe {
  return html`<section aria-labelledby="claims"><h2 id="claims">Claims between the records</h2>
<table class="claims"><thead><tr><th scope="col">Records</th><th scope="col">Relation</th><th scope="col">Status</th><th scope="col" class="num">Score</th><th scope="col" class="num">Matching photographs</th><th scope="col">Asserted by, when</th></tr></thead><tbody>
${links.map((l) => {
  const s = wv(l.one(V.subjectWork)),
    o = wv(l.one(V.objectWork));
  return html`<tr><td><a href="${ctx.href(l.iri, doc)}">${s ? shortName(s) : ''} — ${o ? shortName(o) : ''}</a></td><td>${l.one(V.relation) ? curie(l.one(V.relation)!) : html`<span class="none">no claim triple</span>`}</td><td>${status(l.one(V.status))}${l.one(V.invalidatedBy) ? html` <span class="status status-withdrawn">withdrawn</span>` : ''}</td><td class="num">${l.one(V.score) ?? ''}</td><td class="num">${l.one(V.support) ?? '0'}</td><td>${assertion(ctx, l, doc)}</td></tr>
`;
})}</tbody></table></section>`;
}

function evidenceSection(
  ctx: SiteContext,
  links: Node[],
  nodes: Map<string, Node>,
  wv: (x?: string) => WorkView | undefined,
  doc: string,
): Safe {
  return html`<section aria-labelledby="evidence"><h2 id="evidence">Evidence per image pair</h2>
${links.map((l) => {
  const s = wv(l.one(V.subjectWork)),
    o = wv(l.one(V.objectWork));
  const ms = l
    .all(V.derivedFrom)
    .map((m) => nodes.get(m))
    .filter((x): x is Node => !!x);
  return html`<details id="ev-${l.iri.replace(/^.*\//, '')}"><summary>${s?.id ?? ''} — ${o?.id ?? ''}: ${ms.length} image match${ms.length === 1 ? '' : 'es'}</summary>
${matchTable(ctx, ms, doc, `Image matches behind the claim ${l.iri.replace(/^.*\//, '')}`)}</details>
`;
})}</section>`;
}

function conflictSection(conflicts: Node[], wv: (x?: string) => WorkView | undefined): Safe {
  return html`<section aria-labelledby="conflicts"><h2 id="conflicts">Date conflicts</h2>
<table><thead><tr><th scope="col">Record</th><th scope="col">Date</th><th scope="col">Record</th><th scope="col">Date</th><th scope="col">Severity</th></tr></thead><tbody>
${conflicts.map((x) => {
  const a = wv(x.one(V.workA)),
    b = wv(x.one(V.workB));
  return html`<tr id="${relOf(x.iri)}"><td>${a ? workName(a) : ''}</td><td>${text(a?.date)}</td><td>${b ? workName(b) : ''}</td><td>${text(b?.date)}</td><td>${x.one(V.severity) ?? ''}</td></tr>
`;
})}</tbody></table></section>`;
}

function impliedSection(pairs: Node[], wv: (x?: string) => WorkView | undefined): Safe {
  return html`<section aria-labelledby="implied"><h2 id="implied">Pairs implied by the cluster</h2>
<p>These records are in the same cluster without a direct claim between them.</p>
<ul>${pairs.map((x) => {
    const a = wv(x.one(V.workA)),
      b = wv(x.one(V.workB));
    return html`<li id="${relOf(x.iri)}">${a ? workName(a) : ''} — ${b ? workName(b) : ''}${x.one(V.throughThird) === 'true' ? ' (only through a third archive)' : ''}</li>`;
  })}</ul></section>`;
}

function earlierSection(
  ctx: SiteContext,
  earlier: Node[],
  wv: (x?: string) => WorkView | undefined,
  doc: string,
): Safe {
  return html`<section aria-labelledby="earlier"><h2 id="earlier">Earlier versions of these claims</h2>
<table><thead><tr><th scope="col">Claim</th><th scope="col">In release</th><th scope="col">Relation</th><th scope="col">Status</th><th scope="col" class="num">Score</th></tr></thead><tbody>
${earlier.map((e) => {
  const s = wv(e.one(V.subjectWork)),
    o = wv(e.one(V.objectWork));
  return html`<tr><td><a href="${ctx.href(e.iri, doc)}">${s?.id ?? ''} — ${o?.id ?? ''}</a></td><td>${decodeURIComponent(e.iri.replace(/^.*\/v\//, ''))}</td><td>${e.one(V.relation) ? curie(e.one(V.relation)!) : ''}</td><td>${status(e.one(V.status))}</td><td class="num">${e.one(V.score) ?? ''}</td></tr>
`;
})}</tbody></table></section>`;
}

function citeSection(c: NonNullable<ReturnType<typeof clusterCitation>>): Safe {
  return html`<section aria-labelledby="cite"><h2 id="cite">Cite these claims</h2>
${CITATION_FORMATS.map(
  (
    f,
    i,
  ) => html`<div class="citation"><button type="button" class="copy" data-copy="cite-${f.id}" hidden>Copy the ${f.label.toLowerCase()} citation</button>
<details${i === 0 ? ' open' : ''}><summary id="cite-${f.id}-h">${f.label}</summary>
<pre id="cite-${f.id}" tabindex="0" aria-labelledby="cite-${f.id}-h">${f.render(c)}</pre></details></div>
`,
)}</section>`;
}
