// Link stage: image matches + curator decisions + policy → work-to-work links (design, pipeline step 2).
import type { Model, Policy } from '../model.js';
import type { Problem } from '../errors.js';
import { refRank } from '../model.js';
import { linkColumns, type LinkColumns, type LinkValues } from './columns.js';
import { pairKey, type Link, type LinkKind, type LinkSet, type LinkStatus } from './types.js';
import { weighEvidence, type WeighedEvidence } from '../evidence/index.js';
import { sameConfidence, triangles } from './confidence.js';
import { countingSort } from '../util/sort.js';

/** Per-link values the confidence pass needs beyond the link's own columns. */
interface Scratch {
  /** Best reliable, discriminating score (0: none). */
  discBest: Float64Array;
  /** min(distinct discriminating photos of a, of b). */
  photos: Int32Array;
}

/**
 * Which end of a partial match is the detail. Contract extension (documented in DEVELOPERS.md): for a partial match,
 * matchers write the detail photo as `image_a`; a curator's `part` decision (work_a part of work_b) overrides.
 */
function detailWork(model: Model, row: number): number {
  return model.images.work[model.matches.a[row]];
}

/**
 * Status and kind from the machine evidence alone (policy: proposeAt, autoConfirmAt, partOverlapBelow), given the
 * link's confidence.
 */
export function machineVerdict(
  confidence: number,
  maxOverlap: number,
  reliable: number,
  policy: Policy,
): { kind: LinkKind; status: LinkStatus } {
  const kind: LinkKind = maxOverlap < policy.partOverlapBelow ? 'part' : 'same';
  if (reliable === 0) return { kind, status: 'candidate' };
  if (policy.autoConfirmAt !== null && confidence >= policy.autoConfirmAt) return { kind, status: 'confirmed' };
  return { kind, status: confidence >= policy.proposeAt ? 'proposed' : 'candidate' };
}

/**
 * Aggregates image matches into work pairs (rows grouped by two stable counting sorts over work ranks, so no per-pair
 * objects are built while reading): support, best and mean score, coverage, same or part, status.
 * Curator decisions always win: `same` confirms, `part` and `related` set the kind (confirmed), `distinct` keeps a
 * rejected link so it is never proposed again. Matches below `minOverlap` stay evidence but propose nothing.
 */
export function link(
  model: Model,
  policy: Policy = model.project.policy,
  evidence: WeighedEvidence = weighEvidence(model, policy),
): LinkSet {
  const { matches, images } = model;
  const rank = refRank(model, Array.from(model.works.keys()));
  const byRank = new Int32Array(model.works.length);
  rank.forEach((r, w) => (byRank[r] = w));
  // each evidence row's pair as (lower rank, higher rank); rows grouped by pair in reference order, input order kept
  const lo = new Int32Array(matches.count);
  const hi = new Int32Array(matches.count);
  for (let i = 0; i < matches.count; i++) {
    const ra = rank[images.work[matches.a[i]]],
      rb = rank[images.work[matches.b[i]]];
    lo[i] = ra < rb ? ra : rb;
    hi[i] = ra < rb ? rb : ra;
  }
  const rows = countingSort(countingSort(identity(matches.count), hi, model.works.length), lo, model.works.length);
  // group boundaries: rows[starts[g]] … rows[starts[g + 1] - 1] share one pair
  const starts = new Int32Array(rows.length + 1);
  let groups = 0;
  for (let k = 0; k < rows.length; k++) {
    if (k === 0 || lo[rows[k]] !== lo[rows[k - 1]] || hi[rows[k]] !== hi[rows[k - 1]]) starts[groups++] = k;
  }
  starts[groups] = rows.length;
  const groupKey = (g: number) => pairKey(lo[rows[starts[g]]], hi[rows[starts[g]]]);

  // decisions by pair (later rows win); pairs decided without evidence become links of their own, in the same order
  const decided = new Map<number, number>();
  model.decisions.forEach((d, i) => decided.set(pairKey(rank[d.a], rank[d.b]), i));
  const evidenced = new Set<number>();
  for (let g = 0; g < groups; g++) if (decided.has(groupKey(g))) evidenced.add(groupKey(g));
  const decisionOnly = [...decided.keys()].filter((k) => !evidenced.has(k)).sort((p, q) => p - q);

  const columns = linkColumns(
    groups + decisionOnly.length,
    Int32Array.from(model.works, (w) => w.imageCount),
  );
  const scratch: Scratch = { discBest: new Float64Array(columns.size), photos: new Int32Array(columns.size) };
  const make = (a: number, b: number, start: number, count: number, decision: number | undefined) =>
    makeLink(model, policy, evidence.setAside, a, b, matchRows, start, count, decision, scratch, n);
  const matchRows = new Int32Array(matches.count);
  let kept = 0;
  let n = 0;
  const duplicates: { row: number; first: number }[] = [];
  let d = 0;
  const emitDecisionOnly = (upTo: number) => {
    for (; d < decisionOnly.length && decisionOnly[d] < upTo; d++) {
      const key = decisionOnly[d];
      columns.set(n, make(byRank[Math.floor(key / PAIR)], byRank[key % PAIR], kept, 0, decided.get(key)));
      n++;
    }
  };
  for (let g = 0; g < groups; g++) {
    const key = groupKey(g);
    emitDecisionOnly(key);
    const from = kept;
    for (let k = starts[g]; k < starts[g + 1]; k++) {
      const i = rows[k];
      const repeat = findRepeat(model, matchRows, from, kept, i);
      if (repeat === -1) matchRows[kept++] = i;
      // one run reporting one image pair twice is one piece of evidence
      else duplicates.push({ row: i, first: repeat });
    }
    const first = rows[starts[g]];
    columns.set(n, make(byRank[lo[first]], byRank[hi[first]], from, kept - from, decided.get(key)));
    n++;
  }
  emitDecisionOnly(Infinity);
  duplicates.sort((p, q) => p.row - q.row);
  settle(model, policy, columns, scratch);
  const links = columns.records();
  return {
    links,
    byPair: new PairIndex(links),
    duplicates,
    matchRows: matchRows.slice(0, kept),
    evidence,
    hold: holder(columns),
  };
}

