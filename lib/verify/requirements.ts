// The requirement vocabulary: one interface per kind of requirement a worksheet can state.

/** Fields every requirement may carry. */
export interface RequirementLabel {
  /** Identifier in the product's own requirement list (traceability), e.g. "LC-SRS-041". */
  id?: string;
  /** Plain name for the report; a name is made from the requirement when absent. */
  name?: string;
}

/** Peak-to-peak passband ripple, max − min of 20·log10|H| over [from, to] Hz, at most `atMostDb`. */
export interface PassbandRippleRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "passbandRipple";
  /** Lower edge of the band in Hz, in [0, fs/2]. */
  from: number;
  /** Upper edge of the band in Hz, in [from, fs/2]. */
  to: number;
  /** Limit in dB the achieved value must not exceed. */
  atMostDb: number;
}

/** Largest deviation |20·log10|H| − gainDb| over [from, to] Hz, at most `atMostDb`. */
export interface PassbandDeviationRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "passbandDeviation";
  /** Lower edge of the band in Hz, in [0, fs/2]. */
  from: number;
  /** Upper edge of the band in Hz, in [from, fs/2]. */
  to: number;
  /** Limit in dB the achieved value must not exceed. */
  atMostDb: number;
  /** Nominal passband gain in dB. @default 0 */
  gainDb?: number;
}

/** Smallest attenuation referenceDb − 20·log10|H| over [from, to] Hz, at least `atLeastDb`. */
export interface StopbandAttenuationRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "stopbandAttenuation";
  /** Lower edge of the band in Hz, in [0, fs/2]. */
  from: number;
  /** Upper edge of the band in Hz, in [from, fs/2]. */
  to: number;
  /** Limit in dB the achieved value must reach. */
  atLeastDb: number;
  /** Passband reference level in dB the attenuation is measured from. @default 0 */
  referenceDb?: number;
}

/** Largest gain max 20·log10|H| over [from, to] Hz (headroom), at most `atMostDb`. */
export interface MaximumGainRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "maximumGain";
  /** Limit in dB the achieved value must not exceed. */
  atMostDb: number;
  /** Lower edge in Hz. @default 0 */
  from?: number;
  /** Upper edge in Hz. @default fs/2 */
  to?: number;
}

/** Gain at one frequency (DC, a band centre) within ±toleranceDb of gainDb. */
export interface GainAtRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "gainAt";
  /** Frequency in Hz, in [0, fs/2]; 0 for DC gain. */
  frequency: number;
  /** Wanted gain in dB. */
  gainDb: number;
  /** Allowed deviation from the wanted gain, in dB. */
  toleranceDb: number;
}

/**
 * The band edge: the first frequency in [from, to] Hz where 20·log10|H| passes
 * through `levelDb` (e.g. −3), at least `atLeastHz` or at most `atMostHz`.
 */
export type BandEdgeRequirement =
  & RequirementLabel
  & { kind: "bandEdge"; levelDb: number; from: number; to: number }
  & ({ atLeastHz: number; atMostHz?: never } | { atMostHz: number; atLeastHz?: never });

/** Largest group delay over [from, to] Hz, at most `atMostSamples`. */
export interface GroupDelayMaximumRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "groupDelayMaximum";
  /** Lower edge of the band in Hz, in [0, fs/2]. */
  from: number;
  /** Upper edge of the band in Hz, in [from, fs/2]. */
  to: number;
  /** Limit in samples. */
  atMostSamples: number;
}

/** Group-delay variation max τ − min τ over [from, to] Hz, at most `atMostSamples`. */
export interface GroupDelayFlatnessRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "groupDelayFlatness";
  /** Lower edge of the band in Hz, in [0, fs/2]. */
  from: number;
  /** Upper edge of the band in Hz, in [from, fs/2]. */
  to: number;
  /** Limit in samples. */
  atMostSamples: number;
}

/**
 * Linear phase over [from, to] Hz: the largest deviation of the unwrapped
 * phase from its least-squares straight line, at most `atMostDegrees`.
 * Judge it over a passband: a zero on the unit circle inside the band (as in
 * a stopband) flips the sign of the amplitude, a phase jump of π that counts
 * as deviation.
 */
export interface LinearPhaseRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "linearPhase";
  /** Lower edge of the band in Hz, in [0, fs/2]. */
  from: number;
  /** Upper edge of the band in Hz, in [from, fs/2]. */
  to: number;
  /** Limit in degrees. */
  atMostDegrees: number;
}

/** Stability margin 1 − max|pole|, at least `atLeast` (0 < atLeast ≤ 1 for a useful margin). */
export interface StabilityMarginRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "stabilityMargin";
  /** Smallest allowed margin, 1 − largest pole radius. */
  atLeast: number;
}

/**
 * Settling time of the step response: the time after which every sample stays
 * within ±tolerance·|final value| of the final value (the DC gain), at most
 * `atMostSeconds`.
 */
export interface SettlingTimeRequirement extends RequirementLabel {
  /** Which requirement this is. */
  kind: "settlingTime";
  /** Limit in seconds. */
  atMostSeconds: number;
  /** Settling band as a fraction of the final value, in (0, 1). @default 0.02 */
  tolerance?: number;
}

/** Any requirement of the vocabulary. */
export type Requirement =
  | PassbandRippleRequirement
  | PassbandDeviationRequirement
  | StopbandAttenuationRequirement
  | MaximumGainRequirement
  | GainAtRequirement
  | BandEdgeRequirement
  | GroupDelayMaximumRequirement
  | GroupDelayFlatnessRequirement
  | LinearPhaseRequirement
  | StabilityMarginRequirement
  | SettlingTimeRequirement;

/** A whole written specification: the sample rate and the list of requirements. */
export interface FilterSpec {
  /** Sample rate in Hz. */
  fs: number;
  /** The requirements, checked and reported in this order. */
  requirements: Requirement[];
}
