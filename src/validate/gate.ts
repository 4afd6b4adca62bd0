// Units of the release → the same units, passed on one by one while their triples go into bounded SHACL validation.
import type { Quad } from '@rdfjs/types';
import type { Unit } from '../rdf/index.js';
import { BoundedValidation, type BoundedOptions } from './bounded.js';
import { outcomeOf, type ValidationOutcome } from './report.js';

/** A SHACL gate over a stream of units: `pass` hands every unit on; `outcome` resolves once the stream has ended. */
export interface ShaclGate {
  pass(units: Iterable<Unit> | AsyncIterable<Unit>): AsyncGenerator<Unit>;
  outcome(): Promise<ValidationOutcome>;
}

/** Options of the gate: bounded validation's, and `units`, how many units will pass (when known). */
export interface GateOptions extends BoundedOptions {
  validate?: boolean;
  /**
   * Units the stream will yield in all: with it, the spill is sized for the triples the whole stream will bring
   * (triples per unit so far × units), see BoundedOptions.expectedTriples.
   */
  units?: number;
}

/**
 * Validates exactly the triples of the units that pass (the published release) with the shapes, with the outcome of
 * validating them as one graph (SHACL §3; see BoundedValidation); `validate: false` passes units on unvalidated and
 * gives an empty outcome. Triples are spilled as they pass, so memory stays bounded; validation runs once the stream
 * has ended. When the reader of `pass` stops early, the spill folder is removed.
 */
export function shaclGate(shapes: Quad[], opts: GateOptions = {}): ShaclGate {
  if (opts.validate === false) {
    return {
      async *pass(units) {
        yield* units;
      },
      outcome: async () => outcomeOf([]),
    };
  }
  let seenUnits = 0;
  let seenTriples = 0;
  const total = opts.units;
  const expectedTriples =
    opts.expectedTriples ??
    (total === undefined ? undefined : () => (seenTriples / Math.max(1, seenUnits)) * Math.max(total, seenUnits));
  const run = new BoundedValidation(shapes, { dataLabel: 'the release', ...opts, expectedTriples });
  let ended = false;
  return {
    async *pass(units) {
      try {
        for await (const unit of units) {
          // counted before its triples go in, so the estimate made when spilling starts sees whole units
          seenUnits++;
          seenTriples += unit.quads.length;
          for (const q of unit.quads) run.add(q);
          yield unit;
        }
        ended = true;
      } finally {
        if (!ended) run.cleanup();
      }
    },
    outcome: () =>
      ended
        ? run.finish()
        : Promise.reject(new Error('the SHACL gate was asked for its outcome before every unit passed')),
  };
}
