// The demo's two releases (the second with history against the first) → the dumps as publishers ship them, checked from
// outside: one Turtle block per subject, read by rapper and rdflib with the N-Quads' triple count; gzip copies that
// decompress to the plain bytes; byte sizes and compression in the DCAT description; integers as JSON numbers.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, rmSync, statSync } from 'node:fs';
import { gunzipSync, gzipSync } from 'node:zlib';
import { createHash } from 'node:crypto';
import path from 'node:path';
import N3 from 'n3';
import { build } from '../src/pipeline.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import { iri } from '../src/namespaces.js';
import { COMPRESSIONS, DUMP_FORMATS, FORMATS } from '../src/rdf/formats.js';
import {
  distinctCount,
  merged,
  ourQuads,
  rapper,
  rapperRead,
  rdflibJsonLd,
  rdflibPython,
  rdflibRead,
} from './helpers/external-rdf.js';
import { isomorphic } from './helpers/isomorphic.js';
import { requires } from './helpers/requires.js';
import { validate } from '../src/validate/shacl.js';
import { defaultShapesDir, loadShapesFolder } from '../src/validate/files.js';

const tmp = tempDir('concordat-dumps-');
after(() => rmSync(tmp, { recursive: true, force: true }));
const r1 = await build(path.join(repoRoot, 'demo-data', 'concordance.json'), path.join(tmp, 'r1'));
const r2 = await build(path.join(repoRoot, 'demo-data', 'release-2', 'concordance.json'), path.join(tmp, 'r2'), {
  previous: r1.outDir,
});
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
test(
  'rapper reads the grouped Turtle of the second release with the N-Quads triple count',
  { skip: noRapper },
  async () => {
    for (const s of stems(r2)) {
      const nq = await ourQuads(path.join(r2.outDir, `${s}.nq`));
      assert.equal(rapperRead(path.join(r2.outDir, `${s}.ttl`)).count, nq.length, s);
    }
  },
);
test(
  'rdflib reads the grouped Turtle of the second release with the N-Quads triple count',
  { skip: noRdflib },
  async () => {
    const files = stems(r2).map((s) => path.join(r2.outDir, `${s}.ttl`));
    const read = rdflibRead(files);
    for (const s of stems(r2)) {
      const nq = await ourQuads(path.join(r2.outDir, `${s}.nq`));
      assert.equal(read[path.join(r2.outDir, `${s}.ttl`)].count, distinctCount(merged(nq)), s);
    }
  },
);

test(
  "rdflib's JSON-LD parser reads the second release's JSON-LD dumps as their N-Quads, graph by graph",
  { skip: noRdflib || (!rdflibJsonLd && 'this rdflib has no JSON-LD parser plugin') },
  async () => {
    const read = rdflibRead(stems(r2).map((s) => path.join(r2.outDir, `${s}.jsonld`)));
    for (const s of stems(r2)) {
      const nq = await ourQuads(path.join(r2.outDir, `${s}.nq`));
      const theirs = read[path.join(r2.outDir, `${s}.jsonld`)].quads;
      const graphs = (qs: N3.Quad[]) => [...new Set(qs.map((q) => q.graph.value))].sort();
      assert.deepEqual(graphs(theirs), graphs(nq), s);
      for (const g of graphs(nq))
        assert.ok(
          await isomorphic(
            theirs.filter((q) => q.graph.value === g),
            nq.filter((q) => q.graph.value === g),
          ),
          `${s}: graph ${g}`,
        );
    }
  },
);

// ------------------------------------------------------------------ gzip copies and the DCAT description of the files
const g1 = await build(path.join(repoRoot, 'demo-data', 'concordance.json'), path.join(tmp, 'g1'), {
  gzip: true,
  validate: false,
});
const g2 = await build(path.join(repoRoot, 'demo-data', 'concordance.json'), path.join(tmp, 'g2'), {
  gzip: true,
  validate: false,
});
const dumpFiles = stems(g1).flatMap((s) => DUMP_FORMATS.map((f) => `${s}${FORMATS[f].extension}`));

test('each .gz dump decompresses to the plain dump byte for byte; the header holds no name and no time (RFC 1952 §2.3.1)', () => {
  for (const f of dumpFiles) {
    const gz = readFileSync(path.join(g1.outDir, `${f}.gz`));
    const plain = readFileSync(path.join(g1.outDir, f));
    assert.ok(gunzipSync(gz).equals(plain), f);
    // written in the same pass as the plain file, yet the bytes zlib gives for the finished file
    assert.ok(gz.equals(gzipSync(plain)), `${f}: same bytes as compressing the finished file`);
    assert.deepEqual([...gz.subarray(0, 3)], [0x1f, 0x8b, 8], `${f}: gzip magic and deflate`);
    assert.equal(gz[3] & 0x08, 0, `${f}: FLG.FNAME unset`);
    assert.equal(gz.readUInt32LE(4), 0, `${f}: MTIME 0`);
  }
});

