// Clusters, part links and catalogued dates → the records whose date is far from what their artwork's other records
// give.
import { workRef, type Model } from '../model.js';
import type { Clustering } from '../cluster/types.js';
import type { LinkSet } from '../link/types.js';
import type { DateReading, IntervalReading, YearSpan } from '../dates/index.js';
import type { DateConflict } from './types.js';

/**
 * Default policy `dateTolerance`: dates of one artwork that come within 25 years of each other are not a conflict.
 * Catalogues date by style, workshop phase or a photographer's caption, and two honest datings of one panel often
 * differ by a generation; listing those buries the records that are centuries off. Common practice, no source.
 */
export const DATE_TOLERANCE = 25;

/**
 * Years between two intervals: 0 when they share a year, else the difference between their nearer ends (1465, 1500:
 * 35).
 */
export function yearsApart(a: YearSpan, b: YearSpan): number {
  return Math.max(b.start - a.end, a.start - b.end, 0);
}

/** What a cluster's dated records agree on: the largest group whose dates lie within the tolerance of each other. */
interface Consensus {
  /** Span of the group's dates (smallest start to largest end). */
  span: YearSpan;
  /** The group member whose reading is the most common in the group (first by reference on a tie). */
  anchor: number;
  support: number;
  /** Another group of the same size exists: `span`/`anchor` are the earliest such group. */
  tie: boolean;
}

/**
 * Date conflicts a cataloguer can work through (design, analyse step): one entry per record whose date lies more
 * than `policy.dateTolerance` (default DATE_TOLERANCE) years from the date most of its cluster gives, and per
 * detail whose date lies that far from the work it is part of (confirmed or proposed part links; a detail shares
 * its whole's date). Ranked by how far off (centuries apart first), then cluster, then record.
 *
 * The consensus of a cluster is the largest group of its dated records whose dates lie pairwise within the
 * tolerance (intervals widened by the tolerance share a year; found by one sweep over sorted interval ends, so a
 * cluster of n records costs O(n log n), never pairs). A record outside the group is listed when its interval lies
 * more than the tolerance from the group's span. With two or more largest groups (a tie: 1465 against 1550 in a
 * pair) there is no majority: each record is listed against the other group, the earliest and the latest group
 * standing for the rest. A record is listed once, with the larger distance when it fails both checks.
 */
export function dateConflicts(
  model: Model,
  linkSet: LinkSet,
  clustering: Clustering,
  read: (w: number) => DateReading,
): DateConflict[] {
  const tolerance = model.project.policy.dateTolerance ?? DATE_TOLERANCE;
  const byWork = new Map<number, DateConflict>();
  const consensusOf: (Consensus | undefined)[] = new Array(clustering.clusters.length);
  const keep = (x: DateConflict) => {
    const had = byWork.get(x.work);
    if (had === undefined || x.apart > had.apart) byWork.set(x.work, x);
  };

  clustering.clusters.forEach((c, ci) => {
    const dated: number[] = [];
    for (const w of c.members) if (read(w).kind === 'interval') dated.push(w);
    if (dated.length === 0) return;
    const runs = largestGroups(dated, read, tolerance);
    const first = consensus(dated, read, tolerance, runs.first, runs.tie);
    consensusOf[ci] = first;
    if (dated.length < 2) return;
    const last = runs.tie ? consensus(dated, read, tolerance, runs.last, true) : first;
    for (const w of dated) {
      const r = read(w) as IntervalReading;
      const inFirst = covers(r, runs.first, tolerance);
      if (inFirst && (!runs.tie || covers(r, runs.last, tolerance))) continue;
      const ref = inFirst ? last : first;
      const apart = yearsApart(r, ref.span);
      if (apart > tolerance)
        keep({
          cluster: ci,
          work: w,
          reading: r,
          against: 'cluster',
          anchor: ref.anchor,
          consensus: ref.span,
          support: ref.support,
          dated: dated.length,
          tie: runs.tie,
          apart,
        });
    }
  });

  for (const l of linkSet.links) {
    if (l.kind !== 'part' || l.part === undefined || (l.status !== 'confirmed' && l.status !== 'proposed')) continue;
    const detail = l.part,
      whole = l.part === l.a ? l.b : l.a;
    const r = read(detail);
    if (r.kind !== 'interval') continue;
    const wc = clustering.clusterOf[whole];
    const agreed = wc >= 0 ? consensusOf[wc] : undefined;
    const own = read(whole);
    const ref =
      agreed !== undefined && !agreed.tie
        ? {
            span: agreed.span,
            anchor: agreed.anchor,
            support: agreed.support,
            dated: clusterDated(clustering, wc, read),
          }
        : own.kind === 'interval'
          ? { span: own as YearSpan, anchor: whole, support: 1, dated: 1 }
          : undefined;
    if (ref === undefined) continue;
    const apart = yearsApart(r, ref.span);
    if (apart <= tolerance) continue;
    const dc = clustering.clusterOf[detail];
    keep({
      cluster: dc >= 0 ? dc : wc,
      work: detail,
      reading: r,
      against: 'whole',
      whole,
      anchor: ref.anchor,
      consensus: ref.span,
      support: ref.support,
      dated: ref.dated,
      tie: false,
      apart,
    });
  }

  const refs = new Map<number, string>();
  const ref = (w: number) => refs.get(w) ?? (refs.set(w, workRef(model, w)), refs.get(w)!);
  const clusterOrder = (x: DateConflict) => (x.cluster < 0 ? Infinity : x.cluster);
  return [...byWork.values()].sort(
    (x, y) =>
      y.apart - x.apart ||
      clusterOrder(x) - clusterOrder(y) ||
      (ref(x.work) < ref(y.work) ? -1 : ref(x.work) > ref(y.work) ? 1 : 0),
  );
}

