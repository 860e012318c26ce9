// Data shapes of the design search: target, options, candidates and result.
import type { Rounding } from "../fixed/quantise.ts";
import type { QuantisedDesign } from "../fixed/quantise_design.ts";
import type { MultistageDecimatorDesign } from "../multirate/multistage.ts";
import type { DesignWarning } from "../types.ts";
import type { FilterDesign } from "../verify/filter_design.ts";
import type { RequirementResult } from "../verify/requirement.ts";
import type { FilterSpec } from "../verify/requirements.ts";
import type { BandLayout } from "./band_layout.ts";
import type { ImplementationCost } from "./implementation_cost.ts";

/** The design methods a search can try. */
export type SearchMethod =
  | "equiripple"
  | "kaiser"
  | "leastSquares"
  | "halfband"
  | "butterworth"
  | "chebyshev1"
  | "chebyshev2"
  | "elliptic"
  | "bessel"
  | "multistage";

/** What the design will be built on: fixed-point word lengths and an optional decimation. */
export interface SearchTarget {
  /** Coefficient word length in bits, sign included, 2 … 32. */
  wordLength: number;
  /** Accumulator width in bits, 2 … 128. */
  accumulatorBits: number;
  /** Data (sample) word length in bits, 2 … 32; samples are pure fractions Q0.(W−1). @default wordLength */
  dataBits?: number;
  /** Rounding of the coefficients. @default "nearest" */
  rounding?: Rounding;
  /**
   * Decimation factor M, 1 … 1e6: only every M-th output is kept. Costs are then
   * per output at fs/M, and the multistage plan is tried. @default 1 (no decimation)
   */
  decimation?: number;
}

/** What a search ranks its candidates by. */
export type SearchCost = "multiplies" | "latency" | "memory";

/** Options for {@link searchDesigns}. */
export interface SearchOptions {
  /** The fixed-point target and decimation. */
  target: SearchTarget;
  /**
   * Cost to rank by: multiplies per output sample, latency in seconds, or memory
   * (state + coefficient words). Ties go to fewer multiplies, then less memory,
   * then less latency. @default "multiplies"
   */
  rankBy?: SearchCost;
  /** Methods to try, in the order tried. @default every method, in the order of {@link SEARCH_METHODS} */
  methods?: readonly SearchMethod[];
  /** Largest number of designs made and checked in the whole search, 1 … 10000. @default 200 */
  maxDesigns?: number;
  /** Largest number of designs per method, 1 … 1000. @default 24 */
  maxDesignsPerMethod?: number;
  /**
   * Time limit in milliseconds, > 0. It is checked before each design, so the
   * design under way when it passes still finishes. @default 5000
   */
  timeLimitMs?: number;
  /** Clock in milliseconds, for the time limit. @default performance.now */
  now?: () => number;
  /** Largest FIR length tried, 3 … 4096 taps. @default 4096 */
  maxTaps?: number;
  /**
   * Frequency in Hz at which an IIR design's group delay is its latency, in [0, fs/2].
   * @default 0 Hz for a lowpass or bandstop, fs/2 for a highpass, the passband centre for a bandpass
   */
  latencyFrequency?: number;
  /** Grid points per band for the requirement checks (see CheckOptions). @default adaptive */
  points?: number;
}

/** Where a requirement row comes from: the design as designed, or its quantised coefficients. */
export type Arithmetic = "floating point" | "quantised";

/** One requirement row with the arithmetic it was checked in. */
export interface CheckedRow {
  /** The requirement result. */
  result: RequirementResult;
  /** Floating-point or quantised design. */
  arithmetic: Arithmetic;
  /**
   * margin / |limit| (the margin itself when the limit is 0): the shortfall or
   * spare as a share of the limit, comparable across units.
   */
  relativeMargin: number;
}

/** One design made and checked during a search. */
export interface SearchTrial {
  /** Method. */
  method: SearchMethod;
  /** Size: taps for FIR methods, prototype order for IIR families, tightening step for multistage. */
  size: number;
  /** Whether it met every requirement in floating point and quantised. */
  meets: boolean;
  /** The row with the smallest relative margin (undefined when the design failed to build). */
  worst?: CheckedRow;
  /** Why the design could not be made, when it could not. */
  error?: string;
}

