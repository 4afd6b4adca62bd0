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

/** A buffered text file: strings gathered to ~1 MiB, then handed to the stream; `drain()` gives back-pressure. */
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
  ttl: TextFile;
  nq: TextFile;
  json: JsonLdFile;
  jsonFile: TextFile;
}

function openTarget(dir: string, stem: string, prefixes: Record<string, string>): Target {
  const ttl = new TextFile(path.join(dir, `${stem}.ttl`));
  ttl.write(turtlePrefixes(prefixes));
  const jsonFile = new TextFile(path.join(dir, `${stem}.jsonld`));
  return { ttl, nq: new TextFile(path.join(dir, `${stem}.nq`)), json: new JsonLdFile(jsonFile.write), jsonFile };
}

async function closeTarget(t: Target): Promise<void> {
  t.json.close();
  await Promise.all([t.ttl.end(), t.nq.end(), t.jsonFile.end()]);
}

/**
 * The release's RDF writers: `concordance.*` and `partners/<key>.*`. Each unit is turned into Turtle, N-Quads and
 * JSON-LD text once, and that text goes to the whole release and to the slice of every partner the unit touches.
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
    const ttl = this.turtle.encode(unit.quads);
    const nq = nquadsText(unit.quads);
    const targets = [this.whole, ...(unit.partners === 'all' ? this.partners : [...unit.partners].sort((a, b) => a - b).map((p) => this.partners[p]))];
    for (const t of targets) {
      t.ttl.write(ttl);
      t.nq.write(nq);
      t.json.add(nodes);
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
