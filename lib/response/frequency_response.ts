import {
  requireFrequency,
  requireInteger,
  requireSampleRate,
  requireSamples,
} from "../_validate.ts";
import { realFft } from "../fft/real_fft.ts";

/** A complex frequency response sampled at known frequencies. */
export interface FrequencyResponse {
  /** Frequencies in Hz. */
  frequencies: Float64Array;
  /** Real part of H at each frequency. */
  re: Float64Array;
  /** Imaginary part of H at each frequency. */
  im: Float64Array;
}

/** Options for {@link frequencyResponse}. */
export interface FrequencyGridOptions {
  /**
   * Number of equally spaced frequencies from 0 to fs/2 inclusive, ≥ 2. Any
   * count works; a power of two plus one (513, 1025, 4097…) is fastest.
   * @default 4097
   */
  points?: number;
  /**
   * Denominator a[0..M] of a rational filter B(z)/A(z), a[0] ≠ 0; the first
   * argument is then the numerator b.
   * @default [1] (an FIR filter)
   */
  denominator?: ArrayLike<number>;
}

/** Fold c modulo `size` and take its real DFT: exact DFT samples of a long polynomial. */
function foldedSpectrum(
  c: ArrayLike<number>,
  size: number,
): { re: Float64Array; im: Float64Array } {
  const folded = new Float64Array(size);
  for (let n = 0; n < c.length; n++) folded[n % size]! += c[n] as number;
  return realFft(folded);
}

/**
 * Frequency response on a dense grid from 0 to fs/2, by FFT:
 * H(f) = B(f)/A(f) with B(f) = Σ b[n] e^(−j2πfn/fs) (A likewise), at
 * f_k = k·fs/(2(points−1)), k = 0 … points−1.
 *
 * Coefficient lists longer than the transform are folded modulo its length
 * first, which gives the exact DFT samples (no truncation). Grids whose
 * transform length 2(points−1) is not a power of two use Bluestein's algorithm.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §5.3 (frequency response of rational systems) and §8.4 (DFT as samples of the DTFT).
 *
 * @param taps FIR taps h[0..N−1], or the numerator b when `options.denominator` is given.
 * @param fs Sample rate in Hz, > 0.
 * @param options Grid density and optional denominator.
 * @returns The response at `points` frequencies, 0 and fs/2 included.
 * @throws {RangeError} When fs ≤ 0, points < 2 or a[0] = 0.
 * @throws {TypeError} When a coefficient is not finite.
 * @example
 * ```ts
 * import { frequencyResponse } from "./frequency_response.ts";
 * const h = frequencyResponse([0.5, 0.5], 48000, { points: 3 });
 * // [0.5, 0.5] passes DC with gain 1 and has a null at fs/2.
 * if (h.re[0] !== 1 || Math.abs(h.re[2]!) > 1e-15 || h.frequencies[2] !== 24000) {
 *   throw new Error("two-tap average");
 * }
 * ```
 */
export function frequencyResponse(
  taps: ArrayLike<number>,
  fs: number,
  options: FrequencyGridOptions = {},
): FrequencyResponse {
  requireSamples("Taps", taps);
  requireSampleRate(fs);
  const points = options.points ?? 4097;
  requireInteger("Number of frequency points", points, 2);
  const denominator = options.denominator;
  if (denominator !== undefined) {
    requireSamples("Denominator", denominator);
    if (denominator[0] === 0) throw new RangeError("Denominator a[0] must not be 0, got 0");
  }
  const size = 2 * (points - 1);
  const { re, im } = foldedSpectrum(taps, size);
  const bins = points;
  const out: FrequencyResponse = {
    frequencies: new Float64Array(bins),
    re: re.length === bins ? re : re.slice(0, bins),
    im: im.length === bins ? im : im.slice(0, bins),
  };
  for (let k = 0; k < bins; k++) out.frequencies[k] = (k * fs) / size;
  if (denominator !== undefined && !(denominator.length === 1 && denominator[0] === 1)) {
    const a = foldedSpectrum(denominator, size);
    for (let k = 0; k < bins; k++) {
      const nr = out.re[k]!;
      const ni = out.im[k]!;
      const dr = a.re[k]!;
      const di = a.im[k]!;
      const d = dr * dr + di * di;
      out.re[k] = (nr * dr + ni * di) / d;
      out.im[k] = (ni * dr - nr * di) / d;
    }
  }
  return out;
}

/**
 * Response of a rational filter B(z)/A(z) at any frequencies, by direct
 * evaluation: H(f) = Σ b[k] z^−k / Σ a[k] z^−k with z = e^(j2πf/fs).
 *
 * @param numerator b[0..M] (FIR taps when `denominator` is [1]).
 * @param denominator a[0..N], a[0] ≠ 0. @default [1]
 * @param frequencies Frequencies in Hz, each in [0, fs/2].
 * @param fs Sample rate in Hz.
 * @returns The response at the given frequencies.
 * @throws {RangeError} When a frequency is outside [0, fs/2] or a[0] = 0.
 * @example
 * ```ts
 * import { responseAt } from "./frequency_response.ts";
 * // One-pole lowpass 1/(1 − 0.5 z^−1) has gain 1/(1 − 0.5) = 2 at DC.
 * const h = responseAt([1], [1, -0.5], [0], 1000);
 * if (Math.abs(h.re[0]! - 2) > 1e-15) throw new Error("DC gain 2");
 * ```
 */