/**
 * `LinkSet.hold` over the columns, made outside `link` on purpose: a closure made inside it would share the scope V8
 * keeps for `link`'s other closures, holding the link stage's scratch arrays (row order, pair columns, the untrimmed
 * row list: ≈ 40 bytes per evidence row) for as long as the link set lives.
 */
function holder(columns: LinkColumns): LinkSet['hold'] {
  return (i, reason) => columns.hold(i, reason);
}

/**
 * The confidence pass (src/evidence/README.md, "Link confidence"): third works strongly linked to both ends raise a
 * machine same link's confidence; status follows the confidence; a link whose evidence reached proposeAt but whose
 * confidence does not is held back, saying why. Curator decisions keep their status.
 */
function settle(model: Model, policy: Policy, c: LinkColumns, scratch: Scratch): void {
  const SAME = 0; // index of 'same' in the kind column
  const strong = new Uint8Array(c.size),
    ask = new Uint8Array(c.size);
  for (let i = 0; i < c.size; i++) {
    const curatorSame = c.decision[i] >= 0 && model.decisions[c.decision[i]].verdict === 'same';
    if (c.kind[i] !== SAME) continue;
    if (
      curatorSame ||
      (c.decision[i] < 0 && sameConfidence(scratch.discBest[i], scratch.photos[i] - 1) >= policy.proposeAt)
    )
      strong[i] = 1;
    if (scratch.discBest[i] > 0) ask[i] = 1;
  }
  const t = triangles(model.works.length, c.a, c.b, strong, ask);
  for (let i = 0; i < c.size; i++) {
    if (scratch.discBest[i] === 0) continue;
    const confidence =
      c.kind[i] === SAME ? sameConfidence(scratch.discBest[i], scratch.photos[i] - 1 + t[i]) : scratch.discBest[i];
    c.confidence[i] = confidence;
    if (c.decision[i] >= 0) continue;
    c.setStatus(i, machineVerdict(confidence, c.kind[i] === SAME ? 1 : 0, 1, policy).status);
  }
  for (let i = 0; i < c.size; i++)
    if (c.decision[i] < 0 && c.reliableSupport[i] > 0 && c.best[i] >= policy.proposeAt && c.statusOf(i) === 'candidate')
      c.hold(i, scratch.discBest[i] >= policy.proposeAt ? 'look-alike' : 'indiscriminate');
}

/** Work pair → link index through a sorted key array and binary search (16 bytes a link; a Map took ~60). */
class PairIndex {
  private readonly keys: Float64Array;
  private readonly index: Int32Array;

  constructor(links: readonly Link[]) {
    const keys = Float64Array.from(links, (l) => pairKey(l.a, l.b));
    const order = Int32Array.from(keys.keys()).sort((x, y) => keys[x] - keys[y]);
    this.keys = Float64Array.from(order, (i) => keys[i]);
    this.index = order;
  }

  get(key: number): number | undefined {
    let lo = 0,
      hi = this.keys.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >>> 1;
      const k = this.keys[mid];
      if (k === key) return this.index[mid];
      if (k < key) lo = mid + 1;
      else hi = mid - 1;
    }
    return undefined;
  }
}

/** Pair keys of ranks: exact while ranks stay below 2^26 (see pairKey). */
const PAIR = 67108864;

function identity(n: number): Int32Array {
  const out = new Int32Array(n);
  for (let i = 0; i < n; i++) out[i] = i;
  return out;
}

