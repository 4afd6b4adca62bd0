// Interrupted work leaves nothing behind: the built CLI on a larger generated project, stopped by SIGINT/SIGTERM at
// several moments of `build` and `load`, and killed by SIGKILL (a stale temp folder is then recognised and removed).
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, readlinkSync, rmSync } from 'node:fs';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { generateProject } from '../bench/generate.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const root = tempDir('concordat-interrupt-');
// 3,000 works: a build of a few seconds on a shared two-core machine, long enough to be stopped mid-way
const project = (async () =>
  (await generateProject(path.join(root, 'project'), { works: 3000, partners: 4, seed: 11 })).projectFile)();

interface Run {
  code: number | null;
  signal: NodeJS.Signals | null;
  stderr: string;
}

/**
 * Whether process `pid` has a file under `dir` open (its /proc/<pid>/fd links, proc(5)): the CLI is reading its input,
 * so its own code, handlers included, is running. True where /proc is absent (the moment is then a fixed delay).
 */
function reading(pid: number, dir: string): boolean {
  if (!existsSync('/proc/self/fd')) return true;
  try {
    return readdirSync(`/proc/${pid}/fd`).some((fd) => {
      try {
        return readlinkSync(`/proc/${pid}/fd/${fd}`).startsWith(dir);
      } catch {
        return false;
      }
    });
  } catch {
    return false;
  }
}

/** Spawns the CLI; `when` decides the moment to send `signal` (polled every 5 ms); resolves when the process ends. */
async function interrupted(args: string[], signal: NodeJS.Signals, when: () => boolean, delayMs = 0): Promise<Run> {
  const child = spawn(process.execPath, [cli, ...args], { stdio: ['ignore', 'ignore', 'pipe'] });
  const input = path.resolve(args[1]);
  let seen = false;
  const ready = when;
  when = () =>
    (seen ||= reading(child.pid!, existsSync(path.join(input, 'SHA256SUMS')) ? input : path.dirname(input))) && ready();
  let stderr = '';
  child.stderr.on('data', (d) => (stderr += d));
  const ended = new Promise<Run>((resolve) => child.on('close', (code, sig) => resolve({ code, signal: sig, stderr })));
  let done = false;
  void ended.then(() => (done = true));
  while (!done && !when()) await sleep(5);
  if (delayMs) await sleep(delayMs);
  if (!done) child.kill(signal);
  return ended;
}

const hidden = (dir: string): string[] => (existsSync(dir) ? readdirSync(dir).filter((n) => n.startsWith('.')) : []);
const tempIn = (dir: string) => () => hidden(dir).some((n) => n.includes('.tmp-'));
const fileIn = (dir: string, sub: string) => () =>
  hidden(dir).some((n) => n.includes('.tmp-') && existsSync(path.join(dir, n, sub)));

const EXIT = { SIGINT: 130, SIGTERM: 143 } as const;

const moments: {
  name: string;
  signal: 'SIGINT' | 'SIGTERM';
  when: (out: string) => () => boolean;
  delayMs?: number;
}[] = [
  { name: 'as soon as it reads the project', signal: 'SIGINT', when: () => () => true },
  { name: 'early, while the project loads', signal: 'SIGTERM', when: () => () => true, delayMs: 300 },
  { name: 'just after the temp folder appeared', signal: 'SIGTERM', when: (out) => tempIn(path.dirname(out)) },
  {
    name: 'while the partner slices are written',
    signal: 'SIGINT',
    when: (out) => fileIn(path.dirname(out), 'partners'),
  },
  { name: 'a little later', signal: 'SIGTERM', when: (out) => tempIn(path.dirname(out)), delayMs: 400 },
];

