// Units of quads → the release's RDF files (whole and per partner, Turtle / N-Quads / JSON-LD) and SHACL chunks.
import { createWriteStream, mkdirSync, type WriteStream } from 'node:fs';
import { once } from 'node:events';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import { openQuadWriter, type QuadWriter } from '../rdf/serialize.js';
import type { Unit } from '../rdf/index.js';
import type { ValidationChunk } from '../validate/chunked.js';
import { JsonLdFile, unitNodes } from './jsonld.js';

/** A buffered text file (JSON-LD is written as text, chunked like the RDF writers). */
class TextFile {
  private out: WriteStream;
  private parts: string[] = [];
  private size = 0;
  constructor(file: string) {
    this.out = createWriteStream(file);
  }
  write = (s: string) => {
    this.parts.push(s);
    this.size += s.length;
    if (this.size > 1 << 20) this.flush();
  };
  private flush() {
    if (this.parts.length) this.out.write(this.parts.join(''));
    this.parts = [];
    this.size = 0;
  }
  async end() {
    this.flush();
    this.out.end();
    await once(this.out, 'close');
  }
}

interface Target {
  ttl: QuadWriter;
  nq: QuadWriter;
  json: JsonLdFile;
  jsonFile: TextFile;
}

function openTarget(dir: string, stem: string): Target {
  const jsonFile = new TextFile(path.join(dir, `${stem}.jsonld`));
  return { ttl: openQuadWriter(path.join(dir, `${stem}.ttl`), 'turtle'), nq: openQuadWriter(path.join(dir, `${stem}.nq`), 'nquads'), json: new JsonLdFile(jsonFile.write), jsonFile };
}

async function writeTo(t: Target, quads: Quad[], nodes: object[]): Promise<void> {
  for (const q of quads) {
    if (!t.ttl.write(q)) await t.ttl.drain();
    if (!t.nq.write(q)) await t.nq.drain();
  }
  t.json.add(nodes);
}

async function closeTarget(t: Target): Promise<void> {
  t.json.close();
  await Promise.all([t.ttl.end(), t.nq.end(), t.jsonFile.end()]);
}

/** The release's RDF writers: `concordance.*` and `partners/<key>.*`, each unit going to the partners it touches. */
export class ReleaseWriter {
  private whole: Target;
  private partners: Target[];
  triples = 0;
  constructor(dir: string, partnerKeys: string[]) {
    mkdirSync(path.join(dir, 'partners'), { recursive: true });
    this.whole = openTarget(dir, 'concordance');
    this.partners = partnerKeys.map((k) => openTarget(path.join(dir, 'partners'), k));
  }
  async add(unit: Unit): Promise<void> {
    const nodes = await unitNodes(unit);
    this.triples += unit.quads.length;
    await writeTo(this.whole, unit.quads, nodes);
    const targets = unit.partners === 'all' ? this.partners : [...unit.partners].sort((a, b) => a - b).map((p) => this.partners[p]);
    for (const t of targets) await writeTo(t, unit.quads, nodes);
  }
  async close(): Promise<void> {
    await closeTarget(this.whole);
    for (const t of this.partners) await closeTarget(t);
  }
}

/**
 * A unit as a validation chunk: its own quads, and as context the rdf:type quads of the shared nodes it points to
 * (runs, agents, reviews, curators) plus the unit's own context, so class-based constraints resolve inside the chunk
 * without loading the whole release. Context-only nodes are not themselves judged here (see validateChunks).
 */
export function chunkOf(unit: Unit, typeIndex: Map<string, Quad[]>): ValidationChunk {
  const context: Quad[] = [];
  const seen = new Set<string>();
  for (const q of unit.quads) {
    if (q.object.termType !== 'NamedNode' || seen.has(q.object.value)) continue;
    seen.add(q.object.value);
    const stubs = typeIndex.get(q.object.value);
    if (stubs) context.push(...stubs);
  }
  if (unit.context?.length) context.push(...unit.context);
  return { quads: unit.quads, context };
}

/** Subject IRI → its rdf:type quads, over the shared provenance unit. */
export function typeIndexOf(unit: Unit): Map<string, Quad[]> {
  const index = new Map<string, Quad[]>();
  for (const q of unit.quads)
    if (q.predicate.value === 'http://www.w3.org/1999/02/22-rdf-syntax-ns#type') {
      const list = index.get(q.subject.value) ?? [];
      list.push(q);
      index.set(q.subject.value, list);
    }
  return index;
}
