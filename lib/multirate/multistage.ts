import { requireFinite, requireInteger, requireSampleRate, show } from "../_validate.ts";
import { estimateEquirippleLength } from "../fir/equiripple_length.ts";
import type { DesignBand } from "../fir/types.ts";

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
  /** Input and output sample rates in Hz. */
  inputRate: number;
  outputRate: number;
  /** Passband edge (Hz, the overall one) and this stage's stopband edge (Hz). */
  passbandEdge: number;
  stopbandEdge: number;
  /** Estimated number of taps (Herrmann–Rabiner–Chan). */
  length: number;
  /** Passband ripple allotted to this stage, dB peak to peak. */
  passbandRippleDb: number;
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
      bands: [
        { from: 0, to: fp, gain: 1, weight: 1 },
        { from: stopbandEdge, to: inputRate / 2, gain: 0, weight: stageDp / ds },
      ],
      multiplicationsPerSecond: length * outputRate,
    };
  });
}
