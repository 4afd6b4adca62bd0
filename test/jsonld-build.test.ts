// Units of quads → our framed JSON-LD nodes → jsonld.js toRdf → checked isomorphic to the unit, on the demo release and
// hand-made units.
import { test, after } from 'node:test';
import assert from 'node:assert/strict';
import { rmSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { build } from '../src/pipeline.js';
import type { Unit } from '../src/rdf/index.js';
import { releaseView } from '../src/rdf/view.js';
import { releaseStream } from '../src/rdf/stream.js';
import { loadVocabMap } from '../src/rdf/vocab-map.js';
import { isomorphic } from './helpers/isomorphic.js';
import { JSONLD_CONTEXT, jsonldToNQuads } from '../src/rdf/jsonld.js';
import { unitNodes } from '../src/publish/jsonld.js';
import { NS } from '../src/namespaces.js';
import { repoRoot, tempDir } from './helpers/fixture.js';

const { namedNode: nn, blankNode, literal, quad } = N3.DataFactory;
const G = nn('https://example.org/graph/provenance');
const ex = (s: string) => nn('https://example.org/id/' + s);
const cx = (s: string) => nn(NS.cx + s);
const xsd = (s: string) => nn(NS.xsd + s);
const a = nn(NS.rdf + 'type');

/** Nodes → RDF via jsonld.js toRdf (JSON-LD 1.1 API §4.6) with the shared context inline. */
async function toQuads(nodes: object[]): Promise<Quad[]> {
  const text = JSON.stringify({ '@context': JSONLD_CONTEXT, '@graph': nodes });
  return new N3.Parser({ format: 'application/n-quads' }).parse(
    await jsonldToNQuads(text, 'unit.jsonld', 'file:///unit.jsonld'),
  );
}
/** The unit's quads in the default graph: the JSON-LD dump is the merged graph. */
const merged = (quads: Quad[]) => quads.map((q) => quad(q.subject, q.predicate, q.object));

async function assertRoundTrip(unit: Unit): Promise<object[]> {
  const nodes = await unitNodes(unit);
  assert.ok(await isomorphic(await toQuads(nodes), merged(unit.quads)), `unit ${unit.kind} ${unit.id}`);
  return nodes;
}

/** Every node object (more than an `id`) anywhere in the output, by id. */
function described(nodes: unknown): Map<string, number> {
  const out = new Map<string, number>();
  const walk = (v: unknown) => {
    if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') {
      const o = v as Record<string, unknown>;
      if (typeof o.id === 'string' && Object.keys(o).length > 1) out.set(o.id, (out.get(o.id) ?? 0) + 1);
      Object.values(o).forEach(walk);
    }
  };
  walk(nodes);
  return out;
}

const tmp = tempDir('concordat-jsonld-build-');
after(() => rmSync(tmp, { recursive: true, force: true }));

test('every unit of the demo release gives JSON-LD whose RDF is isomorphic to the unit', async () => {
  const r = await build(path.join(repoRoot, 'demo-data', 'concordance.json'), path.join(tmp, 'demo'), {
    validate: false,
  });
  const vocab = loadVocabMap(r.model.project.vocabMap);
  const view = releaseView(r.model, r.links, r.clustering, r.analysis, vocab);
  const units = [...releaseStream(view).units];
  const kinds = new Set<string>();
  for (const unit of units) {
    const nodes = await assertRoundTrip(unit);
    kinds.add(unit.kind);
    // Each subject is described exactly once in its unit.
    for (const [id, n] of described(nodes)) assert.equal(n, 1, id);
    assert.equal(described(nodes).size, new Set(unit.quads.map((q) => q.subject.value)).size);
  }
  assert.deepEqual([...kinds].sort(), ['cluster', 'dataset', 'link', 'provenance']);
});

const unit = (quads: Quad[], kind: Unit['kind'] = 'cluster'): Unit => ({
  kind,
  id: 'hand-made',
  quads: quads.map((q) => quad(q.subject, q.predicate, q.object, G)),
  partners: 'all',
});

test('a node referenced twice is embedded the first time and referenced by id the second', async () => {
  const [l1, l2, m, run] = [ex('link1'), ex('link2'), ex('match'), ex('run')];
  const nodes = (await assertRoundTrip(
    unit([
      quad(l1, a, cx('Link')),
      quad(l1, nn(NS.prov + 'wasDerivedFrom'), m),
      quad(l2, a, cx('Link')),
      quad(l2, nn(NS.prov + 'wasDerivedFrom'), m),
      quad(m, a, cx('ImageMatch')),
      quad(m, cx('score'), literal('0.93', xsd('decimal'))),
      quad(m, nn(NS.prov + 'wasGeneratedBy'), run),
    ]),
  )) as Record<string, unknown>[];
  assert.equal(nodes.length, 2);
  const [first, second] = nodes.map((n) => n.wasDerivedFrom as unknown[]);
  assert.equal((first[0] as Record<string, unknown>).id, m.value);
  assert.equal((first[0] as Record<string, unknown>).score, '0.93', 'decimals stay JSON strings');
  assert.deepEqual((first[0] as Record<string, unknown>).wasGeneratedBy, [run.value], '@set container, @id coercion');
  assert.equal(second[0], m.value);
});

