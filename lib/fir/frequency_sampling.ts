import { requireFinite, requireInteger, requireSampleRate, show } from "../_validate.ts";
import { designWindow } from "./_design_window.ts";
import { inverseRealFft } from "../fft/real_fft.ts";
import type { DesignWindow } from "./types.ts";

/** Specification of a frequency-sampling FIR. */
export interface FrequencySamplingOptions {
  /** Number of taps N (order N − 1), 1 ≤ N ≤ 2^16. */
  length: number;
  /** Sample rate in Hz. */
  fs: number;
  /**
   * Breakpoints of the wanted magnitude in Hz: non-decreasing, first 0, last
   * fs/2. A frequency given twice marks a jump (from the first gain to the
   * second); no frequency more than twice, and neither 0 nor fs/2 twice.
   * Transition samples are breakpoints inside a transition band (e.g. a gain of
   * about 0.4 midway across a one-sample transition).
   */
  frequencies: readonly number[];
  /** Wanted gain (linear) at each breakpoint; linear between breakpoints. */
  gains: readonly number[];
  /** Window applied to the sampled impulse response; "rectangular" for none. @default "hamming" */
  window?: DesignWindow;
  /**
   * Number of equally spaced samples of the wanted response from 0 to fs/2
   * inclusive, with 2(points − 1) ≥ N. @default 1 + the smallest power of two ≥ N
   */
  gridPoints?: number;
  /** Antisymmetric taps (types III/IV: zero at 0 Hz, and at fs/2 for odd N). @default false */
  antisymmetric?: boolean;
}

/**
 * FIR filter by frequency sampling: the wanted magnitude, interpolated linearly
 * between breakpoints onto K + 1 equally spaced frequencies f_k = k·fs/(2K), is
 * given the linear phase e^(−jπk(N−1)/(2K)) (times j for antisymmetric taps); the
 * inverse real DFT of length 2K gives the impulse response, whose first N
 * samples are kept and windowed.
 *
 * At a jump the grid sample falling exactly on it takes the mean of the two
 * gains. The designs agree with the usual reference implementation
 * (scipy.signal.firwin2) to rounding.
 *
 * Source: L. R. Rabiner, B. Gold and C. A. McGonegal, "An approach to the
 * approximation problem for nonrecursive digital filters", IEEE Trans. Audio
 * Electroacoust. 18(2), 1970; Oppenheim & Schafer, Discrete-Time Signal
 * Processing, 3rd ed., problem 7.50 (frequency-sampling design).
 *
 * @param options Length, sample rate, breakpoints, gains, window, grid, symmetry.
 * @returns The taps h[0..N−1].
 * @throws {RangeError} When the breakpoints do not start at 0, end at fs/2 or
 *   decrease, a frequency repeats more than twice, the grid is too coarse, or
 *   the type's forced zeros (fs/2 for even symmetric N; 0 Hz for antisymmetric;
 *   fs/2 for odd antisymmetric N) meet a non-zero gain.
 * @throws {TypeError} When frequencies and gains differ in length or hold non-numbers.
 * @example
 * ```ts
 * import { designFrequencySampling } from "./frequency_sampling.ts";
 * const h = designFrequencySampling({
 *   length: 31, fs: 2, frequencies: [0, 0.5, 0.5, 1], gains: [1, 1, 0, 0],
 * });
 * const dc = h.reduce((a, b) => a + b, 0);
 * if (Math.abs(dc - 1) > 0.01 || Math.abs(h[0]! - h[30]!) > 1e-15) throw new Error("lowpass");
 * ```
 */
