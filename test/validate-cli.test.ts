// End-to-end: the built `concordat validate` command on small fixture files → exit codes, stdout and stderr.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import N3 from 'n3';
import { readRdfFile } from '../src/rdf/read.js';
import { iri } from '../src/namespaces.js';
import { tempDir } from './helpers/fixture.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const main = join(root, 'dist/src/cli/main.js');
const fixtures = join(root, 'test/fixtures/validate');
const tmp = tempDir('concordat-validate-');

function run(...args: string[]): { code: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [main, 'validate', ...args], { cwd: fixtures, encoding: 'utf8' });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

test('a conforming file exits 0 with no results', () => {
  const r = run('conforming.ttl', '--shapes', 'shapes');
  assert.equal(r.stderr, '');
  assert.equal(r.code, 0);
  assert.match(r.stdout, /^Validated 1 file \(9 triples\) against 1 shapes file\.$/m);
  assert.match(r.stdout, /^Conforms: 0 violations, 0 warnings, 0 infos\.$/m);
});

test('a violating file exits 1 and lists focus node, path and message of each result', () => {
  const r = run('violating.ttl', '--shapes', 'shapes');
  assert.equal(r.code, 1);
  assert.match(r.stdout, /^Does not conform: 2 violations, 0 warnings, 0 infos\.$/m);
  assert.match(
    r.stdout,
    /^ {2}Violation: <https:\/\/concordance\.example\.org\/link-2> cx:objectWork: a link names exactly one object work$/m,
  );
  assert.match(
    r.stdout,
    /^ {2}Violation: <https:\/\/concordance\.example\.org\/link-2> cx:score: score: one decimal in \[0,1\] \(value "1\.5"\^\^xsd:decimal\)$/m,
  );
});

test('warnings alone do not fail the run', () => {
  const r = run('warning-only.ttl', '--shapes', 'shapes');
  assert.equal(r.code, 0);
  assert.match(r.stdout, /^Conforms: 0 violations, 1 warning, 0 infos\.$/m);
  assert.match(
    r.stdout,
    /^ {2}Warning: <https:\/\/concordance\.example\.org\/link-3> prov:wasDerivedFrom: a link should cite/m,
  );
});

test('an unparsable file exits 2 naming file and line', () => {
  const r = run('unparsable.ttl', '--shapes', 'shapes');
  assert.equal(r.code, 2);
  assert.equal(r.stdout, '');
  assert.match(r.stderr, /^unparsable\.ttl:6: Turtle syntax error: /);
});

test('a missing data file exits 2', () => {
  const r = run('no-such-file.nt', '--shapes', 'shapes');
  assert.equal(r.code, 2);
  assert.match(r.stderr, /^no-such-file\.nt: cannot read file/);
});

test('JSON-LD input is validated like Turtle', () => {
  const r = run('link.jsonld', '--shapes', 'shapes');
  assert.equal(r.code, 1);
  assert.match(
    r.stdout,
    /^ {2}Violation: <https:\/\/concordance\.example\.org\/link-5> cx:score: score: one decimal in \[0,1\] \(value "1\.20"\^\^xsd:decimal\)$/m,
  );
});

test('named graphs of TriG and N-Quads input are validated as one data graph', () => {
  const r = run('graphs.trig', 'link.nq', '--shapes', 'shapes');
  assert.equal(r.code, 1);
  assert.match(r.stdout, /^Does not conform: 1 violation, 1 warning, 0 infos\.$/m);
  assert.match(
    r.stdout,
    /^ {2}Violation: <https:\/\/concordance\.example\.org\/link-7> cx:subjectWork: a link names exactly one subject work \(value "not an IRI"\)$/m,
  );
  assert.match(r.stdout, /^ {2}Warning: <https:\/\/concordance\.example\.org\/link-6> prov:wasDerivedFrom: /m);
});

test('several files are merged into one data graph', () => {
  const r = run('conforming.ttl', 'warning-only.ttl', '--shapes', 'shapes');
  assert.equal(r.code, 0);
  assert.match(r.stdout, /^Validated 2 files \(14 triples\)/m);
  assert.match(r.stdout, /1 warning/);
});

