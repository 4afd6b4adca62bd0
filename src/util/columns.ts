// Growable typed-array columns, so million-row tables stay flat in memory (no object per row).

type TypedArray = Int32Array | Float64Array;
type Ctor<T extends TypedArray> = { new (n: number): T };

/** A typed array that doubles when full; `trim()` returns the filled part. */
export class Column<T extends TypedArray> {
  data: T;
  length = 0;
  constructor(
    private readonly ctor: Ctor<T>,
    initial = 1024,
  ) {
    this.data = new ctor(initial);
  }
  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new this.ctor(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }
  /** The filled part as an exact-size copy, so the doubling slack is freed. */
  trim(): T {
    return this.data.slice(0, this.length) as T;
  }
}

export const int32 = () => new Column(Int32Array);
export const float64 = () => new Column(Float64Array);
