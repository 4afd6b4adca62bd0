// Evidence files (`image_a,image_b,score,overlap[,run]`) → the columnar match table, row by row.
import { readNumber } from '../io/number.js';
import type { ProblemList } from '../errors.js';
import type { RunConfig } from '../model.js';
import { float64, int32 } from '../util/columns.js';
import { readTable } from './table.js';
import { resolveRef, type RefResolver } from './refs.js';
import { didYouMean } from '../io/did-you-mean.js';
import { statSync } from 'node:fs';
import path from 'node:path';
import { progress } from '../util/progress.js';

export interface MatchColumns {
  a: ReturnType<typeof int32>;
  b: ReturnType<typeof int32>;
  score: ReturnType<typeof float64>;
  overlap: ReturnType<typeof float64>;
  run: ReturnType<typeof int32>;
  file: ReturnType<typeof int32>;
  line: ReturnType<typeof int32>;
}

export const newMatchColumns = (): MatchColumns => ({
  a: int32(),
  b: int32(),
  score: float64(),
  overlap: float64(),
  run: int32(),
  file: int32(),
  line: int32(),
});

/** Reads one evidence file (design: "Evidence file"); `fileRun` is the run its entry declares (-1 when none). */
export async function loadEvidence(
  file: string,
  fileNo: number,
  fileRun: number,
  runs: RunConfig[],
  images: RefResolver,
  imageWork: (image: number) => number,
  m: MatchColumns,
  problems: ProblemList,
): Promise<{ rows: number; sameRecord: number }> {
  const counts = { rows: 0, sameRecord: 0 };
  const runIds = new Map(runs.map((r, i) => [r.id, i]));
  let size = 0;
  try {
    size = statSync(file).size;
  } catch {
    /* a missing file is reported by the reader */
  }
  const bar = progress(`evidence ${path.basename(file)}`, Math.round(size / 1048576), 'MiB');
  const rows = readTable(file, ',', ['image_a', 'image_b', 'score'], ['overlap', 'run'], problems, 'evidence', (b) =>
    bar.update(Math.round(b / 1048576)),
  );
  try {
    for await (const row of rows) {
      counts.rows++;
      const at = (field: string) => ({ file, line: row.line, field });
      let bad = false;
      const ends: number[] = [];
      for (const col of ['image_a', 'image_b']) {
        const r = resolveRef(images, row.get(col), 'image');
        if (typeof r === 'number') ends.push(r);
        else {
          problems.add({ ...r, ...at(col) });
          bad = true;
        }
      }
      const rawScore = row.get('score').trim();
      const readScore = readNumber(rawScore);
      const score = readScore.ok ? readScore.value : NaN;
      if (!readScore.ok || score < 0 || score > 1) {
        problems.add({
          ...at('score'),
          message: `score "${rawScore}" is not a number in [0,1]`,
          hint: readScore.ok ? 'higher = more alike; rescale the matcher output to 0..1' : readScore.hint,
        });
        bad = true;
      }
      const rawOverlap = row.get('overlap').trim();
      const readOverlap = rawOverlap === '' ? ({ ok: true, value: 1 } as const) : readNumber(rawOverlap);
      const overlap = readOverlap.ok ? readOverlap.value : NaN;
      if (!readOverlap.ok || overlap <= 0 || overlap > 1) {
        problems.add({
          ...at('overlap'),
          message: `overlap "${rawOverlap}" is not a number in (0,1]`,
          hint: readOverlap.ok
            ? 'share of the smaller image the matched region covers; blank means 1'
            : readOverlap.hint,
        });
        bad = true;
      }
      let run = fileRun;
      const rawRun = row.get('run').trim();
      if (rawRun !== '') {
        const r = runIds.get(rawRun);
        if (r === undefined) {
          const near = didYouMean(rawRun, [...runIds.keys()]);
          problems.add({
            ...at('run'),
            message: `unknown run "${rawRun}"`,
            hint: near ? `did you mean "${near}"?` : 'declare it as "run" of an evidence entry in concordance.json',
          });
          bad = true;
        } else run = r;
      } else if (run < 0) {
        problems.add({
          ...at('run'),
          message: 'no run for this row',
          hint: 'give the evidence entry a "run" in concordance.json or fill the run column',
        });
        bad = true;
      }
      if (!bad && ends[0] === ends[1]) {
        problems.add({
          ...at('image_b'),
          message: 'an image matched with itself',
          hint: 'drop self-matches from the matcher output',
        });
        bad = true;
      }
      if (bad) continue;
      if (imageWork(ends[0]) === imageWork(ends[1])) {
        counts.sameRecord++; // two photos of one record: counted and reported, says nothing about other records
        continue;
      }
      m.a.push(ends[0]);
      m.b.push(ends[1]);
      m.score.push(score);
      m.overlap.push(overlap);
      m.run.push(run);
      m.file.push(fileNo);
      m.line.push(row.line);
    }
  } finally {
    bar.stop();
  }
  return counts;
}