test('--json prints counts and results as JSON', () => {
  const r = run('violating.ttl', '--shapes', 'shapes', '--json');
  assert.equal(r.code, 1);
  const out = JSON.parse(r.stdout);
  assert.equal(out.conforms, false);
  assert.equal(out.violations, 2);
  assert.deepEqual(
    out.results.map((x: { path: string }) => x.path),
    [`<${iri('cx', 'objectWork')}>`, `<${iri('cx', 'score')}>`],
  );
  assert.deepEqual(
    out.results.map((x: { component: string }) => x.component),
    [iri('sh', 'MinCountConstraintComponent'), iri('sh', 'MaxInclusiveConstraintComponent')],
  );
});

test('--report writes the same Turtle report bytes on every run', async () => {
  const a = join(tmp, 'a.ttl');
  const b = join(tmp, 'b.ttl');
  assert.equal(run('violating.ttl', 'warning-only.ttl', '--shapes', 'shapes', '--report', a).code, 1);
  assert.equal(run('violating.ttl', 'warning-only.ttl', '--shapes', 'shapes', '--report', b).code, 1);
  assert.equal(readFileSync(a, 'utf8'), readFileSync(b, 'utf8'));
  const store = new N3.Store(await readRdfFile(a));
  assert.equal(store.getSubjects(iri('rdf', 'type'), iri('sh', 'ValidationReport'), null).length, 1);
  assert.equal(store.getObjects(null, iri('sh', 'result'), null).length, 3);
  // SHACL §3.6.1.1: sh:conforms is false when any result exists, warnings included.
  assert.equal(store.getObjects(null, iri('sh', 'conforms'), null)[0].value, 'false');
});

test('a shapes folder without .ttl files exits 2 with a clear message', () => {
  const empty = join(tmp, 'empty-shapes');
  mkdirSync(empty);
  const r = run('conforming.ttl', '--shapes', empty);
  assert.equal(r.code, 2);
  assert.match(r.stderr, /the shapes folder has no \.ttl file/);
});

test('--shacl-engine rdf-validate-shacl writes the same report bytes as the built-in engine', () => {
  const builtin = join(tmp, 'builtin.ttl');
  const reference = join(tmp, 'reference.ttl');
  assert.equal(run('violating.ttl', 'warning-only.ttl', '--shapes', 'shapes', '--report', builtin).code, 1);
  assert.equal(
    run(
      'violating.ttl',
      'warning-only.ttl',
      '--shapes',
      'shapes',
      '--report',
      reference,
      '--shacl-engine',
      'rdf-validate-shacl',
    ).code,
    1,
  );
  assert.equal(readFileSync(reference, 'utf8'), readFileSync(builtin, 'utf8'));
  const bad = run('violating.ttl', '--shapes', 'shapes', '--shacl-engine', 'fastest');
  assert.equal(bad.code, 2, 'a usage error');
  assert.match(bad.stderr, /argument 'fastest' is invalid\. Allowed choices are builtin, rdf-validate-shacl/);
});

test('a JSON-LD document above the bounded-memory limit is refused naming the limit and what to do instead', async () => {
  const { streamDataFiles } = await import('../src/validate/files.js');
  let quads = 0;
  await assert.rejects(
    streamDataFiles([join(fixtures, 'link.jsonld')], () => quads++, 100),
    (err: Error & { problems: Array<{ file: string; hint: string }> }) => {
      assert.match(err.message, /JSON-LD document is read whole.*above the 0\.0 MiB/);
      assert.match(err.problems[0].hint, /N-Quads/);
      assert.equal(err.problems[0].file, join(fixtures, 'link.jsonld'));
      return true;
    },
  );
  assert.equal(quads, 0);
  await streamDataFiles([join(fixtures, 'link.jsonld')], () => quads++);
  assert.ok(quads > 0);
});

test('clean up', () => rmSync(tmp, { recursive: true, force: true }));
