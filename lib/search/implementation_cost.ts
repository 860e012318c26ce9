import {
  requireFinite,
  requireFrequency,
  requireInteger,
  requireSampleRate,
  requireSamples,
  show,
} from "../_validate.ts";
import { detectLinearPhase } from "../fir/linear_phase.ts";
import type { MultistageDecimatorDesign, MultistagePlan } from "../multirate/multistage.ts";
import type { Section } from "../types.ts";
import { type FilterDesign, groupDelayOf, requireDesign } from "../verify/filter_design.ts";

/**
 * Anything the library designs, in a form whose cost can be counted:
 * - a `FilterDesign` (FIR taps, second-order sections, or B(z)/A(z));
 * - a design result carrying `taps` (equiripple, least squares, half-band, Kaiser)
 *   or `sections` (designIir);
 * - a multistage decimator, designed (stages with taps) or only planned
 *   (stages with estimated lengths, counted as symmetric FIR stages).
 */
export type CostedDesign =
  | FilterDesign
  | { taps: ArrayLike<number> }
  | { sections: readonly Section[] }
  | MultistageDecimatorDesign
  | MultistagePlan;

/** Options for {@link implementationCost}. */
export interface CostOptions {
  /** Input sample rate in Hz, > 0. A multistage design must start at this rate. */
  fs: number;
  /**
   * Decimation factor M of a single-rate design, 1 … 1e6: only every M-th output
   * is computed (an FIR decimator in polyphase or direct form; an IIR filter
   * still runs its recursion at the input rate). A multistage design carries
   * its own factors and takes no other. @default 1
   */
  decimation?: number;
  /**
   * Frequency in Hz, in [0, fs/2], at which the latency of a design without linear
   * phase is its group delay. @default 0 Hz; fs/2 when the response vanishes at
   * 0 Hz; the stage's Nyquist frequency for a multistage stage below it
   */
  latencyFrequency?: number;
  /** Tolerance on tap symmetry relative to the largest tap, 0 … <1. @default 1e-12 */
  symmetryTolerance?: number;
}

/** The arithmetic, memory and delay a design costs, per output sample of the implementation. */
export interface ImplementationCost {
  /** Plain description of the structure counted, e.g. "symmetric FIR (type I), 63 taps". */
  structure: string;
  /** Multiplications per output sample (at the output rate); coefficients 0 and ±1 need none. */
  multipliesPerOutput: number;
  /** Additions (and subtractions, including symmetric pre-adds) per output sample. */
  addsPerOutput: number;
  /** Multiplications per input sample: multipliesPerOutput / M. */
  multipliesPerInput: number;
  /** Multiplications per second: multipliesPerOutput × output rate. */
  multipliesPerSecond: number;
  /** Additions per second: addsPerOutput × output rate. */
  addsPerSecond: number;
  /** Delay-line and state words: N − 1 for N taps, 1 or 2 per section (transposed direct form II). */
  stateWords: number;
  /** Coefficient words to store: one per multiplier (shared by a symmetric pair; 0 and ±1 need none). */
  coefficientWords: number;
  /** stateWords + coefficientWords. */
  memoryWords: number;
  /** Latency in input samples: (N − 1)/2 for linear-phase FIR, otherwise the group delay at `latencyFrequency`. */
  latencySamples: number;
  /** Latency in seconds: latencySamples / fs. */
  latencySeconds: number;
  /** Where a group delay was taken as the latency, in Hz; undefined when the delay is constant (linear phase). */
  latencyFrequency: number | undefined;
  /** Input sample rate in Hz. */
  inputRate: number;
  /** Output sample rate in Hz, fs/M. */
  outputRate: number;
  /** Overall decimation factor M (1 for a single-rate filter). */
  decimation: number;
}

/** Counts of one single-rate part, per its own output sample. */
interface PartCount {
  structure: string;
  multiplies: number;
  adds: number;
  stateWords: number;
  coefficientWords: number;
  /** Latency in the part's own input samples; NaN when it must be measured. */
  latency: number;
  /** The part is recursive: it runs at its input rate even when decimating. */
  recursive: boolean;
  design: FilterDesign;
}

const trivial = (c: number): boolean => c === 0 || c === 1 || c === -1;

