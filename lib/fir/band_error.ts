import { requireInteger, requireSamples } from "../_validate.ts";
import { frequencyResponse, responseAt } from "../response/frequency_response.ts";
import { checkBands } from "./_bands.ts";
import type { DesignBand } from "./types.ts";

/** How one band of a specification is met. */
export interface BandMeasurement {
  /** Lower band edge in Hz, as given. */
  from: number;
  /** Upper band edge in Hz, as given. */
  to: number;
  /** Wanted gain (linear), as given. */
  gain: number;
  /** Smallest magnitude |H| found in the band (linear). */
  minGain: number;
  /** Largest magnitude |H| found in the band (linear). */
  maxGain: number;
  /** Largest | |H| − wanted | in the band (linear; wanted interpolates gain → endGain). */
  maxDeviation: number;
  /** Frequency (Hz) of that largest deviation. */
  worstAt: number;
  /** 20·log10(maxGain/minGain): peak-to-peak ripple in dB (meaningful in a passband). */
  rippleDb: number;
  /** −20·log10(maxGain): attenuation in dB (meaningful in a stopband). */
  attenuationDb: number;
}

/** Options for {@link measureBands}. */
export interface MeasureBandsOptions {
  /**
   * Points on the 0 … fs/2 grid, ≥ 3 (a power of two plus one is fastest).
   * @default the smallest 2^k + 1 ≥ max(8193, 16·taps)
   */
  points?: number;
}

/**
 * Measure a filter's magnitude against a band specification on a dense grid
 * (by FFT) plus the exact band edges: per band the minimum and maximum gain,
 * the largest deviation from the wanted gain and where it lies, the ripple and
 * the attenuation in dB.
 *
 * Source: common practice (the figures a filter data sheet quotes).
 *
 * @param taps FIR taps h[0..N−1].
 * @param fs Sample rate in Hz.
 * @param bands Bands with wanted gains (weights are ignored).
 * @param options Grid density.
 * @returns One measurement per band, in order.
 * @throws {RangeError} For band edges outside [0, fs/2] or not increasing.
 * @throws {TypeError} For taps that are not finite numbers.
 * @example
 * ```ts
 * import { measureBands } from "./band_error.ts";
 * const [pass, stop] = measureBands([0.25, 0.5, 0.25], 2, [
 *   { from: 0, to: 0.1, gain: 1 },
 *   { from: 0.9, to: 1, gain: 0 },
 * ]);
 * // H(f) = cos²(πf/2) here: 0 at fs/2, 1 at DC.
 * if (pass!.maxGain !== 1 || stop!.minGain > 1e-15 || !(stop!.attenuationDb > 20)) {
 *   throw new Error("raised-cosine taps");
 * }
 * ```
 */
export function measureBands(
  taps: ArrayLike<number>,
  fs: number,
  bands: readonly DesignBand[],
  options: MeasureBandsOptions = {},
): BandMeasurement[] {
  requireSamples("Taps", taps);
  const checked = checkBands(bands, fs);
  let points = options.points;
  if (points === undefined) {
    points = 8193;
    while (points - 1 < 16 * taps.length) points = 2 * (points - 1) + 1;
  }
  requireInteger("Number of frequency points", points, 3);
  const grid = frequencyResponse(taps, fs, { points });
  return checked.map((band) => {
    const edges = responseAt(taps, [1], [band.from, band.to], fs);
    const m: BandMeasurement = {
      from: band.from,
      to: band.to,
      gain: band.gain,
      minGain: Infinity,
      maxGain: 0,
      maxDeviation: 0,
      worstAt: band.from,
      rippleDb: 0,
      attenuationDb: 0,
    };
    const visit = (f: number, re: number, im: number): void => {
      const mag = Math.hypot(re, im);
      const t = band.to === band.from ? 0 : (f - band.from) / (band.to - band.from);
      const wanted = Math.abs(band.gain + t * (band.endGain - band.gain));
      if (mag < m.minGain) m.minGain = mag;
      if (mag > m.maxGain) m.maxGain = mag;
      const d = Math.abs(mag - wanted);
      if (d > m.maxDeviation) {
        m.maxDeviation = d;
        m.worstAt = f;
      }
    };
    visit(band.from, edges.re[0]!, edges.im[0]!);
    visit(band.to, edges.re[1]!, edges.im[1]!);
    for (let k = 0; k < points!; k++) {
      const f = grid.frequencies[k]!;
      if (f > band.from && f < band.to) visit(f, grid.re[k]!, grid.im[k]!);
    }
    m.rippleDb = 20 * Math.log10(m.maxGain / Math.max(m.minGain, 1e-300));
    m.attenuationDb = -20 * Math.log10(Math.max(m.maxGain, 1e-300));
    return m;
  });
}
