import type { Section, ZerosPolesGain } from "../types.ts";
import type { FrequencyResponse } from "../response/frequency_response.ts";
import { requireFrequency, requireSampleRate } from "../_validate.ts";
import { requireSections } from "./_sections.ts";
import { sectionsToZerosPoles } from "./sections.ts";

/**
 * Complex frequency response of a section cascade at given frequencies,
 * H(f) = Π_k (b0 + b1 z⁻¹ + b2 z⁻²)/(1 + a1 z⁻¹ + a2 z⁻²), z = e^(j2πf/fs),
 * evaluated section by section (no high-order polynomial is formed).
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 5 (frequency response of rational systems).
 *
 * @param sections The cascade.
 * @param frequencies Frequencies in Hz, each in [0, fs/2].
 * @param fs Sample rate in Hz, > 0.
 * @returns The response (same shape as lib/response's FrequencyResponse).
 * @throws {RangeError} When a frequency is outside [0, fs/2] or fs ≤ 0.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { sectionsResponse } from "./analysis.ts";
 * // (1 + z⁻¹)/2 has gain 1 at DC and 0 at fs/2.
 * const h = sectionsResponse([{ b0: 0.5, b1: 0.5, b2: 0, a1: 0, a2: 0 }], [0, 500], 1000);
 * if (h.re[0] !== 1 || Math.hypot(h.re[1]!, h.im[1]!) > 1e-16) throw new Error("average");
 * ```
 */
export function sectionsResponse(
  sections: readonly Section[],
  frequencies: ArrayLike<number>,
  fs: number,
): FrequencyResponse {
  requireSections(sections);
  requireSampleRate(fs);
  const count = frequencies.length;
  const out: FrequencyResponse = {
    frequencies: Float64Array.from(frequencies),
    re: new Float64Array(count),
    im: new Float64Array(count),
  };
  for (let i = 0; i < count; i++) {
    const f = frequencies[i] as number;
    requireFrequency(`Frequency [${i}]`, f, fs);
    const w = (2 * Math.PI * f) / fs;
    const c1 = Math.cos(w);
    const s1 = -Math.sin(w);
    const c2 = Math.cos(2 * w);
    const s2 = -Math.sin(2 * w);
    let hr = 1;
    let hi = 0;
    for (const s of sections) {
      const nr = s.b0 + s.b1 * c1 + s.b2 * c2;
      const ni = s.b1 * s1 + s.b2 * s2;
      const dr = 1 + s.a1 * c1 + s.a2 * c2;
      const di = s.a1 * s1 + s.a2 * s2;
      const d = dr * dr + di * di;
      const qr = (nr * dr + ni * di) / d;
      const qi = (ni * dr - nr * di) / d;
      const t = hr * qr - hi * qi;
      hi = hr * qi + hi * qr;
      hr = t;
    }
    out.re[i] = hr;
    out.im[i] = hi;
  }
  return out;
}

/**
 * Group delay of one factor (1 − r·e^(jφ)·z⁻¹) at ω: (r² − r·cos(ω − φ)) /
 * (1 − 2r·cos(ω − φ) + r²); on the unit circle at ω = φ the limit 1/2.
 */
function rootDelay(re: number, im: number, w: number): number {
  const r2 = re * re + im * im;
  const c = re * Math.cos(w) + im * Math.sin(w); // r·cos(ω − φ)
  const den = 1 - 2 * c + r2;
  if (den <= 1e-30 * Math.max(1, r2)) return 0.5;
  return (r2 - c) / den;
}

/** Delay of b0 + b1 z⁻¹ + b2 z⁻² at ω, through its roots. */
function quadraticDelay(b0: number, b1: number, b2: number, w: number): number {
  if (b0 !== 0) {
    const d = b1 * b1 - 4 * b0 * b2;
    if (d < 0) {
      const re = -b1 / (2 * b0);
      const im = Math.sqrt(-d) / (2 * Math.abs(b0));
      return rootDelay(re, im, w) + rootDelay(re, -im, w);
    }
    const q = -(b1 + (b1 >= 0 ? 1 : -1) * Math.sqrt(d)) / 2;
    if (q === 0) return 0;
    return rootDelay(q / b0, 0, w) + rootDelay(b2 / q, 0, w);
  }
  if (b1 !== 0) return 1 + rootDelay(-b2 / b1, 0, w);
  return b2 !== 0 ? 2 : 0;
}

