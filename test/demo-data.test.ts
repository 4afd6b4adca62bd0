// Demo scenario files → checks: the seeded generator reproduces them byte for byte, and they honour the input contract.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseString } from 'fast-csv';
import { generateDemo } from '../demo-data/generate.js';
import { tempDir } from './helpers/fixture.js';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DEMO = path.join(ROOT, 'demo-data');

type Row = Record<string, string>;

/** Reads a CSV/TSV with a general-purpose parser (BOM stripped), rows keyed by header. */
function readCsv(file: string, delimiter = ','): Promise<Row[]> {
  const text = readFileSync(file, 'utf8').replace(/^\uFEFF/, '');
  return new Promise((resolve, reject) => {
    const rows: Row[] = [];
    parseString<Row, Row>(text, { headers: true, delimiter })
      .on('error', reject)
      .on('data', (r: Row) => rows.push(r))
      .on('end', () => resolve(rows));
  });
}

interface Partner {
  key: string;
  centuryConvention?: string;
  catalogue: { file: string; delimiter: string; columns: Record<string, string> };
}
interface Project {
  partners: Partner[];
  evidence: { file: string; run: Record<string, unknown> }[];
  decisions: string[];
  gold: string;
  policy: Record<string, unknown>;
  previous?: string;
  license: string;
}

/** One release's inputs, read back through its project file. */
async function loadRelease(projectFile: string) {
  const dir = path.dirname(projectFile);
  const project = JSON.parse(readFileSync(projectFile, 'utf8')) as Project;
  const images = new Map<string, string>(); // partner:image → partner:work
  const works = new Map<string, Row[]>();
  const catalogues = new Map<string, Row[]>();
  for (const p of project.partners) {
    const rows = await readCsv(path.join(dir, p.catalogue.file), p.catalogue.delimiter);
    catalogues.set(p.key, rows);
    const cols = p.catalogue.columns;
    for (const r of rows) {
      const img = `${p.key}:${r[cols.image]}`,
        work = `${p.key}:${r[cols.work]}`;
      assert.ok(!images.has(img), `image ${img} listed twice`);
      images.set(img, work);
      works.set(work, [...(works.get(work) ?? []), r]);
    }
  }
  const evidence = (await Promise.all(project.evidence.map((e) => readCsv(path.join(dir, e.file))))).flat();
  const decisions = (await Promise.all(project.decisions.map((f) => readCsv(path.join(dir, f))))).flat();
  const gold = await readCsv(path.join(dir, project.gold));
  /** Best score per unordered work pair. */
  const best = new Map<string, number>();
  for (const e of evidence) {
    const k = [images.get(e.image_a), images.get(e.image_b)].sort().join('|');
    best.set(k, Math.max(best.get(k) ?? 0, Number(e.score)));
  }
  return { project, images, works, catalogues, evidence, decisions, gold, best };
}

const pairKey = (a: string, b: string): string => [a, b].sort().join('|');
const answerKey = (rel: string) => JSON.parse(readFileSync(path.join(DEMO, rel), 'utf8'));