function clusterDated(clustering: Clustering, ci: number, read: (w: number) => DateReading): number {
  let n = 0;
  for (const w of clustering.clusters[ci].members) if (read(w).kind === 'interval') n++;
  return n;
}

/** Whether a reading, its end widened by the tolerance, holds year `at`. */
function covers(r: YearSpan, at: number, tolerance: number): boolean {
  return r.start <= at && at <= r.end + tolerance;
}

/**
 * Sweep over the dated records' intervals with each end widened by the tolerance: two widened intervals share a
 * year exactly when the dates lie within the tolerance of each other, and intervals on a line that pairwise share a
 * year share a common one (Helly's theorem in one dimension), so the deepest point of the sweep is the largest group.
 * Returns the first year of the earliest and of the latest run at the greatest depth, and whether there are two runs.
 */
function largestGroups(
  dated: number[],
  read: (w: number) => DateReading,
  tolerance: number,
): { first: number; last: number; tie: boolean } {
  const n = dated.length;
  const starts = new Float64Array(n),
    ends = new Float64Array(n);
  dated.forEach((w, i) => {
    const r = read(w) as IntervalReading;
    starts[i] = r.start;
    ends[i] = r.end + tolerance + 1; // first year no longer covered
  });
  starts.sort();
  ends.sort();
  let depth = 0,
    best = 0,
    first = 0,
    last = 0,
    runs = 0,
    i = 0,
    j = 0,
    atBest = false;
  while (i < n) {
    if (ends[j] <= starts[i]) {
      depth--;
      j++;
      atBest = false;
      continue;
    }
    const at = starts[i];
    depth++;
    i++;
    if (depth > best) {
      best = depth;
      first = last = at;
      runs = 1;
      atBest = true;
    } else if (depth === best && !atBest) {
      last = at;
      runs++;
      atBest = true;
    }
  }
  return { first, last, tie: runs > 1 };
}

/** The group holding year `at` (widened as in largestGroups): its span, its most common reading, its size. */
function consensus(
  dated: number[],
  read: (w: number) => DateReading,
  tolerance: number,
  at: number,
  tie: boolean,
): Consensus {
  let start = Infinity,
    end = -Infinity,
    support = 0;
  const counts = new Map<string, { n: number; w: number }>();
  for (const w of dated) {
    const r = read(w) as IntervalReading;
    if (!covers(r, at, tolerance)) continue;
    support++;
    start = Math.min(start, r.start);
    end = Math.max(end, r.end);
    const text = r.start === r.end ? String(r.start) : `${r.start}/${r.end}`;
    const c = counts.get(text);
    if (c === undefined) counts.set(text, { n: 1, w });
    else c.n++;
  }
  let anchor = -1,
    most = 0;
  for (const { n, w } of counts.values())
    if (n > most) {
      most = n;
      anchor = w;
    }
  return { span: { start, end }, anchor, support, tie };
}
