import { requireSampleRate, requireSamples } from "../_validate.ts";
import {
  type FrequencyGridOptions,
  frequencyResponse,
  unwrappedPhase,
} from "./frequency_response.ts";
import { type DelayResponse, groupDelay } from "./group_delay.ts";

/**
 * Phase delay τ_p(f) = −φ(ω)/ω of a filter on the dense grid, in samples and
 * seconds, with φ the phase unwrapped from f = 0 and ω = 2πf/fs. At f = 0 the
 * value is the limit, the group delay at DC, when H(0) is real and positive;
 * otherwise (a null or a sign inversion at DC) it is NaN there.
 *
 * The unwrapped phase jumps by π at each zero on the unit circle (the sign of
 * H changes), so in a stopband the phase delay of a linear-phase filter is not
 * its group delay; use {@link groupDelay} for the envelope delay.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.1.2
 * (phase and group delay).
 *
 * @param taps FIR taps, or the numerator b when `options.denominator` is given.
 * @param fs Sample rate in Hz, > 0.
 * @param options Grid density and optional denominator.
 * @returns Phase delay in samples and seconds at each grid frequency.
 * @throws {RangeError} When fs ≤ 0, points < 2 or a[0] = 0.
 * @example
 * ```ts
 * import { phaseDelay } from "./phase_delay.ts";
 * // A pure delay of 3 samples delays every frequency by 3 samples.
 * const d = phaseDelay([0, 0, 0, 1], 8000, { points: 9 });
 * if (d.samples.some((v) => Math.abs(v - 3) > 1e-12)) throw new Error("3 samples");
 * ```
 */
export function phaseDelay(
  taps: ArrayLike<number>,
  fs: number,
  options: FrequencyGridOptions = {},
): DelayResponse {
  requireSamples("Taps", taps);
  requireSampleRate(fs);
  const response = frequencyResponse(taps, fs, options);
  const phase = unwrappedPhase(response);
  const n = phase.length;
  const samples = new Float64Array(n);
  for (let k = 1; k < n; k++) {
    samples[k] = -phase[k]! / ((2 * Math.PI * response.frequencies[k]!) / fs);
  }
  const dc = response.re[0]!;
  const dcPositive = dc > 0 && Math.abs(response.im[0]!) <= 1e-12 * dc;
  samples[0] = dcPositive
    ? groupDelay(taps, fs, { denominator: options.denominator, frequencies: [0] }).samples[0]!
    : Number.NaN;
  const seconds = samples.map((v) => v / fs);
  return { frequencies: response.frequencies, samples, seconds };
}
