// Loaded model → the summary `concordat check` prints (per partner works and images, evidence, decisions, warnings).
import type { Model } from '../model.js';
import type { LoadStats } from './index.js';
import { bounded, displayPath } from '../errors.js';
import { cut, visible } from '../shown.js';
import { warningLines } from './warning-groups.js';

export interface CheckSummary {
  project: string;
  title: string;
  partners: { key: string; name: string; works: number; images: number }[];
  evidence: { rows: number; matches: number; sameRecordSetAside: number; files: number; runs: string[] };
  decisions: number;
  /** Decisions-file rows without a verdict, skipped (a review queue's undecided rows). */
  decisionRowsWithoutVerdict: number;
  goldPairs: number;
  warnings: { file: string; line: number; field: string; message: string; hint?: string }[];
}

/** Counts what was loaded. */
export function summarise(model: Model, stats: LoadStats): CheckSummary {
  const partners = model.project.partners.map((p) => ({ key: p.key, name: p.name, works: 0, images: 0 }));
  for (const w of model.works) {
    partners[w.partner].works++;
    partners[w.partner].images += w.imageCount;
  }
  return {
    project: displayPath(model.projectFile),
    title: model.project.title,
    partners,
    evidence: {
      rows: stats.evidenceRows,
      matches: model.matches.count,
      sameRecordSetAside: stats.sameRecordMatches,
      files: model.evidenceFiles.length,
      runs: model.runs.map((r) => r.id),
    },
    decisions: model.decisions.length,
    decisionRowsWithoutVerdict: stats.undecidedRows,
    goldPairs: model.gold.length,
    warnings: model.warnings.map((w) => bounded({ ...w, file: displayPath(w.file) })),
  };
}

/**
 * The summary as aligned text for a terminal (values from the project cut and their control characters visible);
 * warnings summarised per kind unless `verbose`.
 */
export function summaryText(s: CheckSummary, verbose = false): string {
  const show = (v: string) => visible(cut(v));
  const lines = [
    `${show(s.title)}  (${show(s.project)})`,
    '',
    'partner'.padEnd(14) + 'works'.padStart(8) + 'images'.padStart(9) + '  name',
  ];
  for (const p of s.partners)
    lines.push(p.key.padEnd(14) + String(p.works).padStart(8) + String(p.images).padStart(9) + '  ' + show(p.name));
  lines.push(
    '',
    `evidence: ${s.evidence.rows} rows in ${s.evidence.files} file(s), runs: ${show(s.evidence.runs.join(', ')) || 'none'}; ${s.evidence.matches} cross-record image matches`,
    `decisions: ${s.decisions}${s.decisionRowsWithoutVerdict ? ` (${s.decisionRowsWithoutVerdict} rows without a verdict skipped)` : ''}    gold pairs: ${s.goldPairs}    warnings: ${s.warnings.length}`,
  );
  for (const w of warningLines(s.warnings, verbose)) lines.push('  warning: ' + w);
  return lines.join('\n') + '\n';
}
