// Links, clusters and analysis → the release's report files: report.md, report.json, conflicts.csv, review-queue.csv,
// clusters.csv.
import path from 'node:path';
import { writeFileAtomically } from '../io/temp-file.js';
import type { Model } from '../model.js';
import type { LinkSet } from '../link/types.js';
import type { Clustering } from '../cluster/types.js';
import { writeClusterRegistry } from '../cluster/index.js';
import type { Analysis } from '../analyse/index.js';
import { workContext } from './context.js';
import { reportData } from './data.js';
import { reportMarkdown } from './markdown.js';
import { writeConflicts } from './csv-files.js';
import { writeReviewQueue } from './review-queue.js';
import type { Namer } from '../rdf/index.js';
import { RELEASE_FILES } from '../rdf/formats.js';

export { CONFLICTS_HEADER } from './csv-files.js';
export { REVIEW_HEADER, DECISION_COLUMNS, PAIRS_LISTED } from './review-queue.js';
export { reportData, LIST_LIMIT, type ReportData } from './data.js';

/** File names the report stage writes, in the order returned. */
export const REPORT_FILES = [
  'report.md',
  'report.json',
  'conflicts.csv',
  'review-queue.csv',
  RELEASE_FILES.clusters,
] as const;

function writeText(file: string, text: string): string {
  writeFileAtomically(file, text);
  return file;
}

/**
 * Writes the report files into `dir` (design, "Outputs"), each atomically (temp file, then rename). Same inputs →
 * byte-identical files: no clock, no absolute paths, fixed orders. CSV files are written for spreadsheets (UTF-8 with
 * BOM, CRLF) unless the project's `release.csv` is `plain`; `namer` gives the queue its link and image IRIs. Returns
 * the paths written, in REPORT_FILES order.
 */
/** A work's partner name, for the conflicts a cataloguer reads. */
export function partnerNamer(model: Model): (w: number) => string {
  return (w) => model.project.partners[model.works[w].partner].name;
}

export async function writeReports(
  dir: string,
  model: Model,
  linkSet: LinkSet,
  clustering: Clustering,
  analysis: Analysis,
  namer: Namer,
): Promise<string[]> {
  const ctx = workContext(model);
  const form = model.project.release.csv ?? 'spreadsheet';
  const data = reportData(model, linkSet, clustering, analysis, ctx);
  const at = (name: string) => path.join(dir, name);
  return [
    writeText(at('report.md'), reportMarkdown(data)),
    writeText(at('report.json'), JSON.stringify(data, null, 2) + '\n'),
    await writeConflicts(at('conflicts.csv'), clustering, analysis, ctx, partnerNamer(model), form),
    await writeReviewQueue(at('review-queue.csv'), model, linkSet, analysis, ctx, namer, form),
    await writeClusterRegistry(at(RELEASE_FILES.clusters), model, clustering),
  ];
}
