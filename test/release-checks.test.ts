// The demo release (built once into a temp folder with build()) and generated tiny releases → checked from outside:
// two independent Debian parsers, JSON-LD ↔ N-Quads isomorphism, SPARQL invariants (each shown able to fail),
// property tests with hostile IDs and titles, and byte-identical rebuilds.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import N3 from 'n3';
import { Store } from 'oxigraph';
import { build } from '../src/pipeline.js';
import { NS, iri } from '../src/namespaces.js';
import { isomorphic } from './helpers/isomorphic.js';
import { validate } from '../src/validate/shacl.js';
import { defaultShapesDir, loadShapesFolder } from '../src/validate/files.js';
import { repoRoot, tempDir } from './helpers/fixture.js';
import {
  distinctCount,
  formatOf,
  merged,
  ourQuads,
  rapper,
  rapperRead,
  rdflibRead,
  rdflibJsonLd,
  rdflibPython,
  type ToolReading,
} from './helpers/external-rdf.js';
import { PARTNERS, imageId, writeTinyProject, type TinyProject } from './helpers/tiny-project.js';
import { requires } from './helpers/requires.js';

const tmp = tempDir('concordat-release-checks-');
after(() => rmSync(tmp, { recursive: true, force: true }));
const demo = path.join(repoRoot, 'demo-data', 'concordance.json');
const release = await build(demo, path.join(tmp, 'a'));
const dir = release.outDir;
const partnerKeys = release.model.project.partners.map((p) => p.key);

/** Every file of a folder, relative, sorted. */
const filesOf = (d: string) =>
  (readdirSync(d, { recursive: true, withFileTypes: true }) as import('node:fs').Dirent[])
    .filter((e) => e.isFile())
    .map((e) => path.relative(d, path.join(e.parentPath, e.name)))
    .sort();
const dumpsOf = (d: string) => filesOf(d).filter((f) => /\.(ttl|nq|jsonld)$/.test(f) && f !== 'validation.ttl');

const dumps = dumpsOf(dir);
const ours = new Map<string, N3.Quad[]>();
for (const f of dumps) ours.set(f, await ourQuads(path.join(dir, f)));
const shapes = (await loadShapesFolder(defaultShapesDir())).quads;

test('the demo release has every dump the design lists', () => {
  // design.md "Outputs": concordance.{ttl,nq,jsonld}, partners/{key}.{ttl,nq,jsonld}, dataset.ttl.
  const expected = ['concordance', ...partnerKeys.map((k) => path.join('partners', k))].flatMap((s) =>
    ['ttl', 'nq', 'jsonld'].map((e) => `${s}.${e}`),
  );
  assert.deepEqual(dumps, [...expected, 'dataset.ttl'].sort());
  for (const f of dumps) assert.ok(ours.get(f)!.length > 0, `${f} is not empty`);
});

test('Turtle, N-Quads and JSON-LD of one slice carry the same number of triples (n3, jsonld.js)', () => {
  for (const stem of ['concordance', ...partnerKeys.map((k) => `partners/${k}`)]) {
    const ttl = ours.get(`${stem}.ttl`)!,
      nq = ours.get(`${stem}.nq`)!,
      jsonld = ours.get(`${stem}.jsonld`)!;
    assert.equal(ttl.length, nq.length, `${stem}: Turtle and N-Quads are written from one quad stream`);
    assert.equal(distinctCount(merged(nq)), distinctCount(ttl), stem);
    assert.equal(distinctCount(jsonld), distinctCount(nq), `${stem}: JSON-LD keeps the named graphs`);
    assert.equal(distinctCount(merged(jsonld)), distinctCount(ttl), stem);
  }
});

// Independent parser 1: rdflib (Debian python3-rdflib; rdflib docs "Loading and saving RDF": Graph.parse, format
// "turtle" / "nquads" / "json-ld"). It counts a set of triples (Graph) or quads (ConjunctiveGraph.quads()), and what it
// read, written back as N-Triples / N-Quads, must be isomorphic to what we read (RDF 1.1 Concepts §3.6).
const noRdflib = requires(rdflibPython, 'python3-rdflib is not installed (Debian package; .ci/run installs it)');
let rdflibMemo: Record<string, ToolReading> | null = null;
const rdflibOf = (f: string) =>
  (rdflibMemo ??= rdflibRead(
    dumps.filter((d) => formatOf(d) !== 'jsonld' || rdflibJsonLd).map((d) => path.join(dir, d)),
  ))[path.join(dir, f)];
