import { requireInteger, requireSamples } from "../_validate.ts";
import { designWindowedSinc } from "../fir/windowed_sinc.ts";
import { polyphase } from "./_polyphase.ts";

/** Options shared by the polyphase rate changers. */
export interface PolyphaseOptions {
  /**
   * FIR taps at the high (upsampled) rate.
   * @default designResamplingFilter(up, down); the single tap [1] when no rate changes
   */
  taps?: ArrayLike<number>;
}

/**
 * Lowpass for a rate change by up/down: a Kaiser-window (β = 5) windowed sinc
 * of 20·max(up, down) + 1 taps at the upsampled rate, cutoff at
 * 1/(2·max(up, down)) of that rate (the lower of the two Nyquist frequencies),
 * scaled to a DC gain of `up` so interpolation keeps the signal level.
 *
 * Source: R. E. Crochiere and L. R. Rabiner, Multirate Digital Signal
 * Processing, Prentice-Hall 1983, §2.3 (the filter for sampling-rate
 * conversion by a rational factor); the length and β are common practice.
 *
 * @param up Interpolation factor L, 1 … 4096.
 * @param down Decimation factor M, 1 … 4096.
 * @returns The taps (odd length, symmetric).
 * @throws {RangeError} When a factor is not an integer in range or both are 1.
 * @example
 * ```ts
 * import { designResamplingFilter } from "./resample.ts";
 * const h = designResamplingFilter(3, 2);
 * const dc = h.reduce((a, b) => a + b, 0);
 * if (h.length !== 61 || Math.abs(dc - 3) > 1e-12) throw new Error("61 taps, DC gain 3");
 * ```
 */
export function designResamplingFilter(up: number, down: number): Float64Array {
  requireInteger("Interpolation factor", up, 1, 4096);
  requireInteger("Decimation factor", down, 1, 4096);
  if (up === 1 && down === 1) {
    throw new RangeError("A rate change needs up or down above 1, got up = 1 and down = 1");
  }
  const m = Math.max(up, down);
  const h = designWindowedSinc({
    length: 20 * m + 1,
    fs: 2 * m,
    cutoff: 1,
    window: { name: "kaiser", beta: 5 },
  });
  for (let i = 0; i < h.length; i++) h[i]! *= up;
  return h;
}

/**
 * Rational sample-rate change by up/down with a polyphase FIR:
 * y[n] = Σ_k h[k]·u[n·down − k], where u is the input with up − 1 zeros after
 * every sample. Only products with real input samples are formed and only the
 * kept outputs are computed, about len(h)/up multiplications per output.
 *
 * The output holds ⌈N·up/down⌉ samples (N input samples), the first samples of
 * the full convolution; it is delayed by (len(h) − 1)/2 samples of the
 * upsampled rate (a linear-phase filter's delay), which is not removed.
 *
 * Source: R. E. Crochiere and L. R. Rabiner, Multirate Digital Signal
 * Processing, 1983, §3.3 (polyphase structures for rational conversion).
 *
 * @param signal Input samples.
 * @param up Interpolation factor L, 1 … 4096.
 * @param down Decimation factor M, 1 … 4096.
 * @param options Filter taps at the upsampled rate.
 * @returns ⌈N·up/down⌉ output samples.
 * @throws {RangeError} When a factor is out of range.
 * @throws {TypeError} When the signal or taps hold non-finite values.
 * @example
 * ```ts
 * import { resampleRational } from "./resample.ts";
 * // With the single tap [1], up 2 / down 1 just inserts zeros.
 * const y = resampleRational([1, 2, 3], 2, 1, { taps: [1] });
 * if (y.join() !== "1,0,2,0,3,0") throw new Error("zero stuffing");
 * ```
 */
export function resampleRational(
  signal: ArrayLike<number>,
  up: number,
  down: number,
  options: PolyphaseOptions = {},
): Float64Array {
  requireInteger("Interpolation factor", up, 1, 4096);
  requireInteger("Decimation factor", down, 1, 4096);
  requireSamples("Signal", signal, 0);
  const taps = options.taps ?? (up === 1 && down === 1 ? [1] : designResamplingFilter(up, down));
  requireSamples("Taps", taps);
  const x = Float64Array.from(signal);
  const outputLength = Math.ceil((x.length * up) / down);
  return polyphase(x, Float64Array.from(taps), up, down, outputLength);
}

/**
 * Decimation by an integer factor with a polyphase FIR:
 * y[m] = Σ_k h[k]·x[m·M − k], computing only the kept outputs (about len(h)
 * multiplications per output, none for discarded samples). The default filter
 * is {@link designResamplingFilter}(1, M).
 *
 * Source: Crochiere and Rabiner, Multirate Digital Signal Processing, 1983, §3.3.
 *
 * @param signal Input samples.
 * @param factor Decimation factor M, 1 … 4096.
 * @param options Filter taps at the input rate.
 * @returns ⌈N/M⌉ output samples.
 * @throws {RangeError} When the factor is out of range.
 * @throws {TypeError} When the signal or taps hold non-finite values.
 * @example
 * ```ts
 * import { decimatePolyphase } from "./resample.ts";
 * const y = decimatePolyphase([1, 2, 3, 4, 5, 6], 2, { taps: [0.5, 0.5] });
 * if (y.join() !== "0.5,2.5,4.5") throw new Error("average then keep every second");
 * ```
 */
export function decimatePolyphase(
  signal: ArrayLike<number>,
  factor: number,
  options: PolyphaseOptions = {},
): Float64Array {
  requireInteger("Decimation factor", factor, 1, 4096);
  return resampleRational(signal, 1, factor, {
    taps: options.taps ?? (factor === 1 ? [1] : designResamplingFilter(1, factor)),
  });
}

/**
 * Interpolation by an integer factor with a polyphase FIR: the input with
 * L − 1 zeros after each sample, filtered, y[n] = Σ_j h[p + jL]·x[q − j] with
 * n = qL + p, so no multiplication touches an inserted zero. The default
 * filter {@link designResamplingFilter}(L, 1) has DC gain L, keeping the level.
 *
 * Source: Crochiere and Rabiner, Multirate Digital Signal Processing, 1983, §3.3.
 *
 * @param signal Input samples.
 * @param factor Interpolation factor L, 1 … 4096.
 * @param options Filter taps at the output rate.
 * @returns N·L output samples.
 * @throws {RangeError} When the factor is out of range.
 * @throws {TypeError} When the signal or taps hold non-finite values.
 * @example
 * ```ts
 * import { interpolatePolyphase } from "./resample.ts";
 * // Linear interpolation by 2: taps [0.5, 1, 0.5].
 * const y = interpolatePolyphase([2, 4], 2, { taps: [0.5, 1, 0.5] });
 * if (y.join() !== "1,2,3,4") throw new Error("halfway points");
 * ```
 */
export function interpolatePolyphase(
  signal: ArrayLike<number>,
  factor: number,
  options: PolyphaseOptions = {},
): Float64Array {
  requireInteger("Interpolation factor", factor, 1, 4096);
  return resampleRational(signal, factor, 1, {
    taps: options.taps ?? (factor === 1 ? [1] : designResamplingFilter(factor, 1)),
  });
}
