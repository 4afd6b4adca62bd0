// A release folder + load options → the list of (graph IRI, triple lines) to load, with the release's own date.
import { existsSync } from 'node:fs';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { UserError, EXIT } from '../errors.js';
import { iri } from '../namespaces.js';
import { dropGraphNames, scanTerms, splitByGraph } from './lines.js';
import type { GraphLoad, GraphSource, Store } from './types.js';
import { RELEASE_FILES } from '../rdf/formats.js';
import { verifyRelease } from './complete.js';

/** One graph to load. */
export interface PlannedGraph {
  graph: string;
  source: GraphSource;
}

/** `--graph`: put everything into this graph; `--partner`: load that partner's slice. */
export interface ReleaseLoadOptions {
  graph?: string;
  partner?: string;
}

export const CONCORDANCE = RELEASE_FILES.nquads;
const RELEASE_GRAPH = /^(.*)graph\/(claims|evidence|provenance|dataset)$/;
const ISSUED = `<${iri('dcterms', 'issued')}>`;
const PARTNER_KEY = /^[A-Za-z0-9][A-Za-z0-9_-]*$/;

const bad = (file: string, field: string, message: string, hint: string): UserError =>
  new UserError({ file, line: 0, field, message, hint }, EXIT.badInput);

async function readRequired(path: string, field: string, hint: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch {
    throw bad(path, field, 'cannot be read', hint);
  }
}

/** The project base, from the release's graph names `{base}graph/claims` etc. (the model's graph naming). */
function baseOf(graphs: Iterable<string>): string | null {
  for (const g of graphs) {
    const m = RELEASE_GRAPH.exec(g);
    if (m) return m[1];
  }
  return null;
}

/**
 * The release's own date: the lexical form of dcterms:issued in its dataset graph (DCAT 3 "release date" property),
 * else null.
 */
function issuedIn(text: string): string | null {
  for (const line of text.split('\n')) {
    if (!line.includes(ISSUED)) continue;
    const t = scanTerms(line, '', 0);
    if (t && t[1] === ISSUED && t[2].startsWith('"') && (t.length === 3 || /graph\/dataset>$/.test(t[3])))
      return t[2].slice(1, t[2].lastIndexOf('"'));
  }
  return null;
}

async function partnerPlan(folder: string, key: string, graph: string | undefined): Promise<PlannedGraph[]> {
  if (!PARTNER_KEY.test(key))
    throw bad('command line', '--partner', `"${key}" is not a partner key`, 'letters, digits, "-" and "_"');
  const file = join(folder, 'partners', `${key}.nq`);
  if (!existsSync(file)) {
    const known = existsSync(join(folder, 'partners'))
      ? (await readdir(join(folder, 'partners')))
          .filter((f) => f.endsWith('.nq'))
          .map((f) => f.slice(0, -3))
          .sort()
      : [];
    throw bad(
      file,
      '--partner',
      'no such partner slice in the release',
      known.length ? `partners in this release: ${known.join(', ')}` : 'the release has no partners/ folder',
    );
  }
  await verifyRelease(folder, [`partners/${key}.nq`]);
  const text = await readRequired(file, '--partner', 'check the release folder');
  const parts = splitByGraph(text, file);
  let target = graph;
  if (!target) {
    const base = baseOf(parts.keys());
    if (!base)
      throw bad(
        file,
        '--graph',
        'the slice names no release graph, so the partner graph IRI cannot be derived',
        'give --graph <IRI>',
      );
    target = `${base}graph/partner/${key}`;
  }
  const concordance = join(folder, CONCORDANCE);
  const issued = issuedIn(text) ?? (existsSync(concordance) ? issuedIn(await readFile(concordance, 'utf8')) : null);
  return [{ graph: target, source: { format: 'n-quads', text: '', file, issued, lines: dropGraphNames(text, file) } }];
}

/**
 * What `concordat load` loads: by default each named graph of concordance.nq under its own IRI; with `--graph`,
 * all statements (graph names dropped) into that one graph; with `--partner k`, partners/k.nq into
 * `--graph` or `{base}graph/partner/{k}`.
 */
export async function planRelease(folder: string, opts: ReleaseLoadOptions = {}): Promise<PlannedGraph[]> {
  if (!existsSync(folder)) throw bad(folder, '', 'no such release folder', 'give the folder a build wrote');
  if (opts.partner !== undefined) return partnerPlan(folder, opts.partner, opts.graph);
  await verifyRelease(folder, [CONCORDANCE]);
  const file = join(folder, CONCORDANCE);
  const text = await readRequired(file, '', `a release folder holds ${CONCORDANCE}`);
  const issued = issuedIn(text);
  if (opts.graph)
    return [
      { graph: opts.graph, source: { format: 'n-quads', text: '', file, issued, lines: dropGraphNames(text, file) } },
    ];
  const parts = splitByGraph(text, file);
  const loose = parts.get('');
  if (loose)
    throw new UserError(
      {
        file,
        line: loose.lineNos[0],
        field: '',
        message: `${loose.count} statements have no graph name`,
        hint: 'load the whole file into one graph with --graph <IRI>',
      },
      EXIT.badInput,
    );
  return [...parts.keys()]
    .sort()
    .map((graph) => ({ graph, source: { format: 'n-quads', text: '', file, issued, lines: parts.get(graph)! } }));
}

