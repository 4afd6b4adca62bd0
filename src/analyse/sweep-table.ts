// Sweep rows → an aligned text table (proposeAt, precision, recall, F1) for the terminal.
import type { SweepRow } from './sweep.js';

const pct = (x: number | null) => (x === null ? '—' : `${(Math.round(x * 1000) / 10).toFixed(1)}%`);

/** Right-aligned columns, one row per threshold; `—` where a ratio is undefined (nothing claimed or no gold pair). */
export function sweepTable(rows: SweepRow[]): string {
  const header = ['proposeAt', 'precision', 'recall', 'F1', 'claimed pairs', 'gold found'];
  const body = rows.map((r) => [
    r.proposeAt.toFixed(2),
    pct(r.precision),
    pct(r.recall),
    pct(r.f1),
    String(r.claimedPairs),
    String(r.found),
  ]);
  const width = header.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padStart(width[i])).join('  ');
  return [line(header), ...body.map(line)].join('\n') + '\n';
}
