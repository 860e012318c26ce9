import {
  requireFrequency,
  requireInteger,
  requireSampleRate,
  requireSamples,
} from "../_validate.ts";
import type { Complex, Section } from "../types.ts";
import { polynomialRoots } from "../poly/roots.ts";
import { responseAt } from "../response/frequency_response.ts";
import { sectionsResponse } from "../iir/analysis.ts";
import { applyIir, applySections } from "../iir/filter.ts";
import { applyFirDirect } from "../fir/apply.ts";

/**
 * A filter to verify, in the form it will be implemented:
 * - `fir`: taps h[0..N−1], H(z) = Σ h[n] z^−n;
 * - `sections`: a cascade of second-order sections (a0 = 1), H(z) = ∏ H_k(z);
 * - `rational`: H(z) = B(z)/A(z) with b[0..M], a[0..N] in powers of z^−1, a[0] ≠ 0.
 */
export type FilterDesign =
  | { kind: "fir"; taps: ArrayLike<number> }
  | { kind: "sections"; sections: readonly Section[] }
  | { kind: "rational"; numerator: ArrayLike<number>; denominator: ArrayLike<number> };

/**
 * Throw unless `design` is a well-formed FilterDesign with finite coefficients.
 *
 * @param design The design to check.
 * @throws {TypeError} When the kind is unknown or a coefficient is not finite.
 * @throws {RangeError} When a rational denominator starts with 0.
 * @example
 * ```ts
 * import { requireDesign } from "./filter_design.ts";
 * let threw = false;
 * try { requireDesign({ kind: "fir", taps: [1, NaN] }); } catch (e) { threw = e instanceof TypeError; }
 * if (!threw) throw new Error("NaN tap");
 * ```
 */
export function requireDesign(design: FilterDesign): void {
  if (design === null || typeof design !== "object") {
    throw new TypeError(`Filter design must be an object, got ${String(design)}`);
  }
  switch (design.kind) {
    case "fir":
      requireSamples("FIR taps", design.taps);
      return;
    case "sections": {
      if (!Array.isArray(design.sections) || design.sections.length === 0) {
        throw new TypeError("Sections must be a non-empty array of second-order sections");
      }
      design.sections.forEach((s, k) => {
        for (const key of ["b0", "b1", "b2", "a1", "a2"] as const) {
          const v = s?.[key];
          if (typeof v !== "number" || !Number.isFinite(v)) {
            throw new TypeError(`Section ${k} ${key} must be a finite number, got ${String(v)}`);
          }
        }
      });
      return;
    }
    case "rational":
      requireSamples("Numerator", design.numerator);
      requireSamples("Denominator", design.denominator);
      if (design.denominator[0] === 0) {
        throw new RangeError("Denominator a[0] must not be 0, got 0");
      }
      return;
    default:
      throw new TypeError(
        `Filter design kind must be "fir", "sections" or "rational", got ${
          String((design as { kind?: unknown }).kind)
        }`,
      );
  }
}

/** The polynomials (numerator, denominator) of each factor of a design. */
function factors(design: FilterDesign): [ArrayLike<number>, ArrayLike<number>][] {
  switch (design.kind) {
    case "fir":
      return [[design.taps, [1]]];
    case "sections":
      return design.sections.map((s) => [[s.b0, s.b1, s.b2], [1, s.a1, s.a2]]);
    case "rational":
      return [[design.numerator, design.denominator]];
  }
}

/**
 * P = Σ c[k] u^k and R = Σ k·c[k] u^k = u·P′(u) at u = e^(−jω), by Horner's rule
 * with the derivative carried alongside (no trigonometry inside the loop).
 */
function polyAndRamp(c: ArrayLike<number>, w: number): [number, number, number, number] {
  const ur = Math.cos(w);
  const ui = -Math.sin(w);
  let pr = 0;
  let pi = 0;
  let dr = 0;
  let di = 0;
  for (let k = c.length - 1; k >= 0; k--) {
    // P′ ← P′·u + P, then P ← P·u + c[k].
    const ndr = dr * ur - di * ui + pr;
    di = dr * ui + di * ur + pi;
    dr = ndr;
    const npr = pr * ur - pi * ui + (c[k] as number);
    pi = pr * ui + pi * ur;
    pr = npr;
  }
  // R = u·P′
  return [pr, pi, dr * ur - di * ui, dr * ui + di * ur];
}

