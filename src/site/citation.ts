// A cluster's statements (with the provenance and dataset statements they name) → its citation in text, Markdown and CSL-JSON.
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { Reader, citedClaim, citedRelease } from '../cite/gather.js';
import { citationText, citationMarkdown } from '../cite/text.js';
import { citationCsl } from '../cite/csl.js';
import type { Citation } from '../cite/types.js';
import type { Statement, Term } from './nquads.js';
import type { SiteContext } from './context.js';

const { namedNode, literal, blankNode, quad } = N3.DataFactory;
const term = (o: Term) => (o.kind === 'iri' ? namedNode(o.value) : o.kind === 'bnode' ? blankNode(o.value) : literal(o.value, o.language ?? (o.datatype ? namedNode(o.datatype) : undefined)));
const toQuad = (st: Statement) => quad(namedNode(st.s), namedNode(st.p), term(st.o));

const cache = new WeakMap<SiteContext, Quad[]>();
/** The quads of dataset.ttl a citation reads: the dataset, its publisher, the partner datasets (not the linksets or files). */
function releaseQuads(ctx: SiteContext): Quad[] {
  let q = cache.get(ctx);
  if (!q) {
    const keep = new Set([ctx.info.dataset, ctx.info.publisher?.iri, ...[...ctx.info.partners.values()].map((p) => p.iri)]);
    q = (ctx.info.quads as Quad[]).filter((x) => keep.has(x.subject.value));
    cache.set(ctx, q);
  }
  return q;
}

/** Citation formats shown on a cluster page, each with the label of its copy button (one row per format). */
export const CITATION_FORMATS: readonly { id: string; label: string; render: (c: Citation) => string }[] = [
  { id: 'text', label: 'Plain text', render: citationText },
  { id: 'markdown', label: 'Markdown', render: citationMarkdown },
  { id: 'csl', label: 'CSL-JSON', render: (c) => JSON.stringify(citationCsl(c), null, 2) + '\n' },
];

const STATUS_ORDER: Record<string, number> = { confirmed: 0, proposed: 1, rejected: 2 };

/**
 * The citation `concordat cite <cluster IRI>` would print for this cluster, built from the statements at hand (the
 * unit, the runs, reviews and curators its links name, and dataset.ttl) instead of a whole-release store.
 */
export function clusterCitation(ctx: SiteContext, clusterIri: string, statements: readonly Statement[], links: readonly string[]): Citation | null {
  if (links.length === 0) return null;
  const store = new N3.Store();
  store.addQuads(statements.map(toQuad));
  store.addQuads(releaseQuads(ctx));
  const seen = new Set<string>();
  const want = (x: string) => {
    if (seen.has(x)) return;
    seen.add(x);
    const n = ctx.prov.get(x);
    if (!n) return;
    for (const sts of n.by.values()) for (const st of sts) { store.addQuad(toQuad(st)); if (st.o.kind === 'iri') want(st.o.value); }
  };
  for (const st of statements) if (st.o.kind === 'iri' && !st.o.value.startsWith(ctx.info.base + 'work/')) want(st.o.value);
  const r = new Reader(store);
  const release = citedRelease(r);
  if (!release) return null;
  const claims = links.map((l) => citedClaim(r, l));
  claims.sort((x, y) => STATUS_ORDER[x.status] - STATUS_ORDER[y.status] || (y.score ?? -1) - (x.score ?? -1) || (x.link < y.link ? -1 : 1));
  return { query: clusterIri, target: { kind: 'cluster', iri: clusterIri }, release, claims, quads: [] };
}