/** Loads every planned graph in order; stops at the first failure (graphs loaded before it stay loaded). */
export async function loadPlanned(store: Store, plan: PlannedGraph[]): Promise<GraphLoad[]> {
  const done: GraphLoad[] = [];
  for (const p of plan) done.push(await store.loadGraph(p.graph, p.source));
  return done;
}

/** A graph of the same concordance that held another release and was removed by a load. */
export interface DroppedGraph {
  graph: string;
  /** The release version the graph held (its dataset description's dcat:version), null when it held none. */
  release: string | null;
}

/** What loading a release did. */
export interface ReleaseLoad {
  loads: GraphLoad[];
  /** The loaded release's version, when its graphs describe it. */
  version: string | null;
  dropped: DroppedGraph[];
}

/** `{base}graph/…`: the graph names a release uses (claims, evidence, provenance, dataset, partner/<key>). */
const OWN_GRAPH = /^(.*)graph\/(?:claims|evidence|provenance|dataset|partner\/[^/]+)$/;
const DCAT = 'http://www.w3.org/ns/dcat#';
const VERSIONS = `SELECT DISTINCT ?g ?v WHERE { GRAPH ?g { ?d a <${DCAT}Dataset> ; <${DCAT}version> ?v } }`;

/** Release version per graph that describes its dataset (the dataset graph, a partner slice's graph). */
async function versionsIn(store: Store): Promise<Map<string, Set<string>>> {
  const r = await store.query(VERSIONS);
  const out = new Map<string, Set<string>>();
  if (r.kind !== 'bindings') return out;
  for (const row of r.rows) {
    if (!row.g || !row.v) continue;
    (out.get(row.g.value) ?? out.set(row.g.value, new Set()).get(row.g.value)!).add(row.v.value);
  }
  return out;
}

const only = (s: Set<string> | undefined): string | null => (s && s.size === 1 ? [...s][0] : null);

/**
 * After a release's graphs are loaded: removes every other graph of the same concordance (`{base}graph/…`) that holds
 * another release, so the store holds one release per concordance (a partner graph of release 1 would otherwise
 * stay beside release 2's graphs). A graph's release is its dataset description's version; claims, evidence and
 * provenance graphs take the version of `{base}graph/dataset`. Graphs outside `{base}graph/` are never touched.
 */
async function dropOtherReleases(
  store: Store,
  plan: PlannedGraph[],
): Promise<{ version: string | null; dropped: DroppedGraph[] }> {
  const base = plan.map((p) => OWN_GRAPH.exec(p.graph)?.[1]).find((b) => b !== undefined);
  if (base === undefined) return { version: null, dropped: [] };
  const versions = await versionsIn(store);
  // a remote store stages the loaded graphs until the end of the change: read their new content where it is
  const at = (g: string): string => store.pendingAs?.(g) ?? g;
  const version = plan.map((p) => only(versions.get(at(p.graph)))).find((v) => v !== null) ?? null;
  if (version === null) return { version, dropped: [] };
  const loaded = new Set(plan.map((p) => p.graph));
  const main = only(versions.get(at(`${base}graph/dataset`)));
  const dropped: DroppedGraph[] = [];
  for (const g of await store.listGraphs()) {
    if (loaded.has(g) || OWN_GRAPH.exec(g)?.[1] !== base) continue;
    const v = versions.has(g) ? only(versions.get(g)) : main;
    if (v === version) continue;
    await store.dropGraph(g);
    dropped.push({ graph: g, release: v });
  }
  return { version, dropped };
}

/**
 * Loads a release: each planned graph replaced all or nothing, then the same concordance's graphs of other releases
 * removed (see dropOtherReleases). In a store folder all of it is one change (one manifest write); a remote store
 * stages every graph, then moves and drops them all in one Update request. With `--graph` (everything into one graph
 * of the user's choosing) nothing else is touched.
 */
export async function loadRelease(
  store: Store,
  plan: PlannedGraph[],
  opts: ReleaseLoadOptions = {},
): Promise<ReleaseLoad> {
  const run = async (): Promise<ReleaseLoad> => {
    await store.removeLeftovers?.();
    const loads = await loadPlanned(store, plan);
    const { version, dropped } = opts.graph ? { version: null, dropped: [] } : await dropOtherReleases(store, plan);
    return { loads, version, dropped };
  };
  return store.atomically ? store.atomically(run) : run();
}
