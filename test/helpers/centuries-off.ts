// Test helper: records a century or more off their cluster (brute force over every pair of dated records), and the
// rows of a release's conflicts.csv by record.
import assert from 'node:assert/strict';
import type { BuildResult } from '../../src/pipeline.js';
import { readCsv } from '../../src/io/csv-read.js';
import { CONFLICTS_HEADER } from '../../src/report/index.js';
import { yearsApart } from '../../src/analyse/index.js';
import { dateReader } from '../../src/analyse/readings.js';
import { workRef } from '../../src/model.js';

/**
 * Independent of the consensus sweep: every pair of dated records of each cluster, brute force. A record is a century
 * or more off its cluster when more of the cluster's other dated records lie 100 years or more from it than nearer (in
 * a cluster of three, the two that agree are not off because the third is).
 */
export function centuriesOff(r: BuildResult): string[] {
  const read = dateReader(r.model);
  const out: string[] = [];
  for (const c of r.clustering.clusters) {
    const dated = Array.from(c.members).filter((w) => read(w).kind === 'interval');
    for (const w of dated) {
      const others = dated.filter((x) => x !== w);
      const far = others.filter((x) => yearsApart(read(w) as never, read(x) as never) >= 100).length;
      if (others.length > 0 && far * 2 > others.length) out.push(workRef(r.model, w));
    }
  }
  return out.sort();
}

/** conflicts.csv → its rows by record (the first column), after checking the header. */
export async function conflictRows(file: string): Promise<Map<string, Record<string, string>>> {
  const out = new Map<string, Record<string, string>>();
  let header: string[] | undefined;
  for await (const r of readCsv(file, ',')) {
    if (header === undefined) {
      header = r.fields;
      continue;
    }
    out.set(r.fields[0], Object.fromEntries(header.map((h, i) => [h, r.fields[i]])));
  }
  assert.deepEqual(header, [...CONFLICTS_HEADER]);
  return out;
}
