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
import { generateProject } from './generate.js';
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
export async function measureGenerated(works: number, partners: number, seed: number) {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'concordat-quality-'));
  try {
    const gen = await generateProject(dir, { works, partners, seed });
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

const f = (x: number) => x.toFixed(4);

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  // npm run quality [-- works partners seed …]: the demo, then generated scenarios (default 6,000 works, 4 partners)
  const args = process.argv.slice(2).map(Number);
  const scenarios: [number, number, number][] = [];
  for (let i = 0; i + 2 < args.length; i += 3) scenarios.push([args[i], args[i + 1], args[i + 2]]);
  if (scenarios.length === 0) scenarios.push([6000, 4, 20261203], [6000, 4, 7], [3000, 10, 11]);
  const rows: [string, Awaited<ReturnType<typeof measure>>][] = Object.entries(await measureDemo());
  for (const [works, partners, seed] of scenarios)
    rows.push([
      `generated ${works} works, ${partners} partners, seed ${seed}`,
      await measureGenerated(works, partners, seed),
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
}
