// Scales → the release's dumps measured: bytes of concordance.{nq,ttl,jsonld} plain and gzip-compressed, the time to
// make each format's text, the build with and without the gzip copies, and gzip alone over each finished file.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import os from 'node:os';
import path from 'node:path';
import { generateProject } from './generate.js';
import { DUMP_FORMATS, FORMATS, COMPRESSIONS } from '../src/rdf/formats.js';

const CHILD = fileURLToPath(new URL('./child.js', import.meta.url));
const GNU_TIME = '/usr/bin/time';

/** One child job (bench/child.ts) with the CLI's V8 flags: its JSON line, and CPU seconds from GNU time if present. */
function job(name: string, args: string[]): { out: Record<string, number>; cpuMs: number } {
  const node = [process.execPath, '--max-semi-space-size=64', '--heap-growing-percent=30', CHILD, name, ...args];
  const argv = existsSync(GNU_TIME) ? [GNU_TIME, '-f', 'cpu %U %S', ...node] : node;
  const r = spawnSync(argv[0], argv.slice(1), { encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(`${name} failed: ${r.stderr.trim().split('\n').slice(-3).join(' | ')}`);
  const m = /cpu ([\d.]+) ([\d.]+)/.exec(r.stderr);
  return {
    out: JSON.parse(r.stdout.trim().split('\n').pop()!),
    cpuMs: m ? (Number(m[1]) + Number(m[2])) * 1000 : NaN,
  };
}

const s = (ms: number) => (ms / 1000).toFixed(1) + ' s';
const mb = (b: number) => (b / 1e6).toFixed(1) + ' MB';

async function dumpsAt(works: number, runs: number): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), `concordat-bench-dumps-${works}-`));
  try {
    const gen = await generateProject(path.join(dir, 'project'), {
      works,
      partners: Math.min(25, 3 + Math.floor(Math.log10(works) * 2)),
      seed: 20261004,
      partnerDumps: false,
    });
    console.log(`\n== ${works.toLocaleString('en')} works, no partner slices, build without SHACL, best of ${runs}`);
    // builds alternate plain / gzip so that a change in the machine's load touches both alike
    const best: Record<string, { ms: number; cpuMs: number; out: Record<string, number> }> = {};
    for (let i = 0; i < runs; i++)
      for (const gz of ['0', '1']) {
        const out = path.join(dir, `release-${gz}`);
        rmSync(out, { recursive: true, force: true });
        const r = job('build', [gen.projectFile, out, '0', gz]);
        if (!best[gz] || r.out.ms < best[gz].ms) best[gz] = { ms: r.out.ms, cpuMs: r.cpuMs, out: r.out };
      }
    const [plain, gzip] = [best['0'], best['1']];
    console.log(
      `  build: ${s(plain.ms)} (CPU ${s(plain.cpuMs)}); with gzip copies ${s(gzip.ms)} (CPU ${s(gzip.cpuMs)})`,
    );
    console.log('  format    plain bytes  text made in   gzip bytes  ratio  gzip alone (CPU)');
    for (const f of DUMP_FORMATS) {
      const file = path.join(dir, 'release-1', `concordance${FORMATS[f].extension}`);
      const bytes = statSync(file).size;
      const gzBytes = statSync(file + COMPRESSIONS.gzip.extension).size;
      const alone = job('gzip', [file]);
      console.log(
        `  ${FORMATS[f].label.padEnd(9)} ${mb(bytes).padStart(11)}  ${s(gzip.out[`encode:${f}`]).padStart(12)}` +
          `  ${mb(gzBytes).padStart(11)}  ${(bytes / gzBytes).toFixed(1).padStart(4)}×  ${s(alone.out.ms)} (${s(alone.cpuMs)})`,
      );
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const argv = process.argv.slice(2);
const i = argv.indexOf('--scales');
const scales = i >= 0 ? argv[i + 1].split(',').map(Number) : [10_000, 100_000];
const j = argv.indexOf('--runs');
const runs = j >= 0 ? Number(argv[j + 1]) : 3;
console.log(`concordat dumps bench: ${os.cpus().length} CPUs, load average ${os.loadavg()[0].toFixed(1)} at start`);
for (const n of scales) await dumpsAt(n, runs);