for (const m of moments)
  test(`build stopped by ${m.signal} ${m.name}: exit ${EXIT[m.signal]}, one line, no temp folder, no lock, no release`, async () => {
    const parent = tempDir('concordat-out-');
    const out = path.join(parent, 'release');
    const r = await interrupted(['build', await project, '--out', out], m.signal, m.when(out), m.delayMs);
    assert.equal(r.code, EXIT[m.signal], `exit code (signal ${r.signal}); stderr: ${r.stderr}`);
    const lines = r.stderr.trim().split('\n');
    assert.equal(lines.length, 1, r.stderr);
    assert.match(lines[0], new RegExp(`^concordat: stopped by ${m.signal}`));
    assert.doesNotMatch(r.stderr, /\n\s+at /, 'no stack trace');
    assert.deepEqual(readdirSync(parent), [], 'nothing left beside --out');
  });

test('a build killed by SIGKILL leaves a marked temp folder: load refuses it, the next build removes it, the lock is taken over', async () => {
  const parent = tempDir('concordat-kill-');
  const out = path.join(parent, 'release');
  const r = await interrupted(['build', await project, '--out', out], 'SIGKILL', fileIn(parent, 'partners'));
  assert.equal(r.signal, 'SIGKILL');
  const left = hidden(parent);
  assert.equal(left.filter((n) => n.includes('.tmp-')).length, 1, `the killed build's temp folder: ${left}`);
  assert.ok(left.includes('.release.lock'), 'and its lock');
  const temp = path.join(
    parent,
    left.find((n) => n.includes('.tmp-'))!,
  );
  const marker = JSON.parse(readFileSync(path.join(temp, '.concordat-incomplete'), 'utf8'));
  assert.equal(marker.command, 'build');
  assert.ok(Number.isInteger(marker.pid) && marker.host);

  const load = spawnSync(process.execPath, [cli, 'load', temp, '--store', path.join(parent, 'store')], {
    encoding: 'utf8',
  });
  assert.equal(load.status, 2, load.stderr);
  assert.match(load.stderr, /is the unfinished folder of concordat build \(pid \d+ on .+\), not a release/);
  assert.ok(!existsSync(path.join(parent, 'store', 'manifest.json')), 'nothing loaded');

  const again = spawnSync(process.execPath, [cli, 'build', await project, '--out', out], { encoding: 'utf8' });
  assert.equal(again.status, 0, again.stderr);
  assert.match(again.stderr, /removed .*\.release\.tmp-\w+, the unfinished folder of an interrupted concordat build/);
  assert.deepEqual(hidden(parent), [], 'stale temp folder and lock gone');
  assert.ok(existsSync(path.join(out, 'SHA256SUMS')));
});

test('load into a store folder stopped by SIGINT or SIGTERM: exit 130/143, the store as before, no temp file, no lock', async () => {
  const parent = tempDir('concordat-load-');
  const release = path.join(parent, 'release');
  const b = spawnSync(process.execPath, [cli, 'build', await project, '--out', release], { encoding: 'utf8' });
  assert.equal(b.status, 0, b.stderr);
  const store = path.join(parent, 'store');
  const graphFile = () => existsSync(path.join(store, 'graphs')) && readdirSync(path.join(store, 'graphs')).length > 0;
  const locked = () => existsSync(path.join(store, '.concordat.lock'));
  const cases = [
    ['SIGINT', () => true, 0],
    ['SIGTERM', locked, 0],
    ['SIGINT', graphFile, 0],
    ['SIGTERM', graphFile, 300],
  ] as const;
  let stopped = 0;
  for (const [signal, when, delay] of cases) {
    const r = await interrupted(['load', release, '--store', store], signal, when, delay);
    if (r.code === 0) continue; // finished before the signal: nothing to check at this moment
    stopped++;
    assert.equal(r.code, EXIT[signal], r.stderr);
    assert.match(r.stderr.trim(), new RegExp(`^concordat: stopped by ${signal}`));
    assert.equal(r.stderr.trim().split('\n').length, 1, r.stderr);
    // all or nothing: either no manifest and no graph file, or (stopped after the manifest was written) exactly its
    // files
    const manifest = path.join(store, 'manifest.json');
    const named = existsSync(manifest)
      ? Object.values<{ file: string }>(JSON.parse(readFileSync(manifest, 'utf8')).graphs)
          .map((e) => e.file.slice('graphs/'.length))
          .sort()
      : [];
    const graphs = existsSync(path.join(store, 'graphs')) ? readdirSync(path.join(store, 'graphs')).sort() : [];
    assert.deepEqual(graphs, named, `${signal}: graph files are the manifest's`);
    assert.deepEqual(
      existsSync(store) ? readdirSync(store).filter((n) => n !== 'graphs' && n !== 'manifest.json') : [],
      [],
      'no temp file or lock',
    );
    if (named.length) rmSync(store, { recursive: true }); // start the next case from an empty store
  }
  assert.ok(stopped >= 3, `${stopped} of ${cases.length} loads were stopped before they finished`);
});

