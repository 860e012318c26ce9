import { requireInteger } from "../_validate.ts";

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
  const w = new Float64Array(length);
  if (length === 1) {
    w[0] = 1;
    return w;
  }
  const m = (options.symmetry ?? "symmetric") === "periodic" ? length : length - 1;
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
export function rectangularWindow(length: number, _options: WindowOptions = {}): Float64Array {
  requireInteger("Window length", length, 1);
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
