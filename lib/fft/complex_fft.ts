import { requireSamples } from "../_validate.ts";
import { forwardComplex, inverseComplex } from "./_engine.ts";

/** A complex sequence held as two equally long arrays of real and imaginary parts. */
export interface ComplexSamples {
  /** Real parts. */
  re: Float64Array;
  /** Imaginary parts. */
  im: Float64Array;
}

/** Input to a complex transform: real parts and (optionally) imaginary parts. */
export interface ComplexInput {
  /** Real parts, N ≥ 1 values. */
  re: ArrayLike<number>;
  /** Imaginary parts, same length as `re`. @default all zero */
  im?: ArrayLike<number>;
}

/** The validated parts as typed arrays (imaginary parts zero when omitted). */
function parts(input: ComplexInput, what: string): ComplexSamples {
  if (input === null || typeof input !== "object") {
    throw new TypeError(`${what} must be an object { re, im }, got ${String(input)}`);
  }
  requireSamples(`${what} real part`, input.re);
  const n = input.re.length;
  // The engine does not write to its inputs, so typed arrays are used as they are.
  const re = input.re instanceof Float64Array ? input.re : Float64Array.from(input.re);
  let im: Float64Array = new Float64Array(n);
  if (input.im !== undefined) {
    requireSamples(`${what} imaginary part`, input.im);
    if (input.im.length !== n) {
      throw new TypeError(
        `${what} imaginary part must have the real part's length ${n}, got ${input.im.length}`,
      );
    }
    im = input.im instanceof Float64Array ? input.im : Float64Array.from(input.im);
  }
  return { re, im };
}

/**
 * Discrete Fourier transform of a complex sequence of any length N:
 * X[k] = Σ_{n=0}^{N−1} x[n] e^(−j2πkn/N), k = 0 … N−1, unscaled.
 *
 * Powers of two use tapsheet's radix-4 kernel (decimation in time, input in
 * bit-reversed order, a radix-8 first pass when log2 N is odd); any other
 * length uses Bluestein's chirp-z algorithm (a circular convolution of
 * power-of-two size ≥ 2N − 1), so every length costs O(N log N).
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §9.3
 * (decimation in time; radix 4 in Problem 9.45); L. I. Bluestein, "A linear filtering approach to the computation of
 * the discrete Fourier transform", IEEE Trans. Audio Electroacoust. 18(4), 1970;
 * Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §9.6.2 (chirp transform).
 *
 * @param signal `{ re, im }`, N ≥ 1 values each (im may be omitted for a real signal).
 * @returns `{ re, im }` of the N DFT bins; bin k is at frequency k·fs/N. The two
 *   arrays may share one ArrayBuffer.
 * @throws {TypeError} When the parts differ in length or hold a non-finite value.
 * @throws {RangeError} When the signal is empty.
 * @example
 * ```ts
 * import { complexFft } from "./complex_fft.ts";
 * // A complex exponential at bin 1 of a 3-point DFT lands entirely in bin 1.
 * const c = Math.cos(2 * Math.PI / 3), s = Math.sin(2 * Math.PI / 3);
 * const X = complexFft({ re: [1, c, c], im: [0, s, -s] });
 * if (Math.abs(X.re[1]! - 3) > 1e-12 || Math.abs(X.re[0]!) > 1e-12) throw new Error("bin 1");
 * ```
 */
export function complexFft(signal: ComplexInput): ComplexSamples {
  const x = parts(signal, "Signal");
  return forwardComplex(x.re, x.im);
}

/**
 * Inverse discrete Fourier transform of any length N, scaled by 1/N so that
 * it undoes {@link complexFft}: x[n] = (1/N) Σ_{k=0}^{N−1} X[k] e^(+j2πkn/N).
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §8.5
 * (the DFT pair); Bluestein 1970 for lengths that are not powers of two.
 *
 * @param spectrum `{ re, im }`, N ≥ 1 bins.
 * @returns `{ re, im }`, N samples (the two arrays may share one ArrayBuffer).
 * @throws {TypeError} When the parts differ in length or hold a non-finite value.
 * @example
 * ```ts
 * import { complexFft, inverseComplexFft } from "./complex_fft.ts";
 * const x = inverseComplexFft(complexFft({ re: [1, 2, 3, 4, 5], im: [0, 0, 1, 0, 0] }));
 * if (Math.abs(x.re[4]! - 5) > 1e-12 || Math.abs(x.im[2]! - 1) > 1e-12) throw new Error("round trip");
 * ```
 */
export function inverseComplexFft(spectrum: ComplexInput): ComplexSamples {
  const x = parts(spectrum, "Spectrum");
  return inverseComplex(x.re, x.im);
}
