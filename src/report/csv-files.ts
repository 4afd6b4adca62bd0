// Date conflicts and the review queue → conflicts.csv and review-queue.csv for spreadsheets (formula-safe cells).
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { REVIEW_REASONS, formatInterval, type Analysis } from '../analyse/index.js';
import { CsvFile } from '../io/csv-write.js';
import { num, type WorkContext } from './context.js';

export const CONFLICTS_HEADER = ['cluster', 'severity', 'work_a', 'work_b', 'title_a', 'title_b', 'date_a', 'date_b', 'interval_a', 'interval_b', 'page_a', 'page_b'] as const;

/** Decisions-file columns (design: "Decisions file") first, so a filled-in queue loads as one; context after them. */
export const DECISION_COLUMNS = ['work_a', 'work_b', 'verdict', 'curator', 'date', 'note'] as const;
export const REVIEW_CONTEXT = ['reason', 'score', 'support', 'title_a', 'title_b', 'date_a', 'date_b', 'page_a', 'page_b'] as const;
export const REVIEW_HEADER = [...DECISION_COLUMNS, ...REVIEW_CONTEXT] as const;

/** conflicts.csv: one row per pair of cluster members whose dates conflict; every cell neutralised (spreadsheets). */
export async function writeConflicts(file: string, clustering: Clustering, analysis: Analysis, ctx: WorkContext): Promise<string> {
  const out = new CsvFile(file, CONFLICTS_HEADER, CONFLICTS_HEADER.map(() => true));
  for (const c of analysis.conflicts)
    await out.row([
      clustering.clusters[c.cluster].id, c.severity, ctx.ref(c.a), ctx.ref(c.b), ctx.title(c.a), ctx.title(c.b),
      ctx.date(c.a), ctx.date(c.b), formatInterval(c.readingA), formatInterval(c.readingB), ctx.page(c.a), ctx.page(c.b),
    ]);
  return out.close();
}

/**
 * review-queue.csv, in rank order, verdict/curator/date/note empty. Only the context columns are neutralised: the
 * work references are read back by the decisions loader and never start with = + - @ (partner keys start with a
 * letter).
 */
export async function writeReviewQueue(file: string, linkSet: LinkSet, analysis: Analysis, ctx: WorkContext): Promise<string> {
  const neutral = REVIEW_HEADER.map((_, i) => i >= DECISION_COLUMNS.length);
  const out = new CsvFile(file, REVIEW_HEADER, neutral);
  const q = analysis.review;
  for (let i = 0; i < q.count; i++) {
    const a = q.a[i], b = q.b[i];
    const l = q.link[i] >= 0 ? linkSet.links[q.link[i]] : undefined;
    await out.row([
      ctx.ref(a), ctx.ref(b), '', '', '', '',
      REVIEW_REASONS[q.reason[i]], l ? num(l.best) : '', l ? String(l.support) : '0',
      ctx.title(a), ctx.title(b), ctx.date(a), ctx.date(b), ctx.page(a), ctx.page(b),
    ]);
  }
  return out.close();
}
