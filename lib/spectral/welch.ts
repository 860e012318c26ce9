import { requireInteger, requireSampleRate, requireSamples } from "../_validate.ts";
import { realFft } from "../fft/real_fft.ts";
import { hannWindow } from "../window/windows.ts";

/** Options for {@link welchSpectrum}. */
export interface WelchOptions {
  /** Samples per segment, 1 … signal length. @default min(256, signal length) */
  segmentLength?: number;
  /** Samples shared by neighbouring segments, 0 … segmentLength − 1. @default ⌊segmentLength/2⌋ */
  overlap?: number;
  /**
   * Window samples, one per segment sample.
   * @default periodic Hann window of segmentLength samples
   */
  window?: ArrayLike<number>;
  /** DFT length ≥ segmentLength (zero-padding); any integer. @default segmentLength */
  fftLength?: number;
  /**
   * "density": power spectral density in units²/Hz (integrates over frequency
   * to the mean-square value); "spectrum": power spectrum in units² (a tone of
   * amplitude A shows a peak of A²/2).
   * @default "density"
   */
  scaling?: "density" | "spectrum";
  /** Remove each segment's mean ("constant") before windowing, or not ("none"). @default "constant" */
  detrend?: "constant" | "none";
}

/** A one-sided power spectrum estimate. */
export interface PowerSpectrum {
  /** Frequencies in Hz, 0 … fs/2 (k·fs/fftLength). */
  frequencies: Float64Array;
  /** Power per frequency: units²/Hz for "density", units² for "spectrum". */
  power: Float64Array;
  /** Number of segments averaged. */
  segments: number;
}

/**
 * Power spectrum of a signal by Welch's method: cut the signal into segments
 * of L samples that overlap by D, remove each segment's mean, multiply by the
 * window w, take |DFT|², average over the K = ⌊(N − D)/(L − D)⌋ segments
 * (samples after the last whole segment are not used) and scale:
 * P(f_k) = c_k·mean|X_k|² / (fs·Σw²) for "density", c_k·mean|X_k|² / (Σw)² for
 * "spectrum", with c_k = 2 for the bins that stand for both ±f_k (all but DC
 * and, for an even DFT length, fs/2) and 1 for those.
 *
 * Source: P. D. Welch, "The use of fast Fourier transform for the estimation
 * of power spectra: a method based on time averaging over short, modified
 * periodograms", IEEE Trans. Audio Electroacoust. 15(2), 1967.
 *
 * @param signal Real samples, at least 1.
 * @param fs Sample rate in Hz, > 0.
 * @param options Segment length, overlap, window, DFT length, scaling, detrending.
 * @returns Frequencies, one-sided power and the number of segments.
 * @throws {RangeError} When a length or the overlap is out of range, or fs ≤ 0.
 * @throws {TypeError} When the window's length differs from the segment length,
 *   a sample is not finite, or scaling/detrend is unknown.
 * @example
 * ```ts
 * import { welchSpectrum } from "./welch.ts";
 * // Unit-variance white noise has a flat density of 2σ²/fs one-sided: 2/1000 per Hz.
 * let s = 1;
 * const x = Float64Array.from({ length: 8192 }, () => ((s = (s * 16807) % 2147483647) / 2147483647 - 0.5) * Math.sqrt(12));
 * const p = welchSpectrum(x, 1000, { segmentLength: 256 });
 * const mean = p.power.slice(1, -1).reduce((a, v) => a + v, 0) / (p.power.length - 2);
 * if (Math.abs(mean / 0.002 - 1) > 0.1) throw new Error("flat at 2σ²/fs");
 * ```
 */
export function welchSpectrum(
  signal: ArrayLike<number>,
  fs: number,
  options: WelchOptions = {},
): PowerSpectrum {
  requireSamples("Signal", signal);
  requireSampleRate(fs);
  const length = signal.length;
  const segmentLength = options.segmentLength ?? Math.min(256, length);
  requireInteger("Segment length", segmentLength, 1, length);
  const overlap = options.overlap ?? Math.floor(segmentLength / 2);
  requireInteger("Overlap", overlap, 0, segmentLength - 1);
  const fftLength = options.fftLength ?? segmentLength;
  requireInteger("FFT length", fftLength, segmentLength);
  const scaling = options.scaling ?? "density";
  if (scaling !== "density" && scaling !== "spectrum") {
    throw new TypeError(`Scaling must be "density" or "spectrum", got ${JSON.stringify(scaling)}`);
  }
  const detrend = options.detrend ?? "constant";
  if (detrend !== "constant" && detrend !== "none") {
    throw new TypeError(`Detrend must be "constant" or "none", got ${JSON.stringify(detrend)}`);
  }
  const window = options.window ?? hannWindow(segmentLength, { symmetry: "periodic" });
  requireSamples("Window", window);
  if (window.length !== segmentLength) {
    throw new TypeError(
      `Window must have the segment length ${segmentLength}, got ${window.length} samples`,
    );
  }
  let sumW = 0;
  let sumW2 = 0;
  for (let i = 0; i < segmentLength; i++) {
    sumW += window[i]!;
    sumW2 += window[i]! * window[i]!;
  }
  const step = segmentLength - overlap;
  const segments = Math.floor((length - overlap) / step);
  const bins = Math.floor(fftLength / 2) + 1;
  const power = new Float64Array(bins);
  const segment = new Float64Array(fftLength);
  for (let s = 0; s < segments; s++) {
    const start = s * step;
    let mean = 0;
    if (detrend === "constant") {
      for (let i = 0; i < segmentLength; i++) mean += signal[start + i] as number;
      mean /= segmentLength;
    }
    for (let i = 0; i < segmentLength; i++) {
      segment[i] = ((signal[start + i] as number) - mean) * window[i]!;
    }
    const { re, im } = realFft(segment);
    for (let k = 0; k < bins; k++) power[k]! += re[k]! * re[k]! + im[k]! * im[k]!;
  }
  const scale = (scaling === "density" ? 1 / (fs * sumW2) : 1 / (sumW * sumW)) / segments;
  for (let k = 0; k < bins; k++) {
    const twoSided = k > 0 && !(fftLength % 2 === 0 && k === bins - 1);
    power[k]! *= twoSided ? 2 * scale : scale;
  }
  const frequencies = new Float64Array(bins);
  for (let k = 0; k < bins; k++) frequencies[k] = (k * fs) / fftLength;
  return { frequencies, power, segments };
}
