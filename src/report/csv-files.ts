// Date conflicts → conflicts.csv for spreadsheets (formula-safe cells).
import type { Clustering } from '../cluster/types.js';
import { formatInterval, type Analysis } from '../analyse/index.js';
import { CsvFile, type CsvForm } from '../io/csv-write.js';
import type { WorkContext } from './context.js';

export const CONFLICTS_HEADER = ['cluster', 'severity', 'work_a', 'work_b', 'title_a', 'title_b', 'date_a', 'date_b', 'interval_a', 'interval_b', 'page_a', 'page_b'] as const;

/** conflicts.csv: one row per pair of cluster members whose dates conflict; every cell neutralised (spreadsheets). */
export async function writeConflicts(file: string, clustering: Clustering, analysis: Analysis, ctx: WorkContext, form: CsvForm = 'spreadsheet'): Promise<string> {
  const out = new CsvFile(file, CONFLICTS_HEADER, CONFLICTS_HEADER.map(() => true), form);
  for (const c of analysis.conflicts)
    await out.row([
      clustering.clusters[c.cluster].id, c.severity, ctx.ref(c.a), ctx.ref(c.b), ctx.title(c.a), ctx.title(c.b),
      ctx.date(c.a), ctx.date(c.b), formatInterval(c.readingA), formatInterval(c.readingB), ctx.page(c.a), ctx.page(c.b),
    ]);
  return out.close();
}