/**
 * Complex response of a design at any frequencies in [0, fs/2], by direct
 * evaluation of each factor: H(f) = ∏ B_k(z)/A_k(z) with z = e^(j2πf/fs).
 *
 * @param design The filter (FIR taps, sections or rational).
 * @param frequencies Frequencies in Hz, each in [0, fs/2].
 * @param fs Sample rate in Hz, > 0.
 * @returns `{ frequencies, re, im }`.
 * @throws {RangeError} When a frequency is outside [0, fs/2] or fs ≤ 0.
 * @throws {TypeError} When the design is malformed.
 * @example
 * ```ts
 * import { responseOf } from "./filter_design.ts";
 * // Two-tap average: H(fs/4) = (1 + e^(−jπ/2))/2 = 0.5 − 0.5j.
 * const h = responseOf({ kind: "fir", taps: [0.5, 0.5] }, [2000], 8000);
 * if (Math.abs(h.re[0]! - 0.5) > 1e-15 || Math.abs(h.im[0]! + 0.5) > 1e-15) throw new Error("0.5 − 0.5j");
 * ```
 */
export function responseOf(
  design: FilterDesign,
  frequencies: ArrayLike<number>,
  fs: number,
): { frequencies: Float64Array; re: Float64Array; im: Float64Array } {
  requireDesign(design);
  requireSampleRate(fs);
  switch (design.kind) {
    case "fir":
      return responseAt(design.taps, [1], frequencies, fs);
    case "rational":
      return responseAt(design.numerator, design.denominator, frequencies, fs);
    case "sections":
      return sectionsResponse(design.sections, frequencies, fs);
  }
}

/**
 * Magnitude in dB, 20·log10|H(f)|, of a design at one frequency (floored at −400 dB).
 *
 * @param design The filter.
 * @param frequency Frequency in Hz, in [0, fs/2].
 * @param fs Sample rate in Hz.
 * @returns The gain in dB.
 * @throws {RangeError} When the frequency is outside [0, fs/2].
 * @example
 * ```ts
 * import { gainDbAt } from "./filter_design.ts";
 * const g = gainDbAt({ kind: "fir", taps: [0.5, 0.5] }, 2000, 8000);
 * if (Math.abs(g + 3.0103) > 1e-4) throw new Error("−3.01 dB at fs/4");
 * ```
 */
export function gainDbAt(design: FilterDesign, frequency: number, fs: number): number {
  const h = responseOf(design, [frequency], fs);
  const m = Math.hypot(h.re[0] as number, h.im[0] as number);
  return Math.max(20 * Math.log10(m), -400);
}

/**
 * Group delay in samples, τ(ω) = −dφ/dω, evaluated analytically for each
 * polynomial: τ_C(ω) = Re[ Σ k·c[k] e^(−jωk) / Σ c[k] e^(−jωk) ], and
 * τ = Σ_k (τ_Bk − τ_Ak) over the factors. Where a numerator vanishes exactly
 * (a zero on the unit circle) the delay is undefined and NaN is returned.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §5.1.2 (group delay) and Problem 5.67 (the ramp-weighted formula).
 *
 * @param design The filter.
 * @param frequencies Frequencies in Hz, each in [0, fs/2].
 * @param fs Sample rate in Hz.
 * @returns Group delay in samples at each frequency.
 * @throws {RangeError} When a frequency is outside [0, fs/2].
 * @example
 * ```ts
 * import { groupDelayOf } from "./filter_design.ts";
 * // A symmetric 5-tap FIR delays every frequency by (5 − 1)/2 = 2 samples.
 * const d = groupDelayOf({ kind: "fir", taps: [1, 2, 3, 2, 1] }, [0, 1000, 3000], 8000);
 * if (d.some((x) => Math.abs(x - 2) > 1e-12)) throw new Error("2 samples");
 * ```
 */
