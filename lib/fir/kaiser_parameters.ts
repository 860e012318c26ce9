import { requireFinite, requirePositive, requireSampleRate, show } from "../_validate.ts";

/** Specification for {@link kaiserParameters}. */
export interface KaiserSpec {
  /** Sample rate in Hz. */
  fs: number;
  /** Transition width in Hz (stopband edge − passband edge), 0 < width < fs/2. */
  transitionWidth: number;
  /**
   * Required attenuation A in dB, A = −20·log10(δ) with δ the smaller of the
   * passband and stopband deviations; 0 < A ≤ 300. Give this or `ripple`.
   */
  attenuationDb?: number;
  /** Required peak deviation δ (linear), 0 < δ < 1; used when attenuationDb is absent. */
  ripple?: number;
}

/** Result of {@link kaiserParameters}. */
export interface KaiserParameters {
  /** Number of taps N = M + 1. */
  length: number;
  /** Filter order M = ⌈(A − 8)/(2.285·Δω)⌉ (at least 1). */
  order: number;
  /** Kaiser window shape β. */
  beta: number;
  /** The attenuation A (dB) the numbers were computed for. */
  attenuationDb: number;
}

/**
 * Kaiser's design formulas for a window-method FIR: from the attenuation
 * A = −20·log10 δ and the transition width Δω = 2π·width/fs,
 *
 *   β = 0.1102(A − 8.7)                          for A > 50,
 *   β = 0.5842(A − 21)^0.4 + 0.07886(A − 21)      for 21 ≤ A ≤ 50,
 *   β = 0                                        for A < 21;
 *   M = (A − 8) / (2.285·Δω), rounded up; N = M + 1 taps.
 *
 * The window design then meets δ in both bands (the window method gives equal
 * passband and stopband deviations), usually within ±2 in M.
 *
 * Source: J. F. Kaiser, "Nonrecursive digital filter design using the I0-sinh
 * window function", Proc. IEEE ISCAS, 1974; A. V. Oppenheim and R. W. Schafer,
 * Discrete-Time Signal Processing, 3rd ed., §7.5.3, eqs. (7.75)–(7.76).
 *
 * @param spec Sample rate, transition width, and attenuation (dB) or ripple.
 * @returns Length, order, β and the attenuation used.
 * @throws {RangeError} When the width is not inside (0, fs/2), A is not in (0, 300],
 *   or δ is not in (0, 1).
 * @throws {TypeError} When neither attenuationDb nor ripple is given.
 * @example
 * ```ts
 * import { kaiserParameters } from "./kaiser_parameters.ts";
 * // Oppenheim & Schafer's example: δ = 0.001, ωp = 0.4π, ωs = 0.6π → β = 5.653, M = 37.
 * const k = kaiserParameters({ fs: 2, transitionWidth: 0.2, ripple: 0.001 });
 * if (k.order !== 37 || Math.abs(k.beta - 5.653) > 5e-4) throw new Error("O&S example");
 * ```
 */
export function kaiserParameters(spec: KaiserSpec): KaiserParameters {
  const { fs, transitionWidth } = spec;
  requireSampleRate(fs);
  requirePositive("Transition width", transitionWidth, " Hz");
  if (transitionWidth >= fs / 2) {
    throw new RangeError(
      `Transition width must be below fs/2 = ${show(fs / 2)} Hz, got ${show(transitionWidth)} Hz`,
    );
  }
  let a: number;
  if (spec.attenuationDb !== undefined) {
    requireFinite("Attenuation", spec.attenuationDb);
    a = spec.attenuationDb;
    if (a <= 0 || a > 300) {
      throw new RangeError(`Attenuation must be between 0 and 300 dB, got ${show(a)} dB`);
    }
  } else if (spec.ripple !== undefined) {
    requireFinite("Ripple", spec.ripple);
    if (spec.ripple <= 0 || spec.ripple >= 1) {
      throw new RangeError(`Ripple must be between 0 and 1 (linear), got ${show(spec.ripple)}`);
    }
    a = -20 * Math.log10(spec.ripple);
  } else {
    throw new TypeError("Give attenuationDb or ripple, got neither");
  }
  const beta = kaiserBeta(a);
  const deltaOmega = (2 * Math.PI * transitionWidth) / fs;
  const order = Math.max(1, Math.ceil((a - 8) / (2.285 * deltaOmega) - 1e-9));
  return { length: order + 1, order, beta, attenuationDb: a };
}

/**
 * Kaiser's β for an attenuation A in dB (see {@link kaiserParameters}).
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., eq. (7.75).
 *
 * @param attenuationDb A in dB, ≥ 0.
 * @returns β ≥ 0.
 * @throws {RangeError} When A is negative or not finite.
 * @example
 * ```ts
 * import { kaiserBeta } from "./kaiser_parameters.ts";
 * if (kaiserBeta(20) !== 0 || Math.abs(kaiserBeta(60) - 5.65326) > 1e-5) throw new Error("β(A)");
 * ```
 */
export function kaiserBeta(attenuationDb: number): number {
  requireFinite("Attenuation", attenuationDb);
  if (attenuationDb < 0) {
    throw new RangeError(`Attenuation must be at least 0 dB, got ${show(attenuationDb)} dB`);
  }
  const a = attenuationDb;
  if (a > 50) return 0.1102 * (a - 8.7);
  if (a >= 21) return 0.5842 * (a - 21) ** 0.4 + 0.07886 * (a - 21);
  return 0;
}
