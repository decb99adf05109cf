type Numeric = Float64Array | Int32Array | Uint32Array | Uint8Array;
type Ctor<T extends Numeric> = {
  new (buffer: ArrayBuffer, byteOffset: number, length: number): T;
  new (length: number): T;
  BYTES_PER_ELEMENT: number;
};

/** Largest working memory kept between analyses (a 10,000 m² roof at 0.4 m joists needs about 9 MB). */
const KEEP_BYTES = 16 * 1024 * 1024;

/**
 * Working memory for the mesh, face data and water routing of one analysis at a time. Those
 * arrays never leave an analysis (the mesh handed out is copied), so they are carved from one
 * buffer that the next analysis reuses, zeroed as a fresh array would be: no allocation, and the
 * memory is still in the cache. A request past the end gets a fresh array, and the buffer grows
 * to fit at the next `reset`.
 */
export class Arena {
  private buffer = new ArrayBuffer(0);
  private used = 0;
  private wanted = 0;
  /** True between `reset` and `release`: a nested analysis must not reuse the same memory. */
  busy = false;

  /** Frees every array handed out since the last reset (their contents become garbage). */
  reset(): void {
    if (this.wanted > this.buffer.byteLength && this.wanted <= KEEP_BYTES)
      this.buffer = new ArrayBuffer(Math.ceil(this.wanted * 1.25));
    this.used = 0;
    this.wanted = 0;
    this.busy = true;
  }

  release(): void {
    this.busy = false;
  }

  /** A zeroed array of `n` elements, valid until the next reset. */
  take<T extends Numeric>(ctor: Ctor<T>, n: number): T {
    const start = Math.ceil(this.used / 8) * 8;
    const end = start + n * ctor.BYTES_PER_ELEMENT;
    // Past the end the cursor still advances, so `wanted` ends up as the whole analysis's need.
    this.used = end;
    this.wanted = Math.max(this.wanted, end);
    if (end > this.buffer.byteLength) return new ctor(n);
    const out = new ctor(this.buffer, start, n);
    out.fill(0);
    return out;
  }
}

/** Plain allocation, for callers that keep what they get (tests, tools). */
export const FRESH = {
  take<T extends Numeric>(ctor: Ctor<T>, n: number): T {
    return new ctor(n);
  },
};

export type Memory = Pick<Arena, "take">;
