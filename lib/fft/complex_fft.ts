import { requireSamples } from "../_validate.ts";
import { forwardInterleaved, inverseInterleaved } from "./_engine.ts";

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

function interleave(input: ComplexInput, what: string): Float64Array {
  if (input === null || typeof input !== "object") {
    throw new TypeError(`${what} must be an object { re, im }, got ${String(input)}`);
  }
  requireSamples(`${what} real part`, input.re);
  const n = input.re.length;
  const data = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) data[2 * i] = input.re[i]!;
  if (input.im !== undefined) {
    requireSamples(`${what} imaginary part`, input.im);
    if (input.im.length !== n) {
      throw new TypeError(
        `${what} imaginary part must have the real part's length ${n}, got ${input.im.length}`,
      );
    }
    for (let i = 0; i < n; i++) data[2 * i + 1] = input.im[i]!;
  }
  return data;
}

function split(data: Float64Array, n: number): ComplexSamples {
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = data[2 * i]!;
    im[i] = data[2 * i + 1]!;
  }
  return { re, im };
}

/**
 * Discrete Fourier transform of a complex sequence of any length N:
 * X[k] = Σ_{n=0}^{N−1} x[n] e^(−j2πkn/N), k = 0 … N−1, unscaled.
 *
 * Powers of two use the radix-4 kernel of fft.js; any other length uses
 * Bluestein's chirp-z algorithm (a circular convolution of power-of-two size
 * ≥ 2N − 1), so every length costs O(N log N).
 *
 * Source: L. I. Bluestein, "A linear filtering approach to the computation of
 * the discrete Fourier transform", IEEE Trans. Audio Electroacoust. 18(4), 1970;
 * Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §9.6.2 (chirp transform).
 *
 * @param signal `{ re, im }`, N ≥ 1 values each (im may be omitted for a real signal).
 * @returns `{ re, im }` of the N DFT bins; bin k is at frequency k·fs/N.
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
  const data = interleave(signal, "Signal");
  const n = signal.re.length;
  return split(forwardInterleaved(data, n), n);
}

/**
 * Inverse discrete Fourier transform of any length N, scaled by 1/N so that
 * it undoes {@link complexFft}: x[n] = (1/N) Σ_{k=0}^{N−1} X[k] e^(+j2πkn/N).
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §8.5
 * (the DFT pair); Bluestein 1970 for lengths that are not powers of two.
 *
 * @param spectrum `{ re, im }`, N ≥ 1 bins.
 * @returns `{ re, im }`, N samples.
 * @throws {TypeError} When the parts differ in length or hold a non-finite value.
 * @example
 * ```ts
 * import { complexFft, inverseComplexFft } from "./complex_fft.ts";
 * const x = inverseComplexFft(complexFft({ re: [1, 2, 3, 4, 5], im: [0, 0, 1, 0, 0] }));
 * if (Math.abs(x.re[4]! - 5) > 1e-12 || Math.abs(x.im[2]! - 1) > 1e-12) throw new Error("round trip");
 * ```
 */
export function inverseComplexFft(spectrum: ComplexInput): ComplexSamples {
  const data = interleave(spectrum, "Spectrum");
  const n = spectrum.re.length;
  return split(inverseInterleaved(data, n), n);
}
