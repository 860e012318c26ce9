import { requireInteger, requireSamples } from "../_validate.ts";
import { impulse, step } from "../signal/impulse.ts";
import { filterRational } from "./_difference_equation.ts";

/** Options for {@link impulseResponse} and {@link stepResponse}. */
export interface TimeResponseOptions {
  /**
   * Denominator a[0..M] of a rational filter B(z)/A(z), a[0] ≠ 0.
   * @default [1] (an FIR filter)
   */
  denominator?: ArrayLike<number>;
}

function run(
  numerator: ArrayLike<number>,
  length: number,
  options: TimeResponseOptions,
  input: (length: number) => Float64Array,
): Float64Array {
  requireSamples("Numerator", numerator);
  requireInteger("Length", length, 1);
  const a = options.denominator ?? [1];
  requireSamples("Denominator", a);
  if (a[0] === 0) throw new RangeError("Denominator a[0] must not be 0, got 0");
  return filterRational(numerator, a, input(length));
}

/**
 * Impulse response h[n], n = 0 … length−1, of B(z)/A(z): the output of the
 * difference equation Σ a[k] y[n−k] = Σ b[k] x[n−k] for x = δ[n], starting at
 * rest. For an FIR filter it is the taps followed by zeros.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §2.5
 * and §6.3 (transposed direct form II).
 *
 * @param numerator b[0..M] (FIR taps when there is no denominator).
 * @param length Number of output samples, ≥ 1.
 * @param options Optional denominator.
 * @returns `length` samples of h.
 * @throws {RangeError} When length < 1 or a[0] = 0.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { impulseResponse } from "./time_response.ts";
 * // One pole at 0.5: h[n] = 0.5^n.
 * const h = impulseResponse([1], 4, { denominator: [1, -0.5] });
 * if (h.join() !== "1,0.5,0.25,0.125") throw new Error("0.5^n");
 * ```
 */
export function impulseResponse(
  numerator: ArrayLike<number>,
  length: number,
  options: TimeResponseOptions = {},
): Float64Array {
  return run(numerator, length, options, (n) => impulse(n));
}

/**
 * Step response s[n] = Σ_{k≤n} h[k], n = 0 … length−1, of B(z)/A(z): the
 * output for a unit step input, starting at rest.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §2.5.
 *
 * @param numerator b[0..M] (FIR taps when there is no denominator).
 * @param length Number of output samples, ≥ 1.
 * @param options Optional denominator.
 * @returns `length` samples of s.
 * @throws {RangeError} When length < 1 or a[0] = 0.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { stepResponse } from "./time_response.ts";
 * if (stepResponse([0.25, 0.5, 0.25], 4).join() !== "0.25,0.75,1,1") throw new Error("settles at 1");
 * ```
 */
export function stepResponse(
  numerator: ArrayLike<number>,
  length: number,
  options: TimeResponseOptions = {},
): Float64Array {
  return run(numerator, length, options, (n) => step(n));
}
