// Answer keys → pair, B-cubed and part-of precision/recall/F1 of the published claims: the demo and generated
// scenarios.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { load } from '../src/load/index.js';
import { weighEvidence } from '../src/evidence/index.js';
import { link } from '../src/link/index.js';
import { cluster } from '../src/cluster/index.js';
import { quality, type Quality, type Truth } from '../src/analyse/quality.js';
import { generateProject, type Rates } from './generate.js';
import { readDemoTruth, readTruthCsv } from './truth.js';

/** Loads a project, weighs its evidence, links and clusters it in memory, and measures the claims against `truth`. */
export async function measure(
  projectFile: string,
  truth: Truth,
): Promise<Quality & { works: number; rows: number; indiscriminate: number }> {
  const { model } = await load(projectFile);
  const evidence = weighEvidence(model);
  const links = link(model, model.project.policy, evidence);
  const q = quality(model, links, cluster(model, links), truth);
  return { ...q, works: model.works.length, rows: model.matches.count, indiscriminate: evidence.indiscriminate.length };
}

/** A generated scenario with the phenomena (bench/generate.ts), measured against its answer key. */
export async function measureGenerated(works: number, partners: number, seed: number, rates?: Rates) {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'concordat-quality-'));
  try {
    const gen = await generateProject(dir, { works, partners, seed, rates });
    return await measure(gen.projectFile, readTruthCsv(gen.answerKey));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const demo = (rel: string) => fileURLToPath(new URL(`../../demo-data/${rel}`, import.meta.url));

/** The demo's two releases against their answer keys. */
export async function measureDemo() {
  return {
    'demo release 1': await measure(demo('concordance.json'), readDemoTruth(demo('answer-key.json'))),
    'demo release 2': await measure(
      demo('release-2/concordance.json'),
      readDemoTruth(demo('answer-key.json'), demo('release-2/answer-key.json')),
    ),
  };
}

/**
 * Consortia unlike the default one (`npm run quality -- --spread`): other seeds, partner counts, and rates of junk
 * scans, look-alike works, details, matcher errors and misdated records (bench/generate.ts `Rates`).
 */
export const SPREAD: { name: string; works: number; partners: number; seed: number; rates?: Rates }[] = [
  { name: 'default rates', works: 3000, partners: 4, seed: 1 },
  { name: 'default rates', works: 3000, partners: 4, seed: 2 },
  { name: 'default rates', works: 3000, partners: 4, seed: 3 },
  { name: '3 partners', works: 3000, partners: 3, seed: 5 },
  { name: '10 partners', works: 3000, partners: 10, seed: 11 },
  { name: '25 partners', works: 6000, partners: 25, seed: 13 },
  { name: 'no junk scans', works: 3000, partners: 4, seed: 19, rates: { junk: 0 } },
  { name: 'junk scans ×3', works: 3000, partners: 4, seed: 17, rates: { junk: 3 } },
  { name: 'junk scans ×5', works: 3000, partners: 6, seed: 18, rates: { junk: 5 } },
  { name: 'no look-alikes', works: 3000, partners: 4, seed: 29, rates: { lookAlike: 0 } },
  { name: 'look-alikes 20%', works: 3000, partners: 4, seed: 23, rates: { lookAlike: 0.2 } },
  { name: 'details 20%', works: 3000, partners: 4, seed: 31, rates: { detail: 0.2 } },
  { name: 'matcher errors 5%', works: 3000, partners: 4, seed: 37, rates: { matcherError: 0.05 } },
  { name: 'misdated 5%', works: 3000, partners: 4, seed: 41, rates: { misdated: 0.05 } },
  {
    name: 'all harsher',
    works: 3000,
    partners: 6,
    seed: 43,
    rates: { junk: 3, lookAlike: 0.15, detail: 0.15, matcherError: 0.03 },
  },
];

const f = (x: number) => x.toFixed(4);

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  // npm run quality [-- works partners seed …]: the demo, then generated scenarios (default 6,000 works, 4 partners)
  // npm run quality -- --spread: the SPREAD scenarios, with the lowest, median and highest F1 of each measure
  const spread = process.argv.includes('--spread');
  const args = process.argv
    .slice(2)
    .filter((a) => a !== '--spread')
    .map(Number);
  const scenarios: [number, number, number, Rates?, string?][] = [];
  for (let i = 0; i + 2 < args.length; i += 3) scenarios.push([args[i], args[i + 1], args[i + 2]]);
  if (spread) for (const x of SPREAD) scenarios.push([x.works, x.partners, x.seed, x.rates, x.name]);
  if (scenarios.length === 0) scenarios.push([6000, 4, 20261203], [6000, 4, 7], [3000, 10, 11]);
  const rows: [string, Awaited<ReturnType<typeof measure>>][] = spread ? [] : Object.entries(await measureDemo());
  for (const [works, partners, seed, rates, name] of scenarios)
    rows.push([
      `generated ${works} works, ${partners} partners, seed ${seed}${name ? ` (${name})` : ''}`,
      await measureGenerated(works, partners, seed, rates),
    ]);
  console.log(
    [
      'scenario',
      'works',
      'rows',
      'indiscr.',
      'pair P',
      'pair R',
      'pair F1',
      'B3 P',
      'B3 R',
      'B3 F1',
      'part P',
      'part R',
      'part F1',
    ].join('\t'),
  );
  for (const [name, q] of rows)
    console.log(
      [
        name,
        q.works,
        q.rows,
        q.indiscriminate,
        f(q.pair.precision),
        f(q.pair.recall),
        f(q.pair.f1),
        f(q.bcubed.precision),
        f(q.bcubed.recall),
        f(q.bcubed.f1),
        f(q.partOf.precision),
        f(q.partOf.recall),
        f(q.partOf.f1),
      ].join('\t'),
    );
  if (spread) {
    const stat = (xs: number[]) => {
      const o = [...xs].sort((p, q) => p - q);
      return `${f(o[0])} / ${f(o[Math.floor(o.length / 2)])} / ${f(o[o.length - 1])}`;
    };
    const qs = rows.map(([, q]) => q);
    console.log(`pair F1 min / median / max: ${stat(qs.map((q) => q.pair.f1))}`);
    console.log(`B-cubed F1 min / median / max: ${stat(qs.map((q) => q.bcubed.f1))}`);
    console.log(`part-of F1 min / median / max: ${stat(qs.map((q) => q.partOf.f1))}`);
  }
}
