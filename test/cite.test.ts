// concordat cite: claims with their evidence chain, checked against the input files; formats; not-found; --store.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { z } from 'zod';
import { build } from '../src/pipeline.js';
import { cite, CITE_FORMATS } from '../src/cite/index.js';
import { citationCsl } from '../src/cite/csl.js';
import { citationJsonLd } from '../src/cite/jsonld.js';
import { readCsv } from '../src/io/csv-read.js';
import { expandTemplate } from '../src/io/template.js';
import { loadProjectFile } from '../src/load/project.js';
import { readRdfFile } from '../src/rdf/read.js';
import { load } from '../src/load/index.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import jsonld from 'jsonld';

const project = path.join(repoRoot, 'demo-data', 'concordance.json');
const cli = path.join(repoRoot, 'dist', 'src', 'cli', 'main.js');
const tmp = tempDir('concordat-cite-');
const release = path.join(tmp, '2026.1');
const store = path.join(tmp, 'store');
const run = (...args: string[]) => spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });

const ready = (async () => {
  const r = await build(project, release);
  const loaded = run('load', release, '--store', store);
  assert.equal(loaded.status, 0, loaded.stderr);
  return r;
})();

async function rows(file: string, delimiter = ','): Promise<string[][]> {
  const out: string[][] = [];
  for await (const r of readCsv(file, delimiter)) out.push(r.fields);
  return out.slice(1);
}

test("a citation's image matches are exactly the evidence rows behind the link in the input files", async () => {
  const r = await ready;
  const p = loadProjectFile(project);
  const { model } = await load(project);
  const imageIri = new Map(p.partners.map((x) => [x.key, x.imageIri]));
  const workOfImage = (ref: string) => {
    const [key, id] = [ref.slice(0, ref.indexOf(':')), ref.slice(ref.indexOf(':') + 1)];
    const pi = p.partners.findIndex((x) => x.key === key);
    const w =
      model.images.work[
        model.images.id.findIndex((x, i) => x === id && model.works[model.images.work[i]].partner === pi)
      ];
    return `${key}:${model.works[w].id}`;
  };
  const iriOf = (ref: string) =>
    expandTemplate(imageIri.get(ref.slice(0, ref.indexOf(':')))!, { image: ref.slice(ref.indexOf(':') + 1) });
  const evidence = await rows(p.evidence[0].file);
  const published = r.links.links.filter((l) => l.status !== 'candidate' && l.support > 0);
  const sample = published.filter((_, i) => i % 9 === 0);
  assert.ok(sample.length >= 10);
  for (const l of sample) {
    const [a, b] = [
      `${p.partners[model.works[l.a].partner].key}:${model.works[l.a].id}`,
      `${p.partners[model.works[l.b].partner].key}:${model.works[l.b].id}`,
    ];
    const c = await cite(a, { release });
    const claim = c.claims.find((x) => [x.subject.ref, x.object.ref].sort().join('|') === [a, b].sort().join('|'));
    assert.ok(claim, `${a} – ${b} is cited`);
    const expected = new Set(
      evidence
        .filter(([x, y]) => [workOfImage(x), workOfImage(y)].sort().join('|') === [a, b].sort().join('|'))
        .map(
          ([x, y, score, overlap]) =>
            `${iriOf(x)} ${iriOf(y)} ${Number(Number(score).toFixed(6))} ${overlap === '' ? 1 : Number(Number(overlap).toFixed(6))}`,
        ),
    );
    const got = new Set(claim.matches.map((m) => `${m.source} ${m.target} ${m.score} ${m.overlap}`));
    assert.deepEqual([...got].sort(), [...expected].sort(), `${a} – ${b}`);
    for (const m of claim.matches) assert.equal(m.run, `${p.base}run/${p.evidence[0].run!.id}`);
    // the link confidence as the link stage computed it, never above the best score (src/evidence/README.md)
    assert.equal(claim.confidence, l.reliableSupport > 0 ? Number(l.confidence.toFixed(6)) : undefined, `${a} – ${b}`);
    if (claim.confidence !== undefined) assert.ok(claim.confidence <= claim.score!, `${a} – ${b}`);
  }
  const text = run(
    'cite',
    `${p.partners[0].key}:${r.model.works.find((w) => w.partner === 0)!.id}`,
    '--release',
    release,
  );
  assert.match(text.stdout, /best score [\d.]+, confidence [\d.]+\)/);
});

