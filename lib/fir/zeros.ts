import { requireSamples } from "../_validate.ts";
import { polynomialRoots } from "../poly/roots.ts";
import type { Complex } from "../types.ts";

/**
 * Zeros of an FIR filter: the roots of H(z) = Σ h[n] z^(−n), i.e. of the
 * polynomial h[0] z^(N−1) + h[1] z^(N−2) + … + h[N−1]. Trailing zero taps give
 * zeros at z = 0; leading zero taps are a pure delay and give no zeros.
 *
 * Roots are found by the Aberth–Ehrlich iteration of lib/poly (see
 * {@link polynomialRoots}); complex zeros come in exact conjugate pairs. A
 * linear-phase filter's zeros also come in reciprocal pairs z, 1/z*.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §5.7.4 (zeros of linear-phase systems).
 *
 * @param taps FIR taps h[0..N−1] with at least one non-zero tap.
 * @returns The N − 1 zeros (fewer when h starts with zeros).
 * @throws {TypeError} When a tap is not a finite number.
 * @throws {RangeError} When every tap is zero.
 * @example
 * ```ts
 * import { firZeros } from "./zeros.ts";
 * // 1 + z^−1 has its zero at z = −1 (a null at fs/2).
 * const z = firZeros([1, 1]);
 * if (z.length !== 1 || z[0]!.re !== -1 || z[0]!.im !== 0) throw new Error("zero at −1");
 * ```
 */
export function firZeros(taps: ArrayLike<number>): Complex[] {
  requireSamples("Taps", taps);
  return polynomialRoots(taps);
}
