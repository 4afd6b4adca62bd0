// Scales → synthetic projects built in child processes, timed against serdi, cat and whole-graph SHACL; a table on
// stdout.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, openSync, closeSync, rmSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import os from 'node:os';
import path from 'node:path';
import { generateProject } from './generate.js';

const CHILD = fileURLToPath(new URL('./child.js', import.meta.url));
const GNU_TIME = '/usr/bin/time';

interface Measured {
  wallMs: number;
  cpuMs: number;
  peakKiB: number;
  out: Record<string, number> | null;
  error?: string;
}

/** Runs a job in a fresh Node process; peak RSS from GNU time -v when present, else the child's own maxRSS. */
function child(job: string, args: string[]): Measured {
  // builds run with the CLI's own V8 flags (its shebang), so peak RSS is what a user sees; the whole-graph reference
  // gets a large heap, since it holds the whole graph at once
  const flags =
    job === 'whole'
      ? ['--max-old-space-size=20000', '--max-semi-space-size=64']
      : ['--max-semi-space-size=64', '--heap-growing-percent=30'];
  const node = [process.execPath, ...flags, CHILD, job, ...args];
  const useTime = existsSync(GNU_TIME);
  const argv = useTime ? [GNU_TIME, '-v', ...node] : node;
  const t = performance.now();
  const r = spawnSync(argv[0], argv.slice(1), { encoding: 'utf8', maxBuffer: 64 << 20 });
  const wallMs = performance.now() - t;
  const line = r.stdout.trim().split('\n').pop() ?? '';
  let out: Record<string, number> | null = null;
  try {
    out = JSON.parse(line);
  } catch {
    /* failed job: reported below */
  }
  const m = /Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr);
  const peakKiB = m ? Number(m[1]) : (out?.maxRssKiB ?? 0);
  const cpu = (what: string) =>
    Number(new RegExp(`${what} time \\(seconds\\): ([\\d.]+)`).exec(r.stderr)?.[1] ?? NaN) * 1000;
  const cpuMs = cpu('User') + cpu('System');
  const error = out
    ? undefined
    : (r.stderr
        .split('\n')
        .find((l) => /^\w*Error\b/.test(l))
        ?.slice(0, 160) ?? `exit ${r.status}`);
  return { wallMs, cpuMs, peakKiB, out, error };
}

/** Times a command with stdout to /dev/null: wall time, and CPU time (user + system) from GNU time when present. */
function timed(cmd: string, args: string[]): { ms: number; cpuMs: number; ok: boolean } {
  const devnull = openSync('/dev/null', 'w');
  const argv = existsSync(GNU_TIME) ? [GNU_TIME, '-f', 'cpu %U %S', cmd, ...args] : [cmd, ...args];
  const t = performance.now();
  const r = spawnSync(argv[0], argv.slice(1), { stdio: ['ignore', devnull, 'pipe'], encoding: 'utf8' });
  const ms = performance.now() - t;
  closeSync(devnull);
  const m = /cpu ([\d.]+) ([\d.]+)/.exec(r.stderr ?? '');
  return { ms, cpuMs: m ? (Number(m[1]) + Number(m[2])) * 1000 : NaN, ok: r.status === 0 };
}

const has = (cmd: string) => spawnSync('sh', ['-c', `command -v ${cmd}`]).status === 0;
const s = (ms: number) => (ms / 1000).toFixed(1) + ' s';
const mib = (kib: number) => (kib / 1024).toFixed(0) + ' MiB';
const rate = (n: number, ms: number) => Math.round(n / (ms / 1000)).toLocaleString('en') + '/s';