/** Starts the CLI and resolves once `ready()` holds (or the process ended); `ended` resolves with the outcome. */
async function started(args: string[], ready: () => boolean): Promise<{ ended: Promise<Run> }> {
  const child = spawn(process.execPath, [cli, ...args], { stdio: ['ignore', 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr.on('data', (d) => (stderr += d));
  let done = false;
  const ended = new Promise<Run>((resolve) =>
    child.on('close', (code, signal) => {
      done = true;
      resolve({ code, signal, stderr });
    }),
  );
  while (!done && !ready()) await sleep(5);
  return { ended };
}

test('two builds into one --out: the second is refused (exit 2, names the first); the first completes', async () => {
  const parent = tempDir('concordat-twice-');
  const out = path.join(parent, 'release');
  const first = await started(['build', await project, '--out', out], () =>
    existsSync(path.join(parent, '.release.lock')),
  );
  const second = spawnSync(process.execPath, [cli, 'build', await project, '--out', out], { encoding: 'utf8' });
  assert.equal(second.status, 2, second.stderr);
  assert.match(
    second.stderr,
    /\.release\.lock: --out: concordat build \(pid \d+ on .+\) is writing .*release \(wait for it to finish\)/,
  );
  assert.doesNotMatch(second.stderr, /\n\s+at /);
  const r = await first.ended;
  assert.equal(r.code, 0, r.stderr);
  assert.deepEqual(readdirSync(parent), ['release']);
});

test('an empty folder made at --out while a build runs is not replaced: the build fails with exit 2 and removes its temp folder', async () => {
  const parent = tempDir('concordat-race-');
  const out = path.join(parent, 'release');
  const first = await started(['build', await project, '--out', out], tempIn(parent));
  mkdirSync(out);
  const r = await first.ended;
  assert.equal(r.code, 2, r.stderr);
  assert.match(r.stderr, /release: --out: folder already exists/);
  assert.deepEqual(readdirSync(out), [], 'the folder made meanwhile is untouched');
  assert.deepEqual(readdirSync(parent), ['release']);
});

test('two loads into one store folder: the second is refused while the first holds the lock; the manifest lists the first', async () => {
  const parent = tempDir('concordat-loads-');
  const release = path.join(parent, 'release');
  assert.equal(spawnSync(process.execPath, [cli, 'build', await project, '--out', release]).status, 0);
  const store = path.join(parent, 'store');
  const first = await started(['load', release, '--store', store], () =>
    existsSync(path.join(store, '.concordat.lock')),
  );
  const second = spawnSync(
    process.execPath,
    [cli, 'load', path.join(repoRoot, 'test', 'fixtures', 'store', 'release'), '--store', store],
    { encoding: 'utf8' },
  );
  assert.equal(second.status, 2, second.stderr);
  assert.match(second.stderr, /concordat load \(pid \d+ on .+\) is writing/);
  const r = await first.ended;
  assert.equal(r.code, 0, r.stderr);
  const graphs = Object.keys(JSON.parse(readFileSync(path.join(store, 'manifest.json'), 'utf8')).graphs);
  assert.deepEqual(
    graphs,
    ['claims', 'dataset', 'evidence', 'provenance'].map((g) => `https://concordance.bench.example.org/graph/${g}`),
  );
  assert.ok(!existsSync(path.join(store, '.concordat.lock')));
});
