// Links stored column by column (typed arrays, ~80 bytes a link) → small read-only Link records over them, so a
// million-work release holds its six million links without one heap object of numbers each.
import { HELD_REASONS, type HeldReason, type Link, type LinkKind, type LinkStatus } from './types.js';

const KINDS: readonly LinkKind[] = ['same', 'part', 'related'];
const STATUSES: readonly LinkStatus[] = ['confirmed', 'proposed', 'rejected', 'candidate'];

type ArrayType = Int32ArrayConstructor | Uint8ArrayConstructor | Float64ArrayConstructor;
type Stored = Int32Array | Uint8Array | Float64Array;

/**
 * How one field is stored: the typed array that holds it, and, made once per column, a function that stores a value
 * and a getter that reads it back for a record `{ i }`. Each kind of codec has its own function bodies, so every getter
 * reads one array type
 * (V8 keeps such sites monomorphic: a generic getter over all fields was several times slower).
 */
interface Codec<T, A extends ArrayType> {
  array: A;
  writer(
    column: InstanceType<A>,
    name: string,
    columns: LinkColumns,
  ): (i: number, values: Record<string, unknown>) => void;
  getter(column: InstanceType<A>, columns: LinkColumns): (this: { i: number }) => T;
}

const int: Codec<number, Int32ArrayConstructor> = {
  array: Int32Array,
  writer: (col, name) => (i, v) => {
    col[i] = v[name] as number;
  },
  getter: (col) =>
    function () {
      return col[this.i];
    },
};
const float: Codec<number, Float64ArrayConstructor> = {
  array: Float64Array,
  writer: (col, name) => (i, v) => {
    col[i] = v[name] as number;
  },
  getter: (col) =>
    function () {
      return col[this.i];
    },
};
/** A number or none (stored as -1). */
const optional: Codec<number | undefined, Int32ArrayConstructor> = {
  array: Int32Array,
  writer: (col, name) => (i, v) => {
    col[i] = (v[name] as number | undefined) ?? -1;
  },
  getter: (col) =>
    function () {
      const x = col[this.i];
      return x < 0 ? undefined : x;
    },
};
/** One of a few values, stored as its index. */
const oneOf = <T>(values: readonly T[]): Codec<T, Uint8ArrayConstructor> => ({
  array: Uint8Array,
  writer: (col, name) => (i, v) => {
    col[i] = values.indexOf(v[name] as T);
  },
  getter: (col) =>
    function () {
      return values[col[this.i]];
    },
});
/** One of a few values or none, stored as 1 + its index (0: none). */
const optionalOneOf = <T>(values: readonly T[]): Codec<T | undefined, Uint8ArrayConstructor> => ({
  array: Uint8Array,
  writer: (col, name) => (i, v) => {
    const x = v[name] as T | undefined;
    col[i] = x === undefined ? 0 : 1 + values.indexOf(x);
  },
  getter: (col) =>
    function () {
      const x = col[this.i];
      return x === 0 ? undefined : values[x - 1];
    },
});
/**
 * One end's share of its work's images (coverageA/B), stored as the number of images it was computed from (4 bytes,
 * not 8): read back as that number over the work's image count, the very division that made it, so the same double.
 */
const share = (end: 'a' | 'b'): Codec<number, Int32ArrayConstructor> => ({
  array: Int32Array,
  writer: (col, name, c) => (i, v) => {
    col[i] = Math.round((v[name] as number) * c.imageCount[v[end] as number]);
  },
  getter: (col, c) => {
    const ends = c[end];
    const images = c.imageCount;
    return function () {
      return col[this.i] / images[ends[this.i]];
    };
  },
});
/** A run list, stored as its index in the columns' shared `runLists`. */
const runList: Codec<readonly number[], Int32ArrayConstructor> = {
  array: Int32Array,
  writer: (col, name, c) => (i, v) => {
    col[i] = c.runList(v[name] as readonly number[]);
  },
  getter: (col, c) =>
    function () {
      return c.runLists[col[this.i]];
    },
};