for (const f of dumps) {
  const skip =
    noRdflib || (formatOf(f) === 'jsonld' && !rdflibJsonLd ? 'this rdflib has no JSON-LD parser plugin' : false);
  test(`rdflib parses ${f} with our count and our graph`, { skip }, async () => {
    const theirs = rdflibOf(f);
    assert.equal(theirs.count, distinctCount(ours.get(f)!));
    assert.ok(await isomorphic(theirs.quads, ours.get(f)!));
  });
}

// Independent parser 2: rapper (Debian raptor2-utils; rapper(1): -i turtle|nquads, "Parsing returned N triples").
const noRapper = requires(rapper, 'rapper is not installed (Debian raptor2-utils; .ci/run installs it)');
for (const f of dumps.filter((d) => formatOf(d) !== 'jsonld')) {
  test(`rapper parses ${f} with our count and our graph`, { skip: noRapper }, async () => {
    const theirs = rapperRead(path.join(dir, f));
    assert.equal(theirs.count, ours.get(f)!.length);
    assert.ok(await isomorphic(theirs.quads, ours.get(f)!));
  });
}

// JSON-LD 1.1 API §4.6 toRdf on the JSON-LD dump = the N-Quads dump, named graphs included (RDF 1.1 Concepts §4 dataset
// isomorphism, decided by RDFC-1.0 canonical forms in src/rdf/isomorphic.ts), and graph by graph.
for (const stem of ['concordance', `partners/${partnerKeys[0]}`]) {
  test(`JSON-LD → RDF of ${stem} is isomorphic to its N-Quads, graph by graph`, async () => {
    const fromJsonLd = ours.get(`${stem}.jsonld`)!;
    const fromNq = ours.get(`${stem}.nq`)!;
    assert.ok(fromJsonLd.length > 100);
    const graphs = (qs: N3.Quad[]) => [...new Set(qs.map((q) => q.graph.value))].sort();
    assert.deepEqual(graphs(fromJsonLd), graphs(fromNq));
    assert.ok(graphs(fromNq).length >= 3 && !graphs(fromNq).includes(''), 'every quad is in a named graph');
    for (const g of graphs(fromNq))
      assert.ok(
        await isomorphic(
          fromJsonLd.filter((q) => q.graph.value === g),
          fromNq.filter((q) => q.graph.value === g),
        ),
        g,
      );
    assert.ok(await isomorphic(fromJsonLd, fromNq));
  });
}

test('every class the release uses is the target class of some shape', () => {
  const targets = new Set(
    shapes.filter((q) => q.predicate.value === iri('sh', 'targetClass')).map((q) => q.object.value),
  );
  const used = new Set(
    ours
      .get('concordance.nq')!
      .filter((q) => q.predicate.value === iri('rdf', 'type'))
      .map((q) => q.object.value),
  );
  assert.ok(used.size >= 15);
  assert.deepEqual([...used].filter((c) => !targets.has(c)).sort(), []);
});

// ---------------------------------------------------------------- SPARQL invariants (SPARQL 1.1 Query, in oxigraph)
const P = `PREFIX cx: <${NS.cx}> PREFIX prov: <${NS.prov}> PREFIX owl: <${NS.owl}> PREFIX skos: <${NS.skos}> PREFIX dcterms: <${NS.dcterms}> PREFIX void: <${NS.void}> PREFIX rdf: <${NS.rdf}> PREFIX rdfs: <${NS.rdfs}>\n`;
const CLAIM =
  'owl:sameAs, skos:closeMatch, skos:exactMatch, skos:relatedMatch, dcterms:isPartOf, cx:proposedPartOf, owl:differentFrom';
const base = release.model.project.base;
const claimsGraph = `<${base}graph/claims>`;
const spaces = release.model.project.partners.map((p) => [p.key, p.workIri.slice(0, p.workIri.indexOf('{'))] as const);
const inSpace = (k: number, local: string) => `<${spaces[k][1]}${local}>`;
const nq = readFileSync(path.join(dir, 'concordance.nq'));