test('two gzip builds give byte-identical .gz files, listed in SHA256SUMS with their hashes', () => {
  const sums = (d: string) => readFileSync(path.join(d, 'SHA256SUMS'), 'utf8');
  assert.equal(sums(g1.outDir), sums(g2.outDir));
  for (const f of dumpFiles) {
    const hash = createHash('sha256')
      .update(readFileSync(path.join(g1.outDir, `${f}.gz`)))
      .digest('hex');
    assert.ok(sums(g1.outDir).split('\n').includes(`${hash}  ${f}.gz`), `${f}.gz`);
  }
});

test('dataset.ttl gives every file its dcat:byteSize; the .gz distributions add dcat:compressFormat gzip (DCAT 3 §6.8)', () => {
  const ds = new N3.Store(new N3.Parser().parse(readFileSync(path.join(g1.outDir, 'dataset.ttl'), 'utf8')));
  const one = (s: N3.Term, p: string) => ds.getObjects(s, N3.DataFactory.namedNode(p), null).map((o) => o.value);
  const dists = ds.getSubjects(
    N3.DataFactory.namedNode(iri('rdf', 'type')),
    N3.DataFactory.namedNode(iri('dcat', 'Distribution')),
    null,
  );
  assert.equal(dists.length, dumpFiles.length * 2);
  for (const d of dists) {
    const [url] = one(d, iri('dcat', 'downloadURL'));
    const file = [...dumpFiles, ...dumpFiles.map((f) => `${f}.gz`)].find((f) => url.endsWith(`/${f}`))!;
    assert.ok(file, url);
    const [size] = ds.getObjects(d, N3.DataFactory.namedNode(iri('dcat', 'byteSize')), null) as N3.Literal[];
    assert.equal(size.datatype.value, iri('xsd', 'nonNegativeInteger'));
    assert.equal(Number(size.value), statSync(path.join(g1.outDir, file)).size, file);
    const inner = file.replace(/\.gz$/, '');
    assert.deepEqual(
      one(d, iri('dcat', 'mediaType')),
      [Object.values(FORMATS).find((f) => inner.endsWith(f.extension))!.mediaTypeIri],
      file,
    );
    assert.deepEqual(
      one(d, iri('dcat', 'compressFormat')),
      file.endsWith('.gz') ? ['https://www.iana.org/assignments/media-types/application/gzip'] : [],
      file,
    );
  }
});

test('dataset.ttl of a gzip build conforms to the shipped shapes; a wrong byte size or compression is caught', async () => {
  const shapes = (await loadShapesFolder(defaultShapesDir())).quads;
  const text = readFileSync(path.join(g1.outDir, 'dataset.ttl'), 'utf8');
  const { quad, literal, namedNode } = N3.DataFactory;
  const parsed = new N3.Parser().parse(text);
  assert.deepEqual((await validate(parsed, shapes)).results, []);
  // DCAT 3 §6.8: byte size as xsd:nonNegativeInteger, compression format as an IANA media type IRI
  const gzipIri = COMPRESSIONS.gzip.mediaTypeIri;
  let sizes = 0;
  let formats = 0;
  const damaged = parsed.map((q) => {
    if (q.predicate.value === iri('dcat', 'byteSize') && sizes++ === 0)
      return quad(q.subject, q.predicate, literal(q.object.value, namedNode(iri('xsd', 'decimal'))), q.graph);
    if (q.predicate.value === iri('dcat', 'compressFormat') && q.object.value === gzipIri && formats++ === 0)
      return quad(q.subject, q.predicate, literal('gzip'), q.graph);
    return q;
  });
  const found = (await validate(damaged, shapes)).results.map((r) => r.sourceShape.replace(/^.*#/, ''));
  assert.deepEqual([...new Set(found)].sort(), ['Distribution-byteSize', 'Distribution-compressFormat']);
});

test('the JSON-LD dump writes canonical xsd:integer values as JSON numbers and decimals as strings', () => {
  const doc = JSON.parse(readFileSync(path.join(g1.outDir, 'concordance.jsonld'), 'utf8'));
  const found = { support: new Set<string>(), score: new Set<string>() };
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object')
      for (const [k, x] of Object.entries(v)) {
        if (k === 'support' || k === 'score') found[k].add(typeof x);
        walk(x);
      }
  };
  walk(doc['@graph']); // the nodes, not the context's term definitions
  assert.deepEqual([...found.support], ['number']);
  assert.deepEqual([...found.score], ['string']);
});
