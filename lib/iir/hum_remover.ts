import type { DesignWarning, Section } from "../types.ts";
import { requireInteger, requirePositive, requireSampleRate, show } from "../_validate.ts";

/** Options for {@link designHumRemover}. */
export interface HumRemoverOptions {
  /** Sample rate in Hz, > 0. */
  fs: number;
  /** Mains frequency: 50 or 60 Hz. */
  mainsFrequency: 50 | 60;
  /**
   * Number of frequencies to notch: the fundamental and its harmonics
   * k·f_mains for k = 1..harmonics, stopping below fs/2.
   * @default 1
   */
  harmonics?: number;
  /** −3 dB width of every notch in Hz, > 0 and below the mains frequency. @default 2 */
  bandwidth?: number;
}

/** A cascade of notches for mains interference. */
export interface HumRemover {
  /** One notch section per frequency, fundamental first. */
  sections: Section[];
  /** The notched frequencies in Hz. */
  frequencies: number[];
  /** Soft trouble, e.g. harmonics dropped at fs/2. */
  warnings: DesignWarning[];
}

/**
 * Mains-hum remover: a cascade of second-order notches at the mains
 * frequency and its harmonics, each with the same −3 dB width in Hz. Each
 * notch is the cookbook notch b = [1, −2cos ω_k, 1]/(1 + α),
 * a = [1, −2cos ω_k/(1 + α), (1 − α)/(1 + α)], with α = tan(π·BW/fs), which
 * makes the −3 dB points exactly BW Hz apart (pole radius² = (1 − α)/(1 + α)).
 * Unity gain at DC and far from the notches, an exact null at each k·f_mains.
 *
 * Source: S. K. Mitra, Digital Signal Processing: A Computer-Based
 * Approach, ch. 7, "simple IIR digital filters", second-order notch with
 * −3 dB width B_w where a2 = (1 − tan(B_w/2))/(1 + tan(B_w/2)) (chapter cited
 * from memory); R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad
 * filter coefficients" (notch form).
 *
 * @param options fs, mains frequency (50 or 60 Hz), number of harmonics, notch width.
 * @returns The sections, the notched frequencies and warnings.
 * @throws {RangeError} When the mains frequency is not 50 or 60 Hz, lies at or
 *   above fs/2, harmonics < 1 or > 100, or the width is not in (0, mains frequency).
 * @example
 * ```ts
 * import { designHumRemover } from "./hum_remover.ts";
 * import { sectionsResponse } from "./analysis.ts";
 * const hum = designHumRemover({ fs: 1000, mainsFrequency: 50, harmonics: 3 });
 * const h = sectionsResponse(hum.sections, [50, 100, 150, 0], 1000);
 * const mag = (i: number) => Math.hypot(h.re[i]!, h.im[i]!);
 * if (mag(0) > 1e-12 || mag(1) > 1e-12 || mag(2) > 1e-12 || Math.abs(mag(3) - 1) > 1e-12) {
 *   throw new Error("nulls at 50, 100, 150 Hz; unity at DC");
 * }
 * ```
 */
export function designHumRemover(options: HumRemoverOptions): HumRemover {
  if (options === null || typeof options !== "object") {
    throw new TypeError(`Hum remover options must be an object, got ${String(options)}`);
  }
  const { fs, mainsFrequency } = options;
  const harmonics = options.harmonics ?? 1;
  const bandwidth = options.bandwidth ?? 2;
  requireSampleRate(fs);
  if (mainsFrequency !== 50 && mainsFrequency !== 60) {
    throw new RangeError(`Mains frequency must be 50 or 60 Hz, got ${String(mainsFrequency)} Hz`);
  }
  if (mainsFrequency >= fs / 2) {
    throw new RangeError(
      `Mains frequency must be below fs/2 = ${show(fs / 2)} Hz, got ${mainsFrequency} Hz`,
    );
  }
  requireInteger("Number of harmonics", harmonics, 1, 100);
  requirePositive("Notch bandwidth", bandwidth, " Hz");
  if (bandwidth >= mainsFrequency) {
    throw new RangeError(
      `Notch bandwidth must be below the mains frequency ${mainsFrequency} Hz, got ${
        show(bandwidth)
      } Hz`,
    );
  }
  const alpha = Math.tan((Math.PI * bandwidth) / fs);
  const sections: Section[] = [];
  const frequencies: number[] = [];
  const warnings: DesignWarning[] = [];
  for (let k = 1; k <= harmonics; k++) {
    const f = k * mainsFrequency;
    if (f + bandwidth / 2 >= fs / 2) {
      warnings.push({
        code: "harmonics-dropped",
        message: `Harmonics from ${f} Hz on were not notched: they reach fs/2 = ${
          show(fs / 2)
        } Hz.`,
      });
      break;
    }
    const c = Math.cos((2 * Math.PI * f) / fs);
    const g = 1 / (1 + alpha);
    sections.push({ b0: g, b1: -2 * c * g, b2: g, a1: -2 * c * g, a2: (1 - alpha) * g });
    frequencies.push(f);
  }
  return { sections, frequencies, warnings };
}
