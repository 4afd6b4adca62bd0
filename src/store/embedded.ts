// Graph sources → an in-memory oxigraph store, optionally persisted as a store folder (N-Quads per graph + manifest).
import { randomBytes } from 'node:crypto';
import { readFile, rm } from 'node:fs/promises';
import { join, relative, resolve } from 'node:path';
import { Store as OxStore, namedNode } from 'oxigraph';
import { UserError, EXIT } from '../errors.js';
import { sparqlIri, queryForm } from './bind.js';
import {
  ensureFolder,
  graphFileName,
  readManifest,
  removeStoreLeftovers,
  sha256,
  STORE_LOCK,
  writeManifest,
  type Manifest,
} from './folder.js';
import { takeLock, type Lock } from '../util/lock.js';
import { displayPath } from '../errors.js';
import { removeOnSignal } from '../util/interrupt.js';
import { dropGraphNames, type TripleLines } from './lines.js';
import { writeFileAtomicallyAsync } from '../io/temp-file.js';
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
  return new UserError(
    {
      file: source.file,
      line,
      field: '',
      message: message.replace(/^Parser error at line \d+ column \d+: /, ''),
      hint: 'fix the statement; nothing was loaded',
    },
    EXIT.badInput,
  );
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
    private readonly lock: Lock | null = null,
  ) {}

  /** Set inside {@link atomically}: graph files are written, the manifest only once at the end. */
  private deferred: Manifest | null = null;
  /** Forget-functions of graph files written inside {@link atomically} that no manifest names yet. */
  private unnamed: (() => void)[] = [];

  /**
   * Opens (or creates) a store folder and loads every graph its manifest lists, checking sha256 and counts. With
   * `lock` (every command that writes), the folder is locked against a second writer until `close`, and what a
   * stopped load left behind (temp files, graph files no manifest names) is removed first.
   */
  static async open(folder?: string, opts: { lock?: boolean } = {}): Promise<EmbeddedStore> {
    const db = new OxStore();
    if (!folder) return new EmbeddedStore(db, null, { version: 1, graphs: {} });
    await ensureFolder(folder);
    const lock = opts.lock ? takeLock(join(folder, STORE_LOCK), 'load', folder, '--store') : null;
    try {
      const manifest = await readManifest(folder);
      if (lock)
        for (const f of await removeStoreLeftovers(folder, manifest))
          process.stderr.write(`concordat: removed ${displayPath(f)}, left by a stopped load\n`);
      await EmbeddedStore.fill(db, folder, manifest);
      return new EmbeddedStore(db, folder, manifest, lock);
    } catch (err) {
      lock?.release();
      throw err;
    }
  }

  private static async fill(db: OxStore, folder: string, manifest: Manifest): Promise<void> {
    for (const graph of Object.keys(manifest.graphs).sort()) {
      const entry = manifest.graphs[graph];
      const path = join(folder, entry.file);
      const bytes = await readFile(path).catch(() => {
        throw new UserError(
          {
            file: path,
            line: 0,
            field: '',
            message: 'is named by the manifest but cannot be read',
            hint: 'a load may have changed the store meanwhile: try again; else load the release into a new folder',
          },
          EXIT.badInput,
        );
      });
      const damaged = (message: string): UserError =>
        new UserError(
          {
            file: path,
            line: 0,
            field: '',
            message,
            hint: 'the store folder is damaged; load the release into a new folder',
          },
          EXIT.badInput,
        );
      if (sha256(bytes) !== entry.sha256) throw damaged(`sha256 differs from ${join(folder, 'manifest.json')}`);
      // checked at load time, verified by sha256 now
      db.load(bytes, { format: NQ, no_transaction: true, lenient: true });
      const n = countIn(db, graph);
      if (n !== entry.triples) throw damaged(`holds ${n} triples for <${graph}>, the manifest says ${entry.triples}`);
    }
  }

  /**
   * Runs `fn` (loads and drops) so that a store folder changes all at once: graph files are written as they come, the
   * manifest once at the end (one rename), then files it no longer names are removed. If `fn` fails or the process is
   * stopped, the folder's manifest still names the earlier state; files written meanwhile are removed by the next
   * writer. In memory the store is left as `fn` left it (the command ends anyway).
   */
  async atomically<T>(fn: () => Promise<T>): Promise<T> {
    if (!this.folder) return fn();
    const before = this.manifest;
    this.deferred = before;
    let result: T;
    try {
      result = await fn();
    } catch (err) {
      this.deferred = null;
      for (const forget of this.unnamed.splice(0)) forget();
      // the files written for the abandoned state
      await removeStoreLeftovers(this.folder, before).catch(() => undefined);
      throw err;
    }
    const next = this.deferred;
    this.deferred = null;
    await writeManifest(this.folder, next);
    this.manifest = next;
    for (const forget of this.unnamed.splice(0)) forget();
    const keep = new Set(Object.values(next.graphs).map((e) => e.file));
    for (const e of Object.values(before.graphs))
      if (!keep.has(e.file)) await rm(join(this.folder, e.file), { force: true });
    return result;
  }

  /** Commits a manifest change: at once, or at the end of {@link atomically}. */
  private async commit(next: Manifest, removed: string[]): Promise<void> {
    if (this.deferred) {
      this.deferred = next;
      return;
    }
    await writeManifest(this.folder!, next);
    this.manifest = next;
    for (const f of removed) await rm(join(this.folder!, f), { force: true });
  }

  private get current(): Manifest {
    return this.deferred ?? this.manifest;
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
    // oxigraph's load is one transaction: into an absent graph it can go directly; an existing graph is replaced by
    // MOVE.
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
    await writeFileAtomicallyAsync(join(folder, file), text);
    // until the manifest names it, a stop removes the new graph file (unless an earlier state already names it)
    if (this.deferred && !Object.values(this.manifest.graphs).some((e) => e.file === file))
      this.unnamed.push(removeOnSignal(join(folder, file)));
    const old = this.current.graphs[graph]?.file;
    const next: Manifest = {
      version: 1,
      graphs: {
        ...this.current.graphs,
        [graph]: {
          file,
          triples: count,
          sha256: digest,
          loadedAt: source.issued ?? null,
          source: relative(resolve(folder), resolve(source.file)),
        },
      },
    };
    await this.commit(next, old && old !== file ? [old] : []);
  }

  async dropGraph(graph: string): Promise<void> {
    this.db.update(`DROP SILENT GRAPH ${sparqlIri(graph, '--graph')}`);
    const entry = this.current.graphs[graph];
    if (!this.folder || !entry) return;
    const graphs = { ...this.current.graphs };
    delete graphs[graph];
    await this.commit({ version: 1, graphs }, [entry.file]);
  }

  async countTriples(graph?: string): Promise<number> {
    return countIn(this.db, graph);
  }

  async listGraphs(): Promise<string[]> {
    const rows = this.db.query('SELECT DISTINCT ?g WHERE { GRAPH ?g { ?s ?p ?o } }') as Map<
      string,
      { value: string }
    >[];
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
      text = this.db.query(sparql, {
        results_format: graphForm ? NT : JSON_RESULTS,
        use_default_graph_as_union: true,
      }) as string;
    } catch (err) {
      throw new UserError(
        { file: 'query', line: 0, field: '', message: (err as Error).message, hint: 'check the SPARQL text' },
        EXIT.badInput,
      );
    }
    return graphForm ? parseNTriples(text, 'embedded store') : parseResultsJson(text, 'embedded store');
  }

  async close(): Promise<void> {
    (this.db as unknown as { free?: () => void }).free?.();
    this.lock?.release();
  }
}
