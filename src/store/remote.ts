// Graph sources → a remote SPARQL 1.1 server (Graph Store Protocol for data, Update for MOVE/DROP, Query for counts).
import { randomBytes } from 'node:crypto';
import { UserError, EXIT } from '../errors.js';
import { queryForm, sparqlIri } from './bind.js';
import { chunkLines } from './chunk.js';
import { ALLOW_BASIC_VAR, Http, shownUrl, type HttpAnswer, type HttpRequest } from './http.js';
import { ownerRecord, ownerState, type Owner } from '../util/owner.js';
import { stopping, undoOnSignal } from '../util/interrupt.js';
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

/**
 * Staging graphs are `urn:concordat:staging:<host>:<pid>:<boot id>:<random>`: a later load can tell whose they are and
 * whether that process is gone (RFC 8141 URN syntax; `concordat` is not a registered namespace, common practice for
 * private URNs, no source).
 */
export const STAGING_PREFIX = 'urn:concordat:staging:';
const stagingGraph = (): string => {
  const o = ownerRecord('load');
  return `${STAGING_PREFIX}${encodeURIComponent(o.host)}:${o.pid}:${o.boot || 'none'}:${randomBytes(6).toString('hex')}`;
};
/** The owner a staging graph's name records, or null when the name is not one this version makes. */
function stagingOwner(graph: string): Owner | null {
  const [host, pid, boot] = graph.slice(STAGING_PREFIX.length).split(':');
  if (!host || !/^[0-9]+$/.test(pid ?? '') || boot === undefined) return null;
  return {
    tool: 'concordat',
    pid: Number(pid),
    host: decodeURIComponent(host),
    boot: boot === 'none' ? '' : boot,
    started: '',
    command: 'load',
  };
}

const fail = (where: string, message: string, hint: string): UserError =>
  new UserError({ file: where, line: 0, field: '', message, hint }, EXIT.failure);
const excerpt = (text: string): string => text.replace(/\s+/g, ' ').trim().slice(0, 200);
const list = (graphs: string[]): string => graphs.map((g) => `<${g}>`).join(', ');

/** A graph uploaded into its staging graph and counted there, waiting to be moved into place. */
interface Staged {
  graph: string;
  staging: string;
  triples: number;
}

/** What the server holds after a replace request: graphs replaced, not replaced (and why), drops not done. */
interface CommitState {
  replaced: Staged[];
  notReplaced: Staged[];
  kept: string[];
  describe: Map<string, string>;
}

/** A replace in one Update request: graphs to move into place, graphs to drop, and the targets' counts before. */
interface Change {
  moves: Staged[];
  drops: string[];
  before: Map<string, number>;
}

/**
 * A remote store. Replacing graphs never leaves a target half-written: each graph is uploaded in chunks (Graph Store
 * HTTP Protocol §5.5 POST) into a staging graph of its own, counted there by SPARQL, and only then moved into place
 * with `MOVE SILENT GRAPH` (SPARQL 1.1 Update §3.2.4). Inside {@link atomically} (a release load) every graph is
 * staged first and all moves and drops go in one Update request, which Update §2.2 says a service SHOULD treat
 * atomically. After any failure the server is asked what it now holds, and the message says only what was verified.
 */
