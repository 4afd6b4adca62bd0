// ReleaseWriter: units → concordance.* and partners/*.*, written by the file worker; hashes match the files' bytes.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { createHash } from 'node:crypto';
import { readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import N3 from 'n3';
import type { Quad } from '@rdfjs/types';
import { ReleaseWriter } from '../src/publish/rdf-files.js';
import { nquadsText } from '../src/rdf/text.js';
import type { Unit } from '../src/rdf/index.js';
import { tempDir } from './helpers/fixture.js';

const { namedNode, literal, quad } = N3.DataFactory;
const G = namedNode('https://example.org/graph/claims');
const P = namedNode('http://purl.org/dc/terms/title');

function unit(id: string, n: number, partners: Set<number> | 'all', title = 'Täfelchen'): Unit {
  const quads: Quad[] = [];
  for (let i = 0; i < n; i++)
    quads.push(quad(namedNode(`https://example.org/${id}/${i}`), P, literal(`${title} ${i}`), G));
  return { kind: 'link', id, quads, partners };
}

const sha = (file: string) => createHash('sha256').update(readFileSync(file)).digest('hex');

test('every file gets its units in order, and the hashes returned are those of the bytes on disk', async () => {
  const dir = tempDir('concordat-writer-');
  try {
    // 40 000 quads of ~80 characters: over the shared block's size, so this unit takes the direct path between two
    // block runs
    const units = [
      unit('a', 3, new Set([1])),
      unit('b', 2, new Set([0, 1])),
      unit('big', 40_000, new Set([0])),
      unit('c', 1, 'all'),
      unit('d', 4, new Set([1])),
    ];
    const w = new ReleaseWriter(dir, ['p0', 'p1']);
    for (const u of units) await w.add(u);
    const hashes = await w.close();
    const expectNq = (keep: (u: Unit) => boolean) =>
      units
        .filter(keep)
        .map((u) => nquadsText(u.quads))
        .join('');
    assert.equal(
      readFileSync(path.join(dir, 'concordance.nq'), 'utf8'),
      expectNq(() => true),
    );
    assert.equal(
      readFileSync(path.join(dir, 'partners', 'p0.nq'), 'utf8'),
      expectNq((u) => u.partners === 'all' || u.partners.has(0)),
    );
    assert.equal(
      readFileSync(path.join(dir, 'partners', 'p1.nq'), 'utf8'),
      expectNq((u) => u.partners === 'all' || u.partners.has(1)),
    );
    const files = ['concordance', 'partners/p0', 'partners/p1'].flatMap((s) =>
      ['ttl', 'nq', 'jsonld'].map((e) => `${s}.${e}`),
    );
    assert.deepEqual([...hashes.keys()].sort(), files.sort());
    for (const f of files) assert.equal(hashes.get(f), sha(path.join(dir, f)), f);
    const json = JSON.parse(readFileSync(path.join(dir, 'partners', 'p1.jsonld'), 'utf8'));
    // a JSON-LD dataset: one graph object per unit and named graph, each holding that unit's nodes
    const graphs = json['@graph'] as { id: string; '@graph': unknown[] }[];
    assert.deepEqual(
      graphs.map((g) => [g.id, g['@graph'].length]),
      [3, 2, 1, 4].map((n) => [G.value, n]),
    );
    assert.equal(w.triples, 3 + 2 + 40_000 + 1 + 4);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
});
