// Test helper: writes a tiny three-archive project (invented) into a folder, release by release, for history and cite
// tests.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';

export interface TinyRelease {
  version: string;
  issued?: string;
  /** Evidence rows `image_a,image_b,score,overlap` with images as `partner:imageId`. */
  evidence: string[];
  /** Decision rows `work_a,work_b,verdict,curator,date,note`. */
  decisions?: string[];
  previous?: string;
}

const PARTNERS = ['a', 'b', 'c'];
/** Works 1–9 of each partner, one photo each (`a:1` shows photo `a:p1`), plus a second photo `a:p1x` for a:1. */
const catalogue = (key: string) =>
  [
    'work,photo,title,date',
    ...Array.from({ length: 9 }, (_, i) => `${i + 1},p${i + 1},Panel ${key.toUpperCase()}${i + 1},1475`),
    ...(key === 'a' ? ['1,p1x,Panel A1,1475'] : []),
  ].join('\n') + '\n';

/**
 * Writes `concordance.json` and its inputs for one release into `dir` (catalogues shared); returns the project file.
 */
export function writeTinyProject(dir: string, r: TinyRelease): string {
  for (const sub of ['catalogues', 'evidence', 'decisions']) mkdirSync(path.join(dir, sub), { recursive: true });
  for (const k of PARTNERS) writeFileSync(path.join(dir, 'catalogues', `${k}.csv`), catalogue(k));
  const ev = `evidence/run-${r.version}.csv`;
  writeFileSync(path.join(dir, ev), ['image_a,image_b,score,overlap', ...r.evidence].join('\n') + '\n');
  const dec = `decisions/curators-${r.version}.csv`;
  if (r.decisions?.length)
    writeFileSync(path.join(dir, dec), ['work_a,work_b,verdict,curator,date,note', ...r.decisions].join('\n') + '\n');
  const project = {
    title: 'Tiny invented concordance',
    base: 'https://concordance.example.org/',
    license: 'https://creativecommons.org/publicdomain/zero/1.0/',
    publisher: { name: 'Invented Test Consortium' },
    partners: PARTNERS.map((k) => ({
      key: k,
      name: `Archive ${k.toUpperCase()}`,
      workIri: `https://${k}.example.org/work/{work}`,
      imageIri: `https://${k}.example.org/photo/{image}`,
      catalogue: {
        file: `catalogues/${k}.csv`,
        delimiter: ',',
        columns: { work: 'work', image: 'photo', title: 'title', date: 'date' },
      },
    })),
    evidence: [
      {
        file: ev,
        run: {
          id: `run-${r.version}`,
          software: 'tiny-matcher',
          version: `1.${r.version}`,
          started: '2026-01-02T10:00:00Z',
          parameters: { features: 100 },
        },
      },
    ],
    decisions: r.decisions?.length ? [dec] : [],
    ...(r.previous ? { previous: r.previous } : {}),
    release: { version: r.version, ...(r.issued ? { issued: r.issued } : {}) },
  };
  const file = path.join(dir, `concordance-${r.version}.json`);
  writeFileSync(file, JSON.stringify(project, null, 2) + '\n');
  return file;
}