export class RemoteStore implements Store {
  private readonly http: Http;
  private readonly chunk: number;
  private readonly progress: boolean;
  /** Set inside {@link atomically}: staged graphs and drops wait for one commit. */
  private pending: { moves: Staged[]; drops: string[] } | null = null;
  /** Staging graphs this process made that may still exist on the server (for a signal's clean-up). */
  private readonly stagings = new Set<string>();
  /** The request on the wire, so a signal's clean-up can wait for it before dropping staging graphs. */
  private inflight: Promise<unknown> = Promise.resolve();
  /** The replace request being sent, if any, for the clean-up's report. */
  private committing: Change | null = null;
  private halted = false;
  private forgetUndo: (() => void) | null = null;
  constructor(
    private readonly endpoints: Endpoints,
    private readonly opts: RemoteOptions = {},
  ) {
    const anyUrl = endpoints.gsp ?? endpoints.update ?? endpoints.query;
    this.http = new Http({
      credentials: credentialsFor(anyUrl, opts.env),
      allowBasicOverHttp: (opts.env ?? process.env)[ALLOW_BASIC_VAR] === '1',
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

  /** Every request goes through here: remembered as in flight; none is started for the command once a signal came. */
  private send(method: 'GET' | 'POST', url: string, req: HttpRequest, cleanup = false): Promise<HttpAnswer> {
    if (this.halted && !cleanup) throw fail(shownUrl(url), 'stopped by a signal', 'the clean-up says what was left');
    const p = this.http.send(method, url, req);
    this.inflight = p.catch(() => undefined);
    return p;
  }

  private async update(sparql: string, cleanup = false): Promise<void> {
    const { update } = this.writeUrls();
    const res = await this.send('POST', update, { form: { update: sparql }, accept: JSON_RESULTS }, cleanup);
    if (res.status >= 300)
      throw fail(
        shownUrl(update),
        this.http.redact(`update refused (HTTP ${res.status}): ${excerpt(res.text)}`),
        'check the update URL and that the user may write',
      );
  }

  private failure(err: UserError, message: string): UserError {
    return new UserError({ ...err.problems[0], message: this.http.redact(message) }, err.exitCode);
  }

  async loadGraph(graph: string, source: GraphSource): Promise<GraphLoad> {
    const t0 = performance.now();
    const { gsp } = this.writeUrls();
    sparqlIri(graph, '--graph');
    const lines = linesOf(source.lines ?? dropGraphNames(source.text, source.file));
    if (lines.length === 0) {
      await this.dropGraph(graph);
      return { graph, triples: 0, millis: performance.now() - t0 };
    }
    const staged = await this.stage(graph, lines, source.file, gsp);
    if (this.pending) this.pending.moves.push(staged);
    else await this.commit({ moves: [staged], drops: [], before: await this.counts([graph]) });
    return { graph, triples: staged.triples, millis: performance.now() - t0 };
  }

  /** Uploads one graph's lines into a fresh staging graph and checks its count; on failure the staging graph goes. */
  private async stage(graph: string, lines: string[], file: string, gsp: string): Promise<Staged> {
    const expected = this.opts.hooks?.expectedTriples?.(distinctCount(lines)) ?? distinctCount(lines);
    const staging = stagingGraph();
    this.forgetUndo ??= undoOnSignal(() => this.undo());
    this.stagings.add(staging);
    const stagingUrl = this.graphUrl(gsp, staging);
    try {
      // An empty-body request first: learns the auth challenge and checks credentials before any large body is sent.
      const probe = await this.send('GET', stagingUrl, { accept: NT });
      if (probe.status >= 400 && probe.status !== 404)
        throw fail(
          shownUrl(gsp),
          this.http.redact(`Graph Store answered HTTP ${probe.status}: ${excerpt(probe.text)}`),
          'check --endpoint',
        );
      const chunks = chunkLines(lines, this.chunk);
      for (let i = 0; i < chunks.length; i++) {
        if (this.progress) process.stderr.write(`\r${graph}: chunk ${i + 1}/${chunks.length}`);
        const raw = chunks[i].join('\n') + '\n';
        const body = this.opts.hooks?.chunkBody?.(i, raw) ?? raw;
        const res = await this.send('POST', stagingUrl, { body, contentType: NT });
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
      return { graph, staging, triples: expected };
    } catch (err) {
      if (stopping() || !(err instanceof UserError)) throw err; // a signal's clean-up drops the staging graphs
      const note = (await this.discard([staging])).note;
      throw this.failure(
        err,
        `loading <${graph}> from ${file} failed: ${err.problems[0].message}; ${note}; <${graph}> is unchanged`,
      );
    }
  }

  /** Triple counts of the graphs, by SPARQL (GSP GET may be truncated by the server). */
  private async counts(graphs: string[]): Promise<Map<string, number>> {
    const out = new Map<string, number>();
    for (const g of graphs) out.set(g, await this.countTriples(g));
    return out;
  }

  /**
   * Drops staging graphs and counts them afterwards; the note says what was verified (each is dropped, holds triples
   * still, or could not be checked) and never more.
   */
  private async discard(stagings: string[]): Promise<{ gone: string[]; note: string }> {
    if (stagings.length === 0) return { gone: [], note: '' };
    await this.update(stagings.map((g) => `DROP SILENT GRAPH ${sparqlIri(g)}`).join(' ;\n'), true).catch(
      () => undefined,
    );
    const gone: string[] = [];
    const left: string[] = [];
    const unknown: string[] = [];
    for (const g of stagings) {
      const n = await this.countTriples(g, true).catch(() => -1);
      if (n === 0) {
        gone.push(g);
        this.stagings.delete(g);
      } else (n > 0 ? left : unknown).push(g);
    }
    const one = stagings.length === 1;
    const notes = [
      gone.length ? (one ? 'the staging graph was dropped' : `${gone.length} staging graphs were dropped`) : '',
      left.length ? `staging graph(s) ${list(left)} still hold triples (the next load removes them)` : '',
      unknown.length
        ? `whether staging graph(s) ${list(unknown)} were dropped could not be checked (the next load removes them)`
        : '',
    ];
    return { gone, note: notes.filter(Boolean).join('; ') };
  }

  /** Sends one Update with every move and drop of the change, then checks each graph; says exactly what happened. */
  private async commit(change: Change): Promise<void> {
    const ops = [
      ...change.moves.map((m) => `MOVE SILENT GRAPH ${sparqlIri(m.staging)} TO GRAPH ${sparqlIri(m.graph)}`),
      ...change.drops.map((g) => `DROP SILENT GRAPH ${sparqlIri(g)}`),
    ];
    if (ops.length === 0) return;
    const request = ops.join(' ;\n');
    let refused: UserError | null = null;
    this.committing = change;
    try {
      await this.update(this.opts.hooks?.moveUpdate?.(request) ?? request);
    } catch (err) {
      if (stopping() || !(err instanceof UserError)) throw err;
      refused = err;
    } finally {
      this.committing = null;
    }
    let state: CommitState;
    try {
      state = await this.verify(change);
    } catch (err) {
      if (stopping() || !(err instanceof UserError)) throw err;
      const cause = refused ? refused.problems[0].message : 'the replace request was answered';
      throw this.failure(
        err,
        `${cause}; then the store could not be asked what it holds (${err.problems[0].message}): ` +
          `${list(change.moves.map((m) => m.graph))} may or may not have been replaced; ` +
          `staging graphs may remain (the next load removes them)`,
      );
    }
    for (const m of state.replaced) this.stagings.delete(m.staging);
    if (!refused && state.replaced.length === change.moves.length && state.kept.length === 0) return;
    const discarded = await this.discard(state.notReplaced.map((m) => m.staging));
    const parts = [
      refused
        ? refused.problems[0].message
        : 'the replace request was answered, but the store does not hold what was sent',
      state.replaced.length ? `replaced ${list(state.replaced.map((m) => m.graph))}` : 'no graph was replaced',
      ...state.notReplaced.map((m) => `<${m.graph}> was not replaced (${state.describe.get(m.graph)})`),
      state.kept.length ? `not removed: ${list(state.kept)}` : '',
      discarded.note,
    ];
    throw this.failure(refused ?? fail(shownUrl(this.endpoints.query), '', ''), parts.filter(Boolean).join('; '));
  }

  /** Counts every graph a change touched: a move took effect when its staging graph is empty and its target full. */
  private async verify(change: Change): Promise<CommitState> {
    const state: CommitState = { replaced: [], notReplaced: [], kept: [], describe: new Map() };
    for (const m of change.moves) {
      const [staged, target] = [await this.countTriples(m.staging, true), await this.countTriples(m.graph, true)];
      if (staged === 0 && target === m.triples) {
        state.replaced.push(m);
        continue;
      }
      const before = change.before.get(m.graph);
      state.notReplaced.push(m);
      state.describe.set(
        m.graph,
        `it holds ${target} triples${before === target ? ', as before' : before === undefined ? '' : `, ${before} before`}` +
          (staged === m.triples
            ? '; its new content was still staged'
            : `; its staging graph held ${staged} of ${m.triples}`),
      );
    }
    for (const g of change.drops) if ((await this.countTriples(g, true)) > 0) state.kept.push(g);
    return state;
  }

  /**
   * Inside: every loaded graph is staged and every drop deferred; at the end all of them take effect in one Update
   * request. When `fn` fails, the staged graphs are dropped and no graph is replaced.
   */
  async atomically<T>(fn: () => Promise<T>): Promise<T> {
    if (this.pending) return fn();
    this.pending = { moves: [], drops: [] };
    let result: T;
    try {
      result = await fn();
    } catch (err) {
      const staged = this.pending.moves;
      this.pending = null;
      if (stopping() || !(err instanceof UserError) || staged.length === 0) throw err;
      const note = (await this.discard(staged.map((m) => m.staging))).note;
      throw this.failure(
        err,
        `${err.problems[0].message}; no graph of the release was replaced (${staged.length} graph(s) staged before it: ${note})`,
      );
    }
    const { moves, drops } = this.pending;
    this.pending = null;
    await this.commit({ moves, drops, before: await this.counts(moves.map((m) => m.graph)) });
    return result;
  }

  /** Inside {@link atomically}: the staging graph holding what `graph` will hold once the change takes effect. */
  pendingAs(graph: string): string {
    return this.pending?.moves.findLast((m) => m.graph === graph)?.staging ?? graph;
  }

  /** A signal's clean-up: waits for the request on the wire, drops this process's staging graphs, says what it saw. */
  private async undo(): Promise<string> {
    this.halted = true;
    const committing = this.committing;
    await this.inflight;
    const notes: string[] = [];
    if (committing) {
      const state = await this.verify(committing).catch(() => null);
      notes.push(
        state
          ? `the stop came while the graphs were being replaced: ${state.replaced.length} of ${committing.moves.length} replaced`
          : 'the stop came while the graphs were being replaced; the store could not be asked which were',
      );
    }
    if (this.stagings.size) notes.push((await this.discard([...this.stagings])).note);
    return notes.filter(Boolean).join('; ');
  }

  /**
   * Drops the staging graphs of loads that can no longer finish them: made on this host by a process that no longer
   * exists (or before the last reboot). Staging graphs of other hosts or of live processes are left and named.
   */
  async removeLeftovers(): Promise<void> {
    if (!this.endpoints.gsp || !this.endpoints.update) return;
    for (const g of (await this.listGraphs()).filter((x) => x.startsWith(STAGING_PREFIX))) {
      if (this.stagings.has(g)) continue;
      const owner = stagingOwner(g);
      const state = owner ? ownerState(owner) : 'unknown';
      if (state !== 'gone') {
        const why = {
          alive: `its load (pid ${owner?.pid}) is still running`,
          elsewhere: `its load ran on host ${owner?.host}, which cannot be checked from here`,
          unknown: 'its name does not say which load made it',
        }[state];
        process.stderr.write(`concordat: left <${g}>, a staging graph: ${why}\n`);
        continue;
      }
      await this.update(`DROP SILENT GRAPH ${sparqlIri(g)}`);
      const left = await this.countTriples(g);
      process.stderr.write(
        left === 0
          ? `concordat: removed <${g}>, the staging graph of a stopped load\n`
          : `concordat: could not remove <${g}> (${left} triples remain)\n`,
      );
    }
  }

  async dropGraph(graph: string): Promise<void> {
    const iri = sparqlIri(graph, '--graph');
    if (this.pending) this.pending.drops.push(graph);
    else await this.update(`DROP SILENT GRAPH ${iri}`);
  }

  async countTriples(graph?: string, cleanup = false): Promise<number> {
    const where = graph ? `GRAPH ${sparqlIri(graph, '--graph')} { ?s ?p ?o }` : 'GRAPH ?g { ?s ?p ?o }';
    const r = await this.query(`SELECT (COUNT(*) AS ?n) WHERE { ${where} }`, cleanup);
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
  async query(sparql: string, cleanup = false): Promise<QueryResult> {
    const form = queryForm(sparql);
    const graphForm = form === 'CONSTRUCT' || form === 'DESCRIBE';
    const url = this.endpoints.query;
    const res = await this.send(
      'POST',
      url,
      { form: { query: sparql }, accept: graphForm ? NT : JSON_RESULTS },
      cleanup,
    );
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

  async close(): Promise<void> {
    this.forgetUndo?.();
    this.forgetUndo = null;
  }
}
