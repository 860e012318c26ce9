import {
  requireFinite,
  requireFrequency,
  requireInteger,
  requireSampleRate,
} from "../_validate.ts";

/** Options for {@link linearChirp} and {@link logarithmicChirp}. */
export interface ChirpOptions {
  /** Number of samples, ≥ 2. */
  length: number;
  /** Sample rate in Hz, > 0. */
  fs: number;
  /** Instantaneous frequency at the first sample, in Hz, in [0, fs/2] (> 0 for a logarithmic sweep). */
  startFrequency: number;
  /** Instantaneous frequency at the last sample, in Hz, in [0, fs/2] (> 0 for a logarithmic sweep). */
  endFrequency: number;
  /** Peak amplitude A. @default 1 */
  amplitude?: number;
  /** Phase φ0 at the first sample, in radians. @default 0 */
  phase?: number;
}

function checkChirp(options: ChirpOptions): { duration: number; a: number; p: number } {
  requireInteger("Length", options.length, 2);
  requireSampleRate(options.fs);
  requireFrequency("Start frequency", options.startFrequency, options.fs);
  requireFrequency("End frequency", options.endFrequency, options.fs);
  const a = options.amplitude ?? 1;
  const p = options.phase ?? 0;
  requireFinite("Amplitude", a);
  requireFinite("Phase", p);
  return { duration: (options.length - 1) / options.fs, a, p };
}

/**
 * Linear frequency sweep x[n] = A·cos(φ(t) + φ0), t = n/fs, with
 * φ(t) = 2π(f0·t + (f1 − f0)·t²/(2T)) and T = (length−1)/fs, so the
 * instantaneous frequency runs from f0 at the first sample to f1 at the last.
 *
 * Source: J. R. Klauder et al., "The theory and design of chirp radars", Bell
 * System Technical Journal 39(4), 1960 (linear FM); common practice for test sweeps.
 *
 * @param options Length, sample rate, start and end frequency, amplitude, phase.
 * @returns `length` samples.
 * @throws {RangeError} When length < 2, fs ≤ 0 or a frequency is outside [0, fs/2].
 * @example
 * ```ts
 * import { linearChirp } from "./chirp.ts";
 * // Constant 0 Hz "sweep" is a constant A·cos(φ0).
 * const x = linearChirp({ length: 3, fs: 100, startFrequency: 0, endFrequency: 0, amplitude: 2 });
 * if (x.join() !== "2,2,2") throw new Error("DC");
 * ```
 */
export function linearChirp(options: ChirpOptions): Float64Array {
  const { duration, a, p } = checkChirp(options);
  const { length, fs, startFrequency: f0, endFrequency: f1 } = options;
  const x = new Float64Array(length);
  for (let n = 0; n < length; n++) {
    const t = n / fs;
    x[n] = a * Math.cos(2 * Math.PI * (f0 * t + ((f1 - f0) * t * t) / (2 * duration)) + p);
  }
  return x;
}

/**
 * Logarithmic (exponential) frequency sweep: the instantaneous frequency
 * f(t) = f0·(f1/f0)^(t/T) rises or falls by a constant ratio per second, with
 * phase φ(t) = 2π·f0·T/ln(f1/f0)·((f1/f0)^(t/T) − 1), x[n] = A·cos(φ(n/fs) + φ0),
 * T = (length−1)/fs. Equal start and end frequencies give a tone.
 *
 * Source: A. Farina, "Simultaneous measurement of impulse response and
 * distortion with a swept-sine technique", AES 108th Convention, 2000, preprint 5093.
 *
 * @param options Length, sample rate, start and end frequency (both > 0), amplitude, phase.
 * @returns `length` samples.
 * @throws {RangeError} When length < 2, fs ≤ 0, or a frequency is ≤ 0 or above fs/2.
 * @example
 * ```ts
 * import { logarithmicChirp } from "./chirp.ts";
 * const x = logarithmicChirp({ length: 1001, fs: 1000, startFrequency: 10, endFrequency: 100 });
 * if (x[0] !== 1 || x.some((v) => Math.abs(v) > 1)) throw new Error("starts at the crest");
 * ```
 */
export function logarithmicChirp(options: ChirpOptions): Float64Array {
  const { duration, a, p } = checkChirp(options);
  const { length, fs, startFrequency: f0, endFrequency: f1 } = options;
  if (f0 <= 0) {
    throw new RangeError(
      `Start frequency must be above 0 Hz for a logarithmic sweep, got ${f0} Hz`,
    );
  }
  if (f1 <= 0) {
    throw new RangeError(`End frequency must be above 0 Hz for a logarithmic sweep, got ${f1} Hz`);
  }
  const x = new Float64Array(length);
  const ratio = f1 / f0;
  for (let n = 0; n < length; n++) {
    const t = n / fs;
    const phi = f0 === f1
      ? 2 * Math.PI * f0 * t
      : ((2 * Math.PI * f0 * duration) / Math.log(ratio)) * (ratio ** (t / duration) - 1);
    x[n] = a * Math.cos(phi + p);
  }
  return x;
}
