// Link stage: image matches + curator decisions + policy → work-to-work links (design, pipeline step 2).
import type { Model, Policy } from '../model.js';
import type { Problem } from '../errors.js';
import { cachedWorkRef } from '../model.js';
import { pairKey, type Link, type LinkKind, type LinkSet, type LinkStatus } from './types.js';

interface Acc {
  a: number;
  b: number;
  rows: number[];
  decision?: number;
}

/**
 * Which end of a partial match is the detail. Contract extension (documented in DEVELOPERS.md): for a partial match,
 * matchers write the detail photo as `image_a`; a curator's `part` decision (work_a part of work_b) overrides.
 */
function detailWork(model: Model, row: number): number {
  return model.images.work[model.matches.a[row]];
}

/** Status and kind from the machine evidence alone (policy: proposeAt, autoConfirmAt, partOverlapBelow). */
export function machineVerdict(best: number, maxOverlap: number, reliable: number, policy: Policy): { kind: LinkKind; status: LinkStatus } {
  const kind: LinkKind = maxOverlap < policy.partOverlapBelow ? 'part' : 'same';
  if (reliable === 0) return { kind, status: 'candidate' };
  if (policy.autoConfirmAt !== null && best >= policy.autoConfirmAt) return { kind, status: 'confirmed' };
  return { kind, status: best >= policy.proposeAt ? 'proposed' : 'candidate' };
}

/**
 * Aggregates image matches into work pairs: support, best and mean score, coverage, same or part, status.
 * Curator decisions always win: `same` confirms, `part` and `related` set the kind (confirmed), `distinct` keeps a
 * rejected link so it is never proposed again. Matches below `minOverlap` stay evidence but propose nothing.
 */
export function link(model: Model, policy: Policy = model.project.policy): LinkSet {
  const { matches, images } = model;
  const acc = new Map<number, Acc>();
  const get = (a: number, b: number): Acc => {
    const k = pairKey(a, b);
    let x = acc.get(k);
    if (!x) acc.set(k, (x = { a, b, rows: [] }));
    return x;
  };
  const duplicates: { row: number; first: number }[] = [];
  for (let i = 0; i < matches.count; i++) {
    const rows = get(images.work[matches.a[i]], images.work[matches.b[i]]).rows;
    const lo = Math.min(matches.a[i], matches.b[i]), hi = Math.max(matches.a[i], matches.b[i]);
    const first = rows.find((r) => matches.run[r] === matches.run[i] && Math.min(matches.a[r], matches.b[r]) === lo && Math.max(matches.a[r], matches.b[r]) === hi);
    if (first === undefined) rows.push(i);
    else duplicates.push({ row: i, first }); // one run reporting one image pair twice is one piece of evidence
  }
  model.decisions.forEach((d, i) => (get(d.a, d.b).decision = i)); // later rows win

  const ref = cachedWorkRef(model);
  const links: Link[] = [];
  for (const x of acc.values()) {
    const [a, b] = ref(x.a) < ref(x.b) ? [x.a, x.b] : [x.b, x.a];
    let best = 0, sum = 0, reliable = 0, maxOverlap = 0;
    const imgsA = new Set<number>(), imgsB = new Set<number>(), runs = new Set<number>();
    const detailVotes = new Map<number, number>();
    for (const r of x.rows) {
      const ia = matches.a[r], ib = matches.b[r];
      for (const img of [ia, ib]) (images.work[img] === a ? imgsA : imgsB).add(img);
      runs.add(matches.run[r]);
      if (matches.overlap[r] < policy.minOverlap) continue;
      reliable++;
      sum += matches.score[r];
      if (matches.score[r] > best) best = matches.score[r];
      if (matches.overlap[r] > maxOverlap) maxOverlap = matches.overlap[r];
      if (matches.overlap[r] < policy.partOverlapBelow) {
        const d = detailWork(model, r);
        detailVotes.set(d, (detailVotes.get(d) ?? 0) + 1);
      }
    }
    // a pair known only from a decision has no evidence to call it partial: a `distinct` verdict rejects `same`
    let { kind, status } = x.rows.length ? machineVerdict(best, maxOverlap, reliable, policy) : { kind: 'same' as LinkKind, status: 'candidate' as LinkStatus };
    let part: number | undefined;
    if (kind === 'part') part = (detailVotes.get(a) ?? 0) >= (detailVotes.get(b) ?? 0) ? a : b;
    if (x.decision !== undefined) {
      const d = model.decisions[x.decision];
      if (d.verdict === 'distinct') status = 'rejected';
      else {
        status = 'confirmed';
        kind = d.verdict;
        part = d.verdict === 'part' ? d.a : undefined;
      }
    }
    links.push({
      a, b, kind, status, part,
      support: x.rows.length,
      reliableSupport: reliable,
      best,
      mean: reliable ? sum / reliable : 0,
      maxOverlap,
      coverageA: imgsA.size / model.works[a].imageCount,
      coverageB: imgsB.size / model.works[b].imageCount,
      runs: [...runs].sort((p, q) => p - q),
      decision: x.decision,
      matches: Int32Array.from(x.rows),
    });
  }
  links.sort((p, q) => cmp(ref(p.a), ref(q.a)) || cmp(ref(p.b), ref(q.b)));
  const byPair = new Map<number, number>();
  links.forEach((l, i) => byPair.set(pairKey(l.a, l.b), i));
  return { links, byPair, duplicates };
}

const cmp = (x: string, y: string) => (x < y ? -1 : x > y ? 1 : 0);

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
