import { requireFinite, requireInteger, requireSampleRate, show } from "../_validate.ts";
import { estimateEquirippleLength } from "../fir/equiripple_length.ts";
import type { DesignBand } from "../fir/types.ts";
import { designEquiripple } from "../fir/equiripple.ts";
import { measureBands } from "../fir/band_error.ts";
import type { DesignWarning } from "../types.ts";
import { decimatePolyphase } from "./resample.ts";

/** Overall specification of a decimator for {@link planMultistageDecimator}. */
export interface MultistageDecimatorSpec {
  /** Input sample rate in Hz. */
  fs: number;
  /** Overall decimation factor M, 2 … 1e6; the output rate is fs/M. */
  factor: number;
  /** Passband edge in Hz, 0 < edge < stopband edge. */
  passbandEdge: number;
  /**
   * Final stopband edge in Hz, passband edge < edge ≤ fs/(2M): above it signals
   * may alias, but only into [edge, fs/(2M)], never into the passband. @default fs/(2M)
   */
  stopbandEdge?: number;
  /** Overall peak-to-peak passband ripple in dB, 0 < r ≤ 10 (shared among the stages). */
  passbandRippleDb: number;
  /** Stopband attenuation in dB, 0 < A ≤ 300 (required of every stage). */
  stopbandAttenuationDb: number;
  /** Largest number of stages to consider, 1 … 6. @default 4 */
  maxStages?: number;
}

/** One stage of a planned decimator. */
export interface DecimatorStage {
  /** Decimation factor of this stage. */
  factor: number;
  /** Input sample rate in Hz. */
  inputRate: number;
  /** Output sample rate in Hz (input rate ÷ factor). */
  outputRate: number;
  /** Passband edge in Hz (the overall one). */
  passbandEdge: number;
  /** This stage's stopband edge in Hz: its output rate − the final stopband edge. */
  stopbandEdge: number;
  /** Estimated number of taps (Herrmann–Rabiner–Chan). */
  length: number;
  /** Passband ripple allotted to this stage, dB peak to peak. */
  passbandRippleDb: number;
  /** The same as a linear deviation δp/K. */
  passbandDeviation: number;
  /** Stopband deviation δs required of the stage (linear). */
  stopbandDeviation: number;
  /** Bands and weights ready for designEquiripple (fs = inputRate). */
  bands: DesignBand[];
  /** Multiplications per second: length × output rate (polyphase, no symmetry used). */
  multiplicationsPerSecond: number;
}

/** A planned multistage decimator. */
export interface MultistagePlan {
  /** The stages in processing order (factors multiply to M). */
  stages: DecimatorStage[];
  /** Sum of the stages' multiplications per second. */
  multiplicationsPerSecond: number;
  /** The single-stage design of the same spec, for comparison. */
  singleStage: DecimatorStage;
}

/**
 * Plan a multistage decimator: choose the split M = M₁·M₂·…·M_K (every ordered
 * factorisation into factors ≥ 2, up to maxStages) that minimises the
 * multiplication rate Σ N_i·F_i, where F_i = F_{i−1}/M_i and stage i has
 * passband [0, fp], stopband from F_i − fs_stop (aliasing allowed only into the
 * final transition band), passband ripple δp/K and stopband ripple δs. N_i is
 * the Herrmann–Rabiner–Chan estimate for the stage's transition width
 * (F_i − fs_stop − fp)/F_{i−1}.
 *
 * Source: R. E. Crochiere and L. R. Rabiner, "Optimum FIR digital filter
 * implementations for decimation, interpolation, and narrow-band filtering",
 * IEEE Trans. ASSP 23(5), 1975, pp. 444–456; and their Multirate Digital Signal
 * Processing, 1983, §5.3.
 *
 * @param spec Input rate, factor, edges, ripple, attenuation, stage limit.
 * @returns The cheapest plan, with the single-stage plan for comparison.
 * @throws {RangeError} When an edge, the factor or a ripple is out of range.
 * @example
 * ```ts
 * import { planMultistageDecimator } from "./multistage.ts";
 * const plan = planMultistageDecimator({
 *   fs: 48000, factor: 48, passbandEdge: 400, passbandRippleDb: 0.1, stopbandAttenuationDb: 80,
 * });
 * const product = plan.stages.reduce((p, s) => p * s.factor, 1);
 * if (product !== 48 || plan.stages.length < 2) throw new Error("a multistage split of 48");
 * if (!(plan.multiplicationsPerSecond < plan.singleStage.multiplicationsPerSecond / 5)) {
 *   throw new Error("several times cheaper than one stage");
 * }
 * ```
 */
