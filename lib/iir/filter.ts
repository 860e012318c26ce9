import type { Section } from "../types.ts";
import { requireSamples } from "../_validate.ts";
import { requireSections } from "./_sections.ts";
import { runSections } from "./_run.ts";

/**
 * Filter a signal through a cascade of second-order sections, each in
 * transposed direct form II:
 * y = b0·x + s1;  s1 ← b1·x − a1·y + s2;  s2 ← b2·x − a2·y.
 *
 * Streaming: pass the same `state` to successive calls and the blocks join
 * exactly as if the whole signal had been filtered at once. Without `state`
 * the filter starts at rest (all states zero).
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 6 (cascade form, transposed forms).
 *
 * @param sections The cascade, applied first to last; a0 = 1 in each.
 * @param signal Input samples.
 * @param state Optional filter memory, 2 values per section ([s1, s2] of
 *   section 0, then section 1, …), read and updated in place; see
 *   {@link createSectionState}.
 * @param output Optional Float64Array of the signal's length to write the
 *   result into (it may be the signal itself, for in-place filtering); saves
 *   allocating a new array per call when streaming long signals.
 * @returns Output samples, same length as `signal` (`output` when given).
 * @throws {TypeError} When a coefficient or sample is not finite, or the state or output has the wrong length.
 * @example
 * ```ts
 * import { applySections } from "./filter.ts";
 * // One-pole smoother y[n] = x[n] + 0.5·y[n−1] on a unit step.
 * const s = [{ b0: 1, b1: 0, b2: 0, a1: -0.5, a2: 0 }];
 * const state = new Float64Array(2);
 * const a = applySections(s, [1, 1], state);
 * const b = applySections(s, [1, 1], state);
 * if ([...a, ...b].join() !== "1,1.5,1.75,1.875") throw new Error("streaming");
 * ```
 */
export function applySections(
  sections: readonly Section[],
  signal: ArrayLike<number>,
  state?: Float64Array,
  output?: Float64Array,
): Float64Array {
  requireSections(sections);
  const typed = signal instanceof Float64Array;
  // Typed input is checked inside the filter loop (x − x is NaN only for non-finite x).
  if (!typed) requireSamples("Signal", signal, 0);
  const k = sections.length;
  if (state !== undefined && (!(state instanceof Float64Array) || state.length !== 2 * k)) {
    throw new TypeError(
      `State must be a Float64Array of 2 values per section (${2 * k}), got ${
        state instanceof Float64Array ? `length ${state.length}` : typeof state
      }`,
    );
  }
  if (
    output !== undefined && (!(output instanceof Float64Array) || output.length !== signal.length)
  ) {
    throw new TypeError(
      `Output must be a Float64Array as long as the signal (${signal.length}), got ${
        output instanceof Float64Array ? `length ${output.length}` : typeof output
      }`,
    );
  }
  let y: Float64Array;
  if (output === undefined) {
    // new + set: V8's TypedArray slice() is many times slower for large arrays.
    y = new Float64Array(signal.length);
    y.set(signal as ArrayLike<number>);
  } else {
    y = output;
    if (output !== signal) y.set(signal as ArrayLike<number>);
  }
  const memory = state ?? new Float64Array(2 * k);
  const saved = memory.slice();
  const check = runSections(sections, y, memory);
  if (check !== 0) {
    memory.set(saved);
    requireSamples("Signal", signal, 0);
  }
  return y;
}

/**
 * Zeroed filter memory for {@link applySections}: 2 values per section.
 *
 * @param sections The cascade the state belongs to.
 * @returns A Float64Array of 2·sections.length zeros.
 * @throws {TypeError} When the sections are malformed.
 * @example
 * ```ts
 * import { createSectionState } from "./filter.ts";
 * const st = createSectionState([{ b0: 1, b1: 0, b2: 0, a1: 0, a2: 0 }]);
 * if (st.length !== 2) throw new Error("two states");
 * ```
 */
export function createSectionState(sections: readonly Section[]): Float64Array {
  requireSections(sections);
  return new Float64Array(2 * sections.length);
}

/**
 * Filter a signal with a rational transfer function
 * H(z) = (b[0] + b[1]z⁻¹ + … + b[M]z⁻ᴹ) / (a[0] + a[1]z⁻¹ + … + a[N]z⁻ᴺ), in
 * transposed direct form II (coefficients divided by a[0] first).
 * Prefer {@link applySections} for orders above about 4: the direct form of a
 * high-order polynomial is numerically fragile.
 *
 * Streaming: pass the same `state` (length max(M, N)) to successive calls.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 6 (transposed direct form II).
 *
 * @param numerator b[0..M], at least one value.
 * @param denominator a[0..N], a[0] ≠ 0.
 * @param signal Input samples.
 * @param state Optional filter memory of max(M, N) values, updated in place.
 * @returns Output samples, same length as `signal`.
 * @throws {RangeError} When a[0] = 0.
 * @throws {TypeError} When a value is not finite or the state has the wrong length.
 * @example
 * ```ts
 * import { applyIir } from "./filter.ts";
 * // y[n] = x[n] + 0.5·y[n−1]: impulse response 1, 0.5, 0.25.
 * if (applyIir([1], [1, -0.5], [1, 0, 0]).join() !== "1,0.5,0.25") throw new Error("geometric");
 * ```
 */
export function applyIir(
  numerator: ArrayLike<number>,
  denominator: ArrayLike<number>,
  signal: ArrayLike<number>,
  state?: Float64Array,
): Float64Array {
  requireSamples("Numerator", numerator);
  requireSamples("Denominator", denominator);
  requireSamples("Signal", signal, 0);
  const a0 = denominator[0] as number;
  if (a0 === 0) throw new RangeError("Denominator a[0] must not be 0, got 0");
  const order = Math.max(numerator.length, denominator.length) - 1;
  const b = new Float64Array(order + 1);
  const a = new Float64Array(order + 1);
  for (let i = 0; i < numerator.length; i++) b[i] = (numerator[i] as number) / a0;
  for (let i = 0; i < denominator.length; i++) a[i] = (denominator[i] as number) / a0;
  if (state !== undefined && (!(state instanceof Float64Array) || state.length !== order)) {
    throw new TypeError(
      `State must be a Float64Array of max(M, N) = ${order} values, got ${
        state instanceof Float64Array ? `length ${state.length}` : typeof state
      }`,
    );
  }
  const z = state ?? new Float64Array(order);
  const y = new Float64Array(signal.length);
  const b0 = b[0]!;
  for (let i = 0; i < signal.length; i++) {
    const x = signal[i] as number;
    const out = b0 * x + (order > 0 ? z[0]! : 0);
    for (let k = 1; k < order; k++) z[k - 1] = b[k]! * x - a[k]! * out + z[k]!;
    if (order > 0) z[order - 1] = b[order]! * x - a[order]! * out;
    y[i] = out;
  }
  return y;
}
