// Data quads + shapes quads → ValidationOutcome: the only adapter over rdf-validate-shacl, run over N3.Store.
import type { Quad } from '@rdfjs/types';
import N3 from 'n3';
import type SHACLValidator from 'rdf-validate-shacl';
import { UserError } from '../errors.js';
import { iri } from '../namespaces.js';
import { compileCore } from './engine/index.js';
import { readPath } from './paths.js';
import { outcomeOf, type ResultRow, type ValidationOutcome } from './report.js';
import { decodeQuads } from './wire.js';

export type { ResultRow, ValidationOutcome } from './report.js';

/** Options for one validation. */
export interface ValidateOptions {
  /** Name of the shapes source, used in error messages. */
  shapesLabel?: string;
  /** Stop after this many results (default: all). */
  maxErrors?: number;
  /** Which SHACL engine runs (default: the built-in core engine). */
  engine?: ShaclEngine;
}

/** The SHACL engines: the built-in core engine (src/validate/engine) and rdf-validate-shacl over an N3.Store. */
export const SHACL_ENGINES = ['builtin', 'rdf-validate-shacl'] as const;
export type ShaclEngine = (typeof SHACL_ENGINES)[number];

/**
 * rdf-validate-shacl and its default environment with `dataset()` answering an N3.Store (faster indexed matching),
 * imported only when that engine is chosen: the built-in engine never loads it.
 */
let reference: Promise<{ Validator: typeof SHACLValidator; factory: object }> | null = null;
function loadReference() {
  reference ??= Promise.all([import('rdf-validate-shacl'), import('rdf-validate-shacl/src/defaultEnv.js')]).then(
    ([v, env]) => ({
      Validator: v.default,
      factory: Object.assign(Object.create(env.default) as typeof env.default, {
        dataset: (quads?: Iterable<Quad>) => new N3.Store(quads ? [...quads] : undefined),
      }),
    }),
  );
  return reference;
}

const SH_RESULT = iri('sh', 'result');
const ID = N3.termToId as (t: unknown) => string;

function toStore(quads: Iterable<Quad>): N3.Store {
  return quads instanceof N3.Store ? quads : new N3.Store([...quads] as N3.Quad[]);
}

/** Reads the results of a report graph into rows (SHACL §3.6.2), skipping nested sh:detail results. */
function rowsOf(report: N3.Store, reportNode: N3.Term): ResultRow[] {
  const one = (s: N3.Term, local: string): N3.Term | null => report.getObjects(s, iri('sh', local), null)[0] ?? null;
  return report.getObjects(reportNode, SH_RESULT, null).map((r) => {
    const path = one(r, 'resultPath');
    const value = one(r, 'value');
    const constraint = one(r, 'sourceConstraint');
    return {
      focusNode: ID(one(r, 'focusNode')),
      path: path ? readPath(report, path) : null,
      value: value ? ID(value) : null,
      severity: one(r, 'resultSeverity')?.value ?? iri('sh', 'Violation'),
      component: one(r, 'sourceConstraintComponent')?.value ?? '',
      sourceShape: ID(one(r, 'sourceShape')),
      sourceConstraint: constraint ? ID(constraint) : null,
      messages: report.getObjects(r, iri('sh', 'resultMessage'), null).map(ID).sort(),
    };
  });
}

/** A shapes graph compiled once and applied to many data graphs. */
export interface CompiledShapes {
  /** Validates one data graph and returns its result rows (unsorted). */
  rows(data: Iterable<Quad>): Promise<ResultRow[]>;
  /** The same for data as flat [s, p, o, g, …] n3 term ids (the worker wire format); with `owns`, only results about
   *  focus nodes it accepts (the built-in engine validates only those; rdf-validate-shacl's rows are filtered). */
  rowsOfIds(ids: string[], owns?: (node: string) => boolean): Promise<ResultRow[]>;
}

/** Compiles a shapes graph (SHACL §2.1) for repeated validation; engine failures become a UserError. */
export function compileShapes(shapes: Iterable<Quad>, opts: ValidateOptions = {}): CompiledShapes {
  if ((opts.engine ?? 'builtin') === 'builtin') {
    const core = compileCore(shapes, opts);
    return { rows: (data) => core.rows(data), rowsOfIds: async (ids, owns) => core.rowsOfIds(ids, owns) };
  }
  return compileReference(shapes, opts);
}

/** rdf-validate-shacl behind the same interface. */
function compileReference(shapes: Iterable<Quad>, opts: ValidateOptions): CompiledShapes {
  const fail = (err: unknown): never => {
    throw new UserError({
      file: opts.shapesLabel ?? 'shapes',
      line: 0,
      field: '',
      message: `SHACL validation failed: ${(err as Error).message}`,
      hint: 'check the shapes graph',
    });
  };
  const shapesStore = toStore(shapes);
  let validator: Promise<SHACLValidator> | null = null;
  const compiled = () =>
    (validator ??= loadReference().then(({ Validator, factory }) => {
      try {
        return new Validator(shapesStore, { factory: factory as never, maxErrors: opts.maxErrors });
      } catch (err) {
        return fail(err);
      }
    }));
  const rows = async (data: Iterable<Quad>) => {
    const v = await compiled();
    try {
      const report = await v.validate(toStore(data));
      return rowsOf(report.dataset as N3.Store, report.term as N3.Term);
    } catch (err) {
      return fail(err);
    }
  };
  return {
    rows,
    rowsOfIds: async (ids, owns) => (await rows(decodeQuads(ids))).filter((r) => !owns || owns(r.focusNode)),
  };
}

/**
 * Validates a data graph against a shapes graph (SHACL §3 Validation) and returns counts by severity, sorted
 * result rows and the report graph. `conforms` is false only when some result has severity sh:Violation;
 * the report's own sh:conforms follows SHACL §3.6.1.1 (false when any result exists).
 */
export async function validate(
  data: Iterable<Quad>,
  shapes: Iterable<Quad>,
  opts: ValidateOptions = {},
): Promise<ValidationOutcome> {
  return outcomeOf(await compileShapes(shapes, opts).rows(data));
}
