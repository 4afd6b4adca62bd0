// `npm run demo`: checks the invented demo scenario, builds and validates its release, and shows what it holds.
import { spawnSync } from 'node:child_process';
import { rmSync, existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const cli = path.join(root, 'dist', 'src', 'cli', 'main.js');
const rel = (p: string) => path.relative(process.cwd(), path.join(root, p)) || '.';

/** Runs one concordat command the way a user would, echoing it; stops the demo on failure. */
function concordat(...args: string[]): string {
  process.stdout.write(`\n$ concordat ${args.join(' ')}\n`);
  const r = spawnSync(process.execPath, [cli, ...args], { cwd: process.cwd(), encoding: 'utf8' });
  process.stdout.write(r.stdout);
  process.stderr.write(r.stderr);
  if (r.status !== 0) {
    process.stderr.write(`demo stopped: "concordat ${args[0]}" exited with ${r.status}\n`);
    process.exit(r.status ?? 1);
  }
  return r.stdout;
}

const releases = path.join(root, 'demo-data', 'releases');
// The demo's own output folder: cleared so every run starts fresh (a real build never overwrites a release).
if (existsSync(releases)) rmSync(releases, { recursive: true });

const project1 = rel('demo-data/concordance.json');
const release1 = rel('demo-data/releases/2026.1');
concordat('check', project1);
concordat('build', project1, '--out', release1);
concordat('validate', path.join(release1, 'concordance.nq'));
process.stdout.write(`\nRelease 1 is in ${release1}/ (Turtle, N-Quads, JSON-LD, per-partner slices, reports, SHA256SUMS).\n`);
