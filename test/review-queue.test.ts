// review-queue.csv of the demo release against the release's own RDF: link IRI, kind, status, image pairs with their
// scores, view URLs from a partner's imageView template, record pages.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import { build } from '../src/pipeline.js';
import { readCsv } from '../src/io/csv-read.js';
import { readRdfFile } from '../src/rdf/read.js';
import { REVIEW_HEADER, PAIRS_LISTED } from '../src/report/index.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const CX = 'https://w3id.org/concordat/vocab#';
const tmp = tempDir('concordat-queue-');
const project = path.join(tmp, 'demo', 'concordance.json');
const release = path.join(tmp, 'release');
const VIEW = 'https://vellmar.example.org/viewer/{work}/{image}?size=full';

const built = (async () => {
  cpSync(path.join(repoRoot, 'demo-data'), path.join(tmp, 'demo'), {
    recursive: true,
    filter: (f) => !f.includes(`${path.sep}releases`),
  });
  const p = JSON.parse(readFileSync(project, 'utf8'));
  for (const x of p.partners as { key: string; imageView?: string }[]) {
    if (x.key === 'vellmar') x.imageView = VIEW;
    else delete x.imageView; // only one partner with a template here: the others must show no views
  }
  writeFileSync(project, JSON.stringify(p, null, 2));
  await build(project, release);
  const rows: Record<string, string>[] = [];
  let header: string[] | undefined;
  for await (const r of readCsv(path.join(release, 'review-queue.csv'), ',')) {
    if (!header) header = r.fields;
    else rows.push(Object.fromEntries(header.map((h, i) => [h, r.fields[i]])));
  }
  const store = new N3.Store(await readRdfFile(path.join(release, 'concordance.nq')));
  return { header: header!, rows, store };
})();

const one = (store: N3.Store, s: string, p: string) =>
  store.getObjects(N3.DataFactory.namedNode(s), N3.DataFactory.namedNode(p), null).map((o) => o.value);

test('the queue header: decisions columns with decided_on, then link, kind, status, image pairs, datings and pages', async () => {
  const header: string[] = (await built).header;
  assert.deepEqual([...header], [...REVIEW_HEADER]);
  assert.deepEqual(header.slice(0, 6), ['work_a', 'work_b', 'verdict', 'curator', 'decided_on', 'note']);
  for (const c of [
    'link',
    'kind',
    'status',
    'score',
    'confidence',
    'images_a',
    'images_b',
    'views_a',
    'views_b',
    'pair_scores',
    'pair_overlaps',
    'dating_a',
    'dating_b',
    'page_a',
    'page_b',
  ])
    assert.ok(header.includes(c), c);
  assert.ok(!header.includes('date') && !header.includes('date_a'), 'no column a person could take for another date');
});

test("each queued link is the release's cx:Link with that kind and status; its image pairs are its image matches with their scores", async () => {
  const { rows, store } = await built;
  const withLink = rows.filter((r) => r.link);
  assert.ok(withLink.length > 50, `${withLink.length} rows with a link`);
  for (const r of withLink) {
    assert.deepEqual(
      one(store, r.link, `${CX}status`),
      [`${CX}${r.status[0].toUpperCase()}${r.status.slice(1)}`],
      r.link,
    );
    assert.deepEqual(one(store, r.link, `${CX}kind`), [`${CX}${r.kind[0].toUpperCase()}${r.kind.slice(1)}`], r.link);
    // the link confidence the release publishes (cx:confidence), as the queue shows it (4 decimals)
    const confidence = one(store, r.link, `${CX}confidence`);
    assert.equal(r.confidence, confidence.length ? String(Math.round(Number(confidence[0]) * 1e4) / 1e4) : '', r.link);
    const works = [...one(store, r.link, `${CX}subjectWork`), ...one(store, r.link, `${CX}objectWork`)];
    const pages = works.map((w) => one(store, w, 'http://xmlns.com/foaf/0.1/page')[0]);
    assert.deepEqual([r.page_a, r.page_b].sort(), pages.sort(), "both records' pages");
    const matches = one(store, r.link, 'http://www.w3.org/ns/prov#wasDerivedFrom').map((m) => ({
      images: [one(store, m, `${CX}sourceImage`)[0], one(store, m, `${CX}targetImage`)[0]].sort().join(' '),
      score: Number(one(store, m, `${CX}score`)[0]),
    }));
    const [ia, ib, sc] = [r.images_a.split('\n'), r.images_b.split('\n'), r.pair_scores.split('\n')];
    assert.equal(ia.length, Math.min(Number(r.support), PAIRS_LISTED));
    assert.equal(ib.length, ia.length);
    assert.equal(sc.length, ia.length);
    ia.forEach((a, i) => {
      const m = matches.find((x) => x.images === [a, ib[i]].sort().join(' '));
      assert.ok(m, `${a} ~ ${ib[i]} is an image match of ${r.link}`);
      assert.equal(Number(sc[i]), Math.round(m!.score * 1e4) / 1e4);
    });
    assert.deepEqual(
      sc.map(Number),
      [...sc.map(Number)].sort((x, y) => y - x),
      'best pair first',
    );
  }
});

test("view URLs come from the partner's imageView template, one per listed image, on the side of that partner only", async () => {
  const { rows } = await built;
  let seen = 0;
  for (const r of rows) {
    for (const side of ['a', 'b'] as const) {
      const work = r[`work_${side}`];
      const views = r[`views_${side}`];
      if (!work.startsWith('vellmar:')) {
        assert.equal(views, '', 'no template, no view');
        continue;
      }
      if (!r[`images_${side}`]) continue;
      const images = r[`images_${side}`].split('\n');
      const expected = images.map(
        (iri) =>
          `https://vellmar.example.org/viewer/${encodeURIComponent(work.slice('vellmar:'.length)).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)}/${iri.slice('https://vellmar.example.org/id/photo/'.length)}?size=full`,
      );
      assert.deepEqual(views.split('\n'), expected);
      seen++;
    }
  }
  assert.ok(seen > 10, `${seen} rows with vellmar views`);
});
