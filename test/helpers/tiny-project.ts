// A generated two-archive project (works, image matches, curator decisions) → a project folder on disk, every text
// field CSV-quoted, for property tests of the whole build.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

export interface TinyWork {
  id: string;
  title: string;
  images: number;
}

/** An image match between image `ai` of alpha work `a` and image `bi` of beta work `b` (indices wrap). */
export interface TinyMatch {
  a: number;
  ai: number;
  b: number;
  bi: number;
  /** Percent, 0–100. */
  score: number;
  /** Percent, 1–100. */
  overlap: number;
}

export interface TinyDecision {
  a: number;
  b: number;
  verdict: 'same' | 'part' | 'related' | 'distinct';
  curator: string;
  note: string;
}

export interface TinyProject {
  alpha: TinyWork[];
  beta: TinyWork[];
  matches: TinyMatch[];
  decisions: TinyDecision[];
}

export const PARTNERS = {
  alpha: { workSpace: 'https://alpha.example.org/id/work/', delimiter: ',' },
  beta: { workSpace: 'https://beta.example.org/id/work/', delimiter: ';' },
} as const;

/** One CSV field, always quoted, inner quotes doubled (RFC 4180 §2 rules 5–7). */
export const field = (s: string) => `"${s.replace(/"/g, '""')}"`;
const row = (delimiter: string, cells: string[]) => cells.map(field).join(delimiter) + '\r\n';

/** Image IDs are the work ID plus a number, so they are unique whenever work IDs are. */
export const imageId = (w: TinyWork, k: number) => `${w.id}#${k % w.images}`;

/** Writes the project into `dir` and returns the project file's path. */
export function writeTinyProject(dir: string, p: TinyProject): string {
  for (const sub of ['catalogues', 'evidence', 'decisions']) mkdirSync(path.join(dir, sub), { recursive: true });
  const partners = (['alpha', 'beta'] as const).map((key) => {
    const { workSpace, delimiter } = PARTNERS[key];
    let text = row(delimiter, ['Work', 'Image', 'Title']);
    for (const w of p[key]) for (let k = 0; k < w.images; k++) text += row(delimiter, [w.id, imageId(w, k), w.title]);
    writeFileSync(path.join(dir, 'catalogues', `${key}.csv`), text);
    return {
      key,
      name: `${key} archive`,
      workIri: `${workSpace}{work}`,
      imageIri: `https://${key}.example.org/id/image/{image}`,
      recordPage: `https://${key}.example.org/records/{work}`,
      catalogue: {
        file: `catalogues/${key}.csv`,
        delimiter,
        columns: { work: 'Work', image: 'Image', title: 'Title' },
      },
    };
  });
  const at = <T>(xs: T[], i: number) => xs[i % xs.length];
  let evidence = row(',', ['image_a', 'image_b', 'score', 'overlap']);
  for (const m of p.matches) {
    const [wa, wb] = [at(p.alpha, m.a), at(p.beta, m.b)];
    evidence += row(',', [
      `alpha:${imageId(wa, m.ai)}`,
      `beta:${imageId(wb, m.bi)}`,
      (m.score / 100).toFixed(2),
      (m.overlap / 100).toFixed(2),
    ]);
  }
  writeFileSync(path.join(dir, 'evidence', 'run.csv'), evidence);
  let decisions = row(',', ['work_a', 'work_b', 'verdict', 'curator', 'date', 'note']);
  for (const d of p.decisions)
    decisions += row(',', [
      `alpha:${at(p.alpha, d.a).id}`,
      `beta:${at(p.beta, d.b).id}`,
      d.verdict,
      d.curator,
      '2026-10-20',
      d.note,
    ]);
  // A decisions file with a header and no rows is refused by the loader, so none is written then.
  if (p.decisions.length) writeFileSync(path.join(dir, 'decisions', 'curators.csv'), decisions);
  const project = {
    title: 'Generated concordance',
    base: 'https://concordance.example.org/',
    license: 'https://creativecommons.org/publicdomain/zero/1.0/',
    publisher: { name: 'Generated Test Consortium' },
    partners,
    evidence: [
      {
        file: 'evidence/run.csv',
        run: {
          id: 'run-1',
          software: 'test-matcher',
          version: '1.0.0',
          started: '2026-10-04T09:00:00Z',
          parameters: { features: 500 },
        },
      },
    ],
    decisions: p.decisions.length ? ['decisions/curators.csv'] : [],
    policy: { proposeAt: 0.5, autoConfirmAt: null, partOverlapBelow: 0.7, minOverlap: 0.3 },
    release: { version: '1' },
  };
  const file = path.join(dir, 'concordance.json');
  writeFileSync(file, JSON.stringify(project, null, 2));
  return file;
}