/** A fresh store holding the release (loaded from the N-Quads file's bytes), plus optional injected triples. */
function storeWith(inject?: string): Store {
  const store = new Store();
  store.load(nq, { format: 'application/n-quads' });
  if (inject) store.update(`${P}INSERT DATA { GRAPH ${claimsGraph} { ${inject} } }`);
  return store;
}
const rows = (store: Store, query: string) =>
  store.query(P + query, { use_default_graph_as_union: true }) as Map<string, N3.Term>[];

interface Invariant {
  name: string;
  query: string;
  /** Triples that break the invariant, each set on its own (the query must then return rows naming `caught`). */
  breaks: { inject: string; caught: string }[];
}

const INVARIANTS: Invariant[] = [
  {
    // Design "RDF model": each claim triple is kept in sync with its link resource (standards digest §2 (d)).
    name: 'every claim triple has its link resource (subject, object and relation matching)',
    query: `SELECT ?s ?p ?o WHERE { ?s ?p ?o . FILTER(?p IN (${CLAIM}))
      FILTER NOT EXISTS { ?l a cx:Link ; cx:subjectWork ?s ; cx:objectWork ?o ; cx:relation ?p } }`,
    breaks: [
      {
        inject: `${inSpace(0, 'injected-a')} skos:closeMatch ${inSpace(1, 'injected-b')} .`,
        caught: inSpace(0, 'injected-a'),
      },
      {
        inject: `${inSpace(0, 'injected-a')} owl:sameAs ${inSpace(1, 'injected-b')} . <${base}link/injected> a cx:Link ; cx:subjectWork ${inSpace(0, 'injected-a')} ; cx:objectWork ${inSpace(1, 'injected-b')} ; cx:relation skos:closeMatch .`,
        caught: inSpace(0, 'injected-a'),
      },
    ],
  },
  {
    name: 'every link with a relation has its claim triple',
    query: `SELECT ?l WHERE { ?l a cx:Link ; cx:subjectWork ?s ; cx:objectWork ?o ; cx:relation ?p . FILTER NOT EXISTS { ?s ?p ?o } }`,
    breaks: [
      {
        inject: `<${base}link/injected> a cx:Link ; cx:subjectWork ${inSpace(0, 'injected-a')} ; cx:objectWork ${inSpace(1, 'injected-b')} ; cx:relation skos:closeMatch .`,
        caught: `<${base}link/injected>`,
      },
    ],
  },
  {
    // Design "RDF model": prov:wasDerivedFrom its image matches, prov:wasGeneratedBy the run or the curator review.
    name: 'every link rests on an image match or a curator review',
    query: `SELECT ?l WHERE { ?l a cx:Link .
      FILTER NOT EXISTS { ?l prov:wasDerivedFrom ?m . ?m a cx:ImageMatch }
      FILTER NOT EXISTS { ?l prov:wasGeneratedBy ?r . ?r a cx:CuratorReview } }`,
    breaks: [
      {
        inject: `<${base}link/injected> a cx:Link ; prov:wasGeneratedBy <${base}run/${release.model.runs[0].id}> .`,
        caught: `<${base}link/injected>`,
      },
    ],
  },
  {
    // Standards digest §1 "Choosing": owl:sameAs only for curator-confirmed same artwork; machine-probable →
    // skos:closeMatch.
    name: 'owl:sameAs only on confirmed links',
    query: `SELECT ?s ?o WHERE {
      { ?s owl:sameAs ?o . FILTER NOT EXISTS { ?l a cx:Link ; cx:subjectWork ?s ; cx:objectWork ?o ; cx:relation owl:sameAs ; cx:status cx:Confirmed } }
      UNION { ?l cx:relation owl:sameAs ; cx:status ?st ; cx:subjectWork ?s ; cx:objectWork ?o . FILTER(?st != cx:Confirmed) } }`,
    breaks: [], // filled below from a proposed link of the release
  },
  {
    // OWL 2 eq-ref makes every IRI sameAs itself anyway; a link of a work to itself says nothing (common practice, no
    // source).
    name: 'no claim or link joins a work to itself',
    query: `SELECT ?s WHERE { { ?s ?p ?s . FILTER(?p IN (${CLAIM})) } UNION { ?l cx:subjectWork ?s ; cx:objectWork ?s } }`,
    breaks: [
      {
        inject: `${inSpace(1, 'injected-b')} skos:closeMatch ${inSpace(1, 'injected-b')} .`,
        caught: inSpace(1, 'injected-b'),
      },
      {
        inject: `<${base}link/injected> cx:subjectWork ${inSpace(2, 'injected-c')} ; cx:objectWork ${inSpace(2, 'injected-c')} .`,
        caught: inSpace(2, 'injected-c'),
      },
    ],
  },
  {
    // Design "RDF model": partner works keep the partner's IRIs (the workIri template of the project file).
    name: "every partner work's IRI lies in its partner's URI space",
    query: `SELECT DISTINCT ?w WHERE {
      { ?w cx:partner ?key } UNION { ?x cx:member|cx:subjectWork|cx:objectWork|cx:workA|cx:workB ?w }
      FILTER NOT EXISTS { ?w cx:partner ?k . VALUES (?k ?space) { ${spaces.map(([k, s]) => `(${JSON.stringify(k)} ${JSON.stringify(s)})`).join(' ')} }
        FILTER(STRSTARTS(STR(?w), ?space)) } }`,
    breaks: [
      {
        inject: `<https://elsewhere.example.org/work/1> cx:partner ${JSON.stringify(spaces[0][0])} .`,
        caught: '<https://elsewhere.example.org/work/1>',
      },
      { inject: `${inSpace(0, 'x')} cx:partner ${JSON.stringify(spaces[1][0])} .`, caught: inSpace(0, 'x') },
      { inject: `<${base}work/injected> cx:member ${inSpace(1, 'undescribed')} .`, caught: inSpace(1, 'undescribed') },
    ],
  },
  {
    // Every kind of claim as cautious as its evidence: a predicate the vocab map gives only to confirmed claims
    // (owl:sameAs, dcterms:isPartOf) never stands for an unconfirmed one, neither as a claim triple without a confirmed
    // link behind it nor as the relation of a link that is not confirmed.
    name: 'no unconfirmed claim uses a confirmed-only predicate',
    query: `SELECT ?s ?o WHERE { VALUES ?p { ${release.vocab.confirmedOnly.map((p) => `<${p}>`).join(' ')} }
      { ?s ?p ?o . FILTER NOT EXISTS { ?l a cx:Link ; cx:subjectWork ?s ; cx:objectWork ?o ; cx:relation ?p ; cx:status cx:Confirmed } }
      UNION { ?l cx:relation ?p ; cx:status ?st ; cx:subjectWork ?s ; cx:objectWork ?o . FILTER(?st != cx:Confirmed) } }`,
    breaks: [
      {
        inject: `${inSpace(0, 'injected-a')} dcterms:isPartOf ${inSpace(1, 'injected-b')} .`,
        caught: inSpace(0, 'injected-a'),
      },
      {
        inject: `<${base}link/injected> cx:relation dcterms:isPartOf ; cx:status cx:Proposed ; cx:subjectWork ${inSpace(0, 'injected-a')} ; cx:objectWork ${inSpace(1, 'injected-b')} .`,
        caught: inSpace(0, 'injected-a'),
      },
      {
        inject: `${inSpace(2, 'injected-c')} owl:sameAs ${inSpace(1, 'injected-b')} .`,
        caught: inSpace(2, 'injected-c'),
      },
    ],
  },
  {
    // The link confidence (src/evidence/README.md, "Link confidence") is what the machine proposes on: every link
    // with a score carries one, and no machine-proposed claim (no curator review behind it) has one below proposeAt.
    name: 'every scored link has a confidence, and machine proposals reach proposeAt',
    query: `SELECT ?l WHERE { { ?l a cx:Link ; cx:score ?s . FILTER NOT EXISTS { ?l cx:confidence ?c } }
      UNION { ?l a cx:Link ; cx:status cx:Proposed ; cx:confidence ?c .
        FILTER NOT EXISTS { ?l prov:wasGeneratedBy ?r . ?r a cx:CuratorReview }
        FILTER(?c < ${release.model.project.policy.proposeAt}) } }`,
    breaks: [], // filled below from a proposed link of the release
  },
];
const proposed = rows(
  storeWith(),
  `SELECT ?s ?o WHERE { ?l cx:status cx:Proposed ; cx:relation skos:closeMatch ; cx:subjectWork ?s ; cx:objectWork ?o } ORDER BY ?s ?o LIMIT 1`,
)[0];
INVARIANTS[3].breaks.push(
  {
    inject: `<${proposed.get('s')!.value}> owl:sameAs <${proposed.get('o')!.value}> .`,
    caught: `<${proposed.get('s')!.value}>`,
  },
  {
    inject: `<${base}link/injected> cx:relation owl:sameAs ; cx:status cx:Proposed ; cx:subjectWork ${inSpace(0, 'injected-a')} ; cx:objectWork ${inSpace(1, 'injected-b')} .`,
    caught: inSpace(0, 'injected-a'),
  },
);

