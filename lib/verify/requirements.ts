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
  kind: "passbandRipple";
  from: number;
  to: number;
  atMostDb: number;
}

/** Largest deviation |20·log10|H| − gainDb| over [from, to] Hz, at most `atMostDb`. */
export interface PassbandDeviationRequirement extends RequirementLabel {
  kind: "passbandDeviation";
  from: number;
  to: number;
  atMostDb: number;
  /** Nominal passband gain in dB. @default 0 */
  gainDb?: number;
}

/** Smallest attenuation referenceDb − 20·log10|H| over [from, to] Hz, at least `atLeastDb`. */
export interface StopbandAttenuationRequirement extends RequirementLabel {
  kind: "stopbandAttenuation";
  from: number;
  to: number;
  atLeastDb: number;
  /** Passband reference level in dB the attenuation is measured from. @default 0 */
  referenceDb?: number;
}

/** Largest gain max 20·log10|H| over [from, to] Hz (headroom), at most `atMostDb`. */
export interface MaximumGainRequirement extends RequirementLabel {
  kind: "maximumGain";
  atMostDb: number;
  /** Lower edge in Hz. @default 0 */
  from?: number;
  /** Upper edge in Hz. @default fs/2 */
  to?: number;
}

/** Gain at one frequency (DC, a band centre) within ±toleranceDb of gainDb. */
export interface GainAtRequirement extends RequirementLabel {
  kind: "gainAt";
  /** Frequency in Hz, in [0, fs/2]; 0 for DC gain. */
  frequency: number;
  gainDb: number;
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
  kind: "groupDelayMaximum";
  from: number;
  to: number;
  atMostSamples: number;
}

/** Group-delay variation max τ − min τ over [from, to] Hz, at most `atMostSamples`. */
export interface GroupDelayFlatnessRequirement extends RequirementLabel {
  kind: "groupDelayFlatness";
  from: number;
  to: number;
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
  kind: "linearPhase";
  from: number;
  to: number;
  atMostDegrees: number;
}

/** Stability margin 1 − max|pole|, at least `atLeast` (0 < atLeast ≤ 1 for a useful margin). */
export interface StabilityMarginRequirement extends RequirementLabel {
  kind: "stabilityMargin";
  atLeast: number;
}

/**
 * Settling time of the step response: the time after which every sample stays
 * within ±tolerance·|final value| of the final value (the DC gain), at most
 * `atMostSeconds`.
 */
export interface SettlingTimeRequirement extends RequirementLabel {
  kind: "settlingTime";
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
  requirements: Requirement[];
}
