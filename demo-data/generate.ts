// Seeded demo scenario → the committed demo-data files (catalogues, evidence, decisions, gold, project files, answer
// keys).
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { catalogueText } from './gen/catalogue.js';
import { decisions1, decisions2, decisionsText, gold1, gold2, goldText } from './gen/curation.js';
import { evidenceText, matchesFor, noise, pairKeys, type Match } from './gen/evidence.js';
import { key1, key2 } from './gen/key.js';
import type { PairSpec } from './gen/model.js';
import { PARTNERS } from './gen/partners.js';
import { project1, project2, RUNS } from './gen/project.js';
import { PLAN1, release1 } from './gen/release1.js';
import { PLAN2, release2 } from './gen/release2.js';
import { phenomena1, type Phenomena } from './gen/phenomena.js';
import { Rng } from './gen/rng.js';

const json = (value: unknown): string => JSON.stringify(value, null, 2) + '\n';

/** Writes one file atomically: a temporary sibling first, then a rename. */
function put(outDir: string, rel: string, text: string): void {
  const file = path.join(outDir, rel);
  mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.tmp-${process.pid}`;
  writeFileSync(tmp, text, 'utf8');
  renameSync(tmp, file);
}

/** The phenomena in the answer key: indiscriminate scans by image, look-alike works by record. */
function phenomenaKey(ph: Phenomena) {
  const ref = (r: { partner: string; work: string }) => `${r.partner}:${r.work}`;
  return {
    note: 'Mount-back scans and colour charts match whatever the artwork; prints from one plate and pendants are distinct works that look alike. None of them is a same-work pair.',
    mountBacks: ph.mountBacks,
    charts: ph.charts,
    printsFromOnePlate: ph.prints.map(ref),
    pendants: ph.pendants.map((p) => p.map(ref)),
  };
}

/**
 * Builds both releases of the invented scenario and writes their files under `outDir`.
 * Returns the written paths, relative to `outDir` with `/` separators. Same code, same bytes: no clock, no Math.random.
 */
export function generateDemo(outDir: string): string[] {
  const files = new Map<string, string>();
  const r1 = release1();
  const r2 = release2(r1);
  // after both stories are told, so their records keep their IDs: scans that match whatever the artwork, look-alikes
  const ph = phenomena1(r1.b);

  // release 1: three catalogues, one matcher run
  for (const key of ['vellmar', 'kessling', 'fontclaire'] as const) {
    files.set(PARTNERS[key].file, catalogueText(key, r1.b.recs, Rng.of(`release-1/catalogue/${key}`)));
  }
  const rng1 = Rng.of('release-1/evidence');
  const first = new Map<PairSpec, Match[]>(r1.b.pairs.map((p) => [p, matchesFor(p, rng1)]));
  const noise1 = noise(r1.b.recs, PLAN1.noise, Rng.of('release-1/noise'), pairKeys(r1.b.pairs));
  files.set(
    RUNS.first.file,
    evidenceText([...[...first.values()].flat(), ...ph.matches, ...noise1], Rng.of('release-1/evidence-order')),
  );
  const dec1 = decisions1(r1);
  files.set('decisions/curators.csv', decisionsText(dec1));
  const g1 = gold1(r1);
  files.set('gold/hand-made-concordance.csv', goldText(g1, Rng.of('release-1/gold')));
  files.set('concordance.json', json(project1()));
  files.set(
    'answer-key.json',
    json({
      ...key1(r1, [...[...first.values()].flat(), ...ph.matches], noise1.length, dec1, g1),
      phenomena: phenomenaKey(ph),
    }),
  );

  // release 2: Brindle joins, the rerun covers everyone, more decisions
  files.set(
    `release-2/${PARTNERS.brindle.file}`,
    catalogueText('brindle', r2.b.recs, Rng.of('release-2/catalogue/brindle')),
  );
  const rng2 = Rng.of('release-2/evidence');
  const rerun = [
    ...r1.b.pairs.flatMap((p) => matchesFor(p, rng2, p.kind === 'fading' ? 'faded' : p.kind, first.get(p))),
    ...r2.b.pairs.flatMap((p) => matchesFor(p, rng2)),
    ...ph.matches, // the rerun sees the same scans and look-alikes
  ];
  const allRecs = [...r1.b.recs, ...r2.b.recs];
  const noise2 = noise(allRecs, PLAN2.noise, Rng.of('release-2/noise'), pairKeys([...r1.b.pairs, ...r2.b.pairs]));
  files.set(`release-2/${RUNS.rerun.file}`, evidenceText([...rerun, ...noise2], Rng.of('release-2/evidence-order')));
  const dec2 = decisions2(r2);
  files.set('release-2/decisions/curators-2027.csv', decisionsText(dec2));
  const g2 = gold2(r2);
  files.set('release-2/gold/hand-made-concordance.csv', goldText(g2, Rng.of('release-2/gold')));
  files.set('release-2/concordance.json', json(project2()));
  files.set('release-2/answer-key.json', json(key2(r2, rerun, noise2.length, [...dec1, ...dec2], g2)));

  for (const [rel, text] of files) put(outDir, rel, text);
  return [...files.keys()].sort();
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const outDir = fileURLToPath(new URL('../../demo-data/', import.meta.url));
  for (const rel of generateDemo(outDir)) process.stdout.write(`wrote demo-data/${rel}\n`);
}