test('reference cycles end, with or without a top-level node, and lose nothing', async () => {
  const [l, b, c, d, e] = ['l', 'b', 'c', 'd', 'e'].map(ex);
  const nodes = await assertRoundTrip(
    unit([
      quad(l, a, cx('Link')),
      quad(l, cx('next'), b),
      quad(b, cx('next'), c),
      quad(c, cx('next'), b),
      quad(c, cx('next'), c),
      quad(d, cx('next'), e),
      quad(e, cx('next'), d),
    ]),
  );
  assert.deepEqual(
    [...described(nodes).entries()].sort(),
    [l, b, c, d, e].map((x) => [x.value, 1] as [string, number]).sort(),
  );
  assert.equal(nodes.length, 2, 'the Link, and one node of the d–e cycle');
});

test('literals: language tags, datatypes other than the coercion, plain strings under coerced terms', async () => {
  const w = ex('w');
  const [n] = (await assertRoundTrip(
    unit([
      quad(w, a, cx('Link')),
      quad(w, nn(NS.dcterms + 'title'), literal('Madonna col Bambino', 'it')),
      quad(w, nn(NS.dcterms + 'title'), literal('Madonna and Child')),
      quad(w, cx('score'), literal('7', xsd('integer'))),
      quad(w, cx('support'), literal('n/a')),
      quad(w, cx('memberCount'), literal('3', xsd('integer'))),
      quad(w, cx('partnerCount'), literal('007', xsd('integer'))),
      quad(w, cx('bigCount'), literal('12345678901234567890', xsd('integer'))),
      quad(w, cx('smallCount'), literal('-4', xsd('integer'))),
      quad(w, nn(NS.prov + 'startedAtTime'), literal('2024-05-01', xsd('date'))),
    ]),
  )) as Record<string, unknown>[];
  assert.deepEqual(n.title, [{ '@value': 'Madonna col Bambino', '@language': 'it' }, 'Madonna and Child']);
  assert.deepEqual(n.score, { '@value': '7', '@type': 'xsd:integer' });
  assert.deepEqual(n.support, { '@value': 'n/a' }, 'a plain string would take the xsd:integer coercion');
  assert.equal(
    n.memberCount,
    3,
    'a canonical xsd:integer is a JSON number (JSON-LD 1.1 API §8.6 reads it back as one)',
  );
  assert.deepEqual(n.startedAtTime, { '@value': '2024-05-01', '@type': 'xsd:date' });
  assert.equal(n.partnerCount, '007', 'a non-canonical form stays a string under the coercion');
  assert.deepEqual(
    n.bigCount,
    { '@value': '12345678901234567890', '@type': 'xsd:integer' },
    'beyond 2^53 a double would round',
  );
  assert.equal(n.smallCount, -4);
});

test('properties and values without a term: vocab-relative, compact or full IRIs that expand back', async () => {
  const w = ex('w');
  const other = 'https://example.org/ns/odd%20name#p';
  const [n] = (await assertRoundTrip(
    unit([
      quad(w, a, cx('Link')),
      quad(w, a, nn(NS.prov + 'Entity')),
      quad(w, a, nn('https://example.org/ns/Thing')),
      quad(w, cx('impliedPair'), ex('ip')),
      quad(w, nn(NS.dcterms + 'source'), ex('src')),
      quad(w, nn(other), literal('x')),
      quad(w, cx('status'), cx('Confirmed')),
      quad(w, cx('kind'), cx('title')),
      quad(w, cx('kind'), nn('https://example.org/ns/Other')),
      quad(w, cx('relation'), nn(NS.owl + 'sameAs')),
    ]),
  )) as Record<string, unknown>[];
  assert.deepEqual(n.type, ['Link', 'prov:Entity', 'https://example.org/ns/Thing']);
  assert.deepEqual(n.impliedPair, { id: ex('ip').value });
  assert.deepEqual(n['dcterms:source'], { id: ex('src').value });
  assert.equal(n[other], 'x');
  assert.equal(n.status, 'Confirmed');
  assert.notEqual((n.kind as string[])[0], 'title', '"title" is a term for dcterms:title, not cx:title');
  assert.equal(n.relation, NS.owl + 'sameAs');
});

test('blank-node subjects keep their labels, are embedded where referenced, and round-trip', async () => {
  const [r, b, lone] = [ex('run'), blankNode('plan1'), blankNode('lone')];
  const nodes = (await assertRoundTrip(
    unit(
      [
        quad(r, a, nn(NS.prov + 'Activity')),
        quad(r, nn(NS.prov + 'qualifiedAssociation'), b),
        quad(b, nn(NS.prov + 'hadPlan'), ex('plan')),
        quad(b, nn(NS.rdfs + 'label'), literal('p')),
        quad(lone, nn(NS.rdfs + 'label'), literal('q')),
        quad(lone, cx('member'), b),
      ],
      'provenance',
    ),
  )) as Record<string, unknown>[];
  assert.equal(nodes.length, 2);
  assert.equal((nodes[0]['prov:qualifiedAssociation'] as Record<string, unknown>).id, '_:plan1');
  assert.equal(nodes[1].id, '_:lone');
  assert.deepEqual(nodes[1].member, ['_:plan1']);
});

test('the same unit gives the same JSON twice, and duplicate triples are written once', async () => {
  const w = ex('w');
  const u = unit([
    quad(w, a, cx('Link')),
    quad(w, cx('support'), literal('2', xsd('integer'))),
    quad(w, cx('support'), literal('2', xsd('integer'))),
  ]);
  assert.equal(JSON.stringify(await unitNodes(u)), JSON.stringify(await unitNodes(u)));
  assert.equal(((await unitNodes(u)) as Record<string, unknown>[])[0].support, 2);
});
