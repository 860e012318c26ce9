import { requireInteger, requireSamples } from "../_validate.ts";
import { inverseRealHalf, realHalfSpectrum } from "./_engine.ts";
import type { ComplexSamples } from "./complex_fft.ts";

/** Options for {@link realFft}. */
export interface RealFftOptions {
  /**
   * Transform length N ≥ signal length; the signal is zero-padded to it. Any
   * integer works (non-powers of two go through Bluestein's algorithm).
   * @default the signal length
   */
  size?: number;
}

/**
 * DFT of a real signal at the non-negative frequencies:
 * X[k] = Σ_{n=0}^{N−1} x[n] e^(−j2πkn/N), k = 0 … ⌊N/2⌋ (the other bins are
 * the complex conjugates X[N−k] = X[k]*). Unscaled.
 *
 * Powers of two ≥ 2 run as one complex transform of N/2 points on tapsheet's
 * radix-4 kernel (even samples as real parts, odd samples as imaginary parts)
 * followed by the even/odd split; other lengths use Bluestein's chirp-z
 * algorithm.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §8.6
 * (symmetry of the DFT of a real sequence) and Problem 8.60 (two real
 * N/2-point sequences in one complex transform); Bluestein 1970.
 *
 * @param signal Real samples, at least 1.
 * @param options Transform length (zero-padding).
 * @returns `{ re, im }` with ⌊N/2⌋ + 1 bins; bin k is at k·fs/N Hz. The DC bin
 *   (and the Nyquist bin for even N) has an imaginary part of exactly 0. The
 *   two arrays may share one ArrayBuffer.
 * @throws {RangeError} When size is not an integer or is below the signal length.
 * @throws {TypeError} When the signal holds a non-finite value.
 * @example
 * ```ts
 * import { realFft } from "./real_fft.ts";
 * const X = realFft([1, 0, -1, 0, 1, 0]);
 * // cos(πn/2) sampled 6 times: not periodic in 6, so energy spreads; DC is the plain sum.
 * if (X.re.length !== 4 || Math.abs(X.re[0]! - 1) > 1e-12) throw new Error("DC = sum");
 * ```
 */
export function realFft(signal: ArrayLike<number>, options: RealFftOptions = {}): ComplexSamples {
  // A Float64Array is checked after the transform: any NaN or ±Infinity in the
  // input makes the DC bin (the plain sum) non-finite, and only then is the
  // input scanned for the offending sample.
  const typed = signal instanceof Float64Array && signal.length > 0;
  if (!typed) requireSamples("Signal", signal);
  const size = options.size ?? signal.length;
  requireInteger("Transform size", size, signal.length);
  let input: Float64Array;
  if (signal instanceof Float64Array && signal.length === size) {
    input = signal;
  } else {
    input = new Float64Array(size);
    input.set(signal);
  }
  const { re, im } = realHalfSpectrum(input, size);
  if (typed && !Number.isFinite(re[0]!)) requireSamples("Signal", signal);
  return { re, im };
}

/**
 * Inverse of {@link realFft}: the real signal of length N whose DFT has the
 * given non-negative-frequency bins, x[n] = (1/N) Σ_{k=0}^{N−1} X[k] e^(+j2πkn/N)
 * with X[N−k] = X[k]*. The imaginary parts of the DC bin (and of the Nyquist
 * bin when N is even) are ignored, as a real signal cannot have them.
 *
 * Powers of two ≥ 2 undo {@link realFft}'s even/odd split and run one inverse
 * complex transform of N/2 points; other lengths build the full conjugate-
 * symmetric spectrum and use Bluestein's algorithm.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §8.6
 * and Problem 8.60.
 *
 * @param spectrum `{ re, im }` with ⌊N/2⌋ + 1 bins.
 * @param length Signal length N ≥ 1; must satisfy ⌊N/2⌋ + 1 = number of bins.
 * @returns N real samples.
 * @throws {RangeError} When the number of bins does not fit the length.
 * @throws {TypeError} When the parts differ in length or hold a non-finite value.
 * @example
 * ```ts
 * import { inverseRealFft, realFft } from "./real_fft.ts";
 * const x = inverseRealFft(realFft([3, 1, 4, 1, 5]), 5);
 * if (Math.abs(x[4]! - 5) > 1e-12) throw new Error("round trip");
 * ```
 */
export function inverseRealFft(
  spectrum: { re: ArrayLike<number>; im: ArrayLike<number> },
  length: number,
): Float64Array {
  requireInteger("Signal length", length, 1);
  requireSamples("Spectrum real part", spectrum.re);
  requireSamples("Spectrum imaginary part", spectrum.im);
  const bins = Math.floor(length / 2) + 1;
  if (spectrum.re.length !== bins || spectrum.im.length !== bins) {
    throw new RangeError(
      `A real signal of length ${length} needs ${bins} spectrum bins, got ${spectrum.re.length} real and ${spectrum.im.length} imaginary`,
    );
  }
  // The engine does not write to its inputs, so typed arrays are used as they are.
  const re = spectrum.re instanceof Float64Array ? spectrum.re : Float64Array.from(spectrum.re);
  const im = spectrum.im instanceof Float64Array ? spectrum.im : Float64Array.from(spectrum.im);
  return inverseRealHalf(re, im, length);
}