function parseArgs(argv: string[]): {
  scales: number[];
  whole: boolean;
  keep: boolean;
  partnerDumps: boolean;
  gateOnly: boolean;
  withSite: boolean;
} {
  // 16,500 works give a release of about 1M triples: the scale at which the SHACL target is compared with
  // rdf-validate-shacl over the whole graph (which needs ~2–3 GB per 1M triples and cannot take the larger releases)
  let scales = [10_000, 16_500, 100_000];
  const i = argv.indexOf('--scales');
  if (i >= 0) scales = argv[i + 1].split(',').map(Number);
  if (argv.includes('--with-1m') && !scales.includes(1_000_000)) scales.push(1_000_000);
  return {
    scales,
    whole: !argv.includes('--no-whole'),
    keep: argv.includes('--keep'),
    partnerDumps: !argv.includes('--no-partner-dumps'),
    gateOnly: argv.includes('--gate-only'),
    withSite: argv.includes('--with-site'),
  };
}

/** The scale's synthetic project (3 + 2·log10(works) partners, at most 25; one seed), timed and summarised. */
async function generateTimed(dir: string, works: number, partnerDumps: boolean, say: (k: string, v: string) => void) {
  const tg = performance.now();
  const gen = await generateProject(path.join(dir, 'project'), {
    works,
    partners: Math.min(25, 3 + Math.floor(Math.log10(works) * 2)),
    seed: 20261004,
    partnerDumps,
  });
  say(
    'generate',
    `${s(performance.now() - tg)}: ${gen.images} images, ${gen.evidenceRows} evidence rows, ${gen.decisions} decisions`,
  );
  return gen;
}