test('a curator-confirmed claim names the curator and date of the deciding row of the decisions file', async () => {
  await ready;
  const p = loadProjectFile(project);
  const decisions = await rows(p.decisions[0].file);
  const last = new Map<string, string[]>();
  for (const d of decisions) last.set([d[0], d[1]].sort().join('|'), d);
  const same = [...last.values()].filter((d) => d[2] === 'same').slice(0, 5);
  assert.ok(same.length > 0);
  for (const [a, b, , curator, date] of same) {
    const c = await cite(a, { release });
    const claim = c.claims.find((x) => [x.subject.ref, x.object.ref].sort().join('|') === [a, b].sort().join('|'))!;
    assert.equal(claim.status, 'confirmed');
    assert.equal(claim.review?.date, date);
    assert.ok(claim.review!.curator === curator || claim.review!.curatorName === curator, `${curator} named`);
    assert.equal(c.release.version, '2026.1');
    assert.equal(c.release.issued, '2026-11-30');
    assert.equal(c.release.license, p.license);
  }
});

test('a target the release does not hold: exit 1, a clear message and the nearest work references', () => {
  const r = run('cite', 'vellmar:VF 107', '--release', release);
  assert.equal(r.status, 1);
  assert.match(r.stderr, /holds no claim about vellmar:VF 107/);
  assert.match(r.stderr, /nearest: vellmar:VF 10\d\d/);
  const none = run('cite', 'nobody:zzz-unknown-999', '--release', release);
  assert.equal(none.status, 1);
  assert.doesNotMatch(none.stderr, /nearest/);
  assert.equal(run('cite', 'vellmar:VF 1047').status, 2, 'neither --release nor --store');
});

test('--store reads the embedded store folder and gives the same citation as --release', async () => {
  await ready;
  for (const format of ['text', 'markdown', 'csl-json'] as const) {
    const a = run('cite', 'vellmar:VF 1047', '--release', release, '--format', format);
    const b = run('cite', 'vellmar:VF 1047', '--store', store, '--format', format);
    assert.equal(a.status, 0, a.stderr);
    assert.equal(b.stdout, a.stdout, format);
  }
});

test('a cluster IRI cites exactly the links between its members; text has one sentence per claim', async () => {
  const r = await ready;
  const cl = r.clustering.clusters.find((c) => c.members.length >= 3)!;
  const c = await cite(`${r.model.project.base}work/${cl.id}`, { release });
  const published = Array.from(cl.links).filter((i) => r.links.links[i].status !== 'candidate');
  assert.ok(c.claims.length >= published.length);
  const members = new Set(
    Array.from(cl.members, (w) => `${r.model.project.partners[r.model.works[w].partner].key}:${r.model.works[w].id}`),
  );
  for (const x of c.claims) assert.ok(members.has(x.subject.ref) && members.has(x.object.ref));
  const text = await CITE_FORMATS.text(c);
  assert.equal(text.split('\nEvidence:\n').length - 1, c.claims.length);
  const md = await CITE_FORMATS.markdown(c);
  assert.equal(
    (md.match(/^\| <https:/gm) ?? []).length,
    c.claims.reduce((n, x) => n + x.matches.length, 0),
  );
});

