// Graph sources → a remote SPARQL 1.1 server (Graph Store Protocol for data, Update for MOVE/DROP, Query for counts).
import { randomBytes } from 'node:crypto';
import { UserError, EXIT } from '../errors.js';
import { queryForm, sparqlIri } from './bind.js';
import { chunkLines } from './chunk.js';
import { Http, shownUrl } from './http.js';
import { distinctCount, dropGraphNames, linesOf } from './lines.js';
import { credentialsFor } from './netrc.js';
import { parseNTriples, parseResultsJson } from './results.js';
import type { GraphLoad, GraphSource, QueryResult, Store } from './types.js';

/** The three service URLs; `gsp` and `update` are needed only to write. */
export interface Endpoints {
  gsp?: string;
  update?: string;
  query: string;
}

/** Seams for tests: corrupt one chunk, claim another expected count, or alter the MOVE request. */
export interface RemoteHooks {
  chunkBody?(index: number, body: string): string;
  expectedTriples?(n: number): number;
  moveUpdate?(update: string): string;
}

/** Tuning; defaults follow measured behaviour of a real server (≤100k triples per request). */
export interface RemoteOptions {
  chunkTriples?: number;
  timeoutMs?: number;
  retries?: number;
  backoffMs?: number;
  env?: NodeJS.ProcessEnv;
  hooks?: RemoteHooks;
  /** Progress lines on stderr; default: only when stderr is a terminal. */
  progress?: boolean;
}

const NT = 'application/n-triples';
const JSON_RESULTS = 'application/sparql-results+json';

const fail = (where: string, message: string, hint: string): UserError =>
  new UserError({ file: where, line: 0, field: '', message, hint }, EXIT.failure);
const excerpt = (text: string): string => text.replace(/\s+/g, ' ').trim().slice(0, 200);

/**
 * A remote store. Replacing a graph (Graph Store HTTP Protocol §5.5 POST into a staging graph, in chunks; a SPARQL
 * count of the staging graph; then one Update §3.2.4 `MOVE SILENT GRAPH`) never leaves the target half-replaced:
 * on any failure the staging graph is dropped and the target is left exactly as it was.
 */
export class RemoteStore implements Store {
  private readonly http: Http;
  private readonly chunk: number;
  private readonly progress: boolean;
  constructor(
    private readonly endpoints: Endpoints,
    private readonly opts: RemoteOptions = {},
  ) {
    const anyUrl = endpoints.gsp ?? endpoints.update ?? endpoints.query;
    this.http = new Http({
      credentials: credentialsFor(anyUrl, opts.env),
      timeoutMs: opts.timeoutMs ?? 300_000,
      retries: opts.retries ?? 3,
      backoffMs: opts.backoffMs ?? 1000,
    });
    this.chunk = opts.chunkTriples ?? 100_000;
    this.progress = opts.progress ?? Boolean(process.stderr.isTTY);
  }

  private writeUrls(): { gsp: string; update: string } {
    const { gsp, update } = this.endpoints;
    if (!gsp || !update)
      throw new UserError(
        {
          file: 'command line',
          line: 0,
          field: gsp ? '--update' : '--endpoint',
          message: 'is needed to change a remote store',
          hint: 'give --endpoint <Graph Store URL> --update <SPARQL Update URL> --query-endpoint <SPARQL Query URL>',
        },
        EXIT.badInput,
      );
    return { gsp, update };
  }

  private graphUrl(gsp: string, graph: string): string {
    return `${gsp}${gsp.includes('?') ? '&' : '?'}graph=${encodeURIComponent(graph)}`; // GSP §4.2 indirect identification
  }

  private async update(sparql: string): Promise<void> {
    const { update } = this.writeUrls();
    const res = await this.http.send('POST', update, { form: { update: sparql }, accept: JSON_RESULTS });
    if (res.status >= 300)
      throw fail(
        shownUrl(update),
        this.http.redact(`update refused (HTTP ${res.status}): ${excerpt(res.text)}`),
        'check the update URL and that the user may write',
      );
  }

