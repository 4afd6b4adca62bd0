// The built CLI across commands: --json wherever a result is printed, one option name per concept, number options
// checked with a message naming the option.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { repoRoot, tempDir } from './helpers/fixture.js';

const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8', cwd: repoRoot });
const tmp = tempDir('concordat-cli-');

/** Commands that print a result (a summary, rows, a citation, what was created or proposed). */
const PRINTING = ['check', 'build', 'validate', 'load', 'query', 'sweep', 'diff', 'cite', 'init', 'add-partner'];

test('every command that prints a result offers --json', () => {
  for (const c of PRINTING) assert.match(run(c, '--help').stdout, /\n\s+--json\b/, c);
});

test("the remote query URL is --query-endpoint in every command; load's old --query still works, with a warning", () => {
  for (const c of ['load', 'query']) {
    const help = run(c, '--help').stdout;
    assert.match(help, /--query-endpoint <url>/, c);
    assert.doesNotMatch(help, /--query <url>/, `${c}: the deprecated spelling is not advertised`);
  }
  const r = run('load', 'demo-data', '--query', 'http://127.0.0.1:1/sparql', '--store', path.join(tmp, 'x'));
  assert.match(r.stderr, /--query is deprecated; use --query-endpoint/);
  assert.match(
    r.stderr,
    /--store: cannot be combined with remote endpoint options/,
    'the old spelling still reaches the store choice',
  );
  assert.equal(r.status, 2);
});

const NUMBERS: [string[], RegExp][] = [
  [
    ['sweep', 'demo-data/concordance.json', '--from', 'abc'],
    /option '--from <score>' argument 'abc' is invalid\. "abc" is not a number: give a number from 0 to 1/,
  ],
  [
    ['sweep', 'demo-data/concordance.json', '--to', '1.5'],
    /option '--to <score>' argument '1\.5' is invalid\. 1\.5 is out of range/,
  ],
  [
    ['sweep', 'demo-data/concordance.json', '--step', '0'],
    /option '--step <score>' argument '0' is invalid\. 0 is out of range: give a number above 0 and at most 1/,
  ],
  [
    ['serve', 'site', '--port', '80.5'],
    /option '--port <n>' argument '80\.5' is invalid\. 80\.5 is not a whole number/,
  ],
  [['serve', 'site', '--port', '70000'], /option '--port <n>' argument '70000' is invalid\. 70000 is out of range/],
];

for (const [args, message] of NUMBERS) {
  test(`number options are checked naming the option: ${args.slice(2).join(' ')}`, () => {
    const r = run(...args);
    assert.equal(r.status, 2);
    assert.match(r.stderr, message);
    assert.equal(r.stdout, '');
  });
}

test('sweep reads a decimal comma in a number option', () => {
  const r = run('sweep', 'demo-data/concordance.json', '--from', '0,5', '--to', '0,6', '--step', '0,1', '--json');
  assert.equal(r.status, 0, r.stderr);
  assert.deepEqual(
    JSON.parse(r.stdout).map((x: { proposeAt: number }) => x.proposeAt),
    [0.5, 0.6],
  );
});

test('init --json names the project file and what was created', () => {
  const folder = path.join(tmp, 'p');
  const r = run('init', folder, '--json');
  assert.equal(r.status, 0, r.stderr);
  const j = JSON.parse(r.stdout);
  assert.equal(j.projectFile, path.join(folder, 'concordance.json'));
  assert.deepEqual(j.created, ['concordance.json', 'catalogues/', 'evidence/', 'decisions/']);
});

test('query --json and cite --json on a built release; --json with another --format is refused', () => {
  const release = path.join(tmp, 'r');
  const store = path.join(tmp, 'store');
  assert.equal(run('build', 'demo-data/concordance.json', '--out', release).status, 0);
  assert.equal(run('load', release, '--store', store).status, 0);
  const q = run('query', '--store', store, '--named', 'partner-pair-counts', '--json');
  assert.equal(q.status, 0, q.stderr);
  const rows = JSON.parse(q.stdout); // SPARQL 1.1 Query Results JSON Format §3: head.vars, results.bindings
  assert.ok(Array.isArray(rows.head.vars) && rows.results.bindings.length > 0);
  assert.equal(run('query', '--store', store, '--named', 'partner-pair-counts', '--json', '--format', 'csv').status, 2);
  const c = run('cite', 'vellmar:VF 1101', '--release', release, '--json');
  assert.equal(c.status, 0, c.stderr);
  const j = JSON.parse(c.stdout);
  assert.equal(j.query, 'vellmar:VF 1101');
  assert.ok(j.claims.length > 0 && j.claims.every((x: { link: string }) => x.link.startsWith('https://')));
  assert.equal(j.quads, undefined);
  const both = run('cite', 'vellmar:VF 1101', '--release', release, '--json', '--format', 'markdown');
  assert.equal(both.status, 2);
  assert.match(both.stderr, /--json: cannot be combined with --format markdown/);
});
