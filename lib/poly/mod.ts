/**
 * Polynomial utilities: roots, expansion from roots, products, evaluation.
 *
 * Conventions: a polynomial is an array of real coefficients with the
 * HIGHEST power first, c[0]·x^n + c[1]·x^(n−1) + … + c[n] (so a digital
 * transfer-function numerator b[0] + b[1]z^−1 + … reads the same array as a
 * polynomial in z). Roots are `Complex` values; non-real roots of a real
 * polynomial come in exact conjugate pairs.
 *
 * @module
 */
export * from "./polynomial.ts";
export * from "./roots.ts";
