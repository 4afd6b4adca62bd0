// The one store interface both adapters implement, and the plain data it passes: RDF terms, query results, load
// sources.
import type { TripleLines } from './lines.js';

/** An RDF term as in SPARQL 1.1 Query Results JSON Format §3.2.2 (type `uri`, `bnode` or `literal`). */
export type Term =
  | { type: 'uri'; value: string }
  | { type: 'bnode'; value: string }
  | { type: 'literal'; value: string; datatype?: string; lang?: string };

/** One triple or quad of a CONSTRUCT / DESCRIBE result (graph absent = default graph). */
export interface ResultQuad {
  subject: Term;
  predicate: Term;
  object: Term;
  graph?: Term;
}

/**
 * A query outcome per SPARQL 1.1 Query §16: solutions (SELECT), a boolean (ASK) or an RDF graph (CONSTRUCT, DESCRIBE).
 */
export type QueryResult =
  | { kind: 'bindings'; vars: string[]; rows: Record<string, Term>[] }
  | { kind: 'boolean'; value: boolean }
  | { kind: 'quads'; quads: ResultQuad[] };

/**
 * What to load into one graph: N-Triples or N-Quads text (graph names of N-Quads are dropped), with the file it came
 * from for messages. The text is kept line for line so blank-node labels and bytes survive into a store folder.
 */
export interface GraphSource {
  format: 'n-triples' | 'n-quads';
  text: string;
  /** File name shown in messages and recorded in a store folder's manifest. */
  file: string;
  /** The statements already split into triple lines (with file line numbers); when set, `text` is not read again. */
  lines?: TripleLines;
  /** The release's own date (e.g. its dcterms:issued), recorded as "loaded-at"; null when the release has none. */
  issued?: string | null;
}

/** What a completed graph load reports. */
export interface GraphLoad {
  graph: string;
  triples: number;
  millis: number;
}

/**
 * A triple store holding named graphs (SPARQL 1.1 Graph Store HTTP Protocol §1 terms: a graph store of named graphs).
 */
export interface Store {
  /** Replaces `graph` with the source's triples, all or nothing (Update §3.2.4 MOVE semantics). */
  loadGraph(graph: string, source: GraphSource): Promise<GraphLoad>;
  /** Removes `graph`; absent graphs are not an error (Update §3.2.2 DROP SILENT). */
  dropGraph(graph: string): Promise<void>;
  /** Triples in `graph`, or in all named graphs when omitted. */
  countTriples(graph?: string): Promise<number>;
  /** Named graph IRIs, sorted. */
  listGraphs(): Promise<string[]>;
  /** Runs a SPARQL 1.1 query. */
  query(sparql: string): Promise<QueryResult>;
  /** Releases resources (connections); the store is unusable afterwards. */
  close(): Promise<void>;
  /** Runs loads and drops so that they take effect together (a store folder: one manifest write). */
  atomically?<T>(fn: () => Promise<T>): Promise<T>;
  /** Inside `atomically`: the graph holding what `graph` will hold once the change takes effect (default: itself). */
  pendingAs?(graph: string): string;
  /** Removes what stopped loads left (a remote store's staging graphs); says what it removed, or could not. */
  removeLeftovers?(): Promise<void>;
}
