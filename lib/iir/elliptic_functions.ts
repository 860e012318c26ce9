import { requireFinite, requireInRange } from "../_validate.ts";
import { completeK, jacobiFunctions } from "./_elliptic.ts";

/** Values of the three Jacobi elliptic functions at one argument. */
export interface JacobiValues {
  /** sn(u | m). */
  sn: number;
  /** cn(u | m). */
  cn: number;
  /** dn(u | m). */
  dn: number;
}

/**
 * Complete elliptic integral of the first kind in terms of the parameter
 * m = k²: K(m) = ∫₀^{π/2} dθ / √(1 − m·sin²θ) = π / (2·AGM(1, √(1 − m))),
 * computed by the arithmetic–geometric mean to full double precision.
 *
 * Source: M. Abramowitz and I. A. Stegun, Handbook of Mathematical
 * Functions, §17.6 (arithmetic–geometric mean).
 *
 * @param m Parameter m = k² (the square of the modulus), 0 ≤ m < 1.
 * @returns K(m) (dimensionless), π/2 at m = 0, growing without bound as m → 1.
 * @throws {RangeError} When m is outside [0, 1).
 * @example
 * ```ts
 * import { completeEllipticIntegral } from "./elliptic_functions.ts";
 * // K(1/2) = Γ(1/4)² / (4√π) = 1.8540746773013719 (A&S Table 17.1).
 * if (Math.abs(completeEllipticIntegral(0.5) - 1.8540746773013719) > 1e-15) throw new Error("K(1/2)");
 * ```
 */
export function completeEllipticIntegral(m: number): number {
  requireFinite("Parameter m", m);
  if (m < 0 || m >= 1) throw new RangeError(`Parameter m must be in [0, 1), got ${m}`);
  return completeK(Math.sqrt(1 - m));
}

/**
 * Jacobi elliptic functions sn, cn, dn of a real argument, parameter m = k²,
 * by the descending Landen / arithmetic–geometric-mean method: run the AGM of
 * (1, √(1 − m)), set φ_N = 2^N·a_N·u, step back with
 * φ_{n−1} = (φ_n + asin((c_n/a_n)·sin φ_n))/2, then sn = sin φ₀, cn = cos φ₀,
 * dn = cos φ₀ / cos(φ₁ − φ₀).
 *
 * Source: M. Abramowitz and I. A. Stegun, Handbook of Mathematical
 * Functions, §16.4.
 *
 * @param u Argument (real, finite).
 * @param m Parameter m = k², 0 ≤ m ≤ 1 (m = 0 gives sin/cos, m = 1 tanh/sech).
 * @returns sn, cn and dn at u.
 * @throws {RangeError} When m is outside [0, 1].
 * @throws {TypeError} When u is not finite.
 * @example
 * ```ts
 * import { completeEllipticIntegral, jacobiElliptic } from "./elliptic_functions.ts";
 * // sn(K(m) | m) = 1 and cn(K(m) | m) = 0 (quarter period), here for m = 0.7.
 * const v = jacobiElliptic(completeEllipticIntegral(0.7), 0.7);
 * if (Math.abs(v.sn - 1) > 1e-15 || Math.abs(v.cn) > 1e-14) throw new Error("quarter period");
 * ```
 */
export function jacobiElliptic(u: number, m: number): JacobiValues {
  requireFinite("Argument u", u);
  requireInRange("Parameter m", m, 0, 1);
  return jacobiFunctions(u, Math.sqrt(m), Math.sqrt(1 - m));
}