export function designFrequencySampling(options: FrequencySamplingOptions): Float64Array {
  const { length, fs, frequencies, gains } = options;
  const antisymmetric = options.antisymmetric ?? false;
  requireInteger("Number of taps", length, 1, 1 << 16);
  requireSampleRate(fs);
  if (!Array.isArray(frequencies) || !Array.isArray(gains) || frequencies.length !== gains.length) {
    throw new TypeError(
      `Frequencies and gains must be arrays of equal length, got ${
        Array.isArray(frequencies) ? frequencies.length : typeof frequencies
      } and ${Array.isArray(gains) ? gains.length : typeof gains}`,
    );
  }
  const count = frequencies.length;
  if (count < 2) throw new RangeError(`At least two breakpoints are needed, got ${count}`);
  frequencies.forEach((f, i) => requireFinite(`Frequency ${i + 1}`, f));
  gains.forEach((g, i) => requireFinite(`Gain ${i + 1}`, g));
  const nyquist = fs / 2;
  if (frequencies[0] !== 0 || frequencies[count - 1] !== nyquist) {
    throw new RangeError(
      `Breakpoints must start at 0 Hz and end at fs/2 = ${show(nyquist)} Hz, got ${
        show(frequencies[0]!)
      } … ${show(frequencies[count - 1]!)} Hz`,
    );
  }
  for (let i = 1; i < count; i++) {
    const d = frequencies[i]! - frequencies[i - 1]!;
    if (d < 0) {
      throw new RangeError(
        `Breakpoint frequencies must not decrease: ${show(frequencies[i]!)} Hz follows ${
          show(frequencies[i - 1]!)
        } Hz`,
      );
    }
    if (d === 0 && i >= 2 && frequencies[i - 1] === frequencies[i - 2]) {
      throw new RangeError(
        `A breakpoint frequency may appear at most twice, got ${
          show(frequencies[i]!)
        } Hz three times`,
      );
    }
  }
  if (frequencies[1] === 0 || frequencies[count - 2] === nyquist) {
    throw new RangeError("Neither 0 Hz nor fs/2 may be given twice (a jump needs two sides)");
  }
  const odd = length % 2 === 1;
  const g0 = gains[0]!;
  const gN = gains[count - 1]!;
  if (!antisymmetric && !odd && gN !== 0) {
    throw new RangeError(
      `An even number of symmetric taps forces a zero at fs/2 (type II), but the gain there is ${
        show(gN)
      }: use an odd length, got ${length}`,
    );
  }
  if (antisymmetric && g0 !== 0) {
    throw new RangeError(
      `Antisymmetric taps force a zero at 0 Hz, but the gain there is ${show(g0)}`,
    );
  }
  if (antisymmetric && odd && gN !== 0) {
    throw new RangeError(
      `An odd number of antisymmetric taps (type III) forces a zero at fs/2, but the gain there is ${
        show(gN)
      }: use an even length, got ${length}`,
    );
  }
  let points = options.gridPoints;
  if (points === undefined) {
    points = 2;
    while (points < length) points *= 2;
    points += 1;
  }
  requireInteger("Grid points", points, 2, 1 << 22);
  const half = points - 1; // K
  const size = 2 * half; // inverse DFT length
  if (size < length) {
    throw new RangeError(
      `Grid points must satisfy 2(points − 1) ≥ number of taps ${length}, got ${points}`,
    );
  }
  // Wanted magnitude on the grid.
  const wanted = new Float64Array(points);
  let seg = 0;
  for (let k = 0; k < points; k++) {
    const f = (k * nyquist) / half;
    while (seg < count - 2 && frequencies[seg + 1]! < f) seg++;
    // f lies in [freq[seg], freq[seg+1]]; a jump at f gives the mean of its two sides.
    const fa = frequencies[seg]!;
    const fb = frequencies[seg + 1]!;
    if (fb === f && seg + 2 < count && frequencies[seg + 2] === f) {
      wanted[k] = (gains[seg + 1]! + gains[seg + 2]!) / 2;
    } else if (fb === fa) {
      wanted[k] = gains[seg + 1]!;
    } else {
      wanted[k] = gains[seg]! + ((gains[seg + 1]! - gains[seg]!) * (f - fa)) / (fb - fa);
    }
  }
  // h[n] = (1/size)·Σ_k X_k e^{j2πkn/size} with X_{size−k} = X_k*: an inverse real
  // DFT of X_k = wanted_k·e^{−jπk(N−1)/(2K)} (·j when antisymmetric), Im X_0 and
  // Im X_K dropped; only the first N samples are kept.
  const xr = new Float64Array(points);
  const xi = new Float64Array(points);
  for (let k = 0; k < points; k++) {
    const angle = (-Math.PI * k * (length - 1)) / (2 * half);
    const c = Math.cos(angle);
    const s = Math.sin(angle);
    xr[k] = wanted[k]! * (antisymmetric ? -s : c);
    xi[k] = wanted[k]! * (antisymmetric ? c : s);
  }
  const taps = inverseRealFft({ re: xr, im: xi }, size).slice(0, length);
  const w = designWindow(length, options.window ?? "hamming");
  for (let n = 0; n < length; n++) taps[n]! *= w[n]!;
  if (antisymmetric && odd) taps[(length - 1) / 2] = 0;
  return taps;
}