test('--brief: no line per image match, each claim still names its link IRI and match count; runs and release once', async () => {
  const r = await ready;
  const cl = r.clustering.clusters.find((c) => c.members.length >= 3)!;
  const target = `${r.model.project.base}work/${cl.id}`;
  const full = run('cite', target, '--release', release);
  const brief = run('cite', target, '--release', release, '--brief');
  assert.equal(brief.status, 0, brief.stderr);
  const c = await cite(target, { release });
  assert.ok(c.claims.length >= 2 && c.claims.some((x) => x.matches.length > 1));
  assert.equal(
    (full.stdout.match(/^ {2}- image match: /gm) ?? []).length,
    c.claims.reduce((n, x) => n + x.matches.length, 0),
  );
  assert.equal((brief.stdout.match(/image match: /g) ?? []).length, 0);
  for (const x of c.claims) {
    assert.ok(brief.stdout.includes(`${x.support} image pair${x.support === 1 ? '' : 's'} <${x.link}>`), x.link);
    assert.ok(brief.stdout.includes(`on the evidence of ${x.matches.length} image match`), x.link);
  }
  assert.equal(brief.stdout.split('\nRuns and release:\n').length, 2);
  assert.equal((brief.stdout.match(/^ {2}- release: /gm) ?? []).length, 1);
  assert.equal((full.stdout.match(/^ {2}- release: /gm) ?? []).length, c.claims.length);
  const md = run('cite', target, '--release', release, '--brief', '--format', 'markdown').stdout;
  assert.equal((md.match(/^\| <https:/gm) ?? []).length, 0);
  assert.equal((md.match(/^## Runs and release$/gm) ?? []).length, 1);
  assert.ok(brief.stdout.length < full.stdout.length, `${brief.stdout.length} vs ${full.stdout.length}`);
});

test("JSON-LD output: every statement is in the release and the link's status is among them", async () => {
  await ready;
  const c = await cite('kessling:Inv. 10/2', { release });
  const doc = await citationJsonLd(c);
  const nq = (await jsonld.toRDF(doc, { format: 'application/n-quads' })) as unknown as string;
  const all = new Set(
    (await readRdfFile(path.join(release, 'concordance.nq'))).map(
      (q) => `${q.subject.value} ${q.predicate.value} ${q.object.value}`,
    ),
  );
  const lines = nq.trim().split('\n');
  assert.ok(lines.length > 10);
  const { default: N3 } = await import('n3');
  const quads = new N3.Parser({ format: 'application/n-quads' }).parse(nq);
  for (const q of quads)
    assert.ok(
      all.has(`${q.subject.value} ${q.predicate.value} ${q.object.value}`),
      `${q.subject.value} ${q.predicate.value}`,
    );
  assert.ok(quads.some((q) => q.subject.value === c.claims[0].link && q.predicate.value.endsWith('#status')));
});

// CSL-JSON schema: citation-style-language/schema, schemas/input/csl-data.json (the stored copy at commit 00412663),
// transcribed in part: the item types, `id` and `type` required, name and date variables as defined there, the
// string variables used here, `custom` an object, and no property outside the schema's variables.
const CSL_TYPES = [
  'article',
  'article-journal',
  'article-magazine',
  'article-newspaper',
  'bill',
  'book',
  'broadcast',
  'chapter',
  'classic',
  'collection',
  'dataset',
  'document',
  'entry',
  'entry-dictionary',
  'entry-encyclopedia',
  'figure',
  'graphic',
  'hearing',
  'interview',
  'legal_case',
  'legislation',
  'manuscript',
  'map',
  'motion_picture',
  'musical_score',
  'pamphlet',
  'paper-conference',
  'patent',
  'performance',
  'periodical',
  'personal_communication',
  'post',
  'post-weblog',
  'regulation',
  'report',
  'review',
  'review-book',
  'software',
  'song',
  'speech',
  'standard',
  'thesis',
  'treaty',
  'webpage',
] as const;
const CslName = z.strictObject({
  family: z.string().optional(),
  given: z.string().optional(),
  'dropping-particle': z.string().optional(),
  'non-dropping-particle': z.string().optional(),
  suffix: z.string().optional(),
  'comma-suffix': z.union([z.string(), z.number(), z.boolean()]).optional(),
  'static-ordering': z.union([z.string(), z.number(), z.boolean()]).optional(),
  literal: z.string().optional(),
  'parse-names': z.union([z.string(), z.number(), z.boolean()]).optional(),
});
const CslDate = z.union([
  z.string(),
  z.strictObject({
    'date-parts': z
      .array(
        z
          .array(z.union([z.string(), z.number()]))
          .min(1)
          .max(3),
      )
      .min(1)
      .max(2)
      .optional(),
    season: z.union([z.string(), z.number()]).optional(),
    circa: z.union([z.string(), z.number(), z.boolean()]).optional(),
    literal: z.string().optional(),
    raw: z.string().optional(),
    edtf: z.string().optional(),
  }),
]);
const text = z.string();
const CslItem = z.strictObject({
  id: z.union([z.string(), z.number()]),
  type: z.enum(CSL_TYPES),
  author: z.array(CslName).optional(),
  curator: z.array(CslName).optional(),
  editor: z.array(CslName).optional(),
  issued: CslDate.optional(),
  accessed: CslDate.optional(),
  title: text.optional(),
  'container-title': text.optional(),
  version: text.optional(),
  publisher: text.optional(),
  'publisher-place': text.optional(),
  URL: text.optional(),
  DOI: text.optional(),
  note: text.optional(),
  medium: text.optional(),
  genre: text.optional(),
  abstract: text.optional(),
  custom: z.record(z.string(), z.unknown()).optional(),
});
const CslData = z.array(CslItem);

test("CSL-JSON: one item per claim, URL the claim's link IRI, the curator who decided, both record pages as related links", async () => {
  const r = await ready;
  // a record with several published claims, one of them decided by a curator
  const claimsOf = new Map<number, number>();
  for (const l of r.links.links)
    if (l.status !== 'candidate')
      for (const w of [l.a, l.b]) claimsOf.set(w, (claimsOf.get(l.a === w ? l.a : l.b) ?? 0) + 1);
  const decided = r.links.links.find(
    (l) => l.decision !== undefined && l.status === 'confirmed' && (claimsOf.get(l.a) ?? 0) >= 2,
  )!;
  assert.ok(decided, 'the demo has such a record');
  const ref = `${r.model.project.partners[r.model.works[decided.a].partner].key}:${r.model.works[decided.a].id}`;
  const c = await cite(ref, { release });
  const items = CslData.parse(JSON.parse(await CITE_FORMATS['csl-json'](c)));
  assert.ok(c.claims.length >= 2, 'the record has several claims');
  assert.equal(items.length, c.claims.length);
  c.claims.forEach((claim, i) => {
    const it = items[i];
    assert.equal(it.type, 'dataset');
    assert.equal(it.id, claim.link);
    assert.equal(it.URL, claim.link, 'URL is the claim, not a partner record');
    assert.equal(it.version, '2026.1');
    assert.deepEqual(it.issued, { 'date-parts': [[2026, 11, 30]] });
    const pages = [claim.subject.page, claim.object.page];
    assert.ok(pages.every((p) => p?.startsWith('https://')));
    assert.deepEqual((it.custom as { related: string[] }).related, pages);
    for (const p of pages) assert.ok(String(it.note).includes(p!), 'record pages in the note');
    if (claim.review) assert.deepEqual(it.curator, [{ literal: claim.review.curatorName ?? claim.review.curator }]);
    else assert.equal(it.curator, undefined);
  });
  assert.ok(
    items.some((it) => it.curator),
    'a curator-confirmed claim names its curator',
  );
  assert.throws(
    () => CslData.parse([{ ...citationCsl(c)[0], type: 'data-set' }]),
    'the schema rejects an unknown type',
  );
  assert.throws(
    () => CslData.parse([{ ...citationCsl(c)[0], relatedLinks: [] }]),
    'the schema rejects a property it does not define',
  );
});

test('citing a cluster with date conflicts lists them in every format', async () => {
  const r = await ready;
  const withConflict = r.analysis.conflicts[0];
  assert.ok(withConflict, 'the demo has date conflicts');
  const id = r.clustering.clusters[withConflict.cluster].id;
  const iri = `${loadProjectFile(project).base}work/${id}`;
  const c = await cite(iri, { release });
  const expected = r.analysis.conflicts.filter((x) => x.cluster === withConflict.cluster).length;
  assert.equal(c.conflicts?.length, expected);
  const refs = (c.conflicts ?? []).map((x) => [x.a.ref, x.b.ref].sort().join(' '));
  const ref = (w: number) => `${r.model.project.partners[r.model.works[w].partner].key}:${r.model.works[w].id}`;
  assert.deepEqual(
    refs.sort(),
    r.analysis.conflicts
      .filter((x) => x.cluster === withConflict.cluster)
      .map((x) => [ref(x.work), ref(x.anchor)].sort().join(' '))
      .sort(),
  );
  const items = CslData.parse(citationCsl(c));
  const cluster = items.find((it) => it.id === iri)!;
  assert.equal(cluster.URL, iri);
  assert.equal((cluster.custom as { dateConflicts: unknown[] }).dateConflicts.length, expected);
  assert.match(CITE_FORMATS.text(c) as string, new RegExp(`Date conflicts in this cluster \\(${expected}\\)`));
  assert.match(CITE_FORMATS.markdown(c) as string, /## Date conflicts in this cluster/);
  const one = await cite(c.claims[0].link, { release });
  assert.deepEqual(one.conflicts, [], 'a link has no cluster conflicts');
});
