// Date conflicts → conflicts.csv for spreadsheets (formula-safe cells), one row per disagreeing record.
import type { Clustering } from '../cluster/types.js';
import { formatInterval, type Analysis, type DateConflict } from '../analyse/index.js';
import { CsvFile, type CsvForm } from '../io/csv-write.js';
import type { WorkContext } from './context.js';

/** Columns of conflicts.csv, in the words a cataloguer uses; one row per record, most years apart first. */
export const CONFLICTS_HEADER = [
  'record',
  'partner',
  'title',
  'date_as_catalogued',
  'read_as',
  'consensus_date',
  'consensus_read_as',
  'consensus_records',
  'years_apart',
  'compared_with',
  'cluster',
  'consensus_record',
  'record_page',
  'consensus_record_page',
] as const;

/** One conflict as the cells of CONFLICTS_HEADER (also the rows report.md and report.json list). */
export function conflictCells(
  c: DateConflict,
  clustering: Clustering,
  ctx: WorkContext,
  partnerName: (w: number) => string,
): string[] {
  const share = `${c.support} of ${c.dated}${c.tie ? ' (tie: no majority)' : ''}`;
  return [
    ctx.ref(c.work),
    partnerName(c.work),
    ctx.title(c.work),
    ctx.date(c.work),
    formatInterval(c.reading),
    ctx.date(c.anchor),
    formatInterval({ kind: 'interval', ...c.consensus, form: 'range', approximate: false, uncertain: false }),
    share,
    String(c.apart),
    c.against === 'whole' ? `the work it is part of (${ctx.ref(c.whole!)})` : 'its cluster',
    c.cluster >= 0 ? clustering.clusters[c.cluster].id : '',
    ctx.ref(c.anchor),
    ctx.page(c.work),
    ctx.page(c.anchor),
  ];
}

/**
 * conflicts.csv: one row per record whose date is far from its artwork's consensus; every cell neutralised
 * (spreadsheets).
 */
export async function writeConflicts(
  file: string,
  clustering: Clustering,
  analysis: Analysis,
  ctx: WorkContext,
  partnerName: (w: number) => string,
  form: CsvForm = 'spreadsheet',
): Promise<string> {
  const out = new CsvFile(
    file,
    CONFLICTS_HEADER,
    CONFLICTS_HEADER.map(() => true),
    form,
  );
  for (const c of analysis.conflicts) await out.row(conflictCells(c, clustering, ctx, partnerName));
  return out.close();
}
