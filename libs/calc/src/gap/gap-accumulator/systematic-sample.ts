/**
 * An evenly spaced subsample of bounded size from a stream of unknown length, for bounded-memory
 * quantiles.
 *
 * Method: systematic sampling with a doubling stride: every sample is kept until the buffer is
 * full; then every second kept sample is dropped and the stride doubles, so the buffer always
 * holds between capacity/2 and capacity samples spaced evenly over the whole stream. The cost per
 * sample is one counter test; each compaction is O(capacity) and happens log₂(N/capacity) times.
 * Deterministic: no random numbers.
 * Notes: while N ≤ capacity every sample is kept and the quantiles are exact. Beyond, for a
 * stationary series (MD sampling), a quartile's standard error is about √(p(1 − p)/m)/pdf(q) with
 * m ≥ capacity/2 (≈ 0.7 % of the IQR for a normal sample at capacity 65 536); a period in the
 * data commensurate with the stride would bias it.
 * References: W. G. Cochran, Sampling Techniques, 3rd ed., Wiley, New York, 1977, ch. 8.
 */
export class SystematicSample {
  private readonly values: Float64Array;
  private length = 0;
  private stride = 1;
  private skip = 1;

  constructor(readonly capacity = 65_536) {
    this.values = new Float64Array(capacity);
  }

  push(x: number): void {
    if (--this.skip > 0) return;
    if (this.length === this.capacity) this.compact();
    this.values[this.length++] = x;
    this.skip = this.stride;
  }

  /** A sorted copy of the kept samples (all samples while N ≤ capacity). */
  sorted(): Float64Array {
    return this.values.slice(0, this.length).sort();
  }

  /**
   * Keeps samples 0, 2, 4, … (stream positions 0, 2s, 4s, …) and doubles the stride s. The sample
   * that triggered the compaction sits at position capacity·s, which is on the new grid.
   */
  private compact(): void {
    const half = this.capacity >> 1;
    for (let i = 0; i < half; i++) this.values[i] = this.values[2 * i];
    this.length = half;
    this.stride *= 2;
  }
}
