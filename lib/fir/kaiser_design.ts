import type { BandShape } from "./types.ts";
import { kaiserParameters } from "./kaiser_parameters.ts";
import { designWindowedSinc } from "./windowed_sinc.ts";

/** Specification for {@link designKaiserFilter}. */
export interface KaiserFilterSpec {
  /** Sample rate in Hz. */
  fs: number;
  /** Cutoff(s) in Hz: the middle of each transition band, strictly inside (0, fs/2). */
  cutoff: number | readonly number[];
  /** Band shape. @default "lowpass" */
  response?: BandShape | "multiband";
  /** For "multiband": whether the band at 0 Hz passes. @default "pass" */
  firstBand?: "pass" | "stop";
  /** Width of every transition band in Hz (stopband edge − passband edge), 0 < width < fs/2. */
  transitionWidth: number;
  /** Attenuation A in dB (0 < A ≤ 300), or give `ripple`. */
  attenuationDb?: number;
  /** Peak deviation δ (linear, 0 < δ < 1) in both bands; used when attenuationDb is absent. */
  ripple?: number;
}

/** Result of {@link designKaiserFilter}. */
export interface KaiserFilterDesign {
  /** The taps. */
  taps: Float64Array;
  /** Number of taps (Kaiser's estimate, made odd when the response passes fs/2). */
  length: number;
  /** Kaiser window β. */
  beta: number;
}

/**
 * Window-method FIR sized by Kaiser's formulas in one call: length and β from
 * the attenuation (or ripple) and transition width ({@link kaiserParameters}),
 * then {@link designWindowedSinc} with that Kaiser window. A response that
 * passes fs/2 (highpass, bandstop, …) gets one more tap when the estimate is
 * even, since an even-length symmetric filter has a zero at fs/2.
 *
 * The taps are not rescaled, so the ripple is symmetric about the wanted gains
 * as Kaiser's formulas assume. The formulas are estimates: check the result (e.g. with measureBands) and
 * add a tap or two if a band falls short.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §7.6 (the Kaiser window filter design method).
 *
 * @param spec Sample rate, cutoff(s), response, transition width, attenuation or ripple.
 * @returns Taps, length and β.
 * @throws {RangeError} For out-of-range numbers (see kaiserParameters and designWindowedSinc).
 * @throws {TypeError} When neither attenuationDb nor ripple is given, or for an unknown response.
 * @example
 * ```ts
 * import { designKaiserFilter } from "./kaiser_design.ts";
 * const d = designKaiserFilter({
 *   fs: 48000, cutoff: 6000, response: "highpass", transitionWidth: 1000, attenuationDb: 60,
 * });
 * if (d.length % 2 !== 1 || Math.abs(d.beta - 5.653) > 1e-3) throw new Error("odd, β for 60 dB");
 * ```
 */
export function designKaiserFilter(spec: KaiserFilterSpec): KaiserFilterDesign {
  const k = kaiserParameters({
    fs: spec.fs,
    transitionWidth: spec.transitionWidth,
    ...(spec.attenuationDb !== undefined ? { attenuationDb: spec.attenuationDb } : {}),
    ...(spec.ripple !== undefined ? { ripple: spec.ripple } : {}),
  });
  const response = spec.response ?? "lowpass";
  const cutoffs = typeof spec.cutoff === "number" ? 1 : spec.cutoff.length;
  const passZero = response === "multiband"
    ? (spec.firstBand ?? "pass") === "pass"
    : response === "lowpass" || response === "bandstop";
  const passesNyquist = (cutoffs % 2 === 1) !== passZero;
  const length = passesNyquist && k.length % 2 === 0 ? k.length + 1 : k.length;
  const taps = designWindowedSinc({
    length,
    fs: spec.fs,
    cutoff: spec.cutoff,
    response,
    ...(spec.firstBand !== undefined ? { firstBand: spec.firstBand } : {}),
    window: { name: "kaiser", beta: k.beta },
    // Unscaled: the ripple then lies symmetrically about the wanted gains, which is
    // what Kaiser's formulas predict (scaling to an exact passband gain tilts it).
    scale: false,
  });
  return { taps, length, beta: k.beta };
}