function countFir(taps: ArrayLike<number>, tolerance: number): PartCount {
  const n = taps.length;
  let nonzero = 0;
  let plainMultiplies = 0;
  for (let i = 0; i < n; i++) {
    const c = taps[i] as number;
    if (c !== 0) nonzero++;
    if (!trivial(c)) plainMultiplies++;
  }
  const phase = detectLinearPhase(taps, { tolerance });
  let multiplies = plainMultiplies;
  let structure = `FIR, ${n} taps`;
  let latency = NaN;
  if (phase.type !== null && n > 1) {
    // One multiplier per symmetric pair (after a pre-add), plus the middle tap of an odd length.
    multiplies = 0;
    for (let i = 0; i < Math.ceil(n / 2); i++) if (!trivial(taps[i] as number)) multiplies++;
    structure = `${phase.symmetry} FIR (type ${
      ["I", "II", "III", "IV"][phase.type - 1]
    }), ${n} taps`;
    latency = (n - 1) / 2;
  }
  if (nonzero < n) structure += ` (${nonzero} non-zero)`;
  return {
    structure,
    multiplies,
    adds: Math.max(0, nonzero - 1),
    stateWords: n - 1,
    coefficientWords: multiplies,
    latency,
    recursive: false,
    design: { kind: "fir", taps },
  };
}

function lastNonzero(c: readonly number[]): number {
  for (let i = c.length - 1; i >= 0; i--) if (c[i] !== 0) return i;
  return -1;
}

function countSections(sections: readonly Section[]): PartCount {
  let multiplies = 0;
  let adds = 0;
  let stateWords = 0;
  for (const s of sections) {
    const all = [s.b0, s.b1, s.b2, s.a1, s.a2];
    const nonzero = all.filter((c) => c !== 0).length;
    multiplies += all.filter((c) => !trivial(c)).length;
    adds += Math.max(0, nonzero - 1);
    stateWords += Math.max(lastNonzero([s.b0, s.b1, s.b2]), lastNonzero([1, s.a1, s.a2]), 0);
  }
  const count = sections.length;
  return {
    structure: `${count} second-order section${count === 1 ? "" : "s"} (transposed direct form II)`,
    multiplies,
    adds,
    stateWords,
    coefficientWords: multiplies,
    latency: NaN,
    recursive: sections.some((s) => s.a1 !== 0 || s.a2 !== 0),
    design: { kind: "sections", sections },
  };
}

function countRational(numerator: ArrayLike<number>, denominator: ArrayLike<number>): PartCount {
  const a0 = denominator[0] as number;
  const b = Array.from(numerator, (c) => c / a0);
  const a = Array.from(denominator, (c) => c / a0).slice(1);
  const all = [...b, ...a];
  const nonzero = all.filter((c) => c !== 0).length;
  const multiplies = all.filter((c) => !trivial(c)).length;
  const order = Math.max(lastNonzero(b), lastNonzero([1, ...a]), 0);
  return {
    structure: `direct form B(z)/A(z), order ${order}`,
    multiplies,
    adds: Math.max(0, nonzero - 1),
    stateWords: order,
    coefficientWords: multiplies,
    latency: NaN,
    recursive: a.some((c) => c !== 0),
    design: { kind: "rational", numerator, denominator },
  };
}

function delayAt(design: FilterDesign, frequency: number, rate: number): [number, number] {
  const nyquist = rate / 2;
  const tries = [Math.min(frequency, nyquist), nyquist, 0];
  for (const f of tries) {
    const d = groupDelayOf(design, [f], rate)[0] as number;
    if (Number.isFinite(d)) return [d, f];
  }
  return [NaN, frequency];
}

