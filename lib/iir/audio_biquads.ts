import type { Section } from "../types.ts";
import {
  requireBandEdge,
  requireFinite,
  requirePositive,
  requireSampleRate,
} from "../_validate.ts";

/** Options shared by the audio equaliser biquads. */
export interface BiquadOptions {
  /** Sample rate in Hz, > 0. */
  fs: number;
  /** Centre (peaking, notch, band-pass, all-pass) or corner (shelves) frequency in Hz, inside (0, fs/2). */
  frequency: number;
  /** Quality factor Q, > 0 (shelves: Q = 1/√2 gives the steepest slope without overshoot). @default Math.SQRT1_2 */
  q?: number;
}

/** Options for biquads with a gain: peaking and shelves. */
export interface GainBiquadOptions extends BiquadOptions {
  /** Gain in dB at the centre (peaking) or on the shelf; negative cuts. */
  gainDb: number;
}

interface Intermediate {
  cosW: number;
  alpha: number;
}

function prepare(options: BiquadOptions): Intermediate {
  if (options === null || typeof options !== "object") {
    throw new TypeError(`Biquad options must be an object, got ${String(options)}`);
  }
  const { fs, frequency } = options;
  const q = options.q ?? Math.SQRT1_2;
  requireSampleRate(fs);
  requireBandEdge("Frequency", frequency, fs);
  requirePositive("Q", q);
  const w0 = (2 * Math.PI * frequency) / fs;
  return { cosW: Math.cos(w0), alpha: Math.sin(w0) / (2 * q) };
}

function normalise(
  b0: number,
  b1: number,
  b2: number,
  a0: number,
  a1: number,
  a2: number,
): Section {
  return { b0: b0 / a0, b1: b1 / a0, b2: b2 / a0, a1: a1 / a0, a2: a2 / a0 };
}

function amplitude(options: GainBiquadOptions): number {
  requireFinite("Gain", options.gainDb);
  if (Math.abs(options.gainDb) > 60) {
    throw new RangeError(`Gain must be between -60 dB and 60 dB, got ${options.gainDb} dB`);
  }
  return Math.pow(10, options.gainDb / 40);
}

/**
 * Peaking equaliser biquad (bell): gain `gainDb` at the centre frequency,
 * unity far from it. With A = 10^(G/40), ω0 = 2πf0/fs, α = sin ω0/(2Q):
 * b = [1 + αA, −2cos ω0, 1 − αA], a = [1 + α/A, −2cos ω0, 1 − α/A].
 *
 * Source: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter
 * coefficients" (music-dsp mailing list, 1998; W3C Audio EQ Cookbook note).
 *
 * @param options fs, centre frequency (Hz), Q and gain (dB, |G| ≤ 60).
 * @returns One section, a0 = 1.
 * @throws {RangeError} Frequency outside (0, fs/2), Q ≤ 0, |gain| > 60 dB.
 * @example
 * ```ts
 * import { designPeakingBiquad } from "./audio_biquads.ts";
 * import { sectionsResponse } from "./analysis.ts";
 * const s = designPeakingBiquad({ fs: 48000, frequency: 1000, q: 2, gainDb: 6 });
 * const h = sectionsResponse([s], [1000], 48000);
 * if (Math.abs(20 * Math.log10(Math.hypot(h.re[0]!, h.im[0]!)) - 6) > 1e-12) throw new Error("+6 dB");
 * ```
 */
export function designPeakingBiquad(options: GainBiquadOptions): Section {
  const { cosW, alpha } = prepare(options);
  const a = amplitude(options);
  return normalise(
    1 + alpha * a,
    -2 * cosW,
    1 - alpha * a,
    1 + alpha / a,
    -2 * cosW,
    1 - alpha / a,
  );
}

/**
 * Low-shelf biquad: gain `gainDb` at DC, unity at fs/2, half the dB gain at
 * the corner frequency. With A = 10^(G/40), α = sin ω0/(2Q), c = cos ω0:
 * b = A·[(A+1) − (A−1)c + 2√A·α, 2((A−1) − (A+1)c), (A+1) − (A−1)c − 2√A·α],
 * a = [(A+1) + (A−1)c + 2√A·α, −2((A−1) + (A+1)c), (A+1) + (A−1)c − 2√A·α].
 *
 * Source: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter coefficients".
 *
 * @param options fs, corner frequency (Hz), Q and shelf gain (dB, |G| ≤ 60).
 * @returns One section, a0 = 1.
 * @throws {RangeError} Frequency outside (0, fs/2), Q ≤ 0, |gain| > 60 dB.
 * @example
 * ```ts
 * import { designLowShelfBiquad } from "./audio_biquads.ts";
 * const s = designLowShelfBiquad({ fs: 48000, frequency: 200, gainDb: -12 });
 * const dc = (s.b0 + s.b1 + s.b2) / (1 + s.a1 + s.a2);
 * if (Math.abs(20 * Math.log10(dc) + 12) > 1e-9) throw new Error("−12 dB shelf");
 * ```
 */
export function designLowShelfBiquad(options: GainBiquadOptions): Section {
  const { cosW: c, alpha } = prepare(options);
  const a = amplitude(options);
  const k = 2 * Math.sqrt(a) * alpha;
  return normalise(
    a * ((a + 1) - (a - 1) * c + k),
    2 * a * ((a - 1) - (a + 1) * c),
    a * ((a + 1) - (a - 1) * c - k),
    (a + 1) + (a - 1) * c + k,
    -2 * ((a - 1) + (a + 1) * c),
    (a + 1) + (a - 1) * c - k,
  );
}

