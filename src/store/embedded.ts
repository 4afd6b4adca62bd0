// Graph sources → an in-memory oxigraph store, optionally persisted as a store folder (N-Quads per graph + manifest).
import { randomBytes } from 'node:crypto';
import { readFile, rm } from 'node:fs/promises';
import { join, relative, resolve } from 'node:path';
import { Store as OxStore, namedNode } from 'oxigraph';
import { UserError, EXIT } from '../errors.js';
import { sparqlIri, queryForm } from './bind.js';
import { ensureFolder, graphFileName, readManifest, sha256, writeAtomic, writeManifest, type Manifest } from './folder.js';
import { dropGraphNames, type TripleLines } from './lines.js';
import { parseNTriples, parseResultsJson } from './results.js';
import type { GraphLoad, GraphSource, QueryResult, Store } from './types.js';

const NT = 'application/n-triples';
const NQ = 'application/n-quads';
const JSON_RESULTS = 'application/sparql-results+json';

/** Maps an oxigraph parser message ("… at line 3 column 7: …") back to the source file's line. */
function parseError(err: unknown, source: GraphSource, lines: TripleLines): UserError {
  const message = err instanceof Error ? err.message : String(err);
  const m = /line (\d+)(?: column (\d+))?/.exec(message);
  const line = m ? (lines.lineNos[Number(m[1]) - 1] ?? 0) : 0;
  return new UserError({ file: source.file, line, field: '', message: message.replace(/^Parser error at line \d+ column \d+: /, ''), hint: 'fix the statement; nothing was loaded' }, EXIT.badInput);
}

function countIn(db: OxStore, graph?: string): number {
  const where = graph ? `GRAPH ${sparqlIri(graph)} { ?s ?p ?o }` : 'GRAPH ?g { ?s ?p ?o }';
  const rows = db.query(`SELECT (COUNT(*) AS ?n) WHERE { ${where} }`) as Map<string, { value: string }>[];
  return Number(rows[0].get('n')!.value);
}

/**
 * The embedded store: oxigraph (SPARQL 1.1 Query + Update, in memory). With a folder, every load also writes the
 * graph's N-Quads file and then the manifest, and `open` loads them back; without one, nothing touches the disk.
 * Queries see the union of all named graphs as their default graph, as most SPARQL servers do.
 */
export class EmbeddedStore implements Store {
  private constructor(
    private readonly db: OxStore,
    private readonly folder: string | null,
    private manifest: Manifest,
  ) {}

  /** Opens (or creates) a store folder and loads every graph its manifest lists, checking sha256 and counts. */
  static async open(folder?: string): Promise<EmbeddedStore> {
    const db = new OxStore();
    if (!folder) return new EmbeddedStore(db, null, { version: 1, graphs: {} });
    await ensureFolder(folder);
    const manifest = await readManifest(folder);
    for (const graph of Object.keys(manifest.graphs).sort()) {
      const entry = manifest.graphs[graph];
      const path = join(folder, entry.file);
      const bytes = await readFile(path);
      const damaged = (message: string): UserError =>
        new UserError({ file: path, line: 0, field: '', message, hint: 'the store folder is damaged; load the release into a new folder' }, EXIT.badInput);
      if (sha256(bytes) !== entry.sha256) throw damaged(`sha256 differs from ${join(folder, 'manifest.json')}`);
      db.load(bytes, { format: NQ, no_transaction: true, lenient: true }); // checked at load time, verified by sha256 now
      const n = countIn(db, graph);
      if (n !== entry.triples) throw damaged(`holds ${n} triples for <${graph}>, the manifest says ${entry.triples}`);
    }
    return new EmbeddedStore(db, folder, manifest);
  }

