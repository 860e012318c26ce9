import { requireSamples } from "../_validate.ts";

/** How far a fixed-point output is from its floating-point reference. */
export interface OutputComparison {
  /** Largest |actual − reference|. */
  maxError: number;
  /** √(mean (actual − reference)²). */
  rmsError: number;
  /** 10·log10(Σ reference² / Σ (actual − reference)²); Infinity when they are equal. */
  snrDb: number;
}

/**
 * Compare an output with its reference: largest error, RMS error and
 * signal-to-noise ratio SNR = 10·log10(Σ r² / Σ (a − r)²).
 *
 * @param reference Reference output (floating point).
 * @param actual Output to judge, same length.
 * @returns The comparison.
 * @throws {RangeError} When the lengths differ or are zero.
 * @example
 * ```ts
 * import { compareOutputs } from "./compare.ts";
 * const c = compareOutputs([1, -1], [1.1, -0.9]);
 * if (Math.abs(c.snrDb - 20) > 1e-9 || Math.abs(c.maxError - 0.1) > 1e-12) throw new Error("20 dB");
 * ```
 */
export function compareOutputs(
  reference: ArrayLike<number>,
  actual: ArrayLike<number>,
): OutputComparison {
  requireSamples("Reference", reference);
  requireSamples("Actual output", actual);
  if (reference.length !== actual.length) {
    throw new RangeError(
      `Actual output must have the reference's length ${reference.length}, got ${actual.length}`,
    );
  }
  let maxError = 0;
  let noise = 0;
  let signal = 0;
  for (let i = 0; i < reference.length; i++) {
    const r = reference[i] as number;
    const e = (actual[i] as number) - r;
    maxError = Math.max(maxError, Math.abs(e));
    noise += e * e;
    signal += r * r;
  }
  return {
    maxError,
    rmsError: Math.sqrt(noise / reference.length),
    snrDb: noise === 0 ? Infinity : 10 * Math.log10(signal / noise),
  };
}
