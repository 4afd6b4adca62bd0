// Compiled shapes + a data graph → SHACL result rows: the built-in SHACL core engine (SHACL §3 Validation, §4 Core
// Constraint Components), working on n3 term ids without building RDF/JS quads or a triple store.
import type { Quad } from '@rdfjs/types';
import type { PathTree } from '../paths.js';
import type { ResultRow } from '../report.js';
import type { CheckContext, ShapeRef } from './constraints.js';
import { DataGraph } from './data.js';
import { compileShapesGraph, type Shape } from './shapes.js';
import type { TermId } from './terms.js';

export { DataGraph } from './data.js';

/** Where results go: collected rows, or (rows null) only whether any result occurred. */
interface Sink {
  rows: ResultRow[] | null;
  failed: boolean;
  limit: number;
}

/** The focus nodes of a shape's targets (SHACL §2.1.3), each once. */
function focusNodes(shape: Shape, data: DataGraph): TermId[] {
  const { nodes, classes, subjectsOf, objectsOf } = shape.targets;
  const out = new Set<TermId>(nodes);
  for (const c of classes) for (const n of data.instancesOf(c)) out.add(n);
  for (const p of subjectsOf) for (const n of data.subjectsOf(p)) out.add(n);
  for (const p of objectsOf) for (const n of data.objectsOf(p)) out.add(n);
  return [...out];
}

/** One validation run over one data graph. */
class Run implements CheckContext {
  private sink: Sink;
  /**
   * (shape, node) pairs being checked for conformance, to stop on recursive shapes (SHACL §3.4 leaves them undefined).
   */
  private readonly active = new Set<string>();

  constructor(
    readonly data: DataGraph,
    sink: Sink,
  ) {
    this.sink = sink;
  }

  conforms(ref: ShapeRef, node: TermId): boolean {
    const key = `${ref.id}\u0000${node}`;
    if (this.active.has(key)) return true;
    this.active.add(key);
    const outer = this.sink;
    this.sink = { rows: null, failed: false, limit: Infinity };
    try {
      this.validate(ref.get(), node);
      return !this.sink.failed;
    } finally {
      this.sink = outer;
      this.active.delete(key);
    }
  }

  nested(ref: ShapeRef, focus: TermId): void {
    this.validate(ref.get(), focus);
  }

  /** Validates `focus` against `shape` into the current sink (SHACL §3.4). */
  validate(shape: Shape, focus: TermId): void {
    if (shape.deactivated) return;
    const values = shape.path === null ? [focus] : this.data.pathValues(focus, shape.path);
    const sink = this.sink;
    for (const { component, check } of shape.checks) {
      check(this, focus, values, (value: TermId | null, path?: PathTree) => {
        sink.failed = true;
        if (sink.rows && sink.rows.length < sink.limit) {
          sink.rows.push({
            focusNode: focus,
            path: path ?? shape.path,
            value,
            severity: shape.severity,
            component,
            sourceShape: shape.id,
            sourceConstraint: null,
            messages: shape.messages,
          });
        }
      });
      if (sink.failed && (!sink.rows || sink.rows.length >= sink.limit)) return;
    }
  }
}

/** A shapes graph compiled for the built-in engine. */
export interface CoreEngine {
  /** Result rows (unsorted) for data given as RDF/JS quads; all graphs are merged. */
  rows(data: Iterable<Quad>): Promise<ResultRow[]>;
  /** Result rows for data given as flat [s, p, o, g, …] n3 term ids (the worker wire format); with `owns`, only
   *  focus nodes it accepts are validated (a batch judges the nodes it owns, see bounded.ts). */
  rowsOfIds(ids: readonly string[], owns?: (node: TermId) => boolean): ResultRow[];
  /** Result rows for an index already built. */
  rowsOf(data: DataGraph, owns?: (node: TermId) => boolean): ResultRow[];
}

/** Compiles `shapes` for the built-in engine; unsupported (non-core) parameters throw a UserError naming the shape. */
export function compileCore(
  shapes: Iterable<Quad>,
  opts: { shapesLabel?: string; maxErrors?: number } = {},
): CoreEngine {
  const { targeted } = compileShapesGraph(shapes, opts.shapesLabel ?? 'shapes');
  const rowsOf = (data: DataGraph, owns?: (node: TermId) => boolean): ResultRow[] => {
    const sink: Sink = { rows: [], failed: false, limit: opts.maxErrors ?? Infinity };
    const run = new Run(data, sink);
    for (const shape of targeted) {
      if (shape.deactivated) continue;
      for (const focus of focusNodes(shape, data)) {
        if (owns && !owns(focus)) continue;
        run.validate(shape, focus);
        if (sink.rows!.length >= sink.limit) return sink.rows!;
      }
    }
    return sink.rows!;
  };
  return {
    rows: async (data) => rowsOf(DataGraph.fromQuads(data)),
    rowsOfIds: (ids, owns) => rowsOf(DataGraph.fromIds(ids), owns),
    rowsOf,
  };
}
