// The scenario's partners, runs and files → the two project files (concordance.json) in the contract's shape.
import { PARTNERS, type Field, type PartnerKey } from './partners.js';

/** The matcher runs of the story; the rerun uses a newer version of the same invented matcher. */
export const RUNS = {
  first: {
    file: 'evidence/matcher-2026-10.csv',
    run: {
      id: 'matcher-2026-10',
      software: 'lanternfield-matcher',
      version: '1.8.2',
      started: '2026-10-04T09:00:00Z',
      parameters: { features: 2000, ratioTest: 0.8, minInliers: 12 },
    },
  },
  rerun: {
    file: 'evidence/matcher-2027-04.csv',
    run: {
      id: 'matcher-2027-04',
      software: 'lanternfield-matcher',
      version: '2.0.1',
      started: '2027-04-12T08:30:00Z',
      parameters: { features: 4000, ratioTest: 0.75, minInliers: 15 },
    },
  },
} as const;

const MAPPED: readonly Field[] = ['work', 'image', 'title', 'date', 'width', 'height'];

/** One partner entry; `prefix` leads from the project file to the catalogue folder. */
function partner(key: PartnerKey, prefix: string) {
  const p = PARTNERS[key];
  const columns = Object.fromEntries(MAPPED.flatMap((f) => p.columns.filter(([, g]) => g === f).map(([h]) => [f, h])));
  return {
    key,
    name: p.name,
    homepage: `https://${p.host}/`,
    workIri: `https://${p.host}/${p.paths.work}{work}`,
    imageIri: `https://${p.host}/${p.paths.image}{image}`,
    recordPage: `https://${p.host}/${p.paths.page}{work}`,
    ...(p.paths.view ? { imageView: `https://${p.host}/${p.paths.view}` } : {}),
    ...(p.convention ? { centuryConvention: p.convention } : {}),
    ...(p.language ? { language: p.language } : {}),
    catalogue: { file: prefix + p.file, delimiter: p.format.delimiter, columns },
  };
}

const COMMON = {
  base: 'https://concordance.lanternfield.example.org/',
  license: 'https://creativecommons.org/licenses/by/4.0/',
  publisher: { name: 'Lanternfield Consortium of Photo Archives', homepage: 'https://lanternfield.example.org/' },
};
const POLICY = { proposeAt: 0.5, autoConfirmAt: null, partOverlapBelow: 0.7, minOverlap: 0.3 };

/** Release 1: three archives, one run, one decisions file, no previous release. */
export function project1(): object {
  return {
    title: 'Lanternfield concordance of late medieval panel paintings',
    ...COMMON,
    partners: (['vellmar', 'kessling', 'fontclaire'] as const).map((k) => partner(k, '')),
    evidence: [RUNS.first],
    decisions: ['decisions/curators.csv'],
    gold: 'gold/hand-made-concordance.csv',
    policy: POLICY,
    release: { version: '2026.1', issued: '2026-11-30' },
  };
}

/** Release 2: Brindle joins, the rerun replaces the first run, a second decisions file, release 1 as previous. */
export function project2(): object {
  return {
    title: 'Lanternfield concordance of late medieval panel paintings',
    ...COMMON,
    partners: [
      ...(['vellmar', 'kessling', 'fontclaire'] as const).map((k) => partner(k, '../')),
      partner('brindle', ''),
    ],
    evidence: [RUNS.rerun],
    decisions: ['../decisions/curators.csv', 'decisions/curators-2027.csv'],
    gold: 'gold/hand-made-concordance.csv',
    policy: POLICY,
    previous: '../releases/2026.1',
    release: { version: '2027.1', issued: '2027-05-31' },
  };
}
