import type { Section } from "../types.ts";
import { requireInteger, requireSamples } from "../_validate.ts";
import { requireSections } from "./_sections.ts";
import { runSections } from "./_run.ts";

/** Options for {@link applyZeroPhase}. */
export interface ZeroPhaseOptions {
  /**
   * Samples added at each end by odd reflection before filtering; must be
   * smaller than the signal length.
   * @default 3·(2K + 1 − m) for K sections, m = min(number of sections with
   * b2 = 0, number with a2 = 0) (first-order sections need less settling)
   */
  padLength?: number;
}

/** Steady-state memory of each section for a unit-step input to the cascade. */
function stepState(sections: readonly Section[]): Float64Array {
  const zi = new Float64Array(2 * sections.length);
  let level = 1; // input level reaching this section
  sections.forEach((s, j) => {
    const g = (s.b0 + s.b1 + s.b2) / (1 + s.a1 + s.a2);
    zi[2 * j + 1] = level * (s.b2 - s.a2 * g);
    zi[2 * j] = level * (s.b1 + s.b2 - (s.a1 + s.a2) * g);
    level *= g;
  });
  return zi;
}

/**
 * Zero-phase filtering: the signal is filtered forwards through the
 * sections, then backwards, so the result has no phase shift and the
 * magnitude response squared, |H(f)|².
 *
 * Edge handling: the signal is first extended at each end by `padLength`
 * samples of odd reflection about its end values (x[−k] = 2x[0] − x[k],
 * x[N−1+k] = 2x[N−1] − x[N−1−k]), which continues the signal's level and
 * slope; each pass starts from the section states that a constant input
 * equal to the pass's first sample would have reached in steady state, so
 * no start-up transient is injected; the padding is removed at the end.
 *
 * Source: common practice (odd extension with steady-state initial
 * states); F. Gustafsson, "Determining the initial states in
 * forward-backward filtering", IEEE Trans. Signal Processing 44 (1996)
 * 988–992, discusses the start-up problem and an alternative solution.
 *
 * @param sections The cascade (stable), a0 = 1 in each.
 * @param signal Input samples, longer than the pad length.
 * @param options Pad length.
 * @returns The zero-phase filtered signal, same length as the input.
 * @throws {RangeError} When the signal is not longer than the pad length.
 * @throws {TypeError} When a coefficient or sample is not finite.
 * @example
 * ```ts
 * import { applyZeroPhase } from "./zero_phase.ts";
 * // A constant passes a unit-DC-gain filter unchanged, ends included.
 * const s = [{ b0: 0.25, b1: 0.5, b2: 0.25, a1: 0, a2: 0 }];
 * const y = applyZeroPhase(s, new Float64Array(20).fill(3));
 * if (y.some((v) => Math.abs(v - 3) > 1e-14)) throw new Error("constant kept");
 * ```
 */
export function applyZeroPhase(
  sections: readonly Section[],
  signal: ArrayLike<number>,
  options: ZeroPhaseOptions = {},
): Float64Array {
  requireSections(sections);
  requireSamples("Signal", signal);
  let firstOrderB = 0;
  let firstOrderA = 0;
  for (const s of sections) {
    if (s.b2 === 0) firstOrderB++;
    if (s.a2 === 0) firstOrderA++;
  }
  const defaultPad = 3 * (2 * sections.length + 1 - Math.min(firstOrderB, firstOrderA));
  const pad = options.padLength ?? defaultPad;
  requireInteger("Pad length", pad, 0);
  const n = signal.length;
  if (n <= pad) {
    throw new RangeError(
      `Signal must be longer than the pad length ${pad} for zero-phase filtering, got ${n} samples`,
    );
  }
  const x = new Float64Array(n);
  x.set(signal);
  const ext = new Float64Array(n + 2 * pad);
  const first = x[0]!;
  const last = x[n - 1]!;
  for (let k = 0; k < pad; k++) {
    ext[k] = 2 * first - x[pad - k]!;
    ext[pad + n + k] = 2 * last - x[n - 2 - k]!;
  }
  ext.set(x, pad);
  const zi = stepState(sections);
  const memory = new Float64Array(zi.length);
  for (let i = 0; i < zi.length; i++) memory[i] = zi[i]! * ext[0]!;
  runSections(sections, ext, memory);
  ext.reverse();
  for (let i = 0; i < zi.length; i++) memory[i] = zi[i]! * ext[0]!;
  runSections(sections, ext, memory);
  ext.reverse();
  const out = new Float64Array(n);
  out.set(ext.subarray(pad, pad + n));
  return out;
}
