// The link stage (typed arrays, counting sorts) against a plain reference written the obvious way (a Map of work
// pairs, rows in input order, then a sort by references): random models from fast-check must give the same links,
// the same evidence rows behind each, and the same repeated rows.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import fc from 'fast-check';
import { link, machineVerdict, matchesOf } from '../src/link/index.js';
import { sameConfidence, MAX_TRIANGLES } from '../src/link/confidence.js';
import { weighEvidence } from '../src/evidence/index.js';
import { workRef, type Model, type Verdict } from '../src/model.js';
import type { Link } from '../src/link/types.js';
import { tinyModel } from './helpers/model.js';

/** The reference: group rows per unordered work pair with a Map, decide, sort by (ref a, ref b). */
function plainLinks(model: Model) {
  const { matches, images } = model;
  const policy = model.project.policy;
  const groups = new Map<string, { a: number; b: number; rows: number[]; decision?: number }>();
  const get = (a: number, b: number) => {
    const k = a < b ? `${a},${b}` : `${b},${a}`;
    if (!groups.has(k)) groups.set(k, { a, b, rows: [] });
    return groups.get(k)!;
  };
  const duplicates: { row: number; first: number }[] = [];
  for (let i = 0; i < matches.count; i++) {
    const rows = get(images.work[matches.a[i]], images.work[matches.b[i]]).rows;
    const same = (r: number) =>
      matches.run[r] === matches.run[i] &&
      Math.min(matches.a[r], matches.b[r]) === Math.min(matches.a[i], matches.b[i]) &&
      Math.max(matches.a[r], matches.b[r]) === Math.max(matches.a[i], matches.b[i]);
    const first = rows.find(same);
    if (first === undefined) rows.push(i);
    else duplicates.push({ row: i, first });
  }
  model.decisions.forEach((d, i) => (get(d.a, d.b).decision = i));
  const ref = (w: number) => workRef(model, w);
  const out = [...groups.values()]
    .map((g) => {
      const [a, b] = ref(g.a) < ref(g.b) ? [g.a, g.b] : [g.b, g.a];
      let best = 0,
        sum = 0,
        reliable = 0,
        maxOverlap = 0,
        votesA = 0,
        votesB = 0;
      const imgsA = new Set<number>(),
        imgsB = new Set<number>(),
        runs = new Set<number>();
      const photosA = new Set<number>(),
        photosB = new Set<number>();
      for (const r of g.rows) {
        for (const img of [matches.a[r], matches.b[r]]) (images.work[img] === a ? imgsA : imgsB).add(img);
        runs.add(matches.run[r]);
        if (matches.overlap[r] < policy.minOverlap) continue;
        for (const img of [matches.a[r], matches.b[r]]) (images.work[img] === a ? photosA : photosB).add(img);
        reliable++;
        sum += matches.score[r];
        best = Math.max(best, matches.score[r]);
        maxOverlap = Math.max(maxOverlap, matches.overlap[r]);
        if (matches.overlap[r] < policy.partOverlapBelow) {
          if (images.work[matches.a[r]] === a) votesA++;
          else votesB++;
        }
      }
      const photos = Math.min(photosA.size, photosB.size);
      return { g, a, b, best, sum, reliable, maxOverlap, votesA, votesB, imgsA, imgsB, runs, photos };
    })
    .map(({ g, a, b, best, sum, reliable, maxOverlap, votesA, votesB, imgsA, imgsB, runs, photos }, _, all) => {
      // confidence: best × (1 − ⅓ × ½^agreement), agreement = further photos + third works strongly linked to both
      const strong = (x: (typeof all)[number]) => {
        const d = x.g.decision === undefined ? undefined : model.decisions[x.g.decision].verdict;
        return (
          d === 'same' ||
          (d === undefined &&
            x.reliable > 0 &&
            x.maxOverlap >= policy.partOverlapBelow &&
            sameConfidence(x.best, x.photos - 1) >= policy.proposeAt)
        );
      };
      const nb = (w: number) =>
        new Set(all.filter((x) => strong(x) && (x.a === w || x.b === w)).map((x) => (x.a === w ? x.b : x.a)));
      const na = nb(a),
        nbb = nb(b);
      const third = Math.min(MAX_TRIANGLES, [...na].filter((z) => z !== b && nbb.has(z)).length);
      const isPart = maxOverlap < policy.partOverlapBelow;
      const confidence = reliable === 0 ? 0 : isPart ? best : sameConfidence(best, photos - 1 + third);
      let { kind, status } = g.rows.length
        ? machineVerdict(confidence, maxOverlap, reliable, policy)
        : { kind: 'same' as const, status: 'candidate' as const };
      let part: number | undefined = kind === 'part' ? (votesA >= votesB ? a : b) : undefined;
      if (g.decision !== undefined) {
        const d = model.decisions[g.decision];
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
        support: g.rows.length,
        reliableSupport: reliable,
        best,
        mean: reliable ? sum / reliable : 0,
        maxOverlap,
        coverageA: imgsA.size / model.works[a].imageCount,
        coverageB: imgsB.size / model.works[b].imageCount,
        runs: [...runs].sort((p, q) => p - q),
        decision: g.decision,
        matches: g.rows,
      };
    });
  out.sort((p, q) =>
    ref(p.a) < ref(q.a) ? -1 : ref(p.a) > ref(q.a) ? 1 : ref(p.b) < ref(q.b) ? -1 : ref(p.b) > ref(q.b) ? 1 : 0,
  );
  return { links: out, duplicates };
}

