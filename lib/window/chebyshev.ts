import { requireInRange, requireInteger } from "../_validate.ts";
import { complexFft } from "../fft/complex_fft.ts";
import { withSymmetry } from "./_symmetry.ts";
import type { WindowOptions } from "./windows.ts";

/** Options for {@link chebyshevWindow}. */
export interface ChebyshevWindowOptions extends WindowOptions {
  /**
   * Level of every sidelobe below the main-lobe peak, in dB (a positive
   * number: 60 means sidelobes at −60 dB). Range 1 … 300 dB.
   * @default 100
   */
  sidelobeLevelDb?: number;
}

/** Chebyshev polynomial T_m(x) for any real x. */
function chebyshevPolynomial(m: number, x: number): number {
  if (x > 1) return Math.cosh(m * Math.acosh(x));
  if (x < -1) return (m % 2 === 0 ? 1 : -1) * Math.cosh(m * Math.acosh(-x));
  return Math.cos(m * Math.acos(x));
}

function symmetricChebyshev(length: number, levelDb: number): Float64Array {
  const w = new Float64Array(length);
  if (length === 1) {
    w[0] = 1;
    return w;
  }
  const order = length - 1;
  const beta = Math.cosh(Math.acosh(10 ** (levelDb / 20)) / order);
  // Samples of the equiripple spectrum W(k) = T_order(β cos(πk/N)), k = 0 … N−1.
  const re = new Float64Array(length);
  const im = new Float64Array(length);
  for (let k = 0; k < length; k++) {
    const p = chebyshevPolynomial(order, beta * Math.cos((Math.PI * k) / length));
    if (length % 2 === 1) {
      re[k] = p;
    } else {
      // Half-sample shift so the even-length window is centred between samples.
      re[k] = p * Math.cos((Math.PI * k) / length);
      im[k] = p * Math.sin((Math.PI * k) / length);
    }
  }
  const spectrum = complexFft({ re, im }).re;
  if (length % 2 === 1) {
    const half = (length - 1) / 2;
    for (let n = 0; n < length; n++) w[n] = spectrum[Math.abs(n - half)]!;
  } else {
    const half = length / 2;
    for (let n = 0; n < length; n++) w[n] = spectrum[n < half ? half - n : n - half + 1]!;
  }
  let peak = 0;
  for (let n = 0; n < length; n++) peak = Math.max(peak, w[n]!);
  for (let n = 0; n < length; n++) w[n]! /= peak;
  return w;
}

/**
 * Dolph–Chebyshev window: the window of N samples whose spectrum has every
 * sidelobe at the same level and, for that level, the narrowest main lobe.
 * Its spectrum samples are W(k) = T_{N−1}(β cos(πk/N)) with
 * β = cosh(acosh(10^(L/20)) / (N−1)), where T is the Chebyshev polynomial and
 * L the sidelobe level in dB; the window is their inverse DFT, scaled to a
 * peak of 1. Long windows with a modest sidelobe level have spikes at their
 * ends (a property of the equiripple spectrum, not an error).
 *
 * Source: C. L. Dolph, "A current distribution for broadside arrays which
 * optimizes the relationship between beam width and side-lobe level",
 * Proc. IRE 34(6), 1946; Harris 1978 (Proc. IEEE 66(1)), §V-H, eq. (44).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Sidelobe level in dB and symmetry.
 * @returns The window samples, peak 1.
 * @throws {RangeError} When length < 1 or the sidelobe level is outside 1 … 300 dB.
 * @example
 * ```ts
 * import { chebyshevWindow } from "./chebyshev.ts";
 * const w = chebyshevWindow(5, { sidelobeLevelDb: 60 });
 * if (Math.abs(w[2]! - 1) > 1e-15 || Math.abs(w[0]! - w[4]!) > 1e-15) throw new Error("symmetric, peak 1");
 * ```
 */
export function chebyshevWindow(
  length: number,
  options: ChebyshevWindowOptions = {},
): Float64Array {
  requireInteger("Window length", length, 1);
  const level = options.sidelobeLevelDb ?? 100;
  requireInRange("Sidelobe level", level, 1, 300, " dB");
  return withSymmetry(length, options, (n) => symmetricChebyshev(n, level));
}
