import { requireInteger, requireSamples } from "../_validate.ts";
import { newSplits, type Split } from "../fft/_engine.ts";
import { fftPlan, transformSplit, transformSplitTimes } from "../fft/_radix4.ts";
import { kernelMinimumSize, wasmKernel } from "../fft/_kernel.ts";

/** Options for {@link applyFirOverlapAdd}. */
export interface OverlapAddOptions {
  /**
   * FFT length M, a power of two greater than the number of taps N; each
   * block then takes M − N + 1 new input samples.
   * @default the smallest power of two ≥ 8N, within 512 … 8192 (at least 2N,
   * at most what one block covering the whole signal needs)
   */
  fftLength?: number;
}

/**
 * The FFT length overlap-add uses by default: the smallest power of two ≥ 8N,
 * kept within 512 … 8192 but never below 2N, and no longer than one block
 * covering the whole signal needs. Measured for 1e6 samples (bench/
 * analysis_bench.ts, Deno 2.9 on x86-64; fastest M per number of taps N):
 * 512 for N ≤ 32, 2048 for N = 64 … 255, 8192 for N = 512 and 1024; the work
 * model M·log2 M/(M − N + 1) alone picks lengths 2–4 times too short, as it
 * leaves out the fixed cost of each block. Within a factor 2 of the best
 * length the time changes by less than 10 %.
 */
function defaultFftLength(taps: number, signal: number): number {
  let m = 512;
  while (m < 8 * taps && m < 8192) m *= 2;
  while (m < 2 * taps) m *= 2;
  let whole = 2;
  while (whole < taps + signal - 1) whole *= 2;
  let floor = 2;
  while (floor < 2 * taps) floor *= 2;
  return Math.max(floor, Math.min(m, whole));
}

/**
 * Add the first `count` values of a block's convolution `c` into y from
 * `start` on, clipped to y's length. y[0 … written−1] may already hold
 * contributions and are added to; y from `written` on is still all zero, so
 * it is copied into (a copy is cheaper than reading y back). Returns the new
 * `written`.
 */
function accumulate(
  y: Float64Array,
  c: Float64Array,
  start: number,
  count: number,
  written: number,
): number {
  const end = Math.min(y.length, start + count);
  const added = Math.min(end, Math.max(start, written));
  for (let i = start; i < added; i++) y[i]! += c[i - start]!;
  if (end > added) y.set(c.subarray(added - start, end - start), added);
  return Math.max(written, end);
}

/**
 * Filter a signal with an FIR filter by FFT overlap-add: the input is cut into
 * blocks of L = M − N + 1 samples, each block is convolved with the taps by an
 * M-point FFT, and the overlapping tails are added. Two real blocks share one
 * complex FFT (one as the real part, one as the imaginary part), so each pair
 * costs one forward and one inverse transform. Same result as
 * {@link applyFirDirect} up to rounding (about 1e-15 relative to Σ|h|·max|x|),
 * at O(log N) instead of O(N) work per sample.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §8.7.3 (block convolution, overlap-add); the two-for-one real-FFT packing is
 * common practice (Oppenheim & Schafer, Problem 8.60).
 *
 * @param taps FIR coefficients h[0..N−1], N ≥ 1.
 * @param signal Input samples x (may be empty).
 * @param options FFT length.
 * @returns y[n] = Σ h[k]·x[n−k] for n = 0 … length−1 (same length as the signal).
 * @throws {TypeError} When taps or signal hold a non-finite value.
 * @throws {RangeError} When fftLength is not a power of two above the number of taps.
 * @example
 * ```ts
 * import { applyFirOverlapAdd } from "./overlap_add.ts";
 * const y = applyFirOverlapAdd([0.5, 0.5], [2, 4, 6, 8, 10], { fftLength: 4 });
 * if (y.some((v, i) => Math.abs(v - [1, 3, 5, 7, 9][i]!) > 1e-12)) throw new Error("two-tap average");
 * ```
 */
export function applyFirOverlapAdd(
  taps: ArrayLike<number>,
  signal: ArrayLike<number>,
  options: OverlapAddOptions = {},
): Float64Array {
  requireSamples("Taps", taps);
  requireSamples("Signal", signal, 0);
  const n = taps.length;
  const length = signal.length;
  if (length === 0) return new Float64Array(0);
  const m = options.fftLength ?? defaultFftLength(n, length);
  requireInteger("FFT length", m, n + 1);
  if ((m & (m - 1)) !== 0) throw new RangeError(`FFT length must be a power of two, got ${m}`);
  const block = m - n + 1;
  const x = signal instanceof Float64Array ? signal : Float64Array.from(signal);
  // The WebAssembly kernel runs the same block loop with the same arithmetic.
  const kernel = m >= kernelMinimumSize ? wasmKernel() : undefined;
  if (kernel !== undefined) return kernel.overlapAdd(taps, x, m);
  const plan = fftPlan(m);

  // Filter spectrum, scaled by 1/M so the inverse needs no extra pass.
  const [padded, filter, input, result] = newSplits(m, 4) as [Split, Split, Split, Split];
  for (let k = 0; k < n; k++) padded.re[k] = taps[k]! / m;
  transformSplit(plan, padded.re, padded.im, filter.re, filter.im);

  // Block 0 as real parts of `input`, block 1 as imaginary parts; values from
  // `block` on stay 0. The padded taps' arrays then hold the product of spectra.
  const product = padded;
  const y = new Float64Array(length);
  let written = 0;
  for (let start = 0; start < length; start += 2 * block) {
    const second = start + block;
    const count0 = Math.min(block, length - start);
    const count1 = Math.max(0, Math.min(block, length - second));
    input.re.set(x.subarray(start, start + count0));
    if (count0 < block) input.re.fill(0, count0, block);
    input.im.set(x.subarray(second, second + count1));
    if (count1 < block) input.im.fill(0, count1, block);
    transformSplitTimes(plan, input.re, input.im, filter.re, filter.im, product.re, product.im);
    // Inverse transform by exchanging real and imaginary parts on the way in
    // and out: block 0 convolved with h lands in result.re, block 1 in result.im.
    transformSplit(plan, product.im, product.re, result.im, result.re);
    written = accumulate(y, result.re, start, Math.min(m, count0 + n - 1), written);
    if (count1 > 0) {
      written = accumulate(y, result.im, second, Math.min(m, count1 + n - 1), written);
    }
  }
  return y;
}
