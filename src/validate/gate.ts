// Units of the release → the same units, passed on one by one while each is SHACL-validated as a chunk on the side.
import type { Quad } from '@rdfjs/types';
import type { Unit } from '../rdf/index.js';
import { validateChunks, type ChunkedOptions, type ValidationChunk } from './chunked.js';
import { outcomeOf, type ValidationOutcome } from './report.js';

const RDF_TYPE = 'http://www.w3.org/1999/02/22-rdf-syntax-ns#type';

/** A SHACL gate over a stream of units: `pass` hands every unit on; `outcome` resolves once the stream has ended. */
export interface ShaclGate {
  pass(units: Iterable<Unit> | AsyncIterable<Unit>): AsyncGenerator<Unit>;
  outcome(): Promise<ValidationOutcome>;
}

/**
 * Validates every unit that passes (SHACL §3, chunk by chunk, see validateChunks) with the shapes; `validate: false`
 * passes units on unvalidated and gives an empty outcome. Memory stays flat: a unit waits until the validator takes
 * its chunk, so at most one chunk is between the two. When validation fails, `pass` throws; when the reader of
 * `pass` stops early, validation stops too.
 */
export function shaclGate(shapes: Quad[], opts: ChunkedOptions & { validate?: boolean } = {}): ShaclGate {
  if (opts.validate === false) {
    return {
      async *pass(units) { yield* units; },
      outcome: async () => outcomeOf([]),
    };
  }
  const handOver = new HandOver<Quad[] | ValidationChunk>();
  const outcome = validateChunks(handOver, shapes, opts);
  outcome.catch((e: unknown) => handOver.fail(e));
  return {
    async *pass(units) {
      let typeIndex = new Map<string, Quad[]>();
      try {
        for await (const unit of units) {
          if (unit.kind === 'provenance') typeIndex = typeIndexOf(unit);
          await handOver.put(unit.kind === 'dataset' ? unit.quads : chunkOf(unit, typeIndex));
          yield unit;
        }
      } finally {
        handOver.end();
      }
    },
    outcome: () => outcome,
  };
}

/**
 * One producer → one consumer, no buffer: `put` resolves when the consumer has taken the item, and rejects once the
 * consumer has failed; `end` finishes the consumer's loop.
 */
class HandOver<T> implements AsyncIterable<T> {
  private item: { value: T; taken: () => void; refused: (e: unknown) => void } | null = null;
  private asking: ((r: IteratorResult<T>) => void) | null = null;
  private ended = false;
  private failure: { error: unknown } | null = null;

  put(value: T): Promise<void> {
    if (this.failure) return Promise.reject(this.failure.error);
    return new Promise<void>((taken, refused) => {
      const asking = this.asking;
      if (asking) {
        this.asking = null;
        asking({ value, done: false });
        taken();
      } else this.item = { value, taken, refused };
    });
  }

  end(): void {
    this.ended = true;
    const asking = this.asking;
    this.asking = null;
    asking?.({ value: undefined, done: true });
  }

  fail(error: unknown): void {
    this.failure = { error };
    const item = this.item;
    this.item = null;
    item?.refused(error);
  }

  [Symbol.asyncIterator](): AsyncIterator<T> {
    return {
      next: () => {
        const item = this.item;
        if (item) {
          this.item = null;
          item.taken();
          return Promise.resolve({ value: item.value, done: false });
        }
        if (this.ended) return Promise.resolve({ value: undefined, done: true });
        return new Promise((resolve) => (this.asking = resolve));
      },
    };
  }
}

/**
 * A unit as a validation chunk: its own quads, and as context the rdf:type quads of the shared nodes it points to
 * (runs, agents, reviews, curators) plus the unit's own context, so class-based constraints resolve inside the chunk
 * without loading the whole release. Context-only nodes are not themselves judged here (see validateChunks).
 */
export function chunkOf(unit: Unit, typeIndex: Map<string, Quad[]>): ValidationChunk {
  const context: Quad[] = [];
  const seen = new Set<string>();
  for (const q of unit.quads) {
    if (q.object.termType !== 'NamedNode' || seen.has(q.object.value)) continue;
    seen.add(q.object.value);
    const stubs = typeIndex.get(q.object.value);
    if (stubs) context.push(...stubs);
  }
  if (unit.context?.length) context.push(...unit.context);
  return { quads: unit.quads, context };
}

/** Subject IRI → its rdf:type quads, over the shared provenance unit. */
export function typeIndexOf(unit: Unit): Map<string, Quad[]> {
  const index = new Map<string, Quad[]>();
  for (const q of unit.quads)
    if (q.predicate.value === RDF_TYPE) {
      const list = index.get(q.subject.value) ?? [];
      list.push(q);
      index.set(q.subject.value, list);
    }
  return index;
}