/** Every field of a link and how it is stored: the one list (see {@link Link} in types.ts for what each means). */
const FIELDS = {
  a: int,
  b: int,
  kind: oneOf(KINDS),
  status: oneOf(STATUSES),
  part: optional,
  support: int,
  reliableSupport: int,
  best: float,
  mean: float,
  maxOverlap: float,
  confidence: float,
  setAside: int,
  held: optionalOneOf<HeldReason>(HELD_REASONS),
  coverageA: share('a'),
  coverageB: share('b'),
  runs: runList,
  decision: optional,
  matchStart: int,
};
type Fields = typeof FIELDS;
type Field = keyof Fields;
const NAMES = Object.keys(FIELDS) as Field[];

/** The values of one link, as makeLink computes them. */
export type LinkValues = { [K in Field]: Fields[K] extends Codec<infer T, ArrayType> ? T : never };

/** One typed array per field, named after it (`a`, `status`, …; -1 or 0 where a field is empty, see FIELDS). */
type Columns = { readonly [K in Field]: InstanceType<Fields[K]['array']> };

/** Fixed-size columns for `size` links: one typed array per field (see FIELDS), and what is shared between links. */
export type LinkColumns = ColumnSet & Columns;

/** Columns for `size` links, all zero; `imageCount[w]`: work w's images (see `share`). */
export function linkColumns(size: number, imageCount: Int32Array): LinkColumns {
  const c = new ColumnSet(size, imageCount) as ColumnSet & Record<Field, Stored>;
  for (const name of NAMES) c[name] = new FIELDS[name].array(size);
  return c as LinkColumns;
}

type AnyCodec = Codec<unknown, ArrayType>;
const codec = (name: Field) => FIELDS[name] as unknown as AnyCodec;

class ColumnSet {
  /** Distinct run lists, shared by the links that have them (read only). */
  readonly runLists: number[][] = [];
  private readonly runListIndex = new Map<string, number>();
  private writers: ((i: number, values: Record<string, unknown>) => void)[] | undefined;

  constructor(
    readonly size: number,
    readonly imageCount: Int32Array,
  ) {}

  /** Stores link `i`. */
  set(this: LinkColumns, i: number, v: LinkValues): void {
    const writers = (this.writers ??= NAMES.map((name) => codec(name).writer(this[name] as never, name, this)));
    for (const write of writers) write(i, v);
  }

  /** The index of a run list in `runLists`, added when new. */
  runList(runs: readonly number[]): number {
    const key = runs.join(',');
    let n = this.runListIndex.get(key);
    if (n === undefined) {
      n = this.runLists.length;
      this.runLists.push(Object.freeze([...runs]) as number[]);
      this.runListIndex.set(key, n);
    }
    return n;
  }

  setStatus(this: LinkColumns, i: number, status: LinkStatus): void {
    this.status[i] = STATUSES.indexOf(status);
  }

  statusOf(this: LinkColumns, i: number): LinkStatus {
    return STATUSES[this.status[i]];
  }

  /** Withholds link `i`: status `candidate`, with the reason (the cluster stage's cuts; the link stage's own holds). */
  hold(this: LinkColumns, i: number, reason: HeldReason): void {
    this.status[i] = STATUSES.indexOf('candidate');
    this.held[i] = 1 + HELD_REASONS.indexOf(reason);
  }

  /** Read-only records for every link, in column order: one getter per field of FIELDS (see {@link Link}). */
  records(this: LinkColumns): Link[] {
    class LinkRecord {
      constructor(readonly i: number) {}
      /** The plain values (for tests and debugging: getters are not own properties). */
      toJSON(): LinkValues {
        const self = this as unknown as LinkValues;
        return Object.fromEntries(NAMES.map((name) => [name, self[name]])) as LinkValues;
      }
    }
    for (const name of NAMES)
      Object.defineProperty(LinkRecord.prototype, name, { get: codec(name).getter(this[name] as never, this) });
    return Array.from({ length: this.size }, (_, i) => new LinkRecord(i) as unknown as Link);
  }
}
