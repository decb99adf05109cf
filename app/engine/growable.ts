type TypedArray = Float64Array | Int32Array | Uint32Array;
type Ctor<T extends TypedArray> = { new (n: number): T };

/** An append-only typed array that doubles when full (allocate once, sized generously). */
export class Growable<T extends TypedArray> {
  data: T;
  length = 0;
  constructor(
    private readonly ctor: Ctor<T>,
    capacity: number,
  ) {
    this.data = new ctor(Math.max(16, capacity));
  }
  push(value: number): void {
    if (this.length === this.data.length) this.grow(this.length * 2);
    this.data[this.length++] = value;
  }
  grow(capacity: number): void {
    const next = new this.ctor(capacity);
    next.set(this.data.subarray(0, this.length) as never);
    this.data = next;
  }
  /** The filled part (a view, no copy). */
  view(): T {
    return this.data.subarray(0, this.length) as T;
  }
}
