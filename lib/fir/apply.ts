import { requireSamples } from "../_validate.ts";

/**
 * Filter a signal with an FIR filter by its difference equation,
 * y[n] = Σ_{k=0}^{N−1} h[k]·x[n−k], with x[n] = 0 before the first sample.
 *
 * The output has the input's length (the filter's tail past the last input
 * sample is not produced).
 *
 * @param taps FIR coefficients h[0..N−1], N ≥ 1.
 * @param signal Input samples x.
 * @returns Output samples y, same length as `signal`.
 * @throws {TypeError} When taps or signal hold a non-finite value.
 * @example
 * ```ts
 * import { applyFir } from "./apply.ts";
 * const y = applyFir([0.5, 0.5], [2, 4, 6]);
 * if (y.join() !== "1,3,5") throw new Error("two-tap average");
 * ```
 */
export function applyFir(taps: ArrayLike<number>, signal: ArrayLike<number>): Float64Array {
  requireSamples("Taps", taps);
  requireSamples("Signal", signal, 0);
  const h = Float64Array.from(taps);
  const x = Float64Array.from(signal);
  const y = new Float64Array(x.length);
  const n = h.length;
  for (let i = 0; i < x.length; i++) {
    let acc = 0;
    const kMax = Math.min(n - 1, i);
    for (let k = 0; k <= kMax; k++) acc += h[k]! * x[i - k]!;
    y[i] = acc;
  }
  return y;
}
