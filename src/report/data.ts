// Links, clusters and analysis → the report as plain data (report.json); lists capped, numbers rounded, no clock.
import type { Model } from '../model.js';
import type { LinkKind, LinkSet, LinkStatus } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { DATE_TOLERANCE, REVIEW_REASONS, type Analysis, type DateConflict } from '../analyse/index.js';
import { CONFLICTS_HEADER, conflictCells } from './csv-files.js';
import { num, type WorkContext } from './context.js';
import { withheldData } from './withheld.js';

/** Longest list a report shows; the CSV files hold everything. */
export const LIST_LIMIT = 100;

const KINDS: LinkKind[] = ['same', 'part', 'related'];
const STATUSES: LinkStatus[] = ['confirmed', 'proposed', 'rejected', 'candidate'];
const r4 = (x: number | null) => (x === null ? null : Number(num(x)));

export type ReportData = ReturnType<typeof reportData>;

/** Everything report.md and report.json say, as JSON-ready data in a fixed key order. */
export function reportData(
  model: Model,
  linkSet: LinkSet,
  clustering: Clustering,
  analysis: Analysis,
  ctx: WorkContext,
) {
  const partners = model.project.partners;
  const works = new Array<number>(partners.length).fill(0);
  for (const w of model.works) works[w.partner]++;
  const byKind = Object.fromEntries(KINDS.map((k) => [k, Object.fromEntries(STATUSES.map((s) => [s, 0]))])) as Record<
    LinkKind,
    Record<LinkStatus, number>
  >;
  for (const l of linkSet.links) byKind[l.kind][l.status]++;
  const sizes = new Map<number, number>();
  for (const c of clustering.clusters) sizes.set(c.members.length, (sizes.get(c.members.length) ?? 0) + 1);
  const oversized = clustering.clusters.filter((c) => c.oversized);
  let throughThird = 0;
  for (let i = 0; i < clustering.implied.count; i++) throughThird += clustering.implied.throughThird[i];
  const partnerName = (w: number) => partners[model.works[w].partner].name;
  const cells = (c: DateConflict) => conflictCells(c, clustering, ctx, partnerName);
  const reasons = Object.fromEntries(REVIEW_REASONS.map((r, k) => [r, analysis.review.byReason[k]]));
  const listed = Object.fromEntries(REVIEW_REASONS.map((r) => [r, 0]));
  for (let i = 0; i < analysis.review.count; i++) listed[REVIEW_REASONS[analysis.review.reason[i]]]++;
  const key = (p: number) => partners[p].key;
  // bridges joining two would-be clusters first (larger smaller side first), then by link order
  const bridgeOrder = Array.from(clustering.bridges.keys()).sort(
    (x, y) => clustering.bridgeMinSide[y] - clustering.bridgeMinSide[x] || x - y,
  );
  const ag = analysis.agreement;
  return {
    title: model.project.title,
    version: model.project.release.version,
    partners: partners.map((p, i) => ({ key: p.key, name: p.name, works: works[i] })),
    links: { total: linkSet.links.length, byKind },
    clusters: {
      count: clustering.clusters.length,
      works: clustering.clusters.reduce((n, c) => n + c.members.length, 0),
      sizes: Object.fromEntries([...sizes].sort((x, y) => x[0] - y[0]).map(([s, n]) => [String(s), n])),
      oversizeAt: clustering.oversizeAt,
      oversized: oversized
        .slice(0, LIST_LIMIT)
        .map((c) => ({ id: c.id, members: c.members.length, partners: c.partners.map(key) })),
      oversizedTotal: oversized.length,
      bridges: bridgeOrder.slice(0, LIST_LIMIT).map((k) => {
        const l = linkSet.links[clustering.bridges[k]];
        return {
          cluster: clustering.clusters[clustering.clusterOf[l.a]].id,
          work_a: ctx.ref(l.a),
          work_b: ctx.ref(l.b),
          status: l.status,
          score: r4(l.best),
          smallerSide: clustering.bridgeMinSide[k],
        };
      }),
      bridgesTotal: clustering.bridges.length,
      bridgesJoiningClusters: clustering.bridgeMinSide.filter((x) => x >= 2).length,
      impliedPairs: clustering.impliedTotal,
      impliedListed: clustering.implied.count,
      impliedThroughThirdArchive: throughThird,
      retired: clustering.retired.slice(0, LIST_LIMIT),
      retiredTotal: clustering.retired.length,
    },
    overlap: {
      pairs: analysis.overlap.pairs.map((c) => ({
        from: key(c.from),
        to: key(c.to),
        works: c.works,
        matched: c.matched,
        share: r4(c.share),
      })),
      centuries: analysis.overlap.centuries.map((c) => ({
        from: key(c.from),
        to: key(c.to),
        century: c.century,
        works: c.works,
        matched: c.matched,
        share: r4(c.share),
      })),
    },
    conflicts: {
      tolerance: model.project.policy.dateTolerance ?? DATE_TOLERANCE,
      records: analysis.conflicts.length,
      centuriesApart: analysis.conflicts.filter((c) => c.apart >= 100).length,
      listed: analysis.conflicts
        .slice(0, LIST_LIMIT)
        .map((c) => Object.fromEntries(CONFLICTS_HEADER.map((h, i) => [h, cells(c)[i]]))),
    },
    agreement: ag && {
      goldPairs: ag.goldPairs,
      found: ag.found,
      recall: r4(ag.recall),
      goldWorks: ag.goldWorks,
      claimedPairs: ag.claimedPairs,
      correctPairs: ag.correctPairs,
      precision: r4(ag.precision),
      f1: r4(ag.f1),
      missed: ag.missed.slice(0, LIST_LIMIT).map((m) => ({
        work_a: ctx.ref(m.a),
        work_b: ctx.ref(m.b),
        line: m.line,
        evidence: m.link
          ? { kind: m.link.kind, status: m.link.status, score: r4(m.link.best), support: m.link.support }
          : 'no evidence',
      })),
      missedTotal: ag.missed.length,
    },
    withheld: withheldData(model, linkSet, clustering, LIST_LIMIT),
    reviewQueue: {
      total: analysis.review.total,
      listed: analysis.review.count,
      limit: analysis.review.limit,
      byReason: reasons,
      listedByReason: listed,
    },
  };
}
