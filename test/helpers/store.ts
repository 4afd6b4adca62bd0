// Test helper for store tests: the fixture release, independent counts, graph dumps, and expected named-query rows.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { Parser, Store as N3Store, DataFactory } from 'n3';
import { formatResult } from '../../src/store/format.js';
import type { QueryResult, Store } from '../../src/store/types.js';
import { fixtures } from './fixture.js';

export const FIXTURE = path.join(fixtures, 'store', 'release');
export const BASE = 'https://concordance.example.org/';
export const CX = 'https://w3id.org/concordat/vocab#';
const OWL = 'http://www.w3.org/2002/07/owl#';
const SKOS = 'http://www.w3.org/2004/02/skos/core#';

/** Distinct triples per graph name, counted with n3 (not the code under test); `merge` drops graph names (key ''). */
export function fileCounts(file: string, merge = false): Map<string, number> {
  const quads = new Parser({ format: 'N-Quads' }).parse(readFileSync(file, 'utf8'));
  if (merge) {
    const s = new N3Store(quads.map((q) => DataFactory.quad(q.subject, q.predicate, q.object)));
    return new Map([['', s.size]]);
  }
  const s = new N3Store(quads);
  return new Map(s.getGraphs(null, null, null).map((g) => [g.value, s.countQuads(null, null, null, g)]));
}

/** A graph's triples as sorted N-Triples lines, blank-node labels masked (labels are store-internal). */
export async function graphDump(store: Store, graph: string): Promise<string[]> {
  const r = await store.query(`CONSTRUCT { ?s ?p ?o } WHERE { GRAPH <${graph}> { ?s ?p ?o } }`);
  return formatResult(r, 'table')
    .split('\n')
    .filter(Boolean)
    .map((l) => l.replace(/_:b\d+/g, '_:_'))
    .sort();
}

/** A second version of a graph, sharing no triple with the fixture's. */
export function secondVersion(): { text: string; sorted: string[] } {
  const lines = [
    '<https://harbour.example.org/id/work/H-101> <http://purl.org/dc/terms/title> "Madonna with a pomegranate (revised)" .',
    '<https://harbour.example.org/id/work/H-101> <http://www.w3.org/2004/02/skos/core#closeMatch> <https://lakeside.example.net/work/L-7> .',
    '<https://upland.example.com/objects/U-3> <https://w3id.org/concordat/vocab#dateAsCatalogued> "1590s" .',
  ];
  return { text: lines.join('\n') + '\n', sorted: [...lines].sort() };
}

const W = {
  'H-101': 'https://harbour.example.org/id/work/H-101',
  'H-102': 'https://harbour.example.org/id/work/H-102',
  'L-7': 'https://lakeside.example.net/work/L-7',
  'L-9': 'https://lakeside.example.net/work/L-9',
  'U-3': 'https://upland.example.com/objects/U-3',
};
const hex16 = (s: string): string => createHash('sha256').update(s).digest('hex').slice(0, 16);
/** Link IRI rule of the RDF model: {base}link/{16 hex of sha256 of "a\tb", ordered pair}. */
const link = (a: string, b: string): string => `${BASE}link/${hex16([a, b].sort().join('\t'))}`;
/** The fixture names image matches the same way, over the two image IRIs. */
const match = (a: string, b: string): string => `${BASE}match/${hex16(`${a}\t${b}`)}`;
const IMG = {
  H: 'https://harbour.example.org/id/image/',
  L: 'https://lakeside.example.net/image/',
  U: 'https://upland.example.com/media/',
};

const m1 = [match(IMG.H + 'P-1001', IMG.L + 'P-7001'), '0.93', IMG.H + 'P-1001', IMG.L + 'P-7001'];
const m2 = [match(IMG.H + 'P-1002', IMG.L + 'P-7002'), '0.88', IMG.H + 'P-1002', IMG.L + 'P-7002'];
const m3 = [match(IMG.L + 'P-7001', IMG.U + 'P-3001'), '0.71', IMG.L + 'P-7001', IMG.U + 'P-3001'];
const m4 = [match(IMG.H + 'P-1021', IMG.L + 'P-9001'), '0.55', IMG.H + 'P-1021', IMG.L + 'P-9001'];
const byMatch = (rows: string[][]): string[][] => rows.sort((a, b) => (a[0] + a[6] < b[0] + b[6] ? -1 : 1));
const members = [
  [
    `${BASE}work/1`,
    W['H-101'],
    'harbour',
    'Madonna with a pomegranate',
    'ca. 1480',
    'https://harbour.example.org/records/H-101',
  ],
  [
    `${BASE}work/1`,
    W['L-7'],
    'lakeside',
    'Virgin and Child with pomegranate',
    '1475-1485',
    'https://lakeside.example.net/catalogue/L-7',
  ],
  [
    `${BASE}work/1`,
    W['U-3'],
    'upland',
    'Madonna of the pomegranate, copy',
    'late 16th century',
    'https://upland.example.com/view/U-3',
  ],
];

/** One named-query case: parameters and the rows the fixture implies (values only, '' when unbound). */
export interface NamedCase {
  name: string;
  params: Record<string, string>;
  rows: string[][];
}

/** What each named query must return on the fixture (see test/fixtures/store/release/concordance.nq). */
export const NAMED_CASES: NamedCase[] = [
  {
    name: 'claims-about-record',
    params: { work: W['L-7'] },
    rows: byMatch([
      [link(W['H-101'], W['L-7']), OWL + 'sameAs', W['H-101'], CX + 'Confirmed', '0.93', '2', ...m1],
      [link(W['H-101'], W['L-7']), OWL + 'sameAs', W['H-101'], CX + 'Confirmed', '0.93', '2', ...m2],
      [link(W['L-7'], W['U-3']), SKOS + 'closeMatch', W['U-3'], CX + 'Proposed', '0.71', '1', ...m3],
    ]),
  },
  {
    name: 'claims-about-record',
    params: { work: W['H-102'] },
    rows: [[link(W['H-102'], W['L-9']), '', W['L-9'], CX + 'Rejected', '0.55', '1', ...m4]],
  }, // rejected: no relation
  { name: 'claims-about-record', params: { work: 'https://harbour.example.org/id/work/none' }, rows: [] },
  { name: 'cluster-members', params: { cluster: `${BASE}work/1` }, rows: members },
  { name: 'cluster-members', params: { cluster: `${BASE}work/0` }, rows: members }, // retired ID → its replacement
  {
    name: 'clusters-with-date-conflicts',
    params: {},
    rows: [
      [`${BASE}work/1`, W['H-101'], W['U-3'], 'conflict', 'ca. 1480', 'late 16th century'],
      [`${BASE}work/1`, W['L-7'], W['U-3'], 'conflict', '1475-1485', 'late 16th century'],
    ],
  },
  {
    name: 'pairs-through-third-archive',
    params: {},
    rows: [[`${BASE}work/1`, W['H-101'], W['U-3'], 'harbour', 'upland']],
  },
  {
    name: 'partner-pair-counts',
    params: {},
    rows: [
      ['harbour', 'lakeside', CX + 'Confirmed', '1'],
      ['harbour', 'lakeside', CX + 'Rejected', '1'],
      ['lakeside', 'upland', CX + 'Proposed', '1'],
    ],
  },
];

/** Rows as arrays of term values in variable order ('' for unbound). */
export function project(r: QueryResult): string[][] {
  if (r.kind !== 'bindings') throw new Error(`expected bindings, got ${r.kind}`);
  return r.rows.map((row) => r.vars.map((v) => row[v]?.value ?? ''));
}
