// A cluster's statements (with the provenance and dataset statements they name) → its citation in text, Markdown and
// CSL-JSON.
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { Reader, citedRelease } from '../cite/gather.js';
import { KIND_OF, STATUS_OF, refOfWorkIri } from '../history/names.js';
import { iri } from '../namespaces.js';
import { V, Node } from './context.js';
import { citationText, citationMarkdown } from '../cite/text.js';
import { citationCsl } from '../cite/csl.js';
import type { Citation, CitedClaim, CitedMatch, CitedRelease, CitedRun, CitedWork } from '../cite/types.js';

const REVIEW = iri('cx', 'CuratorReview'),
  MATCH_RUN = iri('cx', 'MatchRun');
const P = {
  qualifiedAssociation: iri('prov', 'qualifiedAssociation'),
  hadPlan: iri('prov', 'hadPlan'),
  parameter: iri('cx', 'parameter'),
  parameterName: iri('cx', 'parameterName'),
  parameterValue: iri('cx', 'parameterValue'),
};
import type { SiteContext } from './context.js';

const cache = new WeakMap<SiteContext, Quad[]>();
/**
 * The quads of dataset.ttl a citation reads: the dataset, its publisher, the partner datasets (not the linksets or
 * files).
 */
function releaseQuads(ctx: SiteContext): Quad[] {
  let q = cache.get(ctx);
  if (!q) {
    const keep = new Set([
      ctx.info.dataset,
      ctx.info.publisher?.iri,
      ...[...ctx.info.partners.values()].map((p) => p.iri),
    ]);
    q = (ctx.info.quads as Quad[]).filter((x) => keep.has(x.subject.value));
    cache.set(ctx, q);
  }
  return q;
}

/** Citation formats shown on a cluster page, each with the label of its copy button (one row per format). */
export const CITATION_FORMATS: readonly { id: string; label: string; render: (c: Citation) => string }[] = [
  { id: 'text', label: 'Plain text', render: citationText },
  { id: 'markdown', label: 'Markdown', render: citationMarkdown },
  { id: 'csl', label: 'CSL-JSON', render: (c) => JSON.stringify(citationCsl(c)) + '\n' },
];

const STATUS_ORDER: Record<string, number> = { confirmed: 0, proposed: 1, rejected: 2 };

/**
 * The citation `concordat cite <cluster IRI>` would print for this cluster, built from the statements at hand (the
 * unit, the runs, reviews and curators its links name, and dataset.ttl) instead of a whole-release store: the same
 * reading as src/cite/gather.ts (PROV-O §3.1 wasDerivedFrom, wasGeneratedBy, wasAttributedTo), without a quad store
 * per cluster (at a million works that store cost more than all the rest of the site).
 */
export function clusterCitation(
  ctx: SiteContext,
  clusterIri: string,
  nodes: ReadonlyMap<string, Node>,
  links: readonly string[],
): Citation | null {
  if (links.length === 0) return null;
  const release = citedReleaseOf(ctx);
  if (!release) return null;
  const node = (x: string): Node | undefined => nodes.get(x) ?? ctx.prov.get(x);
  const sorted = (n: Node | undefined, p: string) => (n ? [...new Set(n.all(p))].sort() : []);
  const one = (n: Node | undefined, p: string) => sorted(n, p)[0];
  const is = (x: string, t: string) => !!node(x)?.all(V.type).includes(t);
  const work = (w: string): CitedWork => {
    const n = node(w);
    const partner = one(n, V.partner) ?? '';
    const p = ctx.info.partners.get(partner);
    return {
      iri: w,
      ref: refOfWorkIri(w, partner, p?.uriSpace),
      partner,
      partnerName: p?.name,
      title: one(n, V.title),
      date: one(n, V.dateAsCatalogued),
      page: one(n, V.page),
    };
  };
  const run = (x: string): CitedRun => {
    const n = node(x);
    const agent = node(one(n, V.associatedWith) ?? '');
    const parameters: CitedRun['parameters'] = [];
    for (const assoc of sorted(n, P.qualifiedAssociation))
      for (const plan of sorted(node(assoc), P.hadPlan))
        for (const par of sorted(node(plan), P.parameter))
          parameters.push({
            name: one(node(par), P.parameterName) ?? par,
            value: one(node(par), P.parameterValue) ?? '',
          });
    parameters.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
    return {
      iri: x,
      id: decodeURIComponent(x.replace(/^.*\//, '')),
      software: one(agent, V.label),
      version: one(agent, V.versionInfo),
      started: one(n, V.startedAt),
      parameters,
    };
  };
  const claims: CitedClaim[] = links.map((link) => {
    const n = node(link);
    const matches: CitedMatch[] = sorted(n, V.derivedFrom).map((m) => {
      const mn = node(m);
      return {
        iri: m,
        source: one(mn, V.sourceImage) ?? '',
        target: one(mn, V.targetImage) ?? '',
        score: Number(one(mn, V.score)),
        overlap: Number(one(mn, V.overlap)),
        run: one(mn, V.generatedBy),
      };
    });
    const generators = sorted(n, V.generatedBy);
    const reviewIri = generators.find((g) => is(g, REVIEW));
    const runIris = [
      ...new Set([
        ...generators.filter((g) => is(g, MATCH_RUN)),
        ...matches.map((m) => m.run).filter((x): x is string => !!x),
      ]),
    ].sort();
    const rv = reviewIri ? node(reviewIri) : undefined;
    const curator = one(rv, V.associatedWith) ?? '';
    const score = one(n, V.score);
    const confidence = one(n, V.confidence);
    return {
      link,
      subject: work(one(n, V.subjectWork)!),
      object: work(one(n, V.objectWork)!),
      relation: one(n, V.relation),
      kind: KIND_OF[one(n, V.kind) ?? ''],
      status: STATUS_OF[one(n, V.status) ?? ''],
      score: score === undefined ? undefined : Number(score),
      confidence: confidence === undefined ? undefined : Number(confidence),
      support: Number(one(n, V.support) ?? 0),
      matches,
      runs: runIris.map(run),
      review: reviewIri
        ? {
            iri: reviewIri,
            curator,
            curatorName: curator ? one(node(curator), V.label) : undefined,
            date: one(rv, V.endedAt) ?? one(rv, V.date),
            verdict: one(rv, V.verdict),
            note: one(rv, V.note),
          }
        : undefined,
    };
  });
  claims.sort(
    (x, y) =>
      STATUS_ORDER[x.status] - STATUS_ORDER[y.status] ||
      (y.score ?? -1) - (x.score ?? -1) ||
      (x.link < y.link ? -1 : 1),
  );
  const conflicts = sorted(node(clusterIri), V.hasDateConflict).map((x) => ({
    iri: x,
    severity: one(node(x), V.severity),
    a: work(one(node(x), V.workA) ?? ''),
    b: work(one(node(x), V.workB) ?? ''),
  }));
  return {
    query: clusterIri,
    target: { kind: 'cluster', iri: clusterIri },
    release,
    claims,
    conflicts,
    brief: true,
    quads: [],
  };
}

const releases = new WeakMap<SiteContext, CitedRelease | undefined>();
/** The release as src/cite/gather.ts citedRelease reads it, from dataset.ttl once per site. */
function citedReleaseOf(ctx: SiteContext): CitedRelease | undefined {
  if (!releases.has(ctx)) {
    const store = new N3.Store();
    store.addQuads(releaseQuads(ctx));
    releases.set(ctx, citedRelease(new Reader(store)));
  }
  return releases.get(ctx);
}