{
  const p = rows(
    storeWith(),
    `SELECT ?l ?c WHERE { ?l cx:status cx:Proposed ; cx:relation skos:closeMatch ; cx:confidence ?c } ORDER BY ?l LIMIT 1`,
  )[0];
  const l = `<${p.get('l')!.value}>`;
  INVARIANTS[INVARIANTS.length - 1].breaks.push(
    { inject: `${l} cx:confidence 0.1 .`, caught: l },
    { inject: `<${base}link/injected> a cx:Link ; cx:score 0.9 .`, caught: `<${base}link/injected>` },
  );
}
const demoStore = storeWith();
test('the vocab map gives owl:sameAs and dcterms:isPartOf to confirmed claims only; proposed part links get cx:proposedPartOf', () => {
  assert.deepEqual(release.vocab.confirmedOnly, [iri('dcterms', 'isPartOf'), iri('owl', 'sameAs')]);
  assert.equal(release.vocab.predicate('part', 'proposed'), iri('cx', 'proposedPartOf'));
  assert.equal(release.vocab.predicate('part', 'confirmed'), iri('dcterms', 'isPartOf'));
});

test('the demo release holds claims, links, clusters and partner works for the invariants to range over', () => {
  const count = (q: string) => Number(rows(demoStore, q)[0].get('n')!.value);
  // proposed and confirmed part links both, so the cautious-claims invariant has something to range over
  assert.ok(
    count(
      `SELECT (COUNT(*) AS ?n) WHERE { ?l cx:kind cx:Part ; cx:status cx:Proposed ; cx:relation cx:proposedPartOf }`,
    ) > 0,
  );
  assert.ok(
    count(
      `SELECT (COUNT(*) AS ?n) WHERE { ?l cx:kind cx:Part ; cx:status cx:Confirmed ; cx:relation dcterms:isPartOf }`,
    ) > 0,
  );
  assert.ok(count(`SELECT (COUNT(*) AS ?n) WHERE { ?s owl:sameAs ?o }`) > 0);
  assert.ok(count(`SELECT (COUNT(*) AS ?n) WHERE { ?l a cx:Link }`) > 50);
  assert.ok(count(`SELECT (COUNT(*) AS ?n) WHERE { ?w cx:partner ?k }`) > 50);
});
for (const inv of INVARIANTS) {
  test(`invariant: ${inv.name}`, () => {
    assert.deepEqual(
      rows(demoStore, inv.query).map((r) => [...r.values()].map((t) => t.value).join(' ')),
      [],
    );
  });
  test(`invariant can fail: ${inv.name}`, () => {
    assert.ok(inv.breaks.length > 0);
    for (const b of inv.breaks) {
      const found = rows(storeWith(b.inject), inv.query).flatMap((r) => [...r.values()].map((t) => `<${t.value}>`));
      assert.ok(found.includes(b.caught), `injecting ${b.inject} is caught`);
    }
  });
}