export function groupDelayOf(
  design: FilterDesign,
  frequencies: ArrayLike<number>,
  fs: number,
): Float64Array {
  requireDesign(design);
  requireSampleRate(fs);
  const parts = factors(design);
  const out = new Float64Array(frequencies.length);
  const delayOf = (c: ArrayLike<number>, w: number): number => {
    const [re, im, rre, rim] = polyAndRamp(c, w);
    const d = re * re + im * im;
    let scale = 0;
    for (let k = 0; k < c.length; k++) scale += Math.abs(c[k] as number);
    if (d <= (1e-14 * scale) ** 2) return NaN;
    return (rre * re + rim * im) / d;
  };
  for (let i = 0; i < out.length; i++) {
    const f = frequencies[i] as number;
    requireFrequency(`Frequency [${i}]`, f, fs);
    const w = (2 * Math.PI * f) / fs;
    let tau = 0;
    for (const [b, a] of parts) tau += delayOf(b, w) - (a.length === 1 ? 0 : delayOf(a, w));
    out[i] = tau;
  }
  return out;
}

/**
 * Poles of a design in the z-plane (an FIR filter has none away from the origin
 * and returns an empty list). Sections use the quadratic formula; a rational
 * design's denominator is solved by `polynomialRoots` of lib/poly (Aberth–Ehrlich
 * iteration with Newton polishing).
 *
 * Source: O. Aberth, "Iteration methods for finding all zeros of a polynomial
 * simultaneously", Math. Comp. 27 (1973); quadratic formula in the cancellation-free
 * form of Press et al., Numerical Recipes, 3rd ed., §5.6.
 *
 * @param design The filter.
 * @returns The poles (complex), in no particular order.
 * @example
 * ```ts
 * import { polesOf } from "./filter_design.ts";
 * const p = polesOf({ kind: "sections", sections: [{ b0: 1, b1: 0, b2: 0, a1: 0, a2: 0.25 }] });
 * // 1 + 0.25 z^−2 has poles at ±0.5j.
 * if (p.length !== 2 || Math.abs(Math.hypot(p[0]!.re, p[0]!.im) - 0.5) > 1e-15) throw new Error("|p| = 0.5");
 * ```
 */
export function polesOf(design: FilterDesign): Complex[] {
  requireDesign(design);
  switch (design.kind) {
    case "fir":
      return [];
    case "sections": {
      const poles: Complex[] = [];
      for (const s of design.sections) {
        // z^2 + a1 z + a2 = 0
        const disc = s.a1 * s.a1 - 4 * s.a2;
        if (s.a2 === 0) {
          if (s.a1 !== 0) poles.push({ re: -s.a1, im: 0 });
        } else if (disc >= 0) {
          const q = -0.5 * (s.a1 + Math.sign(s.a1 || 1) * Math.sqrt(disc));
          poles.push({ re: q, im: 0 }, { re: s.a2 / q, im: 0 });
        } else {
          const im = Math.sqrt(-disc) / 2;
          poles.push({ re: -s.a1 / 2, im }, { re: -s.a1 / 2, im: -im });
        }
      }
      return poles;
    }
    case "rational": {
      const a = Array.from(design.denominator);
      while (a.length > 1 && a[a.length - 1] === 0) a.pop();
      return polynomialRoots(a).filter((p) => p.re !== 0 || p.im !== 0);
    }
  }
}

/**
 * Largest pole radius max|p| (0 for an FIR filter). The design is stable when it is below 1.
 *
 * @param design The filter.
 * @returns The largest pole magnitude.
 * @example
 * ```ts
 * import { poleRadius } from "./filter_design.ts";
 * if (poleRadius({ kind: "rational", numerator: [1], denominator: [1, -0.9] }) !== 0.9) throw new Error("0.9");
 * ```
 */
export function poleRadius(design: FilterDesign): number {
  let r = 0;
  for (const p of polesOf(design)) r = Math.max(r, Math.hypot(p.re, p.im));
  return r;
}

