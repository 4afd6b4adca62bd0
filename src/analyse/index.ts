// Links + clusters → date conflicts, overlap statistics, agreement with the gold concordance, review queue (step 4).
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { dateConflicts } from './conflicts.js';
import { overlapStats } from './overlap.js';
import { agreement } from './agreement.js';
import { reviewQueue } from './review.js';
import { dateReader } from './readings.js';
import type { Analysis } from './types.js';

export type {
  Analysis,
  Agreement,
  CenturyCell,
  DateConflict,
  MissedPair,
  OverlapCell,
  OverlapStats,
  ReviewQueue,
  ReviewReason,
} from './types.js';
export { REVIEW_REASONS } from './types.js';
export { agreement } from './agreement.js';
export { DATE_TOLERANCE, yearsApart } from './conflicts.js';
export { HIGH_SCORE_AT } from './review.js';
export { sweep, sweepValues, type SweepRow } from './sweep.js';
export { sweepTable } from './sweep-table.js';
export { dateReader, recordPager, formatInterval, centuryOf } from './readings.js';

export interface AnalyseOptions {
  /** Unreviewed claims scoring at least this rank high in the review queue (default HIGH_SCORE_AT). */
  highScoreAt?: number;
}

/**
 * The analyse stage (design, pipeline step 4): date conflicts inside clusters, overlap per partner pair and century,
 * agreement with the gold concordance (null without one), and the ranked review queue.
 */
export function analyse(
  model: Model,
  linkSet: LinkSet,
  clustering: Clustering,
  options: AnalyseOptions = {},
): Analysis {
  const read = dateReader(model);
  return {
    conflicts: dateConflicts(model, linkSet, clustering, read),
    overlap: overlapStats(model, linkSet, clustering, read),
    agreement: model.project.gold !== undefined || model.gold.length > 0 ? agreement(model, linkSet, clustering) : null,
    review: reviewQueue(model, linkSet, clustering, options.highScoreAt),
  };
}
