import type { Complex } from "../types.ts";
import { requireSamples } from "../_validate.ts";

/**
 * Coefficients of the monic polynomial with the given roots,
 * Π (x − r_i), highest power first, by multiplying in one factor at a time
 * in complex arithmetic. Non-real roots must come in conjugate pairs for the
 * result to be real; the imaginary parts left by rounding are dropped.
 *
 * Source: the expansion by repeated synthetic multiplication, e.g.
 * W. H. Press et al., Numerical Recipes, 3rd ed., §5.1.
 *
 * @param roots The roots (any order).
 * @returns c[0..n] with c[0] = 1, highest power first (n = number of roots).
 * @throws {TypeError} When a root is not a finite complex number, or the roots
 *   are not closed under conjugation (imaginary part of a coefficient above
 *   1e-9 of the coefficient sizes).
 * @example
 * ```ts
 * import { polynomialFromRoots } from "./polynomial.ts";
 * // (x − 1)(x − j)(x + j) = x³ − x² + x − 1
 * const c = polynomialFromRoots([{ re: 1, im: 0 }, { re: 0, im: 1 }, { re: 0, im: -1 }]);
 * if (c.join() !== "1,-1,1,-1") throw new Error("expanded");
 * ```
 */
export function polynomialFromRoots(roots: readonly Complex[]): Float64Array {
  const n = roots.length;
  const re = new Float64Array(n + 1);
  const im = new Float64Array(n + 1);
  re[0] = 1;
  for (let k = 0; k < n; k++) {
    const r = roots[k];
    if (r === undefined || !Number.isFinite(r.re) || !Number.isFinite(r.im)) {
      throw new TypeError(`Root [${k}] must be a finite complex number, got ${JSON.stringify(r)}`);
    }
    for (let i = k + 1; i >= 1; i--) {
      const pr = re[i - 1]!;
      const pi = im[i - 1]!;
      re[i]! -= pr * r.re - pi * r.im;
      im[i]! -= pr * r.im + pi * r.re;
    }
  }
  let size = 0;
  let worst = 0;
  for (let i = 0; i <= n; i++) {
    size = Math.max(size, Math.abs(re[i]!));
    worst = Math.max(worst, Math.abs(im[i]!));
  }
  if (worst > 1e-9 * size) {
    throw new TypeError(
      `Roots must come in conjugate pairs for a real polynomial, got an imaginary part of ${
        worst.toPrecision(3)
      }`,
    );
  }
  return re;
}

/**
 * Product of two polynomials (discrete convolution of their coefficients),
 * c[k] = Σ a[i]·b[k − i]. The ordering (highest power first or lowest power
 * first) is preserved, as long as both inputs use the same one.
 *
 * @param a Coefficients of the first factor, at least one.
 * @param b Coefficients of the second factor, at least one.
 * @returns a.length + b.length − 1 coefficients.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { multiplyPolynomials } from "./polynomial.ts";
 * // (x + 1)(x − 1) = x² − 1
 * if (multiplyPolynomials([1, 1], [1, -1]).join() !== "1,0,-1") throw new Error("difference of squares");
 * ```
 */
export function multiplyPolynomials(a: ArrayLike<number>, b: ArrayLike<number>): Float64Array {
  requireSamples("First polynomial", a);
  requireSamples("Second polynomial", b);
  const out = new Float64Array(a.length + b.length - 1);
  for (let i = 0; i < a.length; i++) {
    const ai = a[i] as number;
    for (let j = 0; j < b.length; j++) out[i + j]! += ai * (b[j] as number);
  }
  return out;
}

/**
 * Value of p(x) = c[0]·x^n + … + c[n] at a complex point, by Horner's rule.
 *
 * @param coefficients c[0..n], highest power first.
 * @param x The point.
 * @returns p(x).
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { evaluatePolynomial } from "./polynomial.ts";
 * // x² + 1 at x = j is 0.
 * const v = evaluatePolynomial([1, 0, 1], { re: 0, im: 1 });
 * if (v.re !== 0 || v.im !== 0) throw new Error("root");
 * ```
 */
export function evaluatePolynomial(coefficients: ArrayLike<number>, x: Complex): Complex {
  requireSamples("Polynomial coefficients", coefficients);
  let re = 0;
  let im = 0;
  for (let k = 0; k < coefficients.length; k++) {
    const r = re * x.re - im * x.im + (coefficients[k] as number);
    im = re * x.im + im * x.re;
    re = r;
  }
  return { re, im };
}