/** Benchmarks one scale and prints its figures; returns the build time without validation. */
async function benchScale(works: number, whole: boolean, keep: boolean, partnerDumps: boolean): Promise<number> {
  const dir = mkdtempSync(path.join(os.tmpdir(), `concordat-bench-${works}-`));
  const say = (k: string, v: string) => console.log(`  ${k.padEnd(40)} ${v}`);
  console.log(`\n== ${works.toLocaleString('en')} works (${dir})`);
  const gen = await generateTimed(dir, works, partnerDumps, say);

  const nv = child('build', [gen.projectFile, path.join(dir, 'release-nv'), '0']);
  if (!nv.out) {
    say('build without SHACL', `FAILED: ${nv.error}`);
    return NaN;
  }
  const { ms, triples, evidenceRows } = nv.out;
  say(
    'build without SHACL: time / peak RSS',
    `${s(ms)} (process ${s(nv.wallMs)}, CPU ${s(nv.cpuMs)}) / ${mib(nv.peakKiB)}`,
  );
  say(
    '  by stage',
    Object.entries(nv.out)
      .filter(([k]) => k.startsWith('stage:'))
      .map(([k, v]) => `${k.slice(6)} ${s(v)}`)
      .join(', '),
  );
  say(
    '  peak RSS by stage (sampled)',
    Object.entries(nv.out)
      .filter(([k]) => k.startsWith('rss:') && k !== 'rss:')
      .map(([k, v]) => `${k.slice(4)} ${v.toFixed(0)} MiB`)
      .join(', '),
  );
  say('  evidence rows/s, output triples/s', `${rate(evidenceRows, ms)}, ${rate(triples, ms)} (${triples} triples)`);

  const nvNq = path.join(dir, 'release-nv', 'concordance.nq');
  const du = spawnSync('du', ['-sb', path.join(dir, 'release-nv')], { encoding: 'utf8' });
  say(
    'concordance.nq size · whole release folder',
    `${(statSync(nvNq).size / 2 ** 20).toFixed(0)} MiB · ${(Number(du.stdout.split('\t')[0]) / 2 ** 30).toFixed(2)} GiB`,
  );
  const cat = timed('cat', [nvNq]);
  say('cat > /dev/null (floor)', `${s(cat.ms)} (CPU ${s(cat.cpuMs)})`);
  if (has('serdi')) {
    const sd = timed('serdi', ['-i', 'nquads', '-o', 'turtle', nvNq]);
    say(
      'serdi -i nquads -o turtle > /dev/null',
      `${s(sd.ms)} (CPU ${s(sd.cpuMs)})${sd.ok ? '' : ' (serdi reported an error)'}, ${rate(triples, sd.ms)}`,
    );
    say(
      'RATIO build(no SHACL) / serdi',
      `${(ms / sd.ms).toFixed(1)}× wall, ${(nv.cpuMs / sd.cpuMs).toFixed(1)}× CPU  (target at 1M works: ≤ 3×)`,
    );
  } else say('serdi', 'absent: skipped (apt-get install -y serdi)');

  // the release without SHACL is no longer needed: freed before the next build (a 1M-work release is tens of GB)
  if (!keep) rmSync(path.join(dir, 'release-nv'), { recursive: true, force: true });

  const full = child('build', [gen.projectFile, path.join(dir, 'release'), '1']);
  const fullMs = full.out?.ms ?? full.wallMs;
  const verdict = !full.out
    ? `  FAILED: ${full.error}`
    : full.out.nonConforming
      ? '  (release does not conform: SHACL violations)'
      : '';
  say(
    'build with chunked SHACL: time / peak RSS',
    `${s(fullMs)} (CPU ${s(full.cpuMs)}) / ${mib(full.peakKiB)}${verdict}`,
  );
  const chunkedMs = fullMs - ms;
  say('  chunked SHACL share (with − without)', `${s(chunkedMs)}, ${rate(triples, chunkedMs)}`);

  const nq = path.join(dir, 'release', 'concordance.nq');
  // `concordat validate` on the release's N-Quads: bounded memory whatever the file's size (target: ≤ 2 GiB at 10M
  // triples)
  const v = child('validate', [nq]);
  say(
    'concordat validate concordance.nq: time / peak RSS',
    v.out
      ? `${s(v.out.ms)} (CPU ${s(v.cpuMs)}), ${rate(v.out.triples, v.out.ms)} / ${mib(v.peakKiB)}`
      : `FAILED: ${v.error}`,
  );

  measureSite(dir, fullMs, full.cpuMs, say, keep);

  if (whole) {
    const w = child('whole', [nq, 'rdf-validate-shacl']);
    if (w.out) {
      say(
        'whole-graph rdf-validate-shacl: load / validate / RSS',
        `${s(w.out.loadMs)} / ${s(w.out.validateMs)} / ${mib(w.peakKiB)}`,
      );
      say('  whole-graph validate throughput', rate(w.out.triples, w.out.validateMs));
      say('RATIO validate(chunked) / validate(whole)', (chunkedMs / w.out.validateMs).toFixed(2) + '×');
      say('RATIO throughput chunked / whole', (w.out.validateMs / chunkedMs).toFixed(2) + '×  (target: ≥ 3×)');
    } else say('whole-graph rdf-validate-shacl', `FAILED after ${s(w.wallMs)} (peak ${mib(w.peakKiB)}): ${w.error}`);
    // the built-in engine on the same whole graph, one thread: the engine's own speed, without chunking or workers
    const b = child('whole', [nq, 'builtin']);
    if (b.out)
      say(
        'whole-graph built-in engine: validate / RSS',
        `${s(b.out.validateMs)}, ${rate(b.out.triples, b.out.validateMs)} / ${mib(b.peakKiB)}`,
      );
    else say('whole-graph built-in engine', `FAILED after ${s(b.wallMs)}: ${b.error}`);
  }
  if (!keep) rmSync(dir, { recursive: true, force: true });
  return ms;
}

/**
 * The release in `<dir>/release` as a static site (`child.js site`, default threads), against the build with SHACL
 * (target: written in no more than the build's own time, at most 1.5× the release's bytes).
 */
function measureSite(
  dir: string,
  buildMs: number,
  buildCpuMs: number,
  say: (k: string, v: string) => void,
  keep: boolean,
): void {
  const site = child('site', [path.join(dir, 'release'), path.join(dir, 'site')]);
  if (site.out) {
    const rel = Number(
      spawnSync('du', ['-sb', '--apparent-size', path.join(dir, 'release')], { encoding: 'utf8' }).stdout.split(
        '\t',
      )[0],
    );
    say(
      'site: time / peak RSS',
      `${s(site.out.ms)} (process ${s(site.wallMs)}, CPU ${s(site.cpuMs)}) / ${mib(site.peakKiB)}: ${site.out.documents} documents, ${site.out.files} files`,
    );
    say(
      'RATIO site time / build time (with SHACL)',
      `${(site.out.ms / buildMs).toFixed(2)}× wall, ${(site.cpuMs / buildCpuMs).toFixed(2)}× CPU  (target: ≤ 1×)`,
    );
    say(
      'RATIO site bytes / release bytes',
      `${(site.out.bytes / rel).toFixed(2)}× (${(site.out.bytes / 2 ** 30).toFixed(2)} GiB, downloads hard-linked and not counted)  (target: ≤ 1.5×)`,
    );
  } else say('site', `FAILED after ${s(site.wallMs)}: ${site.error}`);
  if (!keep) rmSync(path.join(dir, 'site'), { recursive: true, force: true });
}

