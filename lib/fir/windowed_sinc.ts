import { requireBandEdge, requireInteger, requireSampleRate, show } from "../_validate.ts";
import { designWindow } from "./_design_window.ts";
import type { BandShape, DesignWindow } from "./types.ts";

export type { DesignWindow, DesignWindowName } from "./types.ts";

/** Specification of a window-method (windowed-sinc) FIR. */
export interface WindowedSincOptions {
  /** Number of taps N (filter order N − 1), 1 ≤ N ≤ 2^20. */
  length: number;
  /** Sample rate in Hz. */
  fs: number;
  /**
   * Cutoff(s) in Hz, each strictly inside (0, fs/2) and increasing: the −6 dB
   * points of the ideal response. One for a lowpass or highpass, two for a
   * bandpass or bandstop, any number for a multiband.
   */
  cutoff: number | readonly number[];
  /** Band shape; "multiband" alternates pass and stop bands at the cutoffs. @default "lowpass" */
  response?: BandShape | "multiband";
  /** For "multiband": whether the band starting at 0 Hz passes or stops. @default "pass" */
  firstBand?: "pass" | "stop";
  /** Window applied to the ideal impulse response. @default "hamming" */
  window?: DesignWindow;
  /**
   * Scale so the gain is exactly 1 at the centre of the first passband (at 0 Hz
   * when it starts there, at fs/2 when it reaches fs/2). @default true
   */
  scale?: boolean;
}

const cutoffCount: Record<BandShape, number> = {
  lowpass: 1,
  highpass: 1,
  bandpass: 2,
  bandstop: 2,
};

/**
 * FIR filter by the window method: the ideal (brick-wall) impulse response of
 * the band shape, h_d[n] = Σ_pass [2f₂·sinc(2f₂ m) − 2f₁·sinc(2f₁ m)] with
 * m = n − (N−1)/2 and f in cycles per sample, times a symmetric window, then
 * scaled to unit gain in the first passband.
 *
 * Lowpass by default (the −6 dB point sits at the cutoff). The taps are
 * symmetric: linear phase with a group delay of (N−1)/2 samples. A response
 * with gain at fs/2 (highpass, bandstop, a multiband ending in a passband) needs
 * an odd length, since an even symmetric filter has a zero at fs/2 (type II).
 * With a Kaiser window, {@link kaiserParameters} gives the length and β for a
 * ripple and transition width.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §7.5 "Design of FIR filters by windowing" and §7.6 (Kaiser window method).
 *
 * @param options Length, sample rate, cutoff(s), response, window, scaling.
 * @returns The taps h[0..N−1].
 * @throws {RangeError} When length < 1, a cutoff is not inside (0, fs/2), the
 *   cutoffs do not increase or do not fit the response, or an even length is
 *   asked to pass fs/2.
 * @throws {TypeError} For an unknown window or response name.
 * @example
 * ```ts
 * import { designWindowedSinc } from "./windowed_sinc.ts";
 * const h = designWindowedSinc({ length: 31, fs: 8000, cutoff: 1000 });
 * const dc = h.reduce((a, b) => a + b, 0);
 * if (Math.abs(dc - 1) > 1e-12 || h[0] !== h[30]) throw new Error("unit DC, symmetric");
 * const hp = designWindowedSinc({
 *   length: 41, fs: 1000, cutoff: 200, response: "highpass", window: { name: "kaiser", beta: 6 },
 * });
 * const nyquistGain = hp.reduce((a, b, n) => a + b * (n % 2 === 0 ? 1 : -1), 0);
 * if (Math.abs(nyquistGain - 1) > 1e-12) throw new Error("unit gain at fs/2");
 * ```
 */
export function designWindowedSinc(options: WindowedSincOptions): Float64Array {
  const { length, fs } = options;
  const response = options.response ?? "lowpass";
  requireInteger("Number of taps", length, 1, 1 << 20);
  requireSampleRate(fs);
  const cutoffs = typeof options.cutoff === "number" ? [options.cutoff] : [...options.cutoff];
  cutoffs.forEach((c, i) =>
    requireBandEdge(cutoffs.length === 1 ? "Cutoff" : `Cutoff ${i + 1}`, c, fs)
  );
  for (let i = 1; i < cutoffs.length; i++) {
    if (!(cutoffs[i]! > cutoffs[i - 1]!)) {
      throw new RangeError(
        `Cutoffs must increase: cutoff ${i + 1} is ${show(cutoffs[i]!)} Hz after ${
          show(cutoffs[i - 1]!)
        } Hz`,
      );
    }
  }
  let passZero: boolean;
  if (response === "multiband") {
    const first = options.firstBand ?? "pass";
    if (first !== "pass" && first !== "stop") {
      throw new TypeError(`First band must be "pass" or "stop", got ${String(first)}`);
    }
    passZero = first === "pass";
  } else {
    const count = cutoffCount[response];
    if (count === undefined) {
      throw new TypeError(
        `Response must be lowpass, highpass, bandpass, bandstop or multiband, got ${
          String(response)
        }`,
      );
    }
    if (cutoffs.length !== count) {
      throw new RangeError(
        `A ${response} takes ${count === 1 ? "one cutoff" : "two cutoffs"}, got ${cutoffs.length}`,
      );
    }
    passZero = response === "lowpass" || response === "bandstop";
  }
  const passNyquist = (cutoffs.length % 2 === 1) !== passZero;
  if (passNyquist && length % 2 === 0) {
    throw new RangeError(
      `A ${response} passes fs/2, which an even-length symmetric filter cannot (type II has a zero at fs/2): use an odd number of taps, got ${length}`,
    );
  }
  // Band edges as fractions of the Nyquist frequency, alternating pass/stop from 0.
  const edges = [
    ...(passZero ? [0] : []),
    ...cutoffs.map((c) => c / (fs / 2)),
    ...(passNyquist ? [1] : []),
  ];
  const w = designWindow(length, options.window ?? "hamming");
  const middle = (length - 1) / 2;
  const h = new Float64Array(length);
  let idealSize = 0;
  for (let n = 0; n < length; n++) {
    const m = n - middle;
    let sum = 0;
    for (let b = 0; b + 1 < edges.length; b += 2) {
      sum += edges[b + 1]! * sinc(edges[b + 1]! * m) - edges[b]! * sinc(edges[b]! * m);
    }
    idealSize += Math.abs(sum);
    h[n] = sum * w[n]!;
  }
  if (options.scale ?? true) {
    const left = edges[0]!;
    const right = edges[1]!;
    const f = left === 0 ? 0 : right === 1 ? 1 : (left + right) / 2;
    let s = 0;
    for (let n = 0; n < length; n++) s += h[n]! * Math.cos(Math.PI * (n - middle) * f);
    if (!(Math.abs(s) > 1e-9 * idealSize)) {
      // E.g. a 2-tap Hann or Blackman window is all zeros: nothing is left to scale.
      throw new RangeError(
        `Number of taps must be large enough for the window to leave a non-zero filter, got ${length} taps with this window`,
      );
    }
    for (let n = 0; n < length; n++) h[n]! /= s;
  }
  // Exact symmetry, whatever the rounding of sin() on either side.
  for (let n = 0; n < length / 2; n++) h[length - 1 - n] = h[n]!;
  return h;
}

/** sin(πx)/(πx), 1 at x = 0. */
function sinc(x: number): number {
  if (x === 0) return 1;
  const t = Math.PI * x;
  return Math.sin(t) / t;
}
