/**
 * Spent room of one analysis, handed out again as columns (issue 19, session 10).
 *
 * The first analysis of a long run in a process paid for every page of fresh memory it touched: the
 * system zero-fills each 4 KB page on its first touch (about 11 µs each on the benchmark machine), and a
 * 30 h file's columns are 864 KB each (tests/bench/README.md, "Session 10: the first analysis, again").
 * So a column that is no longer read (the smoother's gains and plane positions, a factor column once the
 * distance is summed) is given back here, and the next column the analysis needs is taken from it.
 *
 * Bounds: only room of the analysis that owns the pool goes in, and the pool lives as long as that call,
 * so nothing is kept between calls or shared between files. Every column `take` returns is zeroed first,
 * so it reads exactly as a fresh `new Float64Array(length)` would, and a result cannot depend on what the
 * room held before. A column taken here may be returned in the analysis's result: it then keeps the buffer
 * it was carved from alive as long as the result (at most the few megabytes of that one analysis).
 */
export class SpareColumns {
  private readonly free: Float64Array[] = [];

  constructor(readonly length: number) {}

  /**
   * Room that nothing reads any more, carved into columns of `length` (a remainder shorter than that is
   * left unused). The caller must not read or write it afterwards.
   */
  give(...rooms: Float64Array[]): void {
    const n = this.length;
    if (n === 0) return;
    for (const room of rooms) for (let at = 0; at + n <= room.length; at += n) this.free.push(room.subarray(at, at + n));
  }

  /** A column of `length` zeros: spent room when there is some, else a fresh array. */
  take(): Float64Array {
    const spent = this.free.pop();
    return spent ? spent.fill(0) : new Float64Array(this.length);
  }

  /** A column of `length` 32-bit integer zeros, laid over one Float64 column (give that column back, not this view). */
  takeInt32(): { ints: Int32Array; room: Float64Array } {
    const room = this.take();
    return { ints: new Int32Array(room.buffer, room.byteOffset, this.length), room };
  }
}