/**
 * Group delay τ(f) = −dφ/dω of a section cascade, in samples, summed over
 * the roots of every section's numerator and denominator: each factor
 * (1 − r·e^(jθ)z⁻¹) contributes (r² − r·cos(ω − θ))/(1 − 2r·cos(ω − θ) + r²),
 * zeros adding and poles subtracting. Exact, with no differentiation of a
 * sampled phase. At a zero exactly on the unit circle the delay is
 * continued by its limit (the zero contributes 1/2 there as everywhere).
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 5 (group delay of a first-order factor).
 *
 * @param sections The cascade.
 * @param frequencies Frequencies in Hz, each in [0, fs/2].
 * @param fs Sample rate in Hz, > 0.
 * @returns Group delay in samples at each frequency (divide by fs for seconds).
 * @throws {RangeError} When a frequency is outside [0, fs/2] or fs ≤ 0.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { sectionsGroupDelay } from "./analysis.ts";
 * // A pure two-sample delay z⁻² has τ = 2 everywhere.
 * const t = sectionsGroupDelay([{ b0: 0, b1: 0, b2: 1, a1: 0, a2: 0 }], [0, 100, 250], 1000);
 * if (t.some((v) => v !== 2)) throw new Error("two samples");
 * ```
 */
export function sectionsGroupDelay(
  sections: readonly Section[],
  frequencies: ArrayLike<number>,
  fs: number,
): Float64Array {
  requireSections(sections);
  requireSampleRate(fs);
  const out = new Float64Array(frequencies.length);
  for (let i = 0; i < frequencies.length; i++) {
    const f = frequencies[i] as number;
    requireFrequency(`Frequency [${i}]`, f, fs);
    const w = (2 * Math.PI * f) / fs;
    let tau = 0;
    for (const s of sections) {
      tau += quadraticDelay(s.b0, s.b1, s.b2, w) - quadraticDelay(1, s.a1, s.a2, w);
    }
    out[i] = tau;
  }
  return out;
}

/** Stability of a section cascade. */
export interface Stability {
  /** Largest pole radius |p|. */
  largestPoleRadius: number;
  /** 1 − largest pole radius: positive when stable. */
  margin: number;
  /** True when every pole lies strictly inside the unit circle. */
  stable: boolean;
}

/**
 * Stability of a section cascade from its poles, found per section in
 * closed form: stable when the largest pole radius is below 1.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 3 (region of convergence of causal stable systems).
 *
 * @param sections The cascade.
 * @returns Largest pole radius, margin (1 − radius) and the verdict.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { sectionStability } from "./analysis.ts";
 * const s = sectionStability([{ b0: 1, b1: 0, b2: 0, a1: 0, a2: 0.81 }]);
 * // Poles at ±0.9j.
 * if (!s.stable || Math.abs(s.margin - 0.1) > 1e-15) throw new Error("radius 0.9");
 * ```
 */
export function sectionStability(sections: readonly Section[]): Stability {
  const { poles } = sectionsToZerosPoles(sections);
  let largest = 0;
  for (const p of poles) largest = Math.max(largest, Math.hypot(p.re, p.im));
  return { largestPoleRadius: largest, margin: 1 - largest, stable: largest < 1 };
}

/** Options for {@link isMinimumPhase}. */
export interface MinimumPhaseOptions {
  /**
   * Count zeros on the unit circle (within `tolerance`) as allowed. Strictly,
   * a minimum-phase system has every zero inside the circle. @default false
   */
  allowZerosOnUnitCircle?: boolean;
  /** Radius tolerance for "on the unit circle". @default 1e-9 */
  tolerance?: number;
}

/**
 * Whether a section cascade is minimum phase: stable, with every zero
 * strictly inside the unit circle (or on it, when allowed), so it has a
 * stable causal inverse and the least group delay for its magnitude response.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 5 (minimum-phase systems).
 *
 * @param sections The cascade.
 * @param options Whether unit-circle zeros count, and the radius tolerance.
 * @returns True when minimum phase.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { isMinimumPhase } from "./analysis.ts";
 * // Zero at 0.5 is inside, zero at 2 is not.
 * const inside = isMinimumPhase([{ b0: 1, b1: -0.5, b2: 0, a1: 0, a2: 0 }]);
 * const outside = isMinimumPhase([{ b0: 1, b1: -2, b2: 0, a1: 0, a2: 0 }]);
 * if (!inside || outside) throw new Error("zero inside vs outside");
 * ```
 */
export function isMinimumPhase(
  sections: readonly Section[],
  options: MinimumPhaseOptions = {},
): boolean {
  const tolerance = options.tolerance ?? 1e-9;
  const zpk: ZerosPolesGain = sectionsToZerosPoles(sections);
  if (!sectionStability(sections).stable) return false;
  const limit = options.allowZerosOnUnitCircle ? 1 + tolerance : 1 - tolerance;
  return zpk.zeros.every((z) => Math.hypot(z.re, z.im) < limit);
}
