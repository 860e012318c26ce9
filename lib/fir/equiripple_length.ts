import { requireBandEdge, requireFinite, requireSampleRate, show } from "../_validate.ts";

/** Specification of a lowpass (or highpass) for {@link estimateEquirippleLength}. */
export interface EquirippleLengthSpec {
  /** Sample rate in Hz. */
  fs: number;
  /** Passband edge in Hz, 0 < edge < fs/2. */
  passbandEdge: number;
  /** Stopband edge in Hz, 0 < edge < fs/2, different from the passband edge. */
  stopbandEdge: number;
  /** Peak-to-peak passband ripple in dB, 0 < r ≤ 10: δp = (10^(r/20) − 1)/(10^(r/20) + 1). */
  passbandRippleDb: number;
  /** Minimum stopband attenuation in dB, 0 < A ≤ 300: δs = 10^(−A/20). */
  stopbandAttenuationDb: number;
  /** Which published formula. @default "herrmann" */
  formula?: "herrmann" | "kaiser";
}

/** Result of {@link estimateEquirippleLength}. */
export interface EquirippleLengthEstimate {
  /** Estimated number of taps (rounded up). */
  length: number;
  /** The formula's unrounded value. */
  exact: number;
  /** Passband deviation δp (linear). */
  passbandDeviation: number;
  /** Stopband deviation δs (linear). */
  stopbandDeviation: number;
  /** Band weights that make an equiripple design share δp and δs: [1, δp/δs]. */
  weights: [number, number];
}

/**
 * Estimated number of taps of an equiripple lowpass or highpass meeting a
 * ripple/attenuation spec, with ΔF = |stopband edge − passband edge|/fs.
 *
 * Herrmann–Rabiner–Chan (default), with logs base 10:
 *   D∞ = (0.005309 L_p² + 0.07114 L_p − 0.4761)·L_s − (0.00266 L_p² + 0.5941 L_p + 0.4278),
 *   f = 11.01217 + 0.51244 (L_p − L_s),   N = D∞/ΔF − f·ΔF + 1,
 * where L_p = log10 δp, L_s = log10 δs (δp ≥ δs; otherwise swapped).
 * Kaiser: N = (−20·log10 √(δp δs) − 13)/(14.6 ΔF) + 1.
 * Both are estimates: check the design and adjust by a few taps.
 *
 * Sources: O. Herrmann, L. R. Rabiner and D. S. K. Chan, "Practical design rules
 * for optimum finite impulse response low-pass digital filters", Bell Syst. Tech.
 * J. 52(6), 1973; J. F. Kaiser, "Nonrecursive digital filter design using the
 * I0-sinh window function", Proc. IEEE ISCAS 1974 (also Oppenheim & Schafer,
 * Discrete-Time Signal Processing, 3rd ed., eq. (7.117)).
 *
 * @param spec Edges (Hz), ripple (dB), attenuation (dB), formula.
 * @returns Length, unrounded value, deviations and matching band weights.
 * @throws {RangeError} When an edge is outside (0, fs/2), the edges are equal,
 *   or a ripple/attenuation is out of range.
 * @example
 * ```ts
 * import { estimateEquirippleLength } from "./equiripple_length.ts";
 * const e = estimateEquirippleLength({
 *   fs: 2, passbandEdge: 0.4, stopbandEdge: 0.6, passbandRippleDb: 0.1737, stopbandAttenuationDb: 60,
 * });
 * // δp ≈ 0.01, δs = 0.001, ΔF = 0.1: about 26 taps.
 * if (e.length !== 26 || Math.abs(e.weights[1] - 10) > 0.01) throw new Error("estimate");
 * ```
 */
export function estimateEquirippleLength(spec: EquirippleLengthSpec): EquirippleLengthEstimate {
  const { fs, passbandEdge, stopbandEdge, passbandRippleDb, stopbandAttenuationDb } = spec;
  requireSampleRate(fs);
  requireBandEdge("Passband edge", passbandEdge, fs);
  requireBandEdge("Stopband edge", stopbandEdge, fs);
  if (passbandEdge === stopbandEdge) {
    throw new RangeError(
      `Stopband edge must differ from the passband edge ${show(passbandEdge)} Hz, got ${
        show(stopbandEdge)
      } Hz`,
    );
  }
  requireFinite("Passband ripple", passbandRippleDb);
  if (passbandRippleDb <= 0 || passbandRippleDb > 10) {
    throw new RangeError(
      `Passband ripple must be between 0 and 10 dB, got ${show(passbandRippleDb)} dB`,
    );
  }
  requireFinite("Stopband attenuation", stopbandAttenuationDb);
  if (stopbandAttenuationDb <= 0 || stopbandAttenuationDb > 300) {
    throw new RangeError(
      `Stopband attenuation must be between 0 and 300 dB, got ${show(stopbandAttenuationDb)} dB`,
    );
  }
  const formula = spec.formula ?? "herrmann";
  if (formula !== "herrmann" && formula !== "kaiser") {
    throw new TypeError(`Formula must be "herrmann" or "kaiser", got ${String(formula)}`);
  }
  const g = 10 ** (passbandRippleDb / 20);
  const dp = (g - 1) / (g + 1);
  const ds = 10 ** (-stopbandAttenuationDb / 20);
  const df = Math.abs(stopbandEdge - passbandEdge) / fs;
  let exact: number;
  if (formula === "kaiser") {
    exact = (-10 * Math.log10(dp * ds) - 13) / (14.6 * df) + 1;
  } else {
    const lp = Math.log10(Math.max(dp, ds));
    const ls = Math.log10(Math.min(dp, ds));
    const dInf = (0.005309 * lp * lp + 0.07114 * lp - 0.4761) * ls -
      (0.00266 * lp * lp + 0.5941 * lp + 0.4278);
    const f = 11.01217 + 0.51244 * (lp - ls);
    exact = dInf / df - f * df + 1;
  }
  return {
    length: Math.max(3, Math.ceil(exact)),
    exact,
    passbandDeviation: dp,
    stopbandDeviation: ds,
    weights: [1, dp / ds],
  };
}
