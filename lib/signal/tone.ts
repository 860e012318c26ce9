import {
  requireFinite,
  requireFrequency,
  requireInteger,
  requireSampleRate,
} from "../_validate.ts";

/** Options for {@link tone}. */
export interface ToneOptions {
  /** Number of samples, ≥ 1. */
  length: number;
  /** Sample rate in Hz, > 0. */
  fs: number;
  /** Frequency in Hz, in [0, fs/2]. */
  frequency: number;
  /** Peak amplitude A (any finite number). @default 1 */
  amplitude?: number;
  /** Phase φ at n = 0, in radians. @default 0 */
  phase?: number;
}

/**
 * Sampled sinusoid x[n] = A·cos(2π·f·n/fs + φ), n = 0 … length−1.
 *
 * The argument is reduced per sample as 2π·((f·n/fs) mod 1), so long signals
 * keep full phase accuracy.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §2.1
 * (sinusoidal sequences).
 *
 * @param options Length, sample rate, frequency, amplitude, phase.
 * @returns `length` samples.
 * @throws {RangeError} When length < 1, fs ≤ 0 or the frequency is outside [0, fs/2].
 * @throws {TypeError} When amplitude or phase is not finite.
 * @example
 * ```ts
 * import { tone } from "./tone.ts";
 * const x = tone({ length: 4, fs: 8000, frequency: 2000 });
 * // fs/4: cos(πn/2) = 1, 0, −1, 0.
 * if (x.some((v, n) => Math.abs(v - [1, 0, -1, 0][n]!) > 1e-15)) throw new Error("quarter rate");
 * ```
 */
export function tone(options: ToneOptions): Float64Array {
  const { length, fs, frequency } = options;
  requireInteger("Length", length, 1);
  requireSampleRate(fs);
  requireFrequency("Frequency", frequency, fs);
  const amplitude = options.amplitude ?? 1;
  const phase = options.phase ?? 0;
  requireFinite("Amplitude", amplitude);
  requireFinite("Phase", phase);
  const x = new Float64Array(length);
  const cycles = frequency / fs;
  for (let n = 0; n < length; n++) {
    const c = cycles * n;
    x[n] = amplitude * Math.cos(2 * Math.PI * (c - Math.floor(c)) + phase);
  }
  return x;
}
