import { requireInteger } from "../_validate.ts";
import { isPeriodic } from "./_symmetry.ts";

/**
 * Symmetric windows suit FIR design (w[n] = w[N−1−n]); periodic windows suit
 * spectral analysis (the symmetric window of length N+1 with its last sample
 * dropped, so that the DFT of length N sees a whole number of periods).
 */
export type WindowSymmetry = "symmetric" | "periodic";

/** Options shared by every window. */
export interface WindowOptions {
  /** Symmetric (filter design) or periodic (spectral analysis). @default "symmetric" */
  symmetry?: WindowSymmetry;
}

/** Evaluate a generalised cosine window Σ (−1)^k a_k cos(2πkn/M). */
function cosineSum(
  length: number,
  coefficients: readonly number[],
  options: WindowOptions,
): Float64Array {
  requireInteger("Window length", length, 1);
  const periodic = isPeriodic(options);
  const w = new Float64Array(length);
  if (length === 1) {
    w[0] = 1;
    return w;
  }
  const m = periodic ? length : length - 1;
  for (let n = 0; n < length; n++) {
    let sum = 0;
    for (let k = 0; k < coefficients.length; k++) {
      const sign = k % 2 === 0 ? 1 : -1;
      sum += sign * (coefficients[k] as number) * Math.cos((2 * Math.PI * k * n) / m);
    }
    w[n] = sum;
  }
  return w;
}

/**
 * Rectangular window: w[n] = 1.
 *
 * @param length Number of samples, ≥ 1.
 * @returns The window samples.
 * @example
 * ```ts
 * import { rectangularWindow } from "./windows.ts";
 * if (rectangularWindow(3).join() !== "1,1,1") throw new Error("all ones");
 * ```
 */
export function rectangularWindow(length: number, options: WindowOptions = {}): Float64Array {
  requireInteger("Window length", length, 1);
  isPeriodic(options);
  return new Float64Array(length).fill(1);
}

/**
 * Hann window: w[n] = 0.5 − 0.5 cos(2πn/M), M = N−1 (symmetric) or N (periodic).
 *
 * Source: F. J. Harris, "On the use of windows for harmonic analysis with the
 * discrete Fourier transform", Proc. IEEE 66(1), 1978, eq. (27a).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Symmetry.
 * @returns The window samples.
 * @throws {RangeError} When length < 1.
 * @example
 * ```ts
 * import { hannWindow } from "./windows.ts";
 * const w = hannWindow(5);
 * if (w[0] !== 0 || w[2] !== 1) throw new Error("Hann: 0 at the ends, 1 in the middle");
 * ```
 */
export function hannWindow(length: number, options: WindowOptions = {}): Float64Array {
  return cosineSum(length, [0.5, 0.5], options);
}

/**
 * Hamming window: w[n] = 0.54 − 0.46 cos(2πn/M).
 *
 * Source: Harris 1978 (see {@link hannWindow}), section on the Hamming window.
 *
 * @param length Number of samples, ≥ 1.
 * @param options Symmetry.
 * @returns The window samples.
 * @example
 * ```ts
 * import { hammingWindow } from "./windows.ts";
 * const w = hammingWindow(3);
 * if (Math.abs(w[0]! - 0.08) > 1e-15 || w[1] !== 1) throw new Error("Hamming ends at 0.08");
 * ```
 */
export function hammingWindow(length: number, options: WindowOptions = {}): Float64Array {
  return cosineSum(length, [0.54, 0.46], options);
}

/**
 * Blackman window: w[n] = 0.42 − 0.5 cos(2πn/M) + 0.08 cos(4πn/M).
 *
 * Source: Harris 1978 (see {@link hannWindow}), eq. (32).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Symmetry.
 * @returns The window samples.
 * @example
 * ```ts
 * import { blackmanWindow } from "./windows.ts";
 * const w = blackmanWindow(3);
 * if (Math.abs(w[0]!) > 1e-15 || Math.abs(w[1]! - 1) > 1e-15) throw new Error("Blackman");
 * ```
 */
export function blackmanWindow(length: number, options: WindowOptions = {}): Float64Array {
  return cosineSum(length, [0.42, 0.5, 0.08], options);
}

/**
 * Exact Blackman window: the three-term cosine window whose coefficients
 * a0 = 7938/18608, a1 = 9240/18608, a2 = 1430/18608 place zeros on the third
 * and fourth sidelobes of the rectangular window:
 * w[n] = a0 − a1 cos(2πn/M) + a2 cos(4πn/M).
 *
 * Source: F. J. Harris, "On the use of windows for harmonic analysis with the
 * discrete Fourier transform", Proc. IEEE 66(1), 1978, §V-E (exact Blackman, −68 dB sidelobes).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Symmetry.
 * @returns The window samples.
 * @throws {RangeError} When length < 1.
 * @example
 * ```ts
 * import { exactBlackmanWindow } from "./windows.ts";
 * const w = exactBlackmanWindow(3);
 * // Ends at a0 − a1 + a2 = 128/18608, peak 1.
 * if (Math.abs(w[0]! - 128 / 18608) > 1e-15 || Math.abs(w[1]! - 1) > 1e-15) throw new Error("ends");
 * ```
 */
export function exactBlackmanWindow(length: number, options: WindowOptions = {}): Float64Array {
  return cosineSum(length, [7938 / 18608, 9240 / 18608, 1430 / 18608], options);
}

/**
 * 4-term Blackman–Harris window (minimum sidelobe, −92 dB):
 * w[n] = 0.35875 − 0.48829 cos(2πn/M) + 0.14128 cos(4πn/M) − 0.01168 cos(6πn/M).
 *
 * Source: Harris 1978 (see {@link exactBlackmanWindow}), §V-E, 4-term −92 dB coefficients.
 *
 * @param length Number of samples, ≥ 1.
 * @param options Symmetry.
 * @returns The window samples.
 * @throws {RangeError} When length < 1.
 * @example
 * ```ts
 * import { blackmanHarrisWindow } from "./windows.ts";
 * const w = blackmanHarrisWindow(5);
 * if (Math.abs(w[0]! - 6e-5) > 1e-15 || Math.abs(w[2]! - 1) > 1e-15) throw new Error("ends 6e-5");
 * ```
 */
export function blackmanHarrisWindow(length: number, options: WindowOptions = {}): Float64Array {
  return cosineSum(length, [0.35875, 0.48829, 0.14128, 0.01168], options);
}

/**
 * Flat-top window, five cosine terms chosen for amplitude accuracy (scalloping
 * loss about 0.01 dB) at the cost of a main lobe about 3.8 bins wide at −3 dB:
 * w[n] = Σ_{k=0}^{4} (−1)^k a_k cos(2πkn/M), a = [0.21557895, 0.41663158,
 * 0.277263158, 0.083578947, 0.006947368]. The peak is 1.000000001, not exactly 1.
 *
 * Source: G. D'Antona and A. Ferrero, Digital Signal Processing for Measurement
 * Systems, Springer 2006, p. 70 (coefficients).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Symmetry.
 * @returns The window samples (some are negative).
 * @throws {RangeError} When length < 1.
 * @example
 * ```ts
 * import { flatTopWindow } from "./windows.ts";
 * const w = flatTopWindow(5);
 * if (!(w[0]! < 0) || Math.abs(w[2]! - 1) > 1e-8) throw new Error("negative ends, unit peak");
 * ```
 */
export function flatTopWindow(length: number, options: WindowOptions = {}): Float64Array {
  return cosineSum(
    length,
    [0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368],
    options,
  );
}