/**
 * Run a design over a signal in double precision, x[n] = 0 before the first
 * sample. FIR by direct convolution; sections in transposed direct form II;
 * a rational design by its difference equation
 * a0·y[n] = Σ b[k] x[n−k] − Σ_{k≥1} a[k] y[n−k].
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §6.5 (transposed forms).
 *
 * @param design The filter.
 * @param signal Input samples.
 * @returns Output samples, same length as the input.
 * @throws {TypeError} When the design or the signal holds a non-finite value.
 * @example
 * ```ts
 * import { applyDesign } from "./filter_design.ts";
 * // One-pole y[n] = x[n] + 0.5 y[n−1] on an impulse gives 0.5^n.
 * const y = applyDesign({ kind: "sections", sections: [{ b0: 1, b1: 0, b2: 0, a1: -0.5, a2: 0 }] }, [1, 0, 0]);
 * if (y.join() !== "1,0.5,0.25") throw new Error("0.5^n");
 * ```
 */
export function applyDesign(design: FilterDesign, signal: ArrayLike<number>): Float64Array {
  requireDesign(design);
  requireSamples("Signal", signal, 0);
  switch (design.kind) {
    case "fir":
      return applyFirDirect(design.taps, signal);
    case "sections":
      return applySections(design.sections, signal);
    case "rational":
      return applyIir(design.numerator, design.denominator, signal);
  }
}

/**
 * A length long enough for the impulse response of a design to decay below
 * `floor` of its start: N for FIR taps, otherwise ⌈log(floor)/log(r)⌉ + 4·order + 8
 * samples for pole radius r, capped at 2^20. Infinity when r ≥ 1 (not stable).
 *
 * @param design The filter.
 * @param floor Relative level the tail must fall below, in (0, 1). @default 1e-13
 * @returns Number of samples, or Infinity for a design that is not stable.
 * @example
 * ```ts
 * import { decayLength } from "./filter_design.ts";
 * if (decayLength({ kind: "fir", taps: [1, 2, 3] }) !== 3) throw new Error("3 taps");
 * if (decayLength({ kind: "rational", numerator: [1], denominator: [1, -1] }) !== Infinity) throw new Error("integrator");
 * ```
 */
export function decayLength(design: FilterDesign, floor = 1e-13): number {
  requireDesign(design);
  if (design.kind === "fir") return design.taps.length;
  const order = design.kind === "sections" ? 2 * design.sections.length : design.denominator.length;
  const r = poleRadius(design);
  if (r >= 1) return Infinity;
  if (r === 0) return order + 1;
  // A repeated pole decays as n^(m−1) r^n; the extra 4·order covers moderate multiplicity.
  const tail = Math.ceil(Math.log(floor) / Math.log(r)) + 4 * order + 8;
  return Math.min(1 << 20, tail);
}

/**
 * Impulse response h[0..length−1] of a design.
 *
 * @param design The filter.
 * @param length Number of samples, 1 … 2^24. @default decay length (taps for FIR; until the tail is below 1e−13 for IIR)
 * @returns The impulse response.
 * @throws {RangeError} When no length is given and the design is not stable.
 * @example
 * ```ts
 * import { impulseResponseOf } from "./filter_design.ts";
 * const h = impulseResponseOf({ kind: "fir", taps: [3, 2, 1] });
 * if (h.join() !== "3,2,1") throw new Error("FIR impulse response = taps");
 * ```
 */
export function impulseResponseOf(design: FilterDesign, length?: number): Float64Array {
  const n = length ?? decayLength(design);
  if (!Number.isFinite(n)) {
    throw new RangeError(
      `Impulse response length must be given for a design that is not stable (pole radius ${
        poleRadius(design).toPrecision(6)
      })`,
    );
  }
  requireInteger("Impulse response length", n, 1, 1 << 24);
  const x = new Float64Array(n);
  x[0] = 1;
  return applyDesign(design, x);
}

/**
 * Step response of a design: the output for x[n] = 1, n ≥ 0.
 *
 * @param design The filter.
 * @param length Number of samples, 1 … 2^24.
 * @returns The step response.
 * @throws {RangeError} When length is out of range.
 * @example
 * ```ts
 * import { stepResponseOf } from "./filter_design.ts";
 * if (stepResponseOf({ kind: "fir", taps: [0.5, 0.5] }, 3).join() !== "0.5,1,1") throw new Error("0.5, 1, 1");
 * ```
 */
export function stepResponseOf(design: FilterDesign, length: number): Float64Array {
  requireInteger("Step response length", length, 1, 1 << 24);
  return applyDesign(design, new Float64Array(length).fill(1));
}
