// Matched work pairs and random look-alikes → one matcher run's evidence rows (image_a,image_b,score,overlap).
import { delimited, PLAIN_CSV } from './csv.js';
import { RANGES, type PairKind, type PairSpec, type Rec } from './model.js';
import type { Rng } from './rng.js';

/** One evidence row before formatting; `overlap` null is written blank (= 1). */
export interface Match {
  a: string;
  b: string;
  score: number;
  overlap: number | null;
}

const imageRef = (r: Rec, i: number): string => `${r.partner}:${r.images[i].id}`;

/** Rounds into a range so a printed value never leaves it. */
function within(value: number, [lo, hi]: [number, number], digits: number): number {
  const f = 10 ** digits;
  return Math.min(Math.floor(hi * f), Math.max(Math.ceil(lo * f), Math.round(value * f))) / f;
}

/**
 * Rows for one work pair. `previous` (the earlier run's rows for the pair) makes a rerun: same photographs,
 * scores moved by at most ±0.03 and kept inside the kind's range, so no pair changes kind by accident.
 */
export function matchesFor(pair: PairSpec, rng: Rng, kind: PairKind = pair.kind, previous?: Match[]): Match[] {
  const range = RANGES[kind];
  return pair.imagePairs.map(([i, j], n) => {
    const old = previous?.[n];
    const score = within(
      old && kind === pair.kind ? old.score + rng.real(-0.03, 0.03) : rng.real(...range.score),
      range.score,
      3,
    );
    const overlap = old
      ? old.overlap
      : rng.chance(range.blank)
        ? null
        : within(rng.real(...range.overlap), range.overlap, 2);
    // the matcher writes the detail photo of a partial match as image_a (the input contract): parts never swap
    const swap = rng.chance(0.5) && kind !== 'part' && kind !== 'small-part';
    return {
      a: imageRef(swap ? pair.b : pair.a, swap ? j : i),
      b: imageRef(swap ? pair.a : pair.b, swap ? i : j),
      score,
      overlap,
    };
  });
}

/** Neither the same artwork nor a detail or replica of one another. */
function unrelated(a: Rec, b: Rec): boolean {
  const root = (r: Rec) => r.art.of ?? r.art;
  return root(a) !== root(b);
}

/** Low-scoring matches between photographs of unrelated works, the background every run produces. */
export function noise(recs: readonly Rec[], count: number, rng: Rng, taken: ReadonlySet<string>): Match[] {
  const out: Match[] = [];
  const seen = new Set(taken);
  while (out.length < count) {
    const a = rng.pick(recs),
      b = rng.pick(recs);
    const key = [a.partner + ':' + a.work, b.partner + ':' + b.work].sort().join('|');
    if (a === b || !unrelated(a, b) || seen.has(key)) continue;
    seen.add(key);
    out.push({
      a: imageRef(a, rng.int(0, a.images.length - 1)),
      b: imageRef(b, rng.int(0, b.images.length - 1)),
      score: within(rng.real(0.05, 0.45), [0.05, 0.45], 3),
      overlap: rng.chance(0.2) ? null : within(rng.real(0.05, 1), [0.05, 1], 2),
    });
  }
  return out;
}

/** Work-pair keys (sorted `partner:work` pair) of the given pairs, to keep noise off them. */
export function pairKeys(pairs: readonly PairSpec[]): Set<string> {
  return new Set(pairs.map((p) => [p.a.partner + ':' + p.a.work, p.b.partner + ':' + p.b.work].sort().join('|')));
}

/** The evidence file: header, rows in the run's (shuffled) output order. */
export function evidenceText(matches: readonly Match[], rng: Rng): string {
  const rows = rng
    .shuffle(matches)
    .map((m) => [m.a, m.b, m.score.toFixed(3), m.overlap === null ? '' : m.overlap.toFixed(2)]);
  return delimited(['image_a', 'image_b', 'score', 'overlap'], rows, PLAIN_CSV);
}
