// The output format table → what is derived from it: readers, dump files written, DCAT distributions; and the build
// summary's predicates, taken from the vocab map the release was written with.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import { build } from '../src/pipeline.js';
import { DUMP_FORMATS, FORMATS } from '../src/rdf/formats.js';
import { READ_FORMATS } from '../src/rdf/read.js';
import { releaseSummary, releaseSummaryText } from '../src/cli/build-summary.js';
import { iri } from '../src/namespaces.js';
import { fixtureCopy, json, repoRoot, tempDir } from './helpers/fixture.js';

const tmp = tempDir('concordat-formats-');
after(() => rmSync(tmp, { recursive: true, force: true }));

test('every format of the table is readable by its extension, under its own label', () => {
  assert.deepEqual(
    Object.keys(READ_FORMATS).sort(),
    Object.values(FORMATS)
      .map((f) => f.extension)
      .sort(),
  );
  for (const f of Object.values(FORMATS)) {
    assert.equal(READ_FORMATS[f.extension].name, f.label);
    assert.equal(READ_FORMATS[f.extension].n3Format === null, f.reader === 'jsonld', f.label);
  }
  // every dump format has a writer; DCAT 3 §6.8 dcat:mediaType as an IANA media-type IRI
  for (const f of DUMP_FORMATS) {
    assert.ok(FORMATS[f].writer, f);
    assert.equal(FORMATS[f].mediaTypeIri, `https://www.iana.org/assignments/media-types/${FORMATS[f].mediaType}`);
  }
});

const project = fixtureCopy('load/base', {
  'concordance.json': json((o) => {
    o.vocabMap = path.join(repoRoot, 'vocab-map', 'exactMatch.json');
  }),
});
const r = await build(path.join(project, 'concordance.json'), path.join(tmp, 'release'), { validate: false });

test('the release holds one file per dump format and stem, and dataset.ttl lists exactly those with their media types', () => {
  const stems = ['concordance', ...r.model.project.partners.map((p) => `partners/${p.key}`)];
  const expected = stems.flatMap((s) => DUMP_FORMATS.map((f) => `${s}${FORMATS[f].extension}`)).sort();
  const written = (readdirSync(r.outDir, { recursive: true }) as string[])
    .map((f) => f.split(path.sep).join('/'))
    .filter((f) => /^(concordance|partners\/)/.test(f) && f !== 'partners')
    .sort();
  assert.deepEqual(written, expected);
  const ds = new N3.Parser().parse(readFileSync(path.join(r.outDir, 'dataset.ttl'), 'utf8'));
  const media = new Map(
    ds.filter((q) => q.predicate.value === iri('dcat', 'mediaType')).map((q) => [q.subject.value, q.object.value]),
  );
  const url = new Map(
    ds.filter((q) => q.predicate.value === iri('dcat', 'downloadURL')).map((q) => [q.subject.value, q.object.value]),
  );
  const listed = [...url]
    .map(([d, u]) => [u.slice(u.indexOf('/releases/') + '/releases/'.length).replace(/^[^/]+\//, ''), media.get(d)])
    .sort();
  const byExt = new Map(DUMP_FORMATS.map((f) => [FORMATS[f].extension, FORMATS[f].mediaTypeIri]));
  assert.deepEqual(
    listed,
    expected.map((f) => [f, byExt.get(path.extname(f))]),
  );
});

test('with the exactMatch vocab map the summary names skos:exactMatch, the predicate the release holds, and no owl:sameAs', () => {
  const s = releaseSummary(r);
  const nq = readFileSync(path.join(r.outDir, 'concordance.nq'), 'utf8');
  assert.ok(nq.includes(`<${iri('skos', 'exactMatch')}>`));
  assert.ok(!nq.includes(`<${iri('owl', 'sameAs')}>`));
  assert.equal(s.example?.predicate, 'skos:exactMatch');
  assert.ok(s.claimTriples['skos:exactMatch'] > 0);
  assert.ok(!('owl:sameAs' in s.claimTriples));
  assert.doesNotMatch(releaseSummaryText(s, 'out'), /owl:sameAs/);
});
