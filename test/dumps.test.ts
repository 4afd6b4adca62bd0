// The demo's two releases (the second with history against the first) → the dumps as publishers ship them, checked from
// outside: one Turtle block per subject, read by rapper and rdflib with the N-Quads' triple count.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import { build } from '../src/pipeline.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { distinctCount, merged, ourQuads, rapper, rapperRead, rdflibPython, rdflibRead } from './helpers/external-rdf.js';
import { requires } from './helpers/requires.js';

const tmp = tempDir('concordat-dumps-');
after(() => rmSync(tmp, { recursive: true, force: true }));
const r1 = await build(path.join(repoRoot, 'demo-data', 'concordance.json'), path.join(tmp, 'r1'));
const r2 = await build(path.join(repoRoot, 'demo-data', 'release-2', 'concordance.json'), path.join(tmp, 'r2'), { previous: r1.outDir });
const releases = { first: r1.outDir, second: r2.outDir };
const stems = (r: typeof r1) => ['concordance', ...r.model.project.partners.map((p) => `partners/${p.key}`)];

/**
 * The subject of each block of a Turtle file as we write it: a statement starts in column 0 with its subject (a
 * prefixed name or an IRIREF, never holding a space), its other lines are indented, and a blank line follows it.
 */
function blocks(ttl: string): { subjects: string[]; unseparated: number } {
  const lines = ttl.split('\n');
  const subjects: string[] = [];
  let unseparated = 0;
  lines.forEach((line, i) => {
    if (line === '' || line.startsWith(' ') || line.startsWith('@prefix ')) return;
    subjects.push(line.slice(0, line.indexOf(' ')));
    if (i > 0 && lines[i - 1] !== '') unseparated++;
  });
  return { subjects, unseparated };
}

for (const [name, dir] of Object.entries(releases))
  test(`${name} release: every Turtle file gives each subject one block, blank lines between blocks (Turtle §2.3 predicate lists)`, () => {
    const r = name === 'first' ? r1 : r2;
    const files = [...stems(r).map((s) => `${s}.ttl`), 'dataset.ttl', ...(name === 'second' ? ['changes.ttl'] : [])];
    for (const f of files) {
      const text = readFileSync(path.join(dir, f), 'utf8');
      const { subjects, unseparated } = blocks(text);
      const repeated = subjects.filter((s, i) => subjects.indexOf(s) !== i);
      assert.deepEqual(repeated, [], `${f}: subjects with more than one block`);
      assert.equal(unseparated, 0, `${f}: blocks without a blank line before them`);
      // the blocks are the subjects the file holds (n3 reads the same set of subjects)
      const parsed = new N3.Parser().parse(text);
      assert.equal(subjects.length, new Set(parsed.map((q) => q.subject.value)).size, f);
    }
  });

// Two independent readers of the grouped Turtle: rapper (Debian raptor2-utils) and rdflib (Debian python3-rdflib) count
// the triples the N-Quads dump holds (RDF 1.1 Concepts §3: the merged graph).
const noRapper = requires(rapper, 'rapper is not installed (Debian raptor2-utils; .ci/run installs it)');
const noRdflib = requires(rdflibPython, 'python3-rdflib is not installed (Debian package; .ci/run installs it)');
test('rapper reads the grouped Turtle of the second release with the N-Quads triple count', { skip: noRapper }, async () => {
  for (const s of stems(r2)) {
    const nq = await ourQuads(path.join(r2.outDir, `${s}.nq`));
    assert.equal(rapperRead(path.join(r2.outDir, `${s}.ttl`)).count, nq.length, s);
  }
});
test('rdflib reads the grouped Turtle of the second release with the N-Quads triple count', { skip: noRdflib }, async () => {
  const files = stems(r2).map((s) => path.join(r2.outDir, `${s}.ttl`));
  const read = rdflibRead(files);
  for (const s of stems(r2)) {
    const nq = await ourQuads(path.join(r2.outDir, `${s}.nq`));
    assert.equal(read[path.join(r2.outDir, `${s}.ttl`)].count, distinctCount(merged(nq)), s);
  }
});