export function responseAt(
  numerator: ArrayLike<number>,
  denominator: ArrayLike<number>,
  frequencies: ArrayLike<number>,
  fs: number,
): FrequencyResponse {
  requireSamples("Numerator", numerator);
  requireSamples("Denominator", denominator);
  requireSampleRate(fs);
  if (denominator[0] === 0) throw new RangeError("Denominator a[0] must not be 0, got 0");
  const count = frequencies.length;
  const out: FrequencyResponse = {
    frequencies: Float64Array.from(frequencies),
    re: new Float64Array(count),
    im: new Float64Array(count),
  };
  for (let i = 0; i < count; i++) {
    const f = frequencies[i] as number;
    requireFrequency(`Frequency [${i}]`, f, fs);
    const w = (2 * Math.PI * f) / fs;
    const [nr, ni] = polyAtUnitCircle(numerator, w);
    const [dr, di] = polyAtUnitCircle(denominator, w);
    const d = dr * dr + di * di;
    out.re[i] = (nr * dr + ni * di) / d;
    out.im[i] = (ni * dr - nr * di) / d;
  }
  return out;
}

/** Σ c[k] e^(−jωk) by Horner's rule in z^−1. */
function polyAtUnitCircle(c: ArrayLike<number>, w: number): [number, number] {
  const zr = Math.cos(w);
  const zi = -Math.sin(w);
  let re = 0;
  let im = 0;
  for (let k = c.length - 1; k >= 0; k--) {
    const r = re * zr - im * zi + (c[k] as number);
    im = re * zi + im * zr;
    re = r;
  }
  return [re, im];
}

/**
 * Magnitude in dB, 20·log10|H|, floored at −400 dB so exact nulls stay finite.
 *
 * @param response A frequency response.
 * @returns One dB value per frequency.
 * @example
 * ```ts
 * import { magnitudeDb, responseAt } from "./frequency_response.ts";
 * const db = magnitudeDb(responseAt([0.5, 0.5], [1], [12000], 48000));
 * // |cos(π/4)| = −3.0103 dB at fs/4.
 * if (Math.abs(db[0]! + 3.0103) > 1e-4) throw new Error("−3 dB at fs/4");
 * ```
 */
export function magnitudeDb(response: FrequencyResponse): Float64Array {
  const out = new Float64Array(response.re.length);
  for (let i = 0; i < out.length; i++) {
    const m = Math.hypot(response.re[i] as number, response.im[i] as number);
    out[i] = Math.max(20 * Math.log10(m), -400);
  }
  return out;
}

/**
 * Magnitude |H| (linear).
 *
 * @param response A frequency response.
 * @returns One magnitude per frequency.
 * @example
 * ```ts
 * import { magnitude, responseAt } from "./frequency_response.ts";
 * if (magnitude(responseAt([2], [1], [0], 10))[0] !== 2) throw new Error("gain 2");
 * ```
 */
export function magnitude(response: FrequencyResponse): Float64Array {
  const out = new Float64Array(response.re.length);
  for (let i = 0; i < out.length; i++) {
    out[i] = Math.hypot(response.re[i] as number, response.im[i] as number);
  }
  return out;
}

/**
 * Phase in radians, unwrapped along the frequency grid: each step between
 * neighbouring points is taken modulo 2π into (−π, π]. The grid must be dense
 * enough that the true phase moves less than π between points.
 *
 * @param response A frequency response on an increasing grid.
 * @returns Unwrapped phase in radians, starting from the principal value at the first point.
 * @example
 * ```ts
 * import { frequencyResponse, unwrappedPhase } from "./frequency_response.ts";
 * // A pure delay of 3 samples has phase −3ω, beyond −π at fs/2: unwrapping keeps it linear.
 * const p = unwrappedPhase(frequencyResponse([0, 0, 0, 1], 2, { points: 9 }));
 * if (Math.abs(p[8]! + 3 * Math.PI) > 1e-12) throw new Error("−3π at Nyquist");
 * ```
 */
export function unwrappedPhase(response: FrequencyResponse): Float64Array {
  const n = response.re.length;
  const out = new Float64Array(n);
  let previous = 0;
  let offset = 0;
  for (let i = 0; i < n; i++) {
    const p = Math.atan2(response.im[i] as number, response.re[i] as number);
    if (i > 0) {
      let d = p - previous;
      while (d > Math.PI) {
        offset -= 2 * Math.PI;
        d -= 2 * Math.PI;
      }
      while (d <= -Math.PI) {
        offset += 2 * Math.PI;
        d += 2 * Math.PI;
      }
    }
    out[i] = p + offset;
    previous = p;
  }
  return out;
}

/**
 * Phase in radians, wrapped to the principal value (−π, π]: φ = atan2(Im H, Re H).
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.1.1 (ARG[H]).
 *
 * @param response A frequency response.
 * @returns One phase per frequency, in (−π, π].
 * @example
 * ```ts
 * import { responseAt, wrappedPhase } from "./frequency_response.ts";
 * // Two-tap average: phase −πf/fs, so −π/4 at fs/4.
 * const p = wrappedPhase(responseAt([0.5, 0.5], [1], [250], 1000));
 * if (Math.abs(p[0]! + Math.PI / 4) > 1e-15) throw new Error("−π/4");
 * ```
 */
export function wrappedPhase(response: FrequencyResponse): Float64Array {
  const out = new Float64Array(response.re.length);
  for (let i = 0; i < out.length; i++) {
    const p = Math.atan2(response.im[i] as number, response.re[i] as number);
    out[i] = p === -Math.PI ? Math.PI : p;
  }
  return out;
}
