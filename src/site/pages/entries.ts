// Shard entries → sections of the shard pages: a link (claim, evidence chain, provenance, earlier states), an image
// match (its photographs, score, run, the claim it supports), a curator review.
import { html, text, type Safe } from '../html.js';
import { V, nodesOf, curie, type Node, type SiteContext } from '../context.js';
import type { Entry, LinkEntry } from '../group.js';
import { assertion, matchTable, statementList, status, workName, workView } from './parts.js';

/** A link's section: heading with the claim, its status, evidence chain and provenance; then earlier states. */
export function linkSection(ctx: SiteContext, l: LinkEntry, doc: string, cluster: string | null): string {
  const nodes = nodesOf([...l.statements, ...l.matches.flatMap((m) => m.statements)]);
  const n = nodes.get(l.iri);
  const states = [...nodes.values()].filter((x) => x.one(V.isVersionOf) === l.iri);
  const main = n ?? states[0];
  if (!main) return '';
  const s = workView(ctx, main.one(V.subjectWork) ?? '', nodes.get(main.one(V.subjectWork) ?? ''));
  const o = workView(ctx, main.one(V.objectWork) ?? '', nodes.get(main.one(V.objectWork) ?? ''));
  const current = n?.by.has(V.status);
  const ms = (n ?? main).all(V.derivedFrom).map((m) => nodes.get(m)).filter((x): x is Node => !!x);
  return html`<article class="entry" id="${rel(ctx, l.iri)}" aria-labelledby="h-${l.hash}">
<h2 id="h-${l.hash}">Claim ${l.hash}</h2>
<p class="iri">Identifier: <code>${l.iri}</code></p>
${current ? html`<p class="claim">${workName(s)} <strong>${n!.one(V.relation) ? curie(n!.one(V.relation)!) : 'no claim triple'}</strong> ${workName(o)} — ${status(n!.one(V.status))}${n!.one(V.score) ? html`, score ${n!.one(V.score)}` : ''}, ${n!.one(V.support) ?? '0'} matching photograph pair${n!.one(V.support) === '1' ? '' : 's'}.</p>` : html`<p class="claim">This claim between ${workName(s)} and ${workName(o)} is no longer published${n?.one(V.invalidatedBy) ? html`: withdrawn by <a href="${ctx.href(n.one(V.invalidatedBy)!, doc)}">${text(ctx.label(n.one(V.invalidatedBy)!))}</a>${n.one(V.invalidatedAt) ? html` on <time datetime="${n.one(V.invalidatedAt)}">${n.one(V.invalidatedAt)}</time>` : ''}` : ''}. Its last published state is below.</p>`}
${cluster ? html`<p>Part of the artwork <a href="${ctx.href(cluster, doc)}">${cluster.replace(/^.*\//, '')}</a>.</p>` : ''}
${n && current ? html`<h3>Provenance</h3><p>Asserted by ${assertion(ctx, n, doc)}.${n.one(V.invalidatedBy) ? html` Withdrawn by <a href="${ctx.href(n.one(V.invalidatedBy)!, doc)}">${text(ctx.label(n.one(V.invalidatedBy)!))}</a>.` : ''}</p>` : ''}
<h3>Evidence chain</h3>
${matchTable(ctx, ms, doc, `Image matches behind claim ${l.hash}`)}
${states.length ? html`<h3>Earlier states</h3>${states.map((x) => html`<section id="${rel(ctx, x.iri)}" class="state"><h4>As published in release ${decodeURIComponent(x.iri.replace(/^.*\/v\//, ''))}</h4>${statementList(ctx, x, doc)}</section>`)}` : ''}
<details><summary>All statements about this claim</summary>${n ? statementList(ctx, n, doc) : ''}</details>
</article>
`.text;
}

/** An image match's section: photographs, score, overlap, run, and the claim it is evidence for. */
export function matchSection(ctx: SiteContext, m: Entry, doc: string, link: string | null): string {
  const n = nodesOf(m.statements).get(m.iri);
  if (!n) return '';
  return html`<article class="entry" id="${rel(ctx, m.iri)}" aria-labelledby="h-${m.hash}">
<h2 id="h-${m.hash}">Image match ${m.hash}</h2>
<p class="iri">Identifier: <code>${m.iri}</code></p>
${link ? html`<p>Evidence for the claim <a href="${ctx.href(link, doc)}">${link.replace(/^.*\//, '')}</a>.</p>` : ''}
${statementList(ctx, n, doc)}
</article>
`.text;
}

/** Any other entry (curator reviews, and what else a shard holds): every statement of every subject. */
export function genericSection(ctx: SiteContext, e: Entry, doc: string): string {
  const nodes = nodesOf(e.statements);
  return html`<article class="entry" id="${rel(ctx, e.iri)}" aria-labelledby="h-${e.hash}">
<h2 id="h-${e.hash}">${e.kind === 'review' ? 'Curator review' : e.kind} ${e.hash}</h2>
<p class="iri">Identifier: <code>${e.iri}</code></p>
${[...nodes.values()].map((x) => html`${x.iri !== e.iri ? html`<h3>${text(ctx.label(x.iri))}</h3>` : ''}${statementList(ctx, x, doc)}`)}
</article>
`.text;
}

const rel = (ctx: SiteContext, x: string) => (x.startsWith(ctx.info.base) ? decodeURIComponent(x.slice(ctx.info.base.length)) : x);
export type { Safe };