  async loadGraph(graph: string, source: GraphSource): Promise<GraphLoad> {
    const t0 = performance.now();
    const { gsp } = this.writeUrls();
    const target = sparqlIri(graph, '--graph');
    const lines = linesOf(source.lines ?? dropGraphNames(source.text, source.file));
    if (lines.length === 0) {
      await this.dropGraph(graph);
      return { graph, triples: 0, millis: performance.now() - t0 };
    }
    const expected = this.opts.hooks?.expectedTriples?.(distinctCount(lines)) ?? distinctCount(lines);
    const staging = `${graph}-staging-${randomBytes(6).toString('hex')}`;
    const stagingUrl = this.graphUrl(gsp, staging);
    try {
      // An empty-body request first: learns the auth challenge and checks credentials before any large body is sent.
      const probe = await this.http.send('GET', stagingUrl, { accept: NT });
      if (probe.status >= 400 && probe.status !== 404)
        throw fail(
          shownUrl(gsp),
          `Graph Store answered HTTP ${probe.status}: ${excerpt(probe.text)}`,
          'check --endpoint',
        );
      const chunks = chunkLines(lines, this.chunk);
      for (let i = 0; i < chunks.length; i++) {
        if (this.progress) process.stderr.write(`\r${graph}: chunk ${i + 1}/${chunks.length}`);
        const raw = chunks[i].join('\n') + '\n';
        const body = this.opts.hooks?.chunkBody?.(i, raw) ?? raw;
        const res = await this.http.send('POST', stagingUrl, { body, contentType: NT });
        if (res.status >= 300)
          throw fail(
            shownUrl(gsp),
            this.http.redact(`chunk ${i + 1} of ${chunks.length} refused (HTTP ${res.status}): ${excerpt(res.text)}`),
            'check the file with a validator; the server rejected its syntax or the user may not write',
          );
      }
      if (this.progress) process.stderr.write('\n');
      const got = await this.countTriples(staging);
      if (got !== expected)
        throw fail(
          shownUrl(this.endpoints.query),
          `the staging graph holds ${got} triples, the file has ${expected}`,
          'the server dropped or merged statements; nothing was replaced',
        );
      const move = `MOVE SILENT GRAPH ${sparqlIri(staging)} TO GRAPH ${target}`;
      await this.update(this.opts.hooks?.moveUpdate?.(move) ?? move);
    } catch (err) {
      await this.update(`DROP SILENT GRAPH ${sparqlIri(staging)}`).catch(() => undefined);
      if (!(err instanceof UserError)) throw err;
      const p = err.problems[0];
      throw new UserError(
        {
          ...p,
          message: `loading <${graph}> from ${source.file} failed: ${p.message}; the staging graph was dropped and <${graph}> is unchanged`,
        },
        EXIT.failure,
      );
    }
    const triples = await this.countTriples(graph);
    if (triples !== expected)
      throw fail(
        shownUrl(this.endpoints.query),
        `<${graph}> holds ${triples} triples after the move, the file has ${expected}`,
        'another writer may have changed the graph meanwhile',
      );
    return { graph, triples, millis: performance.now() - t0 };
  }

  async dropGraph(graph: string): Promise<void> {
    await this.update(`DROP SILENT GRAPH ${sparqlIri(graph, '--graph')}`);
  }

  async countTriples(graph?: string): Promise<number> {
    const where = graph ? `GRAPH ${sparqlIri(graph, '--graph')} { ?s ?p ?o }` : 'GRAPH ?g { ?s ?p ?o }';
    const r = await this.query(`SELECT (COUNT(*) AS ?n) WHERE { ${where} }`);
    const cell = r.kind === 'bindings' ? r.rows[0]?.n : undefined;
    if (!cell || !/^[0-9]+$/.test(cell.value))
      throw fail(shownUrl(this.endpoints.query), 'the count query gave no number', 'check --query');
    return Number(cell.value);
  }

  async listGraphs(): Promise<string[]> {
    const r = await this.query('SELECT DISTINCT ?g WHERE { GRAPH ?g { ?s ?p ?o } }');
    return r.kind === 'bindings'
      ? r.rows
          .map((row) => row.g?.value ?? '')
          .filter(Boolean)
          .sort()
      : [];
  }

  /** SPARQL 1.1 Protocol §2.1.2 (query via URL-encoded POST). */
  async query(sparql: string): Promise<QueryResult> {
    const form = queryForm(sparql);
    const graphForm = form === 'CONSTRUCT' || form === 'DESCRIBE';
    const url = this.endpoints.query;
    const res = await this.http.send('POST', url, { form: { query: sparql }, accept: graphForm ? NT : JSON_RESULTS });
    if (res.status >= 300) {
      const problem = {
        file: shownUrl(url),
        line: 0,
        field: '',
        message: this.http.redact(`query refused (HTTP ${res.status}): ${excerpt(res.text)}`),
        hint: 'check the SPARQL text and --query',
      };
      throw new UserError(problem, res.status === 400 ? EXIT.badInput : EXIT.failure);
    }
    return graphForm ? parseNTriples(res.text, shownUrl(url)) : parseResultsJson(res.text, shownUrl(url));
  }

  async close(): Promise<void> {}
}