/** The earlier kept row (among matchRows[from, to)) reporting the same image pair in the same run as row `i`, or -1. */
function findRepeat(model: Model, matchRows: Int32Array, from: number, to: number, i: number): number {
  const m = model.matches;
  const lo = Math.min(m.a[i], m.b[i]),
    hi = Math.max(m.a[i], m.b[i]);
  for (let k = from; k < to; k++) {
    const r = matchRows[k];
    if (m.run[r] === m.run[i] && Math.min(m.a[r], m.b[r]) === lo && Math.max(m.a[r], m.b[r]) === hi) return r;
  }
  return -1;
}

/** One link from its evidence rows (matchRows[start, start + count)) and the deciding row, if any. */
function makeLink(
  model: Model,
  policy: Policy,
  setAside: Uint8Array,
  a: number,
  b: number,
  matchRows: Int32Array,
  start: number,
  count: number,
  decision: number | undefined,
  scratch: Scratch,
  n: number,
): LinkValues {
  const { matches, images } = model;
  let sum = 0,
    reliable = 0,
    aside = 0;
  // [0]: every reliable row; [1]: reliable rows of discriminating images only
  const best = [0, 0],
    maxOverlap = [0, 0],
    votesA = [0, 0],
    votesB = [0, 0],
    used = [0, 0];
  const imgsA = new Set<number>(),
    imgsB = new Set<number>(),
    runs = new Set<number>();
  const discA = new Set<number>(),
    discB = new Set<number>();
  for (let k = start; k < start + count; k++) {
    const r = matchRows[k];
    const ia = matches.a[r],
      ib = matches.b[r];
    for (const img of [ia, ib]) (images.work[img] === a ? imgsA : imgsB).add(img);
    runs.add(matches.run[r]);
    if (setAside[r]) aside++;
    if (matches.overlap[r] < policy.minOverlap) continue;
    reliable++;
    sum += matches.score[r];
    for (const j of setAside[r] ? [0] : [0, 1]) {
      used[j]++;
      if (matches.score[r] > best[j]) best[j] = matches.score[r];
      if (matches.overlap[r] > maxOverlap[j]) maxOverlap[j] = matches.overlap[r];
      if (matches.overlap[r] < policy.partOverlapBelow) {
        if (detailWork(model, r) === a) votesA[j]++;
        else votesB[j]++;
      }
    }
    if (!setAside[r]) for (const img of [ia, ib]) (images.work[img] === a ? discA : discB).add(img);
  }
  // kind and direction from the discriminating rows when there are any
  const j = used[1] > 0 ? 1 : 0;
  scratch.discBest[n] = best[1];
  scratch.photos[n] = Math.min(discA.size, discB.size);
  // a pair known only from a decision has no evidence to call it partial: a `distinct` verdict rejects `same`
  let { kind, status } = count
    ? machineVerdict(best[1], maxOverlap[j], used[1], policy)
    : { kind: 'same' as LinkKind, status: 'candidate' as LinkStatus };
  let part: number | undefined;
  if (kind === 'part') part = votesA[j] >= votesB[j] ? a : b;
  if (decision !== undefined) {
    const d = model.decisions[decision];
    if (d.verdict === 'distinct') status = 'rejected';
    else {
      status = 'confirmed';
      kind = d.verdict;
      part = d.verdict === 'part' ? d.a : undefined;
    }
  }
  return {
    a,
    b,
    kind,
    status,
    part,
    support: count,
    reliableSupport: reliable,
    best: best[0],
    mean: reliable ? sum / reliable : 0,
    maxOverlap: maxOverlap[j],
    confidence: 0,
    setAside: aside,
    held: undefined,
    coverageA: imgsA.size / model.works[a].imageCount,
    coverageB: imgsB.size / model.works[b].imageCount,
    runs: [...runs].sort((p, q) => p - q),
    decision,
    matchStart: start,
  };
}

/** The evidence rows behind a link, in input order (a view into the set's shared array). */
export function matchesOf(set: Pick<LinkSet, 'matchRows'>, l: Link): Int32Array {
  return set.matchRows.subarray(l.matchStart, l.matchStart + l.support);
}

/** Is this link a published claim (a triple in the claims graph)? */
export const isClaim = (l: Link) => l.status === 'confirmed' || l.status === 'proposed';

/** Repeated evidence rows as warnings naming both lines (for `check`). */
export function duplicateWarnings(model: Model, duplicates: LinkSet['duplicates']): Problem[] {
  const m = model.matches;
  return duplicates.map(({ row, first }) => ({
    file: model.evidenceFiles[m.file[row]],
    line: m.line[row],
    field: 'image_b',
    message: `this image pair and run were already listed${m.file[first] === m.file[row] ? '' : ` in ${model.evidenceFiles[m.file[first]]}`} on line ${m.line[first]}`,
    hint: 'counted once; drop the repeated row',
  }));
}