/**
 * Implementation cost of a design: multiplies and adds per output sample,
 * state and coefficient memory in words, and latency in samples and seconds.
 *
 * Counting rules:
 * - A coefficient of 0 costs nothing; ±1 costs an add but no multiply. Every
 *   non-zero coefficient adds one term, so a part with K non-zero coefficients
 *   needs K − 1 adds per output.
 * - FIR: taps that are symmetric or antisymmetric (linear phase, detected within
 *   `symmetryTolerance`) share one multiplier per pair after a pre-add:
 *   ⌈N/2⌉ multiplies for N taps; a delay line of N − 1 words; latency (N − 1)/2 samples.
 * - Sections (transposed direct form II) and B(z)/A(z): one multiply per
 *   non-trivial coefficient, one state word per delay (2 per biquad); latency
 *   is the group delay at `latencyFrequency`.
 * - Decimation by M: an FIR filter computes only the kept outputs
 *   (polyphase or direct form), so its cost per output stays that of one
 *   output and its cost per input falls by M; a recursive filter must run at the
 *   input rate, so per output it costs M times its per-sample cost.
 * - Multistage decimator with factors M₁…M_K: stage i produces
 *   M_{i+1}···M_K outputs per final output, so the total per output is
 *   Σ cᵢ·M_{i+1}···M_K; latency Σ (Nᵢ − 1)/2 · M₁···M_{i−1} input samples.
 *
 * Sources: R. E. Crochiere and L. R. Rabiner, Multirate Digital Signal
 * Processing (Prentice-Hall, 1983), §3.3 (polyphase structures) and §5.3
 * (multistage cost); A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., §6.5.3 (linear-phase FIR structures with one multiplier per pair).
 *
 * @param design A design of the library (see {@link CostedDesign}).
 * @param options Input sample rate, decimation, latency frequency, symmetry tolerance.
 * @returns The counts, the memory and the latency.
 * @throws {RangeError} For a sample rate, factor, frequency or tolerance out of range, or
 *   a multistage design whose first stage does not start at fs.
 * @throws {TypeError} When the design is malformed.
 * @example
 * ```ts
 * import { implementationCost } from "./implementation_cost.ts";
 * // A symmetric 5-tap FIR: 3 multipliers (pairs h0/h4, h1/h3 and the middle tap), 4 adds.
 * const c = implementationCost({ kind: "fir", taps: [0.1, 0.2, 0.4, 0.2, 0.1] }, { fs: 8000 });
 * if (c.multipliesPerOutput !== 3 || c.addsPerOutput !== 4 || c.stateWords !== 4) throw new Error("3, 4, 4");
 * if (c.latencySamples !== 2 || c.latencySeconds !== 2 / 8000) throw new Error("2 samples");
 * // Decimating by 2 computes every second output only: 3 multiplies per output, 1.5 per input.
 * if (implementationCost({ kind: "fir", taps: [0.1, 0.2, 0.4, 0.2, 0.1] }, { fs: 8000, decimation: 2 })
 *   .multipliesPerInput !== 1.5) throw new Error("polyphase halves the rate");
 * ```
 */
export function implementationCost(design: CostedDesign, options: CostOptions): ImplementationCost {
  if (design === null || typeof design !== "object") {
    throw new TypeError(`Design must be an object, got ${String(design)}`);
  }
  if (options === null || typeof options !== "object") {
    throw new TypeError(`Cost options must be an object { fs, … }, got ${String(options)}`);
  }
  const { fs } = options;
  requireSampleRate(fs);
  const tolerance = options.symmetryTolerance ?? 1e-12;
  requireFinite("Symmetry tolerance", tolerance);
  if (tolerance < 0 || tolerance >= 1) {
    throw new RangeError(
      `Symmetry tolerance must be at least 0 and below 1, got ${show(tolerance)}`,
    );
  }
  const frequency = options.latencyFrequency ?? 0;
  requireFrequency("Latency frequency", frequency, fs);
  if ("stages" in design) {
    if (options.decimation !== undefined && options.decimation !== 1) {
      throw new RangeError(
        `A multistage design carries its own factors; give no decimation, got ${
          show(options.decimation)
        }`,
      );
    }
    return multistageCost(design, fs, frequency, tolerance);
  }
  const decimation = options.decimation ?? 1;
  requireInteger("Decimation factor", decimation, 1, 1e6);
  const part = partOf(design, tolerance);
  let latencySamples = part.latency;
  let latencyFrequency: number | undefined;
  if (Number.isNaN(latencySamples)) {
    [latencySamples, latencyFrequency] = delayAt(part.design, frequency, fs);
  }
  const perOutput = part.recursive ? decimation : 1;
  const multipliesPerOutput = part.multiplies * perOutput;
  const addsPerOutput = part.adds * perOutput;
  const outputRate = fs / decimation;
  let structure = part.structure;
  if (decimation > 1) {
    structure += part.recursive
      ? `, decimating by ${decimation} (the recursion runs at the input rate)`
      : `, decimating by ${decimation} (only kept outputs computed)`;
  }
  return {
    structure,
    multipliesPerOutput,
    addsPerOutput,
    multipliesPerInput: multipliesPerOutput / decimation,
    multipliesPerSecond: multipliesPerOutput * outputRate,
    addsPerSecond: addsPerOutput * outputRate,
    stateWords: part.stateWords,
    coefficientWords: part.coefficientWords,
    memoryWords: part.stateWords + part.coefficientWords,
    latencySamples,
    latencySeconds: latencySamples / fs,
    latencyFrequency,
    inputRate: fs,
    outputRate,
    decimation,
  };
}