test("each partner dataset's void:uriSpace is its workIri prefix (VoID §4.2: a literal)", () => {
  const got = rows(
    demoStore,
    `SELECT ?key ?space WHERE { ?w cx:partner ?key ; void:inDataset ?d . ?d void:uriSpace ?space . FILTER(isLiteral(?space)) } GROUP BY ?key ?space ORDER BY ?key`,
  );
  assert.deepEqual(
    got.map((r) => [r.get('key')!.value, r.get('space')!.value]),
    [...spaces].sort((a, b) => a[0].localeCompare(b[0])),
  );
});

test('a curator named with accents gets an IRI from the unaccented words of the name (Aurélie → aurelie)', () => {
  // Slugs fold diacritics instead of breaking words at them (common practice, no source).
  const people = rows(demoStore, `SELECT ?p ?label WHERE { ?p a prov:Person ; rdfs:label ?label }`);
  assert.ok(
    people.some((r) => /[^\u0000-\u007f]/.test(r.get('label')!.value)),
    'the demo has a curator name with a diacritic',
  );
  for (const r of people) {
    const words = r
      .get('label')!
      .value.split(/[^\p{L}\p{N}]+/u)
      .filter(Boolean)
      .map((w) => w.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase());
    assert.equal(r.get('p')!.value.replace(/^.*\//, ''), words.join('-'));
  }
});

// ---------------------------------------------------------------- determinism
test('two builds of the demo are byte-identical, file by file (design "Outputs": same inputs → byte-identical files)', async () => {
  const again = await build(demo, path.join(tmp, 'b'), { workers: 0 });
  const [a, b] = [filesOf(dir), filesOf(again.outDir)];
  assert.deepEqual(b, a);
  assert.ok(a.length >= 15);
  for (const f of a)
    assert.ok(readFileSync(path.join(dir, f)).equals(readFileSync(path.join(again.outDir, f))), `${f} differs`);
});

// ---------------------------------------------------------------- property: hostile IDs and titles
const piece = fc.constantFrom(
  '"',
  '\\',
  '\n',
  '\t',
  '<',
  '>',
  ' ',
  "'",
  '&',
  '#',
  '%',
  '{',
  '}',
  ':',
  ',',
  ';',
  '/',
  '?',
  '.',
  '@',
  'a',
  'Q',
  '7',
  'é',
  'e\u0301',
  'Ж',
  '漢',
  '\u200b',
  '😀',
  '👩\u200d🎨',
);
const text = fc.array(piece, { maxLength: 8 }).map((a) => a.join(''));
const id = text.map((s) => s.trim()).filter((s) => s !== '');
const works = fc.uniqueArray(fc.record({ id, title: text, images: fc.integer({ min: 1, max: 2 }) }), {
  minLength: 1,
  maxLength: 3,
  selector: (w) => w.id,
});
const project: fc.Arbitrary<TinyProject> = fc.record({
  alpha: works,
  beta: works,
  matches: fc.array(
    fc.record({
      a: fc.nat(9),
      ai: fc.nat(3),
      b: fc.nat(9),
      bi: fc.nat(3),
      score: fc.integer({ min: 40, max: 100 }),
      overlap: fc.integer({ min: 1, max: 100 }),
    }),
    { minLength: 1, maxLength: 5 },
  ),
  decisions: fc.array(
    fc.record({
      a: fc.nat(9),
      b: fc.nat(9),
      verdict: fc.constantFrom('same' as const, 'part' as const, 'related' as const, 'distinct' as const),
      curator: fc.oneof(id, fc.constant('https://orcid.org/0000-0002-1825-0097')),
      note: text,
    }),
    { maxLength: 3 },
  ),
});

/** Works and images named in a release decode back to generated IDs, and titles come back unchanged (RFC 3986 §2.1). */
function assertRoundTrip(p: TinyProject, quads: N3.Quad[]): number {
  let seen = 0;
  const byIri = new Map<string, N3.Quad[]>();
  for (const q of quads) byIri.set(q.subject.value, [...(byIri.get(q.subject.value) ?? []), q]);
  for (const key of ['alpha', 'beta'] as const) {
    const space = PARTNERS[key].workSpace;
    const imageSpace = `https://${key}.example.org/id/image/`;
    for (const [s, qs] of byIri) {
      if (!s.startsWith(space) || !qs.some((q) => q.predicate.value === iri('void', 'inDataset'))) continue;
      const work = p[key].find((w) => w.id === decodeURIComponent(s.slice(space.length)));
      assert.ok(work, `${s} names a generated ${key} work`);
      const titles = qs.filter((q) => q.predicate.value === iri('dcterms', 'title')).map((q) => q.object.value);
      assert.deepEqual(titles, work.title.trim() ? [work.title.trim()] : []);
      seen++;
    }
    const images = new Set(p[key].flatMap((w) => Array.from({ length: w.images }, (_, k) => imageId(w, k))));
    for (const q of quads)
      if (q.object.value.startsWith(imageSpace))
        assert.ok(images.has(decodeURIComponent(q.object.value.slice(imageSpace.length))), q.object.value);
  }
  return seen;
}

test('IDs and titles with quotes, backslashes, newlines, <, >, spaces, unicode and emoji give dumps that parse and conform', async () => {
  let checkedWorks = 0;
  await fc.assert(
    fc.asyncProperty(project, async (p) => {
      const work = mkdtempSync(path.join(tmp, 'prop-'));
      try {
        const r = await build(writeTinyProject(path.join(work, 'project'), p), path.join(work, 'release'), {
          workers: 0,
        });
        assert.equal(r.publish.validation.violations, 0);
        const files = dumpsOf(r.outDir);
        const parsed = new Map<string, N3.Quad[]>();
        for (const f of files) parsed.set(f, await ourQuads(path.join(r.outDir, f)));
        const [ttl, nqQuads, jsonld] = ['ttl', 'nq', 'jsonld'].map((e) => parsed.get(`concordance.${e}`)!);
        assert.equal(ttl.length, nqQuads.length);
        assert.ok(await isomorphic(jsonld, nqQuads), 'JSON-LD and N-Quads agree, named graphs included');
        // The release conforms as one graph too, not only chunk by chunk (SHACL §3 over the merged data graph).
        assert.equal((await validate(merged(nqQuads), shapes)).violations, 0);
        checkedWorks += assertRoundTrip(p, ttl);
        if (rdflibPython) {
          const read = rdflibRead(
            files.filter((f) => formatOf(f) !== 'jsonld' || rdflibJsonLd).map((f) => path.join(r.outDir, f)),
          );
          for (const [f, theirs] of Object.entries(read)) {
            const mine = parsed.get(path.relative(r.outDir, f))!;
            assert.equal(theirs.count, distinctCount(mine), `rdflib count on ${f}`);
            assert.ok(await isomorphic(theirs.quads, mine), `rdflib graph of ${f}`);
          }
        }
        if (rapper)
          for (const f of files.filter((x) => formatOf(x) !== 'jsonld')) {
            const theirs = rapperRead(path.join(r.outDir, f));
            assert.equal(theirs.count, parsed.get(f)!.length, `rapper count on ${f}`);
            assert.ok(await isomorphic(theirs.quads, parsed.get(f)!), `rapper graph of ${f}`);
          }
      } finally {
        rmSync(work, { recursive: true, force: true });
      }
    }),
    { numRuns: Number(process.env.PROP_RUNS ?? 20) },
  );
  assert.ok(checkedWorks > 0, 'some generated works were published and checked');
});

// RFC 6570 §3.2.2 leaves "." unencoded (unreserved), so a work ID "." or ".." would expand to a dot segment; RFC 3986
// §5.2.4 removes those when an IRI is resolved, and rapper's Turtle reader does (its N-Quads reader does not).
// RDF 1.1 Concepts §3.2 asks for IRIs normalized per RFC 3987 §5: the expansion percent-encodes such dots.
test('a work ID "." or ".." keeps its IRI in every reader', { skip: noRapper }, async () => {
  const p: TinyProject = {
    alpha: [{ id: '..', title: 'dots', images: 1 }],
    beta: [{ id: '.', title: 'dot', images: 1 }],
    matches: [{ a: 0, ai: 0, b: 0, bi: 0, score: 90, overlap: 90 }],
    decisions: [],
  };
  const work = mkdtempSync(path.join(tmp, 'dots-'));
  const r = await build(writeTinyProject(path.join(work, 'project'), p), path.join(work, 'release'), { workers: 0 });
  const iris = (qs: N3.Quad[]) =>
    new Set(
      qs.flatMap((q) => [q.subject.value, q.object.value]).filter((v) => v.includes('/id/work/') || v.endsWith('/id/')),
    );
  const fromTurtle = iris(rapperRead(path.join(r.outDir, 'concordance.ttl')).quads);
  assert.deepEqual(fromTurtle, iris(await ourQuads(path.join(r.outDir, 'concordance.ttl'))));
});