const WORKS = ['a:1', 'a:2', 'a:10', 'b:1', 'b:x', 'b:X', 'c:1', 'c:01', 'c:9'];
const work = fc.integer({ min: 0, max: WORKS.length - 1 });
const pair = fc.tuple(work, work).filter(([x, y]) => x !== y);
const spec = fc.record({
  matches: fc.array(
    fc.record({
      pair,
      ka: fc.integer({ min: 0, max: 2 }),
      kb: fc.integer({ min: 0, max: 2 }),
      score: fc.constantFrom(0.2, 0.55, 0.8, 0.95),
      overlap: fc.constantFrom(0.1, 0.5, 0.9, 1),
      run: fc.integer({ min: 0, max: 1 }),
      repeat: fc.boolean(),
    }),
    { maxLength: 40 },
  ),
  decisions: fc.array(fc.record({ pair, verdict: fc.constantFrom<Verdict>('same', 'part', 'related', 'distinct') }), {
    maxLength: 6,
  }),
});

test('link() equals the plain reference on random models (fast-check, 300 runs)', () => {
  fc.assert(
    fc.property(spec, ({ matches, decisions }) => {
      const rows = matches.flatMap((m) => {
        const row: [string, string, number, number] = [
          `${WORKS[m.pair[0]]}#${m.ka}`,
          `${WORKS[m.pair[1]]}#${m.kb}`,
          m.score,
          m.overlap,
        ];
        return m.repeat ? [row, row] : [row];
      });
      const runOf = matches.flatMap((m) => (m.repeat ? [m.run, m.run] : [m.run]));
      const model = tinyModel({
        partners: ['a', 'b', 'c'],
        works: WORKS.map((ref) => ({ ref, images: 3 })),
        matches: rows,
        decisions: decisions.map((d) => [WORKS[d.pair[0]], WORKS[d.pair[1]], d.verdict]),
      });
      model.runs.push({ ...model.runs[0], id: 'run-2' });
      model.matches.run = Int32Array.from(runOf);
      // no image set aside (the evidence stage has tests of its own): confidence from every reliable row
      const got = link(model, model.project.policy, {
        ...weighEvidence(model),
        setAside: new Uint8Array(model.matches.count),
      });
      const want = plainLinks(model);
      assert.deepEqual(got.duplicates, want.duplicates);
      const plain = (l: Link) => ({
        a: l.a,
        b: l.b,
        kind: l.kind,
        status: l.status,
        part: l.part,
        support: l.support,
        reliableSupport: l.reliableSupport,
        best: l.best,
        mean: l.mean,
        maxOverlap: l.maxOverlap,
        coverageA: l.coverageA,
        coverageB: l.coverageB,
        runs: [...l.runs],
        decision: l.decision,
        matches: Array.from(matchesOf(got, l)),
      });
      assert.deepEqual(got.links.map(plain), want.links);
      for (const [i, l] of got.links.entries())
        assert.equal(got.byPair.get(l.a * 67108864 + l.b) ?? got.byPair.get(l.b * 67108864 + l.a), i);
    }),
    { numRuns: 300, seed: 7 },
  );
});
