/**
 * Small Float64Array vectors (a run's feed flows or initial concentrations, one per CSV row) cut
 * as views from shared blocks instead of one buffer each: a Float64Array of its own costs about
 * 230 bytes on the V8 heap for four numbers, a view of a shared block about a third of that. Each
 * view is zero-filled, has its own elements (views never overlap) and behaves as any Float64Array;
 * a block stays in memory while any of its views does.
 */

/** Vectors per block. */
const BLOCK_VECTORS = 1024;

/** A source of zero-filled Float64Array vectors of one length. */
export class VectorPool {
  private block: Float64Array;
  private next = 0;

  constructor(private readonly length: number) {
    this.block = new Float64Array(0);
  }

  /** A fresh zero-filled vector of the pool's length. */
  take(): Float64Array {
    const n = this.length;
    if (this.next + n > this.block.length) {
      this.block = new Float64Array(n * BLOCK_VECTORS);
      this.next = 0;
    }
    const v = this.block.subarray(this.next, this.next + n);
    this.next += n;
    return v;
  }
}
