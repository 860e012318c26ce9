// Data shapes shared by the FIR design methods.

/**
 * One band of a multiband specification. Edges in Hz with 0 ≤ from < to ≤ fs/2;
 * bands are listed in increasing frequency and do not touch (the gaps between
 * them are the transition bands, where the response is left free).
 */
export interface DesignBand {
  /** Lower band edge in Hz. */
  from: number;
  /** Upper band edge in Hz. */
  to: number;
  /**
   * Wanted gain (linear amplitude) in the band: 1 for a passband, 0 for a stopband.
   * For a differentiator, the slope g of D(ω) = g·ω with ω in rad/sample.
   */
  gain: number;
  /**
   * Wanted gain at `to` when it differs from `gain` at `from` (a sloped band;
   * least-squares and frequency-sampling designs only). @default gain
   */
  endGain?: number;
  /** Relative weight of the error in this band, > 0. @default 1 */
  weight?: number;
}

/** Frequency-selective responses the single-cutoff design calls accept. */
export type BandShape = "lowpass" | "highpass" | "bandpass" | "bandstop";

/** Windows the window-method and frequency-sampling designs accept by name. */
export type DesignWindowName = "rectangular" | "hann" | "hamming" | "blackman";

/** A design window: by name, or a Kaiser window with its shape β (0 ≤ β ≤ 10000). */
export type DesignWindow = DesignWindowName | { name: "kaiser"; beta: number };