/**
 * `--gate-only`: only the build as `concordat build` runs it by default (SHACL gate on): time, CPU, peak RSS, stages
 * and sampled RSS per stage; returns its time. For the largest scales, where the other jobs would take as long again.
 */
async function gateOnlyScale(works: number, partnerDumps: boolean, keep: boolean, withSite: boolean): Promise<number> {
  const dir = mkdtempSync(path.join(os.tmpdir(), `concordat-bench-${works}-`));
  const say = (k: string, v: string) => console.log(`  ${k.padEnd(40)} ${v}`);
  console.log(`\n== ${works.toLocaleString('en')} works, build with the SHACL gate only (${dir})`);
  const gen = await generateTimed(dir, works, partnerDumps, say);
  const full = child('build', [gen.projectFile, path.join(dir, 'release'), '1']);
  if (!full.out) {
    say('build with SHACL', `FAILED after ${s(full.wallMs)} (peak ${mib(full.peakKiB)}): ${full.error}`);
    if (!keep) rmSync(dir, { recursive: true, force: true });
    return NaN;
  }
  const o = full.out;
  say(
    'build with SHACL: time / peak RSS',
    `${s(o.ms)} (process ${s(full.wallMs)}, CPU ${s(full.cpuMs)}) / ${mib(full.peakKiB)}${o.nonConforming ? '  (does not conform)' : ''}`,
  );
  say(
    '  by stage',
    Object.entries(o)
      .filter(([k]) => k.startsWith('stage:'))
      .map(([k, v]) => `${k.slice(6)} ${s(v)}`)
      .join(', '),
  );
  say(
    '  peak RSS by stage (sampled)',
    Object.entries(o)
      .filter(([k]) => k.startsWith('rss:') && k !== 'rss:')
      .map(([k, v]) => `${k.slice(4)} ${v.toFixed(0)} MiB`)
      .join(', '),
  );
  say('  output', `${o.triples} triples, ${o.evidenceRows} evidence rows`);
  if (withSite) measureSite(dir, o.ms, full.cpuMs, say, keep);
  if (!keep) rmSync(dir, { recursive: true, force: true });
  return o.ms;
}

/** Largest scale whose whole graph is validated at once for the reference (≈ 1.2M triples). */
const WHOLE_GRAPH_MAX_WORKS = 20_000;

const { scales, whole, keep, partnerDumps, gateOnly, withSite } = parseArgs(process.argv.slice(2));
console.log(
  `concordat bench: ${os.cpus().length} CPUs (${os.cpus()[0]?.model ?? '?'}), ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, node ${process.version}, load average ${os.loadavg()[0].toFixed(1)} at start`,
);
const times = new Map<number, number>();
if (!partnerDumps)
  console.log('per-partner slices off at every scale (--no-partner-dumps): only the whole dumps are written');
for (const n of scales)
  times.set(
    n,
    gateOnly
      ? await gateOnlyScale(n, partnerDumps, keep, withSite)
      : await benchScale(n, whole && n <= WHOLE_GRAPH_MAX_WORKS, keep, partnerDumps),
  );
if (times.has(100_000) && times.has(1_000_000))
  console.log(
    `\nRATIO time 100k → 1M works${gateOnly ? ' (builds with SHACL)' : ''}: ${(times.get(1_000_000)! / times.get(100_000)!).toFixed(1)}×  (target: ≤ 11×)`,
  );
