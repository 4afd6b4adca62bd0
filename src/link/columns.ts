// Links stored column by column (typed arrays, ~80 bytes a link) → small read-only Link records over them, so a
// million-work release holds its six million links without one heap object of numbers each.
import { HELD_REASONS, type HeldReason, type Link, type LinkKind, type LinkStatus } from './types.js';

const KINDS: readonly LinkKind[] = ['same', 'part', 'related'];
const STATUSES: readonly LinkStatus[] = ['confirmed', 'proposed', 'rejected', 'candidate'];

/** The values of one link, as makeLink computes them. */
export interface LinkValues {
  a: number;
  b: number;
  kind: LinkKind;
  status: LinkStatus;
  part: number | undefined;
  support: number;
  reliableSupport: number;
  best: number;
  mean: number;
  maxOverlap: number;
  confidence: number;
  setAside: number;
  held: HeldReason | undefined;
  coverageA: number;
  coverageB: number;
  runs: readonly number[];
  decision: number | undefined;
  matchStart: number;
}

/** Fixed-size columns for `size` links. */
export class LinkColumns {
  readonly a: Int32Array;
  readonly b: Int32Array;
  readonly kind: Uint8Array;
  readonly status: Uint8Array;
  /** -1: none. */
  readonly part: Int32Array;
  readonly support: Int32Array;
  readonly reliableSupport: Int32Array;
  readonly best: Float64Array;
  readonly mean: Float64Array;
  readonly maxOverlap: Float64Array;
  readonly confidence: Float64Array;
  readonly setAside: Int32Array;
  /** 0: none, else 1 + index into HELD_REASONS. */
  readonly held: Uint8Array;
  readonly coverageA: Float64Array;
  readonly coverageB: Float64Array;
  /** Index into `runLists`. */
  readonly runs: Int32Array;
  /** -1: none. */
  readonly decision: Int32Array;
  readonly matchStart: Int32Array;
  /** Distinct run lists, shared by the links that have them (read only). */
  readonly runLists: number[][] = [];
  private readonly runListIndex = new Map<string, number>();

  constructor(readonly size: number) {
    this.a = new Int32Array(size);
    this.b = new Int32Array(size);
    this.kind = new Uint8Array(size);
    this.status = new Uint8Array(size);
    this.part = new Int32Array(size);
    this.support = new Int32Array(size);
    this.reliableSupport = new Int32Array(size);
    this.best = new Float64Array(size);
    this.mean = new Float64Array(size);
    this.maxOverlap = new Float64Array(size);
    this.confidence = new Float64Array(size);
    this.setAside = new Int32Array(size);
    this.held = new Uint8Array(size);
    this.coverageA = new Float64Array(size);
    this.coverageB = new Float64Array(size);
    this.runs = new Int32Array(size);
    this.decision = new Int32Array(size);
    this.matchStart = new Int32Array(size);
  }

  /** Stores link `i`. */
  set(i: number, v: LinkValues): void {
    this.a[i] = v.a;
    this.b[i] = v.b;
    this.kind[i] = KINDS.indexOf(v.kind);
    this.status[i] = STATUSES.indexOf(v.status);
    this.part[i] = v.part ?? -1;
    this.support[i] = v.support;
    this.reliableSupport[i] = v.reliableSupport;
    this.best[i] = v.best;
    this.mean[i] = v.mean;
    this.maxOverlap[i] = v.maxOverlap;
    this.confidence[i] = v.confidence;
    this.setAside[i] = v.setAside;
    this.held[i] = v.held === undefined ? 0 : 1 + HELD_REASONS.indexOf(v.held);
    this.coverageA[i] = v.coverageA;
    this.coverageB[i] = v.coverageB;
    this.runs[i] = this.runList(v.runs);
    this.decision[i] = v.decision ?? -1;
    this.matchStart[i] = v.matchStart;
  }

  private runList(runs: readonly number[]): number {
    const key = runs.join(',');
    let n = this.runListIndex.get(key);
    if (n === undefined) {
      n = this.runLists.length;
      this.runLists.push(Object.freeze([...runs]) as number[]);
      this.runListIndex.set(key, n);
    }
    return n;
  }

  setStatus(i: number, status: LinkStatus): void {
    this.status[i] = STATUSES.indexOf(status);
  }

  statusOf(i: number): LinkStatus {
    return STATUSES[this.status[i]];
  }

  /** Withholds link `i`: status `candidate`, with the reason (the cluster stage's cuts; the link stage's own holds). */
  hold(i: number, reason: HeldReason): void {
    this.status[i] = STATUSES.indexOf('candidate');
    this.held[i] = 1 + HELD_REASONS.indexOf(reason);
  }

  /** Read-only records for every link, in column order. */
  records(): Link[] {
    return Array.from({ length: this.size }, (_, i) => new LinkRecord(this, i));
  }
}

/** One link read from the columns (see {@link Link} for the meaning of each field). */
class LinkRecord implements Link {
  constructor(private readonly c: LinkColumns, private readonly i: number) {}
  get a(): number { return this.c.a[this.i]; }
  get b(): number { return this.c.b[this.i]; }
  get kind(): LinkKind { return KINDS[this.c.kind[this.i]]; }
  get status(): LinkStatus { return STATUSES[this.c.status[this.i]]; }
  get part(): number | undefined { const p = this.c.part[this.i]; return p < 0 ? undefined : p; }
  get support(): number { return this.c.support[this.i]; }
  get reliableSupport(): number { return this.c.reliableSupport[this.i]; }
  get best(): number { return this.c.best[this.i]; }
  get mean(): number { return this.c.mean[this.i]; }
  get maxOverlap(): number { return this.c.maxOverlap[this.i]; }
  get confidence(): number { return this.c.confidence[this.i]; }
  get setAside(): number { return this.c.setAside[this.i]; }
  get held(): HeldReason | undefined { const h = this.c.held[this.i]; return h === 0 ? undefined : HELD_REASONS[h - 1]; }
  get coverageA(): number { return this.c.coverageA[this.i]; }
  get coverageB(): number { return this.c.coverageB[this.i]; }
  get runs(): number[] { return this.c.runLists[this.c.runs[this.i]]; }
  get decision(): number | undefined { const d = this.c.decision[this.i]; return d < 0 ? undefined : d; }
  get matchStart(): number { return this.c.matchStart[this.i]; }

  /** The plain values (for tests and debugging: getters are not own properties). */
  toJSON(): LinkValues {
    const { a, b, kind, status, part, support, reliableSupport, best, mean, maxOverlap, confidence, setAside, held, coverageA, coverageB, runs, decision, matchStart } = this;
    return { a, b, kind, status, part, support, reliableSupport, best, mean, maxOverlap, confidence, setAside, held, coverageA, coverageB, runs, decision, matchStart };
  }
}