export function planMultistageDecimator(spec: MultistageDecimatorSpec): MultistagePlan {
  const { fs, factor, passbandEdge, passbandRippleDb, stopbandAttenuationDb } = spec;
  requireSampleRate(fs);
  requireInteger("Decimation factor", factor, 2, 1e6);
  const outputNyquist = fs / (2 * factor);
  const stopbandEdge = spec.stopbandEdge ?? outputNyquist;
  requireFinite("Passband edge", passbandEdge);
  requireFinite("Stopband edge", stopbandEdge);
  if (stopbandEdge > outputNyquist || stopbandEdge <= 0) {
    throw new RangeError(
      `Stopband edge must be above 0 Hz and at most fs/(2M) = ${show(outputNyquist)} Hz, got ${
        show(stopbandEdge)
      } Hz`,
    );
  }
  if (passbandEdge <= 0 || passbandEdge >= stopbandEdge) {
    throw new RangeError(
      `Passband edge must be between 0 Hz and the stopband edge ${show(stopbandEdge)} Hz, got ${
        show(passbandEdge)
      } Hz`,
    );
  }
  const maxStages = spec.maxStages ?? 4;
  requireInteger("Maximum number of stages", maxStages, 1, 6);
  // Checked here so the messages speak of the overall spec.
  estimateEquirippleLength({
    fs,
    passbandEdge,
    stopbandEdge: Math.min(fs / 2 - 1e-9 * fs, fs / factor - stopbandEdge),
    passbandRippleDb,
    stopbandAttenuationDb,
  });
  const g = 10 ** (passbandRippleDb / 20);
  const dp = (g - 1) / (g + 1);
  const ds = 10 ** (-stopbandAttenuationDb / 20);
  const plans: DecimatorStage[][] = [];
  for (const split of factorisations(factor, maxStages)) {
    plans.push(stagesFor(split, fs, passbandEdge, stopbandEdge, dp, ds));
  }
  const cost = (stages: DecimatorStage[]) =>
    stages.reduce((sum, s) => sum + s.multiplicationsPerSecond, 0);
  let best = plans[0]!;
  for (const p of plans) if (cost(p) < cost(best)) best = p;
  const single = stagesFor([factor], fs, passbandEdge, stopbandEdge, dp, ds)[0]!;
  return { stages: best, multiplicationsPerSecond: cost(best), singleStage: single };
}

/** Every ordered factorisation of m into at most k factors, each ≥ 2. */
function factorisations(m: number, k: number): number[][] {
  const out: number[][] = [];
  const walk = (rest: number, prefix: number[]): void => {
    if (rest === 1) {
      if (prefix.length > 0) out.push(prefix);
      return;
    }
    if (prefix.length === k) return;
    for (let f = 2; f <= rest; f++) {
      if (rest % f === 0) walk(rest / f, [...prefix, f]);
    }
  };
  walk(m, []);
  return out;
}

function stagesFor(
  split: number[],
  fs: number,
  fp: number,
  fStop: number,
  dp: number,
  ds: number,
): DecimatorStage[] {
  const k = split.length;
  const stageDp = dp / k;
  const rippleDb = 20 * Math.log10((1 + stageDp) / (1 - stageDp));
  const attenuationDb = -20 * Math.log10(ds);
  let rate = fs;
  return split.map((m) => {
    const inputRate = rate;
    const outputRate = rate / m;
    rate = outputRate;
    const stopbandEdge = Math.min(outputRate - fStop, inputRate / 2);
    const estimate = estimateEquirippleLength({
      fs: inputRate,
      passbandEdge: fp,
      stopbandEdge: Math.min(stopbandEdge, inputRate / 2 * (1 - 1e-12)),
      passbandRippleDb: rippleDb,
      stopbandAttenuationDb: attenuationDb,
    });
    const length = estimate.length;
    return {
      factor: m,
      inputRate,
      outputRate,
      passbandEdge: fp,
      stopbandEdge,
      length,
      passbandRippleDb: rippleDb,
      passbandDeviation: stageDp,
      stopbandDeviation: ds,
      bands: [
        { from: 0, to: fp, gain: 1, weight: 1 },
        { from: stopbandEdge, to: inputRate / 2, gain: 0, weight: stageDp / ds },
      ],
      multiplicationsPerSecond: length * outputRate,
    };
  });
}

/** One designed stage of a multistage decimator. */
export interface DesignedDecimatorStage {
  /** Decimation factor of the stage. */
  factor: number;
  /** Input sample rate of the stage in Hz. */
  inputRate: number;
  /** Equiripple taps at the stage's input rate. */
  taps: Float64Array;
  /** Measured peak passband deviation (linear). */
  passbandDeviation: number;
  /** Measured peak stopband gain (linear). */
  stopbandGain: number;
}