/**
 * High-shelf biquad: gain `gainDb` at fs/2, unity at DC, half the dB gain at
 * the corner frequency. With A = 10^(G/40), α = sin ω0/(2Q), c = cos ω0:
 * b = A·[(A+1) + (A−1)c + 2√A·α, −2((A−1) + (A+1)c), (A+1) + (A−1)c − 2√A·α],
 * a = [(A+1) − (A−1)c + 2√A·α, 2((A−1) − (A+1)c), (A+1) − (A−1)c − 2√A·α].
 *
 * Source: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter coefficients".
 *
 * @param options fs, corner frequency (Hz), Q and shelf gain (dB, |G| ≤ 60).
 * @returns One section, a0 = 1.
 * @throws {RangeError} Frequency outside (0, fs/2), Q ≤ 0, |gain| > 60 dB.
 * @example
 * ```ts
 * import { designHighShelfBiquad } from "./audio_biquads.ts";
 * const s = designHighShelfBiquad({ fs: 48000, frequency: 8000, gainDb: 4 });
 * const nyquist = (s.b0 - s.b1 + s.b2) / (1 - s.a1 + s.a2);
 * if (Math.abs(20 * Math.log10(nyquist) - 4) > 1e-9) throw new Error("+4 dB shelf");
 * ```
 */
export function designHighShelfBiquad(options: GainBiquadOptions): Section {
  const { cosW: c, alpha } = prepare(options);
  const a = amplitude(options);
  const k = 2 * Math.sqrt(a) * alpha;
  return normalise(
    a * ((a + 1) + (a - 1) * c + k),
    -2 * a * ((a - 1) + (a + 1) * c),
    a * ((a + 1) + (a - 1) * c - k),
    (a + 1) - (a - 1) * c + k,
    2 * ((a - 1) - (a + 1) * c),
    (a + 1) - (a - 1) * c - k,
  );
}

/**
 * Notch biquad: a null exactly at the centre frequency, unity at DC and
 * fs/2. b = [1, −2cos ω0, 1], a = [1 + α, −2cos ω0, 1 − α], α = sin ω0/(2Q).
 * Its −3 dB width is exactly Δω = 2·atan(α) rad/sample (pole radius² =
 * (1 − α)/(1 + α)); designHumRemover uses this to set widths in Hz.
 *
 * Source: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter coefficients".
 *
 * @param options fs, centre frequency (Hz) and Q.
 * @returns One section, a0 = 1.
 * @throws {RangeError} Frequency outside (0, fs/2) or Q ≤ 0.
 * @example
 * ```ts
 * import { designNotchBiquad } from "./audio_biquads.ts";
 * import { sectionsResponse } from "./analysis.ts";
 * const s = designNotchBiquad({ fs: 1000, frequency: 50, q: 30 });
 * const h = sectionsResponse([s], [50, 0], 1000);
 * if (Math.hypot(h.re[0]!, h.im[0]!) > 1e-12 || Math.abs(h.re[1]! - 1) > 1e-12) throw new Error("notch");
 * ```
 */
export function designNotchBiquad(options: BiquadOptions): Section {
  const { cosW, alpha } = prepare(options);
  return normalise(1, -2 * cosW, 1, 1 + alpha, -2 * cosW, 1 - alpha);
}

/**
 * Second-order all-pass biquad: |H| = 1 at every frequency, phase −π at the
 * centre frequency. b = [1 − α, −2cos ω0, 1 + α], a = [1 + α, −2cos ω0, 1 − α].
 *
 * Source: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter coefficients".
 *
 * @param options fs, centre frequency (Hz) and Q.
 * @returns One section, a0 = 1.
 * @throws {RangeError} Frequency outside (0, fs/2) or Q ≤ 0.
 * @example
 * ```ts
 * import { designAllPassBiquad } from "./audio_biquads.ts";
 * const s = designAllPassBiquad({ fs: 48000, frequency: 3000, q: 0.7 });
 * // Numerator is the reversed denominator: b0 = a2, b2 = 1.
 * if (Math.abs(s.b0 - s.a2) > 1e-16 || Math.abs(s.b2 - 1) > 1e-16) throw new Error("all-pass");
 * ```
 */
export function designAllPassBiquad(options: BiquadOptions): Section {
  const { cosW, alpha } = prepare(options);
  return normalise(1 - alpha, -2 * cosW, 1 + alpha, 1 + alpha, -2 * cosW, 1 - alpha);
}

/**
 * Band-pass biquad with 0 dB peak gain at the centre frequency:
 * b = [α, 0, −α], a = [1 + α, −2cos ω0, 1 − α], α = sin ω0/(2Q).
 *
 * Source: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter
 * coefficients" (constant 0 dB peak gain form).
 *
 * @param options fs, centre frequency (Hz) and Q.
 * @returns One section, a0 = 1.
 * @throws {RangeError} Frequency outside (0, fs/2) or Q ≤ 0.
 * @example
 * ```ts
 * import { designBandPassBiquad } from "./audio_biquads.ts";
 * const s = designBandPassBiquad({ fs: 8000, frequency: 1000, q: 5 });
 * // Zeros at DC and fs/2.
 * if (s.b0 + s.b1 + s.b2 !== 0 || s.b0 - s.b1 + s.b2 !== 0) throw new Error("zeros at 0 and fs/2");
 * ```
 */
export function designBandPassBiquad(options: BiquadOptions): Section {
  const { cosW, alpha } = prepare(options);
  return normalise(alpha, 0, -alpha, 1 + alpha, -2 * cosW, 1 - alpha);
}
