import { requireSamples } from "../_validate.ts";
import { directKernel, reversedTaps } from "./_direct_kernel.ts";

/**
 * An FIR filter that keeps its state between calls, for signals that arrive
 * in blocks: feeding a signal in blocks of any sizes gives exactly (bit for
 * bit) the output of {@link applyFirDirect} on the whole signal. The state is
 * the last N − 1 input samples.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §6.5.1 (direct form; the delay line holds the past inputs).
 *
 * @example
 * ```ts
 * import { StreamingFirFilter } from "./streaming.ts";
 * const filter = new StreamingFirFilter([0.5, 0.5]);
 * const a = filter.process([2, 4]);
 * const b = filter.process([6]);
 * if ([...a, ...b].join() !== "1,3,5") throw new Error("state carried across blocks");
 * ```
 */
export class StreamingFirFilter {
  /** The filter's taps h[0..N−1] (a copy). */
  readonly taps: Float64Array;
  #reversed: Float64Array;
  #history: Float64Array;

  /**
   * Create a filter at rest (all past inputs zero).
   *
   * @param taps FIR coefficients h[0..N−1], N ≥ 1.
   * @throws {TypeError} When a tap is not finite.
   * @throws {RangeError} When there are no taps.
   */
  constructor(taps: ArrayLike<number>) {
    requireSamples("Taps", taps);
    this.taps = Float64Array.from(taps);
    this.#reversed = reversedTaps(taps);
    this.#history = new Float64Array(taps.length - 1);
  }

  /**
   * Filter the next block: y[n] = Σ h[k]·x[n−k] where x runs on from the
   * previous blocks.
   *
   * @param block Input samples (may be empty).
   * @returns One output sample per input sample.
   * @throws {TypeError} When a sample is not finite.
   */
  process(block: ArrayLike<number>): Float64Array {
    requireSamples("Block", block, 0);
    const keep = this.#history.length;
    const extended = new Float64Array(keep + block.length);
    extended.set(this.#history);
    extended.set(block, keep);
    const y = new Float64Array(block.length);
    directKernel(this.#reversed, extended, y, block.length);
    this.#history = extended.slice(extended.length - keep);
    return y;
  }

  /** Return to rest: forget all past input. */
  reset(): void {
    this.#history.fill(0);
  }
}
