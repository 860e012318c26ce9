import {
  requireFrequency,
  requireInteger,
  requireSampleRate,
  requireSamples,
} from "../_validate.ts";
import { checkedDenominator } from "./_denominator.ts";
import { delayAt, delayOnGrid } from "./_delay_sums.ts";
import type { FrequencyGridOptions } from "./frequency_response.ts";

/** Options for {@link groupDelay}. */
export interface GroupDelayOptions extends FrequencyGridOptions {
  /**
   * Frequencies in Hz, each in [0, fs/2], at which to evaluate the delay
   * directly instead of on the dense grid (`points` is then ignored).
   * @default the dense grid of `points` frequencies
   */
  frequencies?: ArrayLike<number>;
}

/** A delay (group or phase delay) at known frequencies. */
export interface DelayResponse {
  /** Frequencies in Hz. */
  frequencies: Float64Array;
  /** Delay in samples at each frequency. */
  samples: Float64Array;
  /** The same delay in seconds (samples / fs). */
  seconds: Float64Array;
}

/**
 * Group delay τ(f) = −dφ/dω of a filter, in samples and seconds, by the ramp
 * formula τ = Re{ Σ n·b[n] e^(−jωn) / Σ b[n] e^(−jωn) } (ω = 2πf/fs) for the
 * numerator, minus the same for the denominator: no phase is unwrapped or
 * differentiated. On the dense grid both sums come from FFTs.
 *
 * Where the numerator or denominator vanishes on the unit circle (a zero of
 * multiplicity m exactly at ω), the ratio is 0/0; there the delay is the limit
 * from either side, Re{S_{m+1} / ((m+1)·S_m)} with S_m = Σ n^m b[n] e^(−jωn)
 * (L'Hôpital's rule). So a linear-phase FIR filter reports its constant delay
 * (N−1)/2 even at its stopband nulls; the phase jump of π there is not a delay.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §5.1.2 (group delay) and Problem 5.66 (the ramp formula for a polynomial).
 *
 * @param taps FIR taps, or the numerator b when `options.denominator` is given.
 * @param fs Sample rate in Hz, > 0.
 * @param options Grid density, explicit frequencies, denominator a (a[0] ≠ 0).
 * @returns Delay in samples and seconds at each frequency.
 * @throws {RangeError} When fs ≤ 0, points < 2, a frequency is outside [0, fs/2] or a[0] = 0.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { groupDelay } from "./group_delay.ts";
 * // (1 + z^−1)^3: constant delay (4 − 1)/2 = 1.5 samples, also at its triple zero at fs/2.
 * const d = groupDelay([1, 3, 3, 1], 1000, { points: 5 });
 * if (d.samples.some((v) => Math.abs(v - 1.5) > 1e-9)) throw new Error("1.5 samples everywhere");
 * ```
 */
export function groupDelay(
  taps: ArrayLike<number>,
  fs: number,
  options: GroupDelayOptions = {},
): DelayResponse {
  requireSamples("Taps", taps);
  requireSampleRate(fs);
  const b = Float64Array.from(taps);
  const a = checkedDenominator(options.denominator);
  let frequencies: Float64Array;
  let samples: Float64Array;
  if (options.frequencies !== undefined) {
    requireSamples("Frequencies", options.frequencies, 0);
    frequencies = Float64Array.from(options.frequencies);
    const w = new Float64Array(frequencies.length);
    for (let i = 0; i < w.length; i++) {
      requireFrequency(`Frequency [${i}]`, frequencies[i]!, fs);
      w[i] = (2 * Math.PI * frequencies[i]!) / fs;
    }
    samples = delayAt(b, w);
    if (a !== undefined) {
      const da = delayAt(a, w);
      for (let i = 0; i < w.length; i++) samples[i]! -= da[i]!;
    }
  } else {
    const points = options.points ?? 4097;
    requireInteger("Number of frequency points", points, 2);
    frequencies = new Float64Array(points);
    for (let k = 0; k < points; k++) frequencies[k] = (k * fs) / (2 * (points - 1));
    samples = delayOnGrid(b, points);
    if (a !== undefined) {
      const da = delayOnGrid(a, points);
      for (let k = 0; k < points; k++) samples[k]! -= da[k]!;
    }
  }
  const seconds = samples.map((v) => v / fs);
  return { frequencies, samples, seconds };
}
