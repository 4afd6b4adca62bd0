// A model + a range of proposal thresholds → precision, recall and F1 against the gold concordance at each threshold.
import type { Model } from '../model.js';
import { UserError } from '../errors.js';
import { link } from '../link/index.js';
import { cluster } from '../cluster/index.js';
import { agreement } from './agreement.js';

export interface SweepRow {
  proposeAt: number;
  /** Same-cluster pairs among works of the gold file, and the gold pairs found. */
  claimedPairs: number;
  found: number;
  precision: number | null;
  recall: number | null;
  f1: number | null;
}

/** `from`, `from + step`, … up to `to` (inclusive, within rounding), rounded to 6 decimals; refuses bad ranges. */
export function sweepValues(from: number, to: number, step: number): number[] {
  const bad = (field: string, message: string, hint: string) =>
    new UserError({ file: 'concordat sweep', line: 0, field, message, hint });
  for (const [field, v] of [
    ['--from', from],
    ['--to', to],
  ] as const)
    if (!Number.isFinite(v) || v < 0 || v > 1)
      throw bad(field, `${v} is not a score between 0 and 1`, 'scores run from 0 to 1');
  if (!Number.isFinite(step) || step <= 0) throw bad('--step', `${step} is not a positive step`, 'e.g. --step 0.05');
  if (from > to) throw bad('--from', `--from ${from} is above --to ${to}`, 'swap them');
  const count = Math.floor((to - from) / step + 1e-9) + 1;
  return Array.from({ length: count }, (_, i) => Math.round((from + i * step) * 1e6) / 1e6);
}

/**
 * Re-runs link (with `proposeAt` replaced), cluster and agreement for each value (design, pipeline step 4,
 * "per-threshold sweep"). Needs a gold concordance.
 */
export function sweep(model: Model, values: number[]): SweepRow[] {
  if (model.gold.length === 0)
    throw new UserError({
      file: model.projectFile,
      line: 0,
      field: 'gold',
      message: 'the project has no gold concordance pairs',
      hint: 'name a gold file of work_a,work_b pairs in concordance.json',
    });
  return values.map((proposeAt) => {
    const links = link(model, { ...model.project.policy, proposeAt });
    const a = agreement(model, links, cluster(model, links));
    return {
      proposeAt,
      claimedPairs: a.claimedPairs,
      found: a.found,
      precision: a.precision,
      recall: a.recall,
      f1: a.f1,
    };
  });
}
