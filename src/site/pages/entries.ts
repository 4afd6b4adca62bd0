// Shard entries → sections of the shard pages: a link (claim, evidence chain, provenance, earlier states), an image
// match (its photographs, score, run, the claim it supports), a curator review.
import { html, text, type Safe } from '../html.js';
import { V, nodesOf, curie, type Node, type SiteContext } from '../context.js';
import type { Entry, LinkEntry } from '../group.js';
import { assertion, matchTable, photo, statementList, status, workName, workView } from './parts.js';

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
  const ms = (n ?? main)
    .all(V.derivedFrom)
    .map((m) => nodes.get(m))
    .filter((x): x is Node => !!x);
  return html`<article class="entry" id="${rel(ctx, l.iri)}" aria-labelledby="h-${l.hash}">
<h2 id="h-${l.hash}">Claim ${l.hash}</h2>
<p class="iri">Identifier: <code>${l.iri}</code></p>
${current ? html`<p class="claim">${workName(s)} <strong>${n!.one(V.relation) ? curie(n!.one(V.relation)!) : 'no claim triple'}</strong> ${workName(o)} — ${status(n!.one(V.status))}${n!.one(V.score) ? html`, score ${n!.one(V.score)}` : ''}, ${n!.one(V.support) ?? '0'} matching photograph pair${n!.one(V.support) === '1' ? '' : 's'}.</p>` : html`<p class="claim">This claim between ${workName(s)} and ${workName(o)} is no longer published${n?.one(V.invalidatedBy) ? html`: withdrawn by <a href="${ctx.href(n.one(V.invalidatedBy)!, doc)}">${text(ctx.label(n.one(V.invalidatedBy)!))}</a>${n.one(V.invalidatedAt) ? html` on <time datetime="${n.one(V.invalidatedAt)}">${n.one(V.invalidatedAt)}</time>` : ''}` : ''}. Its last published state is below.</p>`}
${cluster ? html`<p>Part of the artwork <a href="${ctx.href(cluster, doc)}">${cluster.replace(/^.*\//, '')}</a>.</p>` : ''}
${n && current ? html`<h3>Provenance</h3><p>Asserted by ${assertion(ctx, n, doc)}.${n.one(V.invalidatedBy) ? html` Withdrawn by <a href="${ctx.href(n.one(V.invalidatedBy)!, doc)}">${text(ctx.label(n.one(V.invalidatedBy)!))}</a>.` : ''}</p>` : ''}
<h3>Evidence chain</h3>
${matchTable(ctx, ms, doc, `Image matches behind claim ${l.hash}`)}
${states.length ? html`<h3>Earlier states</h3>${states.map((x) => html`<section id="${rel(ctx, x.iri)}" class="state"><h4>As published in release ${decodeURIComponent(x.iri.replace(/^.*\/v\//, ''))}</h4>${statementList(ctx, x, doc)}</section>`)}` : ''}
</article>
`.text;
}

/**
 * The head of the table of a match shard page; each match is one row of it (a million matches: no more markup than
 * needed).
 */
export const MATCH_TABLE_HEAD =
  '<table class="evidence"><caption>Image matches: photographs, score, overlap, run, and the claim each is evidence for</caption>\n<thead><tr><th scope="col">Match</th><th scope="col">Photograph A</th><th scope="col">Photograph B</th><th scope="col" class="num">Score</th><th scope="col" class="num">Overlap</th><th scope="col">Run</th><th scope="col">Claim</th></tr></thead><tbody>\n';
export const MATCH_TABLE_TAIL = '</tbody></table>\n';

/** An image match's row: its photographs, score, overlap, run, and the claim it is evidence for. */
export function matchSection(ctx: SiteContext, m: Entry, doc: string, link: string | null): string {
  const n = nodesOf(m.statements).get(m.iri);
  if (!n) return '';
  const run = n.one(V.generatedBy);
  return html`<tr id="${rel(ctx, m.iri)}"><th scope="row">${m.hash}</th><td>${photo(ctx, n.one(V.sourceImage))}</td><td>${photo(ctx, n.one(V.targetImage))}</td><td>${n.one(V.score)}</td><td>${n.one(V.overlap)}</td><td>${run ? html`<a href="${ctx.href(run, doc)}">${run.replace(/^.*\//, '')}</a>` : ''}</td><td>${link ? html`<a href="${ctx.href(link, doc)}">${link.replace(/^.*\//, '')}</a>` : ''}</td></tr>
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

const rel = (ctx: SiteContext, x: string) =>
  x.startsWith(ctx.info.base) ? decodeURIComponent(x.slice(ctx.info.base.length)) : x;
export type { Safe };
