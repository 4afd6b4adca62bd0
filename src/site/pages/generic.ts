// A document of its own (run, software agent, curator, release, partner, publisher, named graph) → its page.
import { html, page, text, type Safe } from '../html.js';
import { nodesOf, type SiteContext } from '../context.js';
import type { Statement } from '../nquads.js';
import type { DocKind } from '../routes.js';
import { statementList } from './parts.js';

/** Page titles by kind (one row per kind). */
const TITLE: Partial<Record<DocKind, string>> = {
  run: 'Match run',
  agent: 'Software',
  curator: 'Curator',
  release: 'Release',
  partner: 'Archive',
  publisher: 'Publisher',
  graph: 'Named graph',
  dataset: 'Dataset',
};

/** What each named graph of the release holds (design, "RDF model"). */
const GRAPHS: Record<string, string> = {
  claims:
    'the claim triples between partner works (owl:sameAs, skos:closeMatch, dcterms:isPartOf, skos:relatedMatch) and the minimal description of each work',
  evidence: 'the image matches: pairs of photographs, score, overlap, run',
  provenance: 'links as resources, clusters, runs, software, curator reviews, curators, earlier states and withdrawals',
  dataset: 'the VoID and DCAT description of the release: linksets, files, licence, versions',
};

export function genericPage(
  ctx: SiteContext,
  doc: string,
  kind: DocKind,
  statements: readonly Statement[],
  extra?: Safe,
): string {
  const iri = ctx.info.base + doc.split('/').map(encodeURIComponent).join('/');
  const nodes = nodesOf(statements);
  const own = nodes.get(iri);
  const name = own ? ctx.label(iri) : decodeURIComponent(doc.replace(/^.*\//, ''));
  const graph = kind === 'graph' ? GRAPHS[doc.replace(/^graph\//, '')] : undefined;
  const main = html`${graph ? html`<p>A named graph of every release of this concordance (in <code>concordance.nq</code> and the JSON-LD dumps): ${graph}.</p>` : ''}
${extra ?? ''}
${[...nodes.values()].map(
  (
    n,
  ) => html`<section id="${n.iri.startsWith(ctx.info.base) ? decodeURIComponent(n.iri.slice(ctx.info.base.length)) : n.iri}" aria-label="${ctx.label(n.iri)}">${n.iri !== iri ? html`<h2>${text(ctx.label(n.iri))}</h2><p class="iri"><code>${n.iri}</code></p>` : ''}${statementList(ctx, n, doc)}</section>
`,
)}`;
  return page({
    doc,
    title: `${TITLE[kind] ?? kind}: ${name}`,
    siteTitle: ctx.info.title,
    alternates: true,
    iri,
    main,
    licence: ctx.info.licence,
  });
}