test('the generator reproduces the committed demo files byte for byte', () => {
  const out = tempDir('concordat-demo-');
  try {
    const written = generateDemo(out);
    assert.ok(written.includes('concordance.json') && written.includes('release-2/concordance.json'));
    for (const rel of written) {
      assert.ok(
        readFileSync(path.join(out, rel)).equals(readFileSync(path.join(DEMO, rel))),
        `${rel} differs from the committed file`,
      );
    }
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
});

test('release 1 follows the input contract', async () => {
  const r = await loadRelease(path.join(DEMO, 'concordance.json'));
  assert.equal(r.project.partners.length, 3);
  assert.equal(r.project.previous, undefined);
  assert.ok(
    ['https://creativecommons.org/publicdomain/zero/1.0/', 'https://creativecommons.org/licenses/by/4.0/'].includes(
      r.project.license,
    ),
  );
  assert.deepEqual(r.project.policy, { proposeAt: 0.5, autoConfirmAt: null, partOverlapBelow: 0.7, minOverlap: 0.3 });
  for (const e of r.project.evidence)
    for (const f of ['id', 'software', 'version', 'started', 'parameters']) assert.ok(f in e.run, f);
  assert.deepEqual(
    new Set(r.project.partners.map((p) => p.centuryConvention ?? 'unknown')),
    new Set(['ordinal', 'iso', 'unknown']),
  );
  assert.ok(r.works.size >= 150 && r.works.size <= 300, `${r.works.size} works`);
  for (const e of r.evidence) {
    assert.ok(r.images.has(e.image_a) && r.images.has(e.image_b), `unknown image in ${e.image_a},${e.image_b}`);
    assert.notEqual(e.image_a, e.image_b);
    const score = Number(e.score);
    assert.ok(e.score !== '' && score >= 0 && score <= 1, `score ${e.score}`);
    assert.ok(e.overlap === '' || (Number(e.overlap) > 0 && Number(e.overlap) <= 1), `overlap ${e.overlap}`);
  }
  for (const d of r.decisions) {
    assert.ok(r.works.has(d.work_a) && r.works.has(d.work_b), `unknown work in ${d.work_a},${d.work_b}`);
    assert.ok(['same', 'part', 'related', 'distinct'].includes(d.verdict), d.verdict);
    assert.match(d.curator, /^(https:\/\/orcid\.org\/\d{4}-\d{4}-\d{4}-\d{3}[\dX]|[\p{L} .'-]+)$/u);
    assert.match(d.date, /^\d{4}-\d{2}-\d{2}(T\d{2}:\d{2}:\d{2}Z)?$/);
  }
  assert.ok(r.decisions.length >= 15 && r.decisions.length <= 30);
  const decided = r.decisions.map((d) => pairKey(d.work_a, d.work_b));
  assert.equal(decided.length - new Set(decided).size, 1, 'exactly one pair decided twice');
  assert.ok(r.gold.length >= 30 && r.gold.length <= 60);
  for (const g of r.gold)
    assert.ok(r.works.has(g.work_a) && r.works.has(g.work_b), `unknown work in gold ${g.work_a},${g.work_b}`);
});

test('release 1 catalogues carry the export habits and date forms of real archives', async () => {
  const r = await loadRelease(path.join(DEMO, 'concordance.json'));
  const raw = (p: Partner) => readFileSync(path.join(DEMO, p.catalogue.file), 'utf8');
  const texts = r.project.partners.map(raw);
  assert.deepEqual(r.project.partners.map((p) => p.catalogue.delimiter).sort(), ['\t', ',', ';'].sort());
  assert.ok(
    texts.some((t) => t.startsWith('\uFEFF') && t.includes('\r\n')),
    'one export has a BOM and CRLF',
  );
  const titles = r.project.partners.flatMap((p) =>
    r.catalogues.get(p.key)!.map((row) => ({ p, title: row[p.catalogue.columns.title] })),
  );
  assert.ok(
    titles.some(({ title }) => title.includes('\n')),
    'a title spans two lines',
  );
  assert.ok(
    titles.some(({ title }) => title.includes('"')),
    'a title holds quotes',
  );
  assert.ok(
    titles.some(({ p, title }) => p.catalogue.delimiter !== '\t' && title.includes(p.catalogue.delimiter)),
    "a title holds its file's delimiter",
  );
  const ids = [...r.images.keys(), ...r.works.keys()];
  for (const re of [/ /, /\//, /[À-ÿ]/])
    assert.ok(
      ids.some((id) => re.test(id.split(':')[1])),
      `an ID matching ${re}`,
    );

  const dates = r.project.partners.flatMap((p) => r.catalogues.get(p.key)!.map((row) => row[p.catalogue.columns.date]));
  // English at Vellmar, German at Kessling, French at Fontclaire, EDTF at Kessling
  const forms: [string, RegExp][] = [
    ['year', /^\d{4}$/],
    ['ca.', /^ca\. \d{4}$/],
    ['late century', /^late 15th century$/],
    ['century', /^1\dth century$/],
    ['um', /^um \d{4}$/],
    ['bis', /^\d{4} bis \d{4}$/],
    ['Jh.', /^1\d\. Jh\.$/],
    ['vers', /^vers \d{4}$/],
    ['entre … et', /^entre \d{4} et \d{4}$/],
    ['siècle', /^X[IVX]+e siècle$/],
    ['s.', /^X[IVX]+e s\.$/],
    ['EDTF decade', /^\d{3}X$/],
    ['EDTF approximate', /^\d{4}~$/],
    ['EDTF interval', /^\d{4}\/\d{4}$/],
  ];
  for (const [name, re] of forms)
    assert.ok(
      dates.some((d) => re.test(d)),
      `date form ${name}`,
    );

  const vellmar = r.project.partners.find((p) => p.catalogue.columns.width)!;
  const { width, height } = vellmar.catalogue.columns;
  const small = r.catalogues.get(vellmar.key)!.filter((row) => Math.min(Number(row[width]), Number(row[height])) < 300);
  assert.ok(small.length >= 1 && small.length <= 10, `${small.length} small images`);

  // rows of one work agree on title everywhere, and on date except in exactly one work
  let disagreeing = 0;
  for (const p of r.project.partners) {
    const byWork = new Map<string, Row[]>();
    for (const row of r.catalogues.get(p.key)!)
      byWork.set(row[p.catalogue.columns.work], [...(byWork.get(row[p.catalogue.columns.work]) ?? []), row]);
    for (const rows of byWork.values()) {
      assert.equal(new Set(rows.map((x) => x[p.catalogue.columns.title])).size, 1);
      if (new Set(rows.map((x) => x[p.catalogue.columns.date])).size > 1) disagreeing++;
    }
  }
  assert.equal(disagreeing, 1);
});

test('release 1 evidence holds the difficulties its answer key names', async () => {
  const r = await loadRelease(path.join(DEMO, 'concordance.json'));
  const key = answerKey('answer-key.json');
  for (const c of key.chains) {
    assert.ok(r.best.get(pairKey(c.a, c.via))! >= 0.5 && r.best.get(pairKey(c.via, c.c))! >= 0.5);
    assert.equal(r.best.get(pairKey(c.a, c.c)), undefined, 'a chain has no direct link between its ends');
  }
  for (const b of key.bridges) {
    const s = r.best.get(pairKey(b.link[0], b.link[1]))!;
    // one photograph only: high enough to be published (confidence 2/3 × score ≥ 0.6, src/link/confidence.ts)
    assert.ok(s >= 0.9 && s < 0.96, `bridge score ${s}`);
  }
  for (const [a, b] of key.weak) assert.ok(r.best.get(pairKey(a, b))! < 0.5);
  for (const [a, b] of key.missed) assert.equal(r.best.get(pairKey(a, b)), undefined);
  const noise = r.evidence.filter((e) => Number(e.score) < 0.46).length;
  assert.ok(noise >= key.counts.noiseRows, `${noise} low-score rows`);
  assert.equal(r.works.size, key.counts.works);
  assert.equal(r.evidence.length, key.counts.evidenceRows);
});

test('release 2 adds a partner, reruns the matcher and changes clusters as its answer key says', async () => {
  const r1 = await loadRelease(path.join(DEMO, 'concordance.json'));
  const r2 = await loadRelease(path.join(DEMO, 'release-2', 'concordance.json'));
  const key = answerKey('release-2/answer-key.json');
  assert.equal(r2.project.partners.length, 4);
  assert.equal(r2.project.previous, '../releases/2026.1');
  assert.notEqual(r2.project.evidence[0].run.id, r1.project.evidence[0].run.id);
  const partnersSeen = new Set(r2.evidence.flatMap((e) => [e.image_a, e.image_b]).map((i) => i.split(':')[0]));
  assert.deepEqual([...partnersSeen].sort(), r2.project.partners.map((p) => p.key).sort());
  for (const e of r2.evidence) assert.ok(r2.images.has(e.image_a) && r2.images.has(e.image_b));
  for (const d of [...r2.decisions, ...r2.gold]) assert.ok(r2.works.has(d.work_a) && r2.works.has(d.work_b));
  for (const [a, b] of key.disappeared) {
    assert.ok(r1.best.get(pairKey(a, b))! >= 0.5 && r2.best.get(pairKey(a, b))! < 0.5, `${a} ~ ${b} should fade`);
  }
  const rerunLink = key.merges.find((m: { link?: string[] }) => m.link).link;
  assert.equal(r1.best.get(pairKey(rerunLink[0], rerunLink[1])), undefined);
  assert.ok(r2.best.get(pairKey(rerunLink[0], rerunLink[1]))! >= 0.5);
  const verdict = (a: string, b: string) =>
    r2.decisions.filter((d) => pairKey(d.work_a, d.work_b) === pairKey(a, b)).at(-1)?.verdict;
  for (const s of key.splits) assert.equal(verdict(s.link[0], s.link[1]), 'distinct');
  for (const [a, b] of key.confirmedFromProposed) {
    assert.ok(r1.best.get(pairKey(a, b))! >= 0.5);
    assert.equal(
      r1.decisions.find((d) => pairKey(d.work_a, d.work_b) === pairKey(a, b)),
      undefined,
    );
    assert.equal(verdict(a, b), 'same');
  }
  assert.equal(r2.works.size, key.counts.works);
});

test('the README counts match the answer keys', () => {
  const readme = readFileSync(path.join(DEMO, 'README.md'), 'utf8');
  for (const [rel, col] of [
    ['answer-key.json', 1],
    ['release-2/answer-key.json', 2],
  ] as const) {
    const counts = answerKey(rel).counts as Record<string, number>;
    for (const [name, n] of Object.entries(counts)) {
      const row = readme.split('\n').find((l) => l.startsWith(`| \`${name}\` |`));
      assert.ok(row, `README has a row for ${name}`);
      const cells = row.split('|').map((c) => c.trim());
      assert.equal(cells[cells.length - 2 - (2 - col)], String(n), `${name} in ${rel}`);
    }
  }
});
