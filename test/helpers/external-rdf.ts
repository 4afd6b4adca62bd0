// RDF dump files → triple and quad counts from our own parsing (n3, jsonld.js) and from two independent Debian tools:
// python3-rdflib and raptor2-utils' rapper. Each tool is looked up once; absent tools give null (tests skip).
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import N3 from 'n3';
import { jsonldToNQuads } from '../../src/rdf/jsonld.js';

export type DumpFormat = 'turtle' | 'nquads' | 'jsonld';

/** Format of a release file by its extension. */
export function formatOf(file: string): DumpFormat {
  if (file.endsWith('.ttl')) return 'turtle';
  if (file.endsWith('.nq')) return 'nquads';
  if (file.endsWith('.jsonld')) return 'jsonld';
  throw new Error(`not an RDF dump: ${file}`);
}

/** Parses a dump with our own stack: n3 for Turtle and N-Quads, jsonld.js toRdf (via src/rdf/jsonld.ts) for JSON-LD. */
export async function ourQuads(file: string): Promise<N3.Quad[]> {
  const text = readFileSync(file, 'utf8');
  const format = formatOf(file);
  if (format === 'jsonld')
    return new N3.Parser({ format: 'application/n-quads' }).parse(
      await jsonldToNQuads(text, file, pathToFileURL(file).href),
    );
  return new N3.Parser({
    format: format === 'turtle' ? 'text/turtle' : 'application/n-quads',
    baseIRI: pathToFileURL(file).href,
  }).parse(text);
}

/** Number of distinct quads (an RDF graph or dataset is a set: RDF 1.1 Concepts §3, §4). */
export function distinctCount(quads: N3.Quad[]): number {
  return new Set(quads.map((q) => [q.subject, q.predicate, q.object, q.graph].map((t) => N3.termToId(t)).join(' ')))
    .size;
}

/** The same quads with graph names dropped (the merged graph a Turtle or JSON-LD dump carries). */
export function merged(quads: N3.Quad[]): N3.Quad[] {
  const { quad, defaultGraph } = N3.DataFactory;
  return quads.map((q) => quad(q.subject, q.predicate, q.object, defaultGraph()));
}

const ok = (cmd: string, args: string[]) => {
  const r = spawnSync(cmd, args, { encoding: 'utf8' });
  return r.status === 0;
};

/** A Python interpreter that imports rdflib (Debian's python3-rdflib installs into /usr/bin/python3), or null. */
export const rdflibPython: string | null =
  ['python3', '/usr/bin/python3'].find((py) => ok(py, ['-c', 'import rdflib'])) ?? null;

/** Whether that rdflib has its JSON-LD parser plugin (built in since rdflib 6.0; Debian bookworm ships 6.1.1). */
export const rdflibJsonLd: boolean =
  rdflibPython !== null &&
  ok(rdflibPython, ['-c', 'from rdflib.plugin import get\nfrom rdflib.parser import Parser\nget("json-ld", Parser)']);

/** rapper from raptor2-utils, or null. */
export const rapper: string | null = ok('rapper', ['--version']) ? 'rapper' : null;

const RDFLIB_READ = `
import json, sys, rdflib
rdflib.NORMALIZE_LITERALS = False  # keep lexical forms as written (rdflib would print "Z" as "+00:00")
out = {}
for path, fmt in json.load(sys.stdin):
    if fmt in ("nquads", "jsonld"):
        g = rdflib.ConjunctiveGraph()
        g.parse(path, format={"nquads": "nquads", "jsonld": "json-ld"}[fmt])
        out[path] = [sum(1 for _ in g.quads((None, None, None, None))), g.serialize(format="nquads")]
    else:
        g = rdflib.Graph()
        g.parse(path, format="turtle")
        out[path] = [len(g), g.serialize(format="nt")]
print(json.dumps(out))
`;

/**
 * What an outside tool read from one file: its own count and what it parsed, re-read from its N-Triples/N-Quads output.
 */
export interface ToolReading {
  count: number;
  quads: N3.Quad[];
}

const reRead = (text: string) => new N3.Parser({ format: 'application/n-quads' }).parse(text);

/**
 * rdflib's reading of each file: distinct triples of a Graph (Turtle) or quads of a ConjunctiveGraph (N-Quads, and
 * JSON-LD, whose dump is a dataset with named graphs), plus its N-Triples / N-Quads serialisation; one Python process
 * for all files. Parse errors throw.
 */
export function rdflibRead(files: string[]): Record<string, ToolReading> {
  if (!rdflibPython) throw new Error('rdflib is not installed');
  const r = spawnSync(rdflibPython, ['-c', RDFLIB_READ], {
    input: JSON.stringify(files.map((f) => [f, formatOf(f)])),
    encoding: 'utf8',
    maxBuffer: 1 << 28,
  });
  if (r.status !== 0) throw new Error(`rdflib failed: ${r.stderr.trim().split('\n').slice(-3).join(' | ')}`);
  const raw = JSON.parse(r.stdout) as Record<string, [number, string]>;
  return Object.fromEntries(Object.entries(raw).map(([f, [count, text]]) => [f, { count, quads: reRead(text) }]));
}

/**
 * rapper's reading (`rapper -i turtle|nquads -o ntriples|nquads file`; its "Parsing returned N triples" line is the
 * count, the same number `-c` prints). Parse errors throw.
 */
export function rapperRead(file: string): ToolReading {
  const format = formatOf(file);
  if (format === 'jsonld') throw new Error('rapper reads no JSON-LD');
  const r = spawnSync('rapper', ['-i', format, '-o', format === 'nquads' ? 'nquads' : 'ntriples', file], {
    encoding: 'utf8',
    maxBuffer: 1 << 28,
  });
  const m = /Parsing returned (\d+) (?:triples|statements)/.exec(r.stderr);
  if (r.status !== 0 || !m || /error/i.test(r.stderr)) throw new Error(`rapper failed on ${file}: ${r.stderr.trim()}`);
  return { count: Number(m[1]), quads: reRead(r.stdout) };
}