/** Result of {@link designMultistageDecimator}. */
export interface MultistageDecimatorDesign {
  /** Stages in processing order. */
  stages: DesignedDecimatorStage[];
  /** Stages that still miss their share of the spec after the extra taps allowed. */
  warnings: DesignWarning[];
}

/**
 * Design the stages of a planned multistage decimator: each stage is an
 * equiripple lowpass (Parks–McClellan) with the plan's bands and weights,
 * starting at the plan's estimated length and growing by one tap at a time
 * (up to `maxExtraTaps`) until its measured passband deviation and stopband
 * gain meet the stage's share of the spec.
 *
 * Source: Crochiere and Rabiner, IEEE Trans. ASSP 23(5), 1975 (stage
 * specifications); Parks–McClellan design per stage (see designEquiripple).
 *
 * @param plan A plan from {@link planMultistageDecimator}.
 * @param maxExtraTaps Taps a stage may grow beyond its estimate, 0 … 64. @default 8
 * @returns The designed stages and any warnings.
 * @throws {RangeError} When maxExtraTaps is out of range.
 * @throws {ConvergenceError} When a stage's equiripple design fails.
 * @example
 * ```ts
 * import { designMultistageDecimator, planMultistageDecimator } from "./multistage.ts";
 * const plan = planMultistageDecimator({
 *   fs: 48000, factor: 8, passbandEdge: 2000, passbandRippleDb: 0.2, stopbandAttenuationDb: 60,
 * });
 * const design = designMultistageDecimator(plan);
 * if (design.warnings.length > 0) throw new Error("every stage met");
 * if (!design.stages.every((s) => s.stopbandGain <= 1e-3)) throw new Error("60 dB per stage");
 * ```
 */
export function designMultistageDecimator(
  plan: MultistagePlan,
  maxExtraTaps = 8,
): MultistageDecimatorDesign {
  requireInteger("Extra taps", maxExtraTaps, 0, 64);
  const warnings: DesignWarning[] = [];
  const stages = plan.stages.map((s, index) => {
    let best: DesignedDecimatorStage | undefined;
    for (let extra = 0; extra <= maxExtraTaps; extra++) {
      const d = designEquiripple({
        length: Math.max(3, s.length + extra),
        fs: s.inputRate,
        bands: s.bands,
      });
      const [pass, stop] = measureBands(d.taps, s.inputRate, s.bands);
      best = {
        factor: s.factor,
        inputRate: s.inputRate,
        taps: d.taps,
        passbandDeviation: pass!.maxDeviation,
        stopbandGain: stop!.maxGain,
      };
      if (
        best.passbandDeviation <= s.passbandDeviation && best.stopbandGain <= s.stopbandDeviation
      ) {
        return best;
      }
    }
    warnings.push({
      code: "stage-short",
      message: `Stage ${index + 1} (×${s.factor}) misses its share of the spec with ${
        best!.taps.length
      } taps: passband deviation ${best!.passbandDeviation.toExponential(2)} (wanted ${
        s.passbandDeviation.toExponential(2)
      }), stopband gain ${best!.stopbandGain.toExponential(2)} (wanted ${
        s.stopbandDeviation.toExponential(2)
      }).`,
    });
    return best!;
  });
  return { stages, warnings };
}

/**
 * Run a signal through a designed multistage decimator, stage by stage with
 * polyphase decimation (only kept outputs are computed).
 *
 * Source: Crochiere and Rabiner, Multirate Digital Signal Processing, 1983, §5.
 *
 * @param signal Input samples at the plan's input rate.
 * @param design Stages from {@link designMultistageDecimator}.
 * @returns Samples at the output rate (⌈N/M₁⌉, then ⌈·/M₂⌉, …).
 * @throws {TypeError} When the signal holds non-finite values.
 * @example
 * ```ts
 * import { decimateMultistage } from "./multistage.ts";
 * const design = {
 *   stages: [
 *     { factor: 2, inputRate: 4, taps: Float64Array.of(1), passbandDeviation: 0, stopbandGain: 0 },
 *     { factor: 2, inputRate: 2, taps: Float64Array.of(1), passbandDeviation: 0, stopbandGain: 0 },
 *   ],
 *   warnings: [],
 * };
 * if (decimateMultistage([1, 2, 3, 4, 5, 6, 7, 8], design).join() !== "1,5") {
 *   throw new Error("every fourth sample");
 * }
 * ```
 */
export function decimateMultistage(
  signal: ArrayLike<number>,
  design: MultistageDecimatorDesign,
): Float64Array {
  let x: Float64Array = Float64Array.from(signal);
  for (const stage of design.stages) x = decimatePolyphase(x, stage.factor, { taps: stage.taps });
  return x;
}