/** How a method fared. */
export type CandidateStatus = "meets" | "fails" | "not applicable" | "skipped";

/** The best design one method found: its smallest size that meets everything, or its nearest miss. */
export interface SearchCandidate {
  /** Method. */
  method: SearchMethod;
  /** Plain name of the method, e.g. "Equiripple FIR". */
  label: string;
  /** Whether it meets; "not applicable" when the method cannot fit the spec; "skipped" when a limit stopped the search first. */
  status: CandidateStatus;
  /** Why the method is not applicable, was skipped, or stopped short. */
  reason?: string;
  /** Size: taps, prototype order, or multistage tightening step; 0 when nothing was designed. */
  size: number;
  /** The size in words, e.g. "63 taps", "order 4 (8 poles, 4 sections)". */
  sizeLabel: string;
  /** The published estimate the search started from (same unit as size), when there is one. */
  estimate?: number;
  /** Which estimate, e.g. "Herrmann–Rabiner–Chan". */
  estimateSource?: string;
  /** The floating-point design (for multistage, the equivalent single-rate FIR at fs). */
  design?: FilterDesign;
  /** The quantised design that was checked (multistage: equivalent FIR of the quantised stages). */
  quantisedDesign?: FilterDesign;
  /** Codes and formats of the quantised coefficients, one entry per stage (one for single-stage designs). */
  quantisation?: QuantisedDesign[];
  /** The designed stages of a multistage decimator (floating point). */
  stages?: MultistageDecimatorDesign;
  /** Requirement rows of the floating-point design, in the spec's order. */
  floatingResults: RequirementResult[];
  /**
   * Requirement rows of the quantised design, in the spec's order, then the
   * target's own checks (accumulator width; stability for IIR designs).
   */
  quantisedResults: RequirementResult[];
  /** The row with the smallest relative margin over both lists. */
  worst?: CheckedRow;
  /** Every row not met, the worst (smallest relative margin) first. */
  failures: CheckedRow[];
  /** Implementation cost of the design (at the target's decimation). */
  cost?: ImplementationCost;
  /** The value ranked by (multiplies per output, latency in s, or memory words). */
  rankValue?: number;
  /** Soft trouble from the design method. */
  warnings: DesignWarning[];
}

/** The limits a search ran under and what it used. */
export interface SearchLimits {
  /** Largest number of designs allowed. */
  maxDesigns: number;
  /** Largest number of designs per method. */
  maxDesignsPerMethod: number;
  /** Time limit in ms. */
  timeLimitMs: number;
  /** Designs made and checked. */
  designsTried: number;
  /** Time the search took in ms (by the clock given). */
  elapsedMs: number;
  /** Which limit stopped the search early, if one did. */
  stoppedBy?: "designs" | "time";
}

/** The outcome of {@link searchDesigns}. */
export interface SearchResult {
  /** The specification searched for. */
  spec: FilterSpec;
  /** Band shape, edges and targets inferred from it. */
  layout: BandLayout;
  /** Target (with defaults filled in). */
  target: Required<SearchTarget>;
  /** What the candidates are ranked by. */
  rankBy: SearchCost;
  /** One candidate per method: those that meet, cheapest first; then those that fail, nearest first; then the rest. */
  candidates: SearchCandidate[];
  /** The cheapest candidate meeting every requirement, if any. */
  chosen?: SearchCandidate;
  /** When none meets: the candidate nearest to meeting (largest worst relative margin). */
  nearest?: SearchCandidate;
  /** One sentence: what was chosen, or what the nearest candidate misses and by how much. */
  summary: string;
  /** Every design made, in order. */
  trials: SearchTrial[];
  /** Limits and usage. */
  limits: SearchLimits;
  /** Soft trouble with the spec or target (e.g. aliasing into the passband after decimation). */
  warnings: DesignWarning[];
}
