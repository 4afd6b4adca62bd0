// Units of quads → the release's RDF files (whole and per partner, Turtle / N-Quads / JSON-LD) and SHACL chunks.
import { createWriteStream, mkdirSync, type WriteStream } from 'node:fs';
import { once } from 'node:events';
import path from 'node:path';
import type { Quad } from '@rdfjs/types';
import { TurtleEncoder, nquadsText, turtlePrefixes } from '../rdf/text.js';
import { prefixMap } from '../rdf/formats.js';
import type { Unit } from '../rdf/index.js';
import type { ValidationChunk } from '../validate/chunked.js';
import { JsonLdFile, unitNodes } from './jsonld.js';

/** A buffered output file: byte runs gathered to ~1 MiB, then handed to the stream; `drain()` gives back-pressure. */
class OutFile {
  private out: WriteStream;
  private parts: Buffer[] = [];
  private size = 0;
  constructor(file: string) {
    this.out = createWriteStream(file);
  }
  write(b: Buffer): void {
    if (b.length === 0) return;
    this.parts.push(b);
    this.size += b.length;
    if (this.size > 1 << 20) this.flush();
  }
  text(s: string): void {
    this.write(Buffer.from(s, 'utf8'));
  }
  private flush() {
    if (this.parts.length) this.out.write(this.parts.length === 1 ? this.parts[0] : Buffer.concat(this.parts, this.size));
    this.parts = [];
    this.size = 0;
  }
  async drain() {
    if (this.out.writableNeedDrain) await once(this.out, 'drain');
  }
  async end() {
    this.flush();
    this.out.end();
    await once(this.out, 'close');
  }
}

interface Target {
  ttl: OutFile;
  nq: OutFile;
  json: OutFile;
  /** No JSON-LD node written yet (no separator before the next run). */
  jsonFirst: boolean;
}

function openTarget(dir: string, stem: string, prefixes: Record<string, string>): Target {
  const t: Target = { ttl: new OutFile(path.join(dir, `${stem}.ttl`)), nq: new OutFile(path.join(dir, `${stem}.nq`)), json: new OutFile(path.join(dir, `${stem}.jsonld`)), jsonFirst: true };
  t.ttl.text(turtlePrefixes(prefixes));
  t.json.text(JsonLdFile.head);
  return t;
}

async function closeTarget(t: Target): Promise<void> {
  t.json.text(JsonLdFile.tail);
  await Promise.all([t.ttl.end(), t.nq.end(), t.json.end()]);
}

const SEPARATOR = Buffer.from(',\n');

/**
 * The release's RDF writers: `concordance.*` and `partners/<key>.*`. Each unit is turned into Turtle, N-Quads and
 * JSON-LD bytes once, and those bytes go to the whole release and to the slice of every partner the unit touches.
 */
export class ReleaseWriter {
  private whole: Target;
  private partners: Target[];
  private turtle: TurtleEncoder;
  triples = 0;
  constructor(dir: string, partnerKeys: string[], prefixes: Record<string, string> = prefixMap()) {
    mkdirSync(path.join(dir, 'partners'), { recursive: true });
    this.turtle = new TurtleEncoder(prefixes);
    this.whole = openTarget(dir, 'concordance', prefixes);
    this.partners = partnerKeys.map((k) => openTarget(path.join(dir, 'partners'), k, prefixes));
  }
  async add(unit: Unit): Promise<void> {
    const nodes = await unitNodes(unit);
    this.triples += unit.quads.length;
    const ttl = Buffer.from(this.turtle.encode(unit.quads), 'utf8');
    const nq = Buffer.from(nquadsText(unit.quads), 'utf8');
    const json = nodes.length ? Buffer.from(JsonLdFile.text(nodes), 'utf8') : null;
    const targets = [this.whole, ...(unit.partners === 'all' ? this.partners : [...unit.partners].sort((a, b) => a - b).map((p) => this.partners[p]))];
    for (const t of targets) {
      t.ttl.write(ttl);
      t.nq.write(nq);
      if (json) {
        if (!t.jsonFirst) t.json.write(SEPARATOR);
        t.jsonFirst = false;
        t.json.write(json);
      }
    }
    await this.whole.nq.drain();
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
