import { requireBandEdge, requireInteger, requireSampleRate } from "../_validate.ts";
import { blackmanWindow, hammingWindow, hannWindow, rectangularWindow } from "../window/windows.ts";

/** Windows the windowed-sinc design accepts by name. */
export type DesignWindowName = "rectangular" | "hann" | "hamming" | "blackman";

/** Specification of a windowed-sinc lowpass. */
export interface WindowedSincOptions {
  /** Number of taps N (filter order N − 1), ≥ 1. */
  length: number;
  /** Sample rate in Hz. */
  fs: number;
  /** Cutoff in Hz, 0 < cutoff < fs/2: the −6 dB point of the ideal response. */
  cutoff: number;
  /** Window applied to the ideal impulse response. @default "hamming" */
  window?: DesignWindowName;
}

const windowByName = {
  rectangular: rectangularWindow,
  hann: hannWindow,
  hamming: hammingWindow,
  blackman: blackmanWindow,
} as const;

/**
 * Lowpass FIR by the window method: the ideal impulse response
 * h_d[n] = 2(fc/fs)·sinc(2(fc/fs)(n − (N−1)/2)), multiplied by a symmetric
 * window and scaled so the gain at DC is exactly 1.
 *
 * The taps are symmetric, so the filter has linear phase with a group delay of
 * (N−1)/2 samples.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §7.5 "Design of FIR filters by windowing".
 *
 * @param options Length, sample rate, cutoff and window.
 * @returns The taps h[0..N−1].
 * @throws {RangeError} When length < 1 or the cutoff is not inside (0, fs/2).
 * @example
 * ```ts
 * import { designWindowedSinc } from "./windowed_sinc.ts";
 * const h = designWindowedSinc({ length: 31, fs: 8000, cutoff: 1000 });
 * const dc = h.reduce((a, b) => a + b, 0);
 * if (Math.abs(dc - 1) > 1e-12 || h[0] !== h[30]) throw new Error("unit DC, symmetric");
 * ```
 */
export function designWindowedSinc(options: WindowedSincOptions): Float64Array {
  const { length, fs, cutoff } = options;
  const windowName = options.window ?? "hamming";
  requireInteger("Number of taps", length, 1, 1 << 20);
  requireSampleRate(fs);
  requireBandEdge("Cutoff", cutoff, fs);
  const makeWindow = windowByName[windowName];
  if (makeWindow === undefined) {
    throw new TypeError(
      `Window must be one of ${Object.keys(windowByName).join(", ")}, got ${String(windowName)}`,
    );
  }
  const w = makeWindow(length);
  const fc = cutoff / fs;
  const middle = (length - 1) / 2;
  const h = new Float64Array(length);
  let sum = 0;
  for (let n = 0; n < length; n++) {
    const t = n - middle;
    const ideal = t === 0 ? 2 * fc : Math.sin(2 * Math.PI * fc * t) / (Math.PI * t);
    h[n] = ideal * w[n]!;
    sum += h[n]!;
  }
  for (let n = 0; n < length; n++) h[n]! /= sum;
  // Exact symmetry, whatever the rounding of sin() on either side.
  for (let n = 0; n < length / 2; n++) h[length - 1 - n] = h[n]!;
  return h;
}