  /**
   * Replaces a graph all or nothing: an absent graph is loaded in one transaction; an existing one via a staging graph
   * and one `MOVE` (SPARQL 1.1 Update §3.2.4). Persists to the folder, if one is open.
   */
  async loadGraph(graph: string, source: GraphSource): Promise<GraphLoad> {
    const t0 = performance.now();
    const target = sparqlIri(graph, '--graph');
    const lines = source.lines ?? dropGraphNames(source.text, source.file);
    if (lines.count === 0) {
      await this.dropGraph(graph);
      return { graph, triples: 0, millis: performance.now() - t0 };
    }
    const body = Buffer.from(lines.text);
    // oxigraph's load is one transaction: into an absent graph it can go directly; an existing graph is replaced by MOVE.
    const replacing = countIn(this.db, graph) > 0;
    const into = replacing ? `${graph}-staging-${randomBytes(6).toString('hex')}` : graph;
    try {
      this.db.load(body, { format: NT, to_graph_name: namedNode(into) });
    } catch (err) {
      if (replacing) this.db.update(`DROP SILENT GRAPH ${sparqlIri(into)}`);
      throw parseError(err, source, lines);
    }
    if (replacing) this.db.update(`MOVE SILENT GRAPH ${sparqlIri(into)} TO GRAPH ${target}`);
    const triples = countIn(this.db, graph);
    if (this.folder) await this.persist(graph, lines.text, triples, source);
    return { graph, triples, millis: performance.now() - t0 };
  }

  /** Writes the graph file, then the manifest, then removes the file the manifest no longer names. */
  private async persist(graph: string, triples: string, count: number, source: GraphSource): Promise<void> {
    const folder = this.folder!;
    // Every line ends with " .\n" and N-Triples has no raw newline inside a term, so this touches line ends only.
    const text = triples.replace(/ \.\n/g, ` <${graph}> .\n`);
    const digest = sha256(text);
    const file = graphFileName(graph, digest);
    await writeAtomic(join(folder, file), text);
    const old = this.manifest.graphs[graph]?.file;
    const next: Manifest = {
      version: 1,
      graphs: { ...this.manifest.graphs, [graph]: { file, triples: count, sha256: digest, loadedAt: source.issued ?? null, source: relative(resolve(folder), resolve(source.file)) } },
    };
    await writeManifest(folder, next);
    this.manifest = next;
    if (old && old !== file) await rm(join(folder, old), { force: true });
  }

  async dropGraph(graph: string): Promise<void> {
    this.db.update(`DROP SILENT GRAPH ${sparqlIri(graph, '--graph')}`);
    const entry = this.manifest.graphs[graph];
    if (!this.folder || !entry) return;
    const graphs = { ...this.manifest.graphs };
    delete graphs[graph];
    this.manifest = { version: 1, graphs };
    await writeManifest(this.folder, this.manifest);
    await rm(join(this.folder, entry.file), { force: true });
  }

  async countTriples(graph?: string): Promise<number> {
    return countIn(this.db, graph);
  }

  async listGraphs(): Promise<string[]> {
    const rows = this.db.query('SELECT DISTINCT ?g WHERE { GRAPH ?g { ?s ?p ?o } }') as Map<string, { value: string }>[];
    return rows.map((r) => r.get('g')!.value).sort();
  }

  /** The manifest as loaded or last written (graph → file, count, sha256, loaded-at, source). */
  get contents(): Manifest {
    return this.manifest;
  }

  async query(sparql: string): Promise<QueryResult> {
    const form = queryForm(sparql);
    const graphForm = form === 'CONSTRUCT' || form === 'DESCRIBE';
    let text: string;
    try {
      text = this.db.query(sparql, { results_format: graphForm ? NT : JSON_RESULTS, use_default_graph_as_union: true }) as string;
    } catch (err) {
      throw new UserError({ file: 'query', line: 0, field: '', message: (err as Error).message, hint: 'check the SPARQL text' }, EXIT.badInput);
    }
    return graphForm ? parseNTriples(text, 'embedded store') : parseResultsJson(text, 'embedded store');
  }

  async close(): Promise<void> {
    (this.db as unknown as { free?: () => void }).free?.();
  }
}
