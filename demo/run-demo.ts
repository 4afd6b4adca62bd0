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
  process.stdout.write(`\n$ concordat ${args.map((a) => (/[\s'"]/.test(a) ? JSON.stringify(a) : a)).join(' ')}\n`);
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
const project2 = rel('demo-data/release-2/concordance.json');
const release1 = rel('demo-data/releases/2026.1');
const release2 = rel('demo-data/releases/2027.1');
const store = rel('demo-data/releases/store');

process.stdout.write("Release 1: three invented archives, one matcher run, curators' decisions.\n");
concordat('check', project1);
concordat('build', project1, '--out', release1);
concordat('validate', path.join(release1, 'concordance.nq'));

process.stdout.write('\nPartners load the release into a triple store and query it.\n');
concordat('load', release1, '--store', store);
concordat('query', '--store', store, '--named', 'partner-pair-counts', '--format', 'table');

process.stdout.write(
  '\nRelease 2: a fourth archive joins, the matcher is rerun, curators decide more (previous: release 1).\n',
);
const built = concordat('build', project2, '--out', release2);
concordat('diff', release1, release2);
const example = /example claim: (\S+:.+?) owl:sameAs/.exec(built)?.[1];
if (!example) throw new Error('the release summary names no example claim');
concordat('cite', example, '--release', release2);
process.stdout.write(
  '\nThe releases as web sites: every IRI they mint answers HTML, Turtle and JSON-LD (the second keeps what the first published).\n',
);
const site1 = rel('demo-data/releases/site-2026.1');
const site2 = rel('demo-data/releases/site-2027.1');
concordat('site', release1, '--out', site1);
concordat('site', release2, '--out', site2, '--previous', site1);
process.stdout.write(
  `\nServe the site and open it in a browser:\n  npx concordat serve ${site2} --port 8080\n  then http://127.0.0.1:8080/ ; an IRI: curl -i -H 'Accept: text/turtle' http://127.0.0.1:8080/work/c000001\n`,
);
process.stdout.write(
  `\nReleases are in ${rel('demo-data/releases')}/ (Turtle, N-Quads, JSON-LD, per-partner slices, reports, changes, SHA256SUMS); the embedded store in ${store}/.\n`,
);
