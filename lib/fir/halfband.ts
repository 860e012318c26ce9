import { requireFinite, requireInteger, requireSampleRate, show } from "../_validate.ts";
import type { DesignWarning } from "../types.ts";
import { designEquiripple } from "./equiripple.ts";

/** Specification of an equiripple half-band lowpass. */
export interface HalfbandOptions {
  /** Number of taps N with N = 4k − 1 (7, 11, 15, …, up to 65535) so the end taps are non-zero. */
  length: number;
  /** Sample rate in Hz. */
  fs: number;
  /** Passband edge in Hz, 0 < edge < fs/4; the stopband starts at fs/2 − edge. */
  passbandEdge: number;
}

/** Result of {@link designHalfband}. */
export interface HalfbandDesign {
  /** Taps: h[centre] = ½ and every second tap from the centre exactly 0. */
  taps: Float64Array;
  /**
   * Equiripple deviation δ on the design grid, the same in both bands (linear):
   * passband 1 ± δ, stopband ≤ δ. The peak between grid points can be up to
   * about 1% larger; measure the taps with measureBands for a verdict.
   */
  deviation: number;
  /** Stopband edge fs/2 − passbandEdge in Hz. */
  stopbandEdge: number;
  /** Warnings from the underlying exchange. */
  warnings: DesignWarning[];
}

/**
 * Equiripple half-band lowpass: symmetric about fs/4, H(f) + H(fs/2 − f) = 1 for
 * the amplitude, so every second tap except the centre one (½) is exactly zero
 * and a decimator or interpolator by 2 built on it costs about N/4
 * multiplications per output. Passband [0, fp] and stopband [fs/2 − fp, fs/2]
 * share the same ripple δ.
 *
 * Built by Vaidyanathan and Nguyen's trick: an equiripple type II filter g of
 * length (N + 1)/2 approximating 1 on [0, 2fp] gives h[2n] = g[n]/2, h[centre] = ½,
 * with δ = δ_g/2.
 *
 * Source: P. P. Vaidyanathan and T. Q. Nguyen, "A 'trick' for the design of FIR
 * half-band filters", IEEE Trans. Circuits Syst. 34(3), 1987, pp. 297–300.
 *
 * @param options Length (4k − 1), sample rate, passband edge.
 * @returns Taps, the common deviation, the stopband edge and warnings.
 * @throws {RangeError} When the length is not 4k − 1 or the edge is not inside (0, fs/4).
 * @throws {ConvergenceError} When the underlying exchange fails.
 * @example
 * ```ts
 * import { designHalfband } from "./halfband.ts";
 * const d = designHalfband({ length: 23, fs: 48000, passbandEdge: 9000 });
 * if (d.taps[11] !== 0.5 || d.taps[9] !== 0 || d.taps[13] !== 0) throw new Error("half-band zeros");
 * if (!(d.deviation < 0.01)) throw new Error("about 43 dB for this spec");
 * ```
 */
export function designHalfband(options: HalfbandOptions): HalfbandDesign {
  const { length, fs, passbandEdge } = options;
  requireInteger("Number of taps", length, 7, 65535);
  if (length % 4 !== 3) {
    throw new RangeError(
      `A half-band filter needs N = 4k − 1 taps (7, 11, 15, …) so its end taps are non-zero, got ${length}`,
    );
  }
  requireSampleRate(fs);
  requireFinite("Passband edge", passbandEdge);
  if (passbandEdge <= 0 || passbandEdge >= fs / 4) {
    throw new RangeError(
      `Half-band passband edge must be between 0 Hz and fs/4 = ${show(fs / 4)} Hz, got ${
        show(passbandEdge)
      } Hz`,
    );
  }
  const half = (length + 1) / 2;
  const g = designEquiripple({
    length: half,
    fs,
    bands: [{ from: 0, to: 2 * passbandEdge, gain: 1 }],
    // Twice the usual density: the half-length design is cheap, and the peaks
    // between grid points then stay within a fraction of a percent of δ.
    gridDensity: 32,
  });
  const taps = new Float64Array(length);
  for (let n = 0; n < half; n++) taps[2 * n] = g.taps[n]! / 2;
  taps[half - 1] = 0.5;
  return {
    taps,
    deviation: g.deviation / 2,
    stopbandEdge: fs / 2 - passbandEdge,
    warnings: g.warnings,
  };
}