function partOf(
  design: Exclude<CostedDesign, MultistageDecimatorDesign | MultistagePlan>,
  tolerance: number,
): PartCount {
  if ("kind" in design) {
    requireDesign(design);
    switch (design.kind) {
      case "fir":
        return countFir(design.taps, tolerance);
      case "sections":
        return countSections(design.sections);
      case "rational":
        return countRational(design.numerator, design.denominator);
    }
  }
  if ("taps" in design) {
    requireSamples("Taps", design.taps);
    return countFir(design.taps, tolerance);
  }
  if ("sections" in design) {
    requireDesign({ kind: "sections", sections: design.sections });
    return countSections(design.sections);
  }
  throw new TypeError("Design must be a FilterDesign, or carry taps, sections or stages");
}

function multistageCost(
  design: MultistageDecimatorDesign | MultistagePlan,
  fs: number,
  frequency: number,
  tolerance: number,
): ImplementationCost {
  const stages = design.stages;
  if (!Array.isArray(stages) || stages.length === 0) {
    throw new TypeError("A multistage design must have at least one stage");
  }
  const first = stages[0]!;
  if (Math.abs(first.inputRate - fs) > 1e-9 * fs) {
    throw new RangeError(
      `The first stage must run at fs = ${show(fs)} Hz, got ${show(first.inputRate)} Hz`,
    );
  }
  const parts: PartCount[] = stages.map((s, i) => {
    requireInteger(`Stage ${i + 1} factor`, s.factor, 1, 1e6);
    if ("taps" in s) return countFir(s.taps, tolerance);
    // A planned stage: an equiripple lowpass of the estimated length, symmetric.
    requireInteger(`Stage ${i + 1} length`, s.length, 1);
    const n = s.length;
    return {
      structure: `symmetric FIR (estimated), ${n} taps`,
      multiplies: Math.ceil(n / 2),
      adds: n - 1,
      stateWords: n - 1,
      coefficientWords: Math.ceil(n / 2),
      latency: (n - 1) / 2,
      recursive: false,
      design: { kind: "fir", taps: [1] },
    };
  });
  const decimation = stages.reduce((p, s) => p * s.factor, 1);
  let multiplies = 0;
  let adds = 0;
  let stateWords = 0;
  let coefficientWords = 0;
  let latencySamples = 0;
  let measured = false;
  let before = 1; // M₁···M_{i−1}
  stages.forEach((s, i) => {
    const part = parts[i]!;
    const after = decimation / (before * s.factor); // outputs of stage i per final output
    multiplies += part.multiplies * after;
    adds += part.adds * after;
    stateWords += part.stateWords;
    coefficientWords += part.coefficientWords;
    let latency = part.latency;
    if (Number.isNaN(latency)) {
      const rate = fs / before;
      latency = delayAt(part.design, Math.min(frequency, rate / 2), rate)[0];
      measured = true;
    }
    latencySamples += latency * before;
    before *= s.factor;
  });
  const outputRate = fs / decimation;
  const factors = stages.map((s) => `×${s.factor}`).join("");
  return {
    structure: `${stages.length}-stage decimator ${factors}: ${
      parts.map((p) => p.structure).join("; ")
    }`,
    multipliesPerOutput: multiplies,
    addsPerOutput: adds,
    multipliesPerInput: multiplies / decimation,
    multipliesPerSecond: multiplies * outputRate,
    addsPerSecond: adds * outputRate,
    stateWords,
    coefficientWords,
    memoryWords: stateWords + coefficientWords,
    latencySamples,
    latencySeconds: latencySamples / fs,
    latencyFrequency: measured ? frequency : undefined,
    inputRate: fs,
    outputRate,
    decimation,
  };
}
