import { requireSamples } from "../_validate.ts";
import { directKernel, reversedTaps } from "./_direct_kernel.ts";
import { applyFirOverlapAdd } from "./overlap_add.ts";

/**
 * Filter a signal with an FIR filter by its difference equation (direct form),
 * y[n] = Σ_{k=0}^{N−1} h[k]·x[n−k], with x[n] = 0 before the first sample.
 *
 * The output has the input's length (the filter's tail past the last input
 * sample is not produced). The inner loop works on typed arrays and computes
 * four outputs per pass over the taps; each output is summed in tap order,
 * so {@link StreamingFirFilter} reproduces it bit for bit. Cost O(N) per sample.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §6.5.1 (direct form for FIR systems).
 *
 * @param taps FIR coefficients h[0..N−1], N ≥ 1.
 * @param signal Input samples x (may be empty).
 * @returns Output samples y, same length as `signal`.
 * @throws {TypeError} When taps or signal hold a non-finite value.
 * @example
 * ```ts
 * import { applyFirDirect } from "./apply.ts";
 * const y = applyFirDirect([0.5, 0.5], [2, 4, 6]);
 * if (y.join() !== "1,3,5") throw new Error("two-tap average");
 * ```
 */
export function applyFirDirect(taps: ArrayLike<number>, signal: ArrayLike<number>): Float64Array {
  requireSamples("Taps", taps);
  requireSamples("Signal", signal, 0);
  const n = taps.length;
  const extended = new Float64Array(signal.length + n - 1);
  extended.set(signal, n - 1);
  const y = new Float64Array(signal.length);
  directKernel(reversedTaps(taps), extended, y, signal.length);
  return y;
}

/** How {@link applyFir} filters. */
export type FirMethod = "auto" | "direct" | "overlap-add";

/** Options for {@link applyFir}. */
export interface ApplyFirOptions {
  /**
   * "direct" (difference equation), "overlap-add" (FFT blocks) or "auto",
   * which picks the one expected to be faster from the number of taps and the
   * signal length.
   * @default "auto"
   */
  method?: FirMethod;
}

/**
 * Where overlap-add starts to beat the direct form: from N taps on signals of
 * L samples with N ≥ 24 + 50 000/L. Measured on the development machine
 * (Deno 2.9, x86-64; bench/analysis_bench.ts, group "FIR crossover"), the
 * smallest N at which overlap-add was faster:
 *
 * | L         | 256 | 1024 | 4096 | 16384 | 65536 | 10^6 |
 * | --------- | --- | ---- | ---- | ----- | ----- | ---- |
 * | measured  | 170 | 90   | 34   | 22    | 20    | 23   |
 * | this rule | 220 | 73   | 37   | 28    | 25    | 25   |
 *
 * Near the crossover the two differ by less than 10 %, so the rule's misses
 * cost little; far from it the choice matters (255 taps on 10^6 samples:
 * overlap-add 8 times faster; 8 taps: the direct form 1.8 times faster).
 */
function prefersOverlapAdd(taps: number, signalLength: number): boolean {
  return (taps - 24) * signalLength >= 50_000;
}

/**
 * Filter a signal with an FIR filter, y[n] = Σ_{k=0}^{N−1} h[k]·x[n−k]
 * (x = 0 before the first sample), choosing the algorithm: the direct form
 * ({@link applyFirDirect}) for short filters or short signals, FFT overlap-add
 * ({@link applyFirOverlapAdd}) where it is measured to be faster: from N taps
 * on signals of L samples with N ≥ 24 + 50 000/L (25 taps on long signals,
 * 73 on 1024 samples). Both give the same output up to rounding (about
 * 1e-15 relative to Σ|h|·max|x|).
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §6.5.1 (direct form) and §8.7.3 (overlap-add).
 *
 * @param taps FIR coefficients h[0..N−1], N ≥ 1.
 * @param signal Input samples x (may be empty).
 * @param options Algorithm choice.
 * @returns Output samples y, same length as `signal`.
 * @throws {TypeError} When taps or signal hold a non-finite value, or the method is unknown.
 * @example
 * ```ts
 * import { applyFir } from "./apply.ts";
 * const y = applyFir([0.5, 0.5], [2, 4, 6]);
 * if (y.join() !== "1,3,5") throw new Error("two-tap average");
 * ```
 */
export function applyFir(
  taps: ArrayLike<number>,
  signal: ArrayLike<number>,
  options: ApplyFirOptions = {},
): Float64Array {
  const method = options.method ?? "auto";
  if (method !== "auto" && method !== "direct" && method !== "overlap-add") {
    throw new TypeError(
      `Method must be "auto", "direct" or "overlap-add", got ${JSON.stringify(method)}`,
    );
  }
  const useFft = method === "overlap-add" ||
    (method === "auto" && prefersOverlapAdd(taps.length, signal.length));
  return useFft ? applyFirOverlapAdd(taps, signal) : applyFirDirect(taps, signal);
}
