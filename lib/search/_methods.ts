// The design methods a search tries: which specs each fits, its size lattice,
// its published starting estimate, and how it builds a design of a given size (private).
import { show } from "../_validate.ts";
import { designEquiripple } from "../fir/equiripple.ts";
import { estimateEquirippleLength } from "../fir/equiripple_length.ts";
import { designHalfband } from "../fir/halfband.ts";
import { kaiserBeta } from "../fir/kaiser_parameters.ts";
import { designLeastSquares } from "../fir/least_squares.ts";
import type { DesignBand } from "../fir/types.ts";
import { designWindowedSinc } from "../fir/windowed_sinc.ts";
import { designIir, type IirFamily } from "../iir/design.ts";
import { estimateIirOrder, type IirOrderEstimate, type IirRequirements } from "../iir/order.ts";
import { MAX_BESSEL_ORDER } from "../iir/prototypes.ts";
import { designMultistageDecimator, planMultistageDecimator } from "../multirate/multistage.ts";
import type { BandLayout } from "./band_layout.ts";
import { type Built, equivalentTaps, withGain } from "./_evaluate.ts";
import type { SearchMethod } from "./types.ts";

/** Highest prototype order the IIR design functions accept (lib/iir MAX_ORDER). */
const MAX_IIR_ORDER = 40;

/** How the search drives one method. Sizes are indexed by consecutive integers. */
export interface MethodPlan {
  method: SearchMethod;
  label: string;
  /** Why the method cannot fit the spec, when it cannot. */
  notApplicable?: string;
  sizeOf(index: number): number;
  /** Smallest index whose size is at least `size`. */
  indexOf(size: number): number;
  minIndex: number;
  maxIndex: number;
  startIndex: number;
  estimate?: number;
  estimateSource?: string;
  /** FIR lengths: attenuation grows about linearly with the length, so margins predict the length needed. */
  linearInSize: boolean;
  build(size: number): Built;
  sizeLabel(size: number, built?: Built): string;
}

/** What the methods need besides the layout. */
export interface MethodContext {
  layout: BandLayout;
  decimation: number;
  maxTaps: number;
}

/** Every method, in the order a search tries them. */
export const METHOD_ORDER: readonly SearchMethod[] = [
  "equiripple",
  "elliptic",
  "halfband",
  "multistage",
  "chebyshev1",
  "chebyshev2",
  "kaiser",
  "leastSquares",
  "butterworth",
  "bessel",
];

const LABELS: Record<SearchMethod, string> = {
  equiripple: "Equiripple FIR",
  kaiser: "Kaiser-window FIR",
  leastSquares: "Weighted least-squares FIR",
  halfband: "Half-band FIR",
  butterworth: "Butterworth IIR",
  chebyshev1: "Chebyshev I IIR",
  chebyshev2: "Chebyshev II IIR",
  elliptic: "Elliptic IIR",
  bessel: "Bessel IIR",
  multistage: "Multistage decimator",
};

/** Plain name of a method. */
export function methodLabel(method: SearchMethod): string {
  return LABELS[method];
}

/** Peak-to-peak ripple in dB of a linear deviation δ: 20·log10((1 + δ)/(1 − δ)). */
const rippleDbOf = (deviation: number): number =>
  20 * Math.log10((1 + deviation) / (1 - deviation));

const passesNyquist = (layout: BandLayout): boolean =>
  layout.response === "highpass" || layout.response === "bandstop";

/** The transition bands (gaps between design bands), lowest first. */
function transitions(layout: BandLayout): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 1; i < layout.bands.length; i++) {
    out.push([layout.bands[i - 1]!.to, layout.bands[i]!.from]);
  }
  return out;
}

function narrowestTransition(layout: BandLayout): [number, number] {
  let best = transitions(layout)[0]!;
  for (const t of transitions(layout)) if (t[1] - t[0] < best[1] - best[0]) best = t;
  return best;
}

/** Herrmann–Rabiner–Chan length for the narrowest transition, or undefined outside its range. */
function equirippleEstimate(
  layout: BandLayout,
  edges: [number, number],
  passbandDeviation: number,
  stopbandDeviation: number,
): number | undefined {
  try {
    return estimateEquirippleLength({
      fs: layout.fs,
      passbandEdge: edges[0],
      stopbandEdge: edges[1],
      passbandRippleDb: rippleDbOf(passbandDeviation),
      stopbandAttenuationDb: -20 * Math.log10(stopbandDeviation),
    }).length;
  } catch {
    return undefined;
  }
}

function notApplicable(method: SearchMethod, reason: string): MethodPlan {
  return {
    method,
    label: LABELS[method],
    notApplicable: reason,
    sizeOf: (i) => i,
    indexOf: (s) => s,
    minIndex: 0,
    maxIndex: -1,
    startIndex: 0,
    linearInSize: false,
    build: () => {
      throw new Error(reason);
    },
    sizeLabel: () => "—",
  };
}

const scaled = (taps: ArrayLike<number>, gain: number): Float64Array =>
  Float64Array.from(taps, (h) => h * gain);

/** FIR sizes: every length from 3 taps, or odd lengths only (types I) when the response passes fs/2. */
function firLattice(
  odd: boolean,
  maxTaps: number,
): Pick<MethodPlan, "sizeOf" | "indexOf" | "minIndex" | "maxIndex"> {
  return odd
    ? {
      sizeOf: (i) => 2 * i + 1,
      indexOf: (s) => Math.max(1, Math.ceil((s - 1) / 2)),
      minIndex: 1,
      maxIndex: Math.floor((maxTaps - 1) / 2),
    }
    : {
      sizeOf: (i) => i,
      indexOf: (s) => Math.max(3, Math.ceil(s)),
      minIndex: 3,
      maxIndex: maxTaps,
    };
}

const clampIndex = (plan: Pick<MethodPlan, "minIndex" | "maxIndex">, i: number): number =>
  Math.min(plan.maxIndex, Math.max(plan.minIndex, i));

const tapsLabel = (n: number): string => `${n} taps`;

function equiripplePlan(ctx: MethodContext): MethodPlan {
  const { layout } = ctx;
  const lattice = firLattice(passesNyquist(layout), ctx.maxTaps);
  const estimate = equirippleEstimate(
    layout,
    narrowestTransition(layout),
    layout.passbandDeviation,
    layout.stopbandDeviation,
  );
  const gain = 10 ** (layout.gainDb / 20);
  return {
    method: "equiripple",
    label: LABELS.equiripple,
    ...lattice,
    startIndex: clampIndex(lattice, lattice.indexOf(estimate ?? 3)),
    ...(estimate === undefined ? {} : {
      estimate,
      estimateSource: "Herrmann–Rabiner–Chan (narrowest transition band)",
    }),
    linearInSize: true,
    build: (length) => {
      const d = designEquiripple({ length, fs: layout.fs, bands: layout.bands });
      return { design: { kind: "fir", taps: scaled(d.taps, gain) }, warnings: d.warnings };
    },
    sizeLabel: tapsLabel,
  };
}

function cutoffsOf(layout: BandLayout): number[] {
  return transitions(layout).map(([a, b]) => (a + b) / 2);
}

function kaiserPlan(ctx: MethodContext): MethodPlan {
  const { layout } = ctx;
  const odd = passesNyquist(layout);
  const lattice = firLattice(odd, ctx.maxTaps);
  const attenuationDb = -20 *
    Math.log10(Math.min(layout.passbandDeviation, layout.stopbandDeviation));
  if (!(attenuationDb <= 300)) {
    return notApplicable(
      "kaiser",
      `Kaiser's formulas stop at 300 dB, got ${show(attenuationDb)} dB`,
    );
  }
  // Kaiser's own form N = (A − 7.95)/(14.36·Δf) + 1, Δf = width/fs (14.36 ≈ 2.285·2π).
  const deltaOmega = (2 * Math.PI * layout.transitionWidth) / layout.fs;
  const kaiserLength = Math.ceil((attenuationDb - 7.95) / (2.285 * deltaOmega) + 1 - 1e-9);
  const estimate = odd && kaiserLength % 2 === 0 ? kaiserLength + 1 : kaiserLength;
  // The length rule read backwards: N taps afford A(N) = 8 + 2.285·Δω·(N − 1) dB over
  // the narrowest transition (Oppenheim & Schafer's form), and the window takes the β for it.
  const betaFor = (length: number): number =>
    kaiserBeta(Math.min(300, 8 + 2.285 * deltaOmega * (length - 1)));
  const cutoff = cutoffsOf(layout);
  const gain = 10 ** (layout.gainDb / 20);
  return {
    method: "kaiser",
    label: LABELS.kaiser,
    ...lattice,
    startIndex: clampIndex(lattice, lattice.indexOf(estimate)),
    estimate,
    estimateSource: "Kaiser's length formula (A − 7.95)/(14.36·Δf) + 1",
    linearInSize: true,
    build: (length) => {
      const taps = designWindowedSinc({
        length,
        fs: layout.fs,
        cutoff,
        response: layout.response,
        window: { name: "kaiser", beta: betaFor(length) },
        scale: false,
      });
      return { design: { kind: "fir", taps: scaled(taps, gain) }, warnings: [] };
    },
    sizeLabel: (n) => `${n} taps (β = ${betaFor(n).toFixed(3)})`,
  };
}

function leastSquaresPlan(ctx: MethodContext): MethodPlan {
  const { layout } = ctx;
  const lattice = firLattice(passesNyquist(layout), Math.min(ctx.maxTaps, 4096));
  const estimate = equirippleEstimate(
    layout,
    narrowestTransition(layout),
    layout.passbandDeviation,
    layout.stopbandDeviation,
  );
  const gain = 10 ** (layout.gainDb / 20);
  // A squared-error design spreads its error; weighting each band by 1/δ² evens the peaks.
  const bands: DesignBand[] = layout.bands.map((b) => ({ ...b, weight: (b.weight ?? 1) ** 2 }));
  return {
    method: "leastSquares",
    label: LABELS.leastSquares,
    ...lattice,
    startIndex: clampIndex(lattice, lattice.indexOf(estimate ?? 3)),
    ...(estimate === undefined ? {} : {
      estimate,
      estimateSource: "Herrmann–Rabiner–Chan (the equiripple length, a lower bound in practice)",
    }),
    linearInSize: true,
    build: (length) => {
      const d = designLeastSquares({ length, fs: layout.fs, bands });
      return { design: { kind: "fir", taps: scaled(d.taps, gain) }, warnings: d.warnings };
    },
    sizeLabel: tapsLabel,
  };
}

function halfbandPlan(ctx: MethodContext): MethodPlan {
  const { layout } = ctx;
  const quarter = layout.fs / 4;
  const half = layout.fs / 2;
  if (layout.response !== "lowpass" && layout.response !== "highpass") {
    return notApplicable(
      "halfband",
      `A half-band filter is a lowpass or highpass, not a ${layout.response}`,
    );
  }
  const p = layout.passband as number;
  const s = layout.stopband as number;
  const straddles = layout.response === "lowpass"
    ? p < quarter && quarter < s
    : s < quarter && quarter < p;
  if (!straddles) {
    return notApplicable(
      "halfband",
      `A half-band filter is symmetric about fs/4 = ${
        show(quarter)
      } Hz, which must lie inside the transition band ${show(Math.min(p, s))}–${
        show(Math.max(p, s))
      } Hz`,
    );
  }
  // The half-band lowpass whose passband edge e covers both the passband and the mirrored stopband.
  const edge = layout.response === "lowpass" ? Math.max(p, half - s) : Math.max(s, half - p);
  const deviation = Math.min(layout.passbandDeviation, layout.stopbandDeviation);
  const lengthEstimate = equirippleEstimate(layout, [edge, half - edge], deviation, deviation);
  const lattice = {
    sizeOf: (k: number) => 4 * k - 1,
    indexOf: (n: number) => Math.max(2, Math.ceil((n + 1) / 4)),
    minIndex: 2,
    maxIndex: Math.floor((ctx.maxTaps + 1) / 4),
  };
  const estimate = lengthEstimate === undefined
    ? undefined
    : lattice.sizeOf(lattice.indexOf(lengthEstimate));
  const gain = 10 ** (layout.gainDb / 20);
  return {
    method: "halfband",
    label: LABELS.halfband,
    ...lattice,
    startIndex: clampIndex(lattice, lattice.indexOf(estimate ?? 7)),
    ...(estimate === undefined ? {} : {
      estimate,
      estimateSource: "Herrmann–Rabiner–Chan for δp = δs, rounded up to 4k − 1 taps",
    }),
    linearInSize: true,
    build: (length) => {
      const d = designHalfband({ length, fs: layout.fs, passbandEdge: edge });
      let taps = d.taps;
      if (layout.response === "highpass") {
        // 1 − H(z) (delayed): the complementary half-band highpass.
        const centre = (length - 1) / 2;
        taps = taps.map((h, n) => (n === centre ? 1 - h : 0 - h)); // 0 − h keeps zeros +0
      }
      return { design: { kind: "fir", taps: scaled(taps, gain) }, warnings: d.warnings };
    },
    sizeLabel: (n) => `${n} taps (${(n + 1) / 2 + 1} non-zero)`,
  };
}

/**
 * Passband edges of a bandstop moved toward the stopband so that the
 * prototype selectivity λ = min over the stopband edges of B·Ω/|Ω₀² − Ω²|
 * is largest (first the lower edge, then the upper, by golden-section search).
 * Moving a passband edge toward the stopband only widens the passband, so a
 * design meeting the moved edges meets the spec; the balanced λ lowers the order.
 */
function balancedBandstopEdges(layout: BandLayout): [number, number] {
  const fs = layout.fs;
  const warp = (f: number) => Math.tan((Math.PI * f) / fs);
  const [s0, s1] = (layout.stopband as [number, number]).map(warp) as [number, number];
  const lambda = (p0: number, p1: number): number => {
    const w0 = p0 * p1;
    const b = p1 - p0;
    return Math.min((b * s0) / Math.abs(w0 - s0 * s0), (b * s1) / Math.abs(w0 - s1 * s1));
  };
  const golden = (lo: number, hi: number, f: (x: number) => number): number => {
    const g = (Math.sqrt(5) - 1) / 2;
    let a = lo;
    let b = hi;
    for (let i = 0; i < 80 && b - a > 1e-12 * Math.max(1, b); i++) {
      const c = b - g * (b - a);
      const d = a + g * (b - a);
      if (f(c) >= f(d)) b = d;
      else a = c;
    }
    const best = (a + b) / 2;
    return f(best) >= f(lo) ? best : lo;
  };
  let [p0, p1] = layout.passband as [number, number];
  const [stop0, stop1] = layout.stopband as [number, number];
  let w0 = warp(p0);
  const w1 = warp(p1);
  w0 = golden(w0, warp(stop0 - 1e-9 * fs), (x) => lambda(x, w1));
  p0 = (fs / Math.PI) * Math.atan(w0);
  // The upper edge moves down toward the stopband: search in the reflected variable.
  const w1best = golden(-w1, -warp(stop1 + 1e-9 * fs), (x) => lambda(w0, -x));
  p1 = (fs / Math.PI) * Math.atan(-w1best);
  return [p0, p1];
}

function iirRequirements(layout: BandLayout, family: IirFamily): IirRequirements {
  return {
    family,
    response: layout.response,
    fs: layout.fs,
    passband: layout.response === "bandstop" ? balancedBandstopEdges(layout) : layout.passband,
    stopband: layout.stopband,
    passbandRippleDb: layout.passbandRippleDb,
    stopbandAttenuationDb: layout.stopbandAttenuationDb,
  };
}

/**
 * The design options for order N that leave margin on both sides: the
 * ripple and attenuation are tightened by a factor r on the power ratios
 * (Gp/r, Gs·r, with G = 10^(dB/10) − 1), r the geometric middle of 1 and the
 * largest factor for which the estimated order is still at most N.
 */
function tightenedEstimate(requirements: IirRequirements, order: number): IirOrderEstimate {
  const gp = Math.expm1((requirements.passbandRippleDb / 10) * Math.LN10);
  const gs = Math.expm1((requirements.stopbandAttenuationDb / 10) * Math.LN10);
  const dB = (ratio: number): number => (10 / Math.LN10) * Math.log1p(ratio);
  const at = (logR: number): IirOrderEstimate | undefined => {
    const r = Math.exp(logR);
    try {
      return estimateIirOrder({
        ...requirements,
        passbandRippleDb: dB(gp / r),
        stopbandAttenuationDb: dB(gs * r),
      });
    } catch {
      return undefined;
    }
  };
  const fits = (e: IirOrderEstimate | undefined): boolean => e !== undefined && e.order <= order;
  let lo = 0;
  let hi = Math.log(1e6);
  if (!fits(at(lo))) return estimateIirOrder(requirements);
  if (fits(at(hi))) lo = hi;
  else {
    for (let i = 0; i < 30; i++) {
      const mid = (lo + hi) / 2;
      if (fits(at(mid))) lo = mid;
      else hi = mid;
    }
  }
  return at(lo / 2) ?? estimateIirOrder(requirements);
}

function iirPlan(ctx: MethodContext, family: IirFamily): MethodPlan {
  const { layout } = ctx;
  const requirements = iirRequirements(layout, family);
  let estimate: IirOrderEstimate;
  try {
    estimate = estimateIirOrder(requirements);
  } catch (e) {
    return notApplicable(family, (e as Error).message);
  }
  const limit = family === "bessel" ? MAX_BESSEL_ORDER : MAX_IIR_ORDER;
  const gain = 10 ** (layout.gainDb / 20);
  const banded = layout.response === "bandpass" || layout.response === "bandstop";
  return {
    method: family,
    label: LABELS[family],
    sizeOf: (i) => i,
    indexOf: (s) => Math.ceil(s),
    // The order formulas give the smallest order meeting the band limits: no lower order can.
    minIndex: estimate.order,
    maxIndex: limit,
    startIndex: estimate.order,
    estimate: estimate.order,
    estimateSource: family === "bessel"
      ? "smallest Bessel order meeting both limits (evaluated prototype)"
      : family === "elliptic"
      ? "elliptic degree equation"
      : family === "butterworth"
      ? "Butterworth order formula"
      : "Chebyshev order formula",
    linearInSize: false,
    build: (order) => {
      const options = tightenedEstimate(requirements, order);
      const d = designIir({ ...options, order });
      return {
        design: { kind: "sections", sections: withGain(d.sections, gain) },
        warnings: d.warnings,
      };
    },
    sizeLabel: (n) => {
      const poles = banded ? 2 * n : n;
      const sections = Math.ceil(poles / 2);
      return banded
        ? `prototype order ${n} (${poles} poles, ${sections} sections)`
        : `order ${n} (${sections} section${sections === 1 ? "" : "s"})`;
    },
  };
}

function multistagePlan(ctx: MethodContext): MethodPlan {
  const { layout, decimation } = ctx;
  if (decimation < 2) {
    return notApplicable("multistage", "No decimation factor was given");
  }
  if (layout.response !== "lowpass") {
    return notApplicable(
      "multistage",
      `A multistage decimator is a lowpass, not a ${layout.response}`,
    );
  }
  const fs = layout.fs;
  const outputRate = fs / decimation;
  const p = layout.passband as number;
  const s = layout.stopband as number;
  if (!(p < outputRate / 2)) {
    return notApplicable(
      "multistage",
      `The passband edge ${show(p)} Hz must lie below the output Nyquist frequency fs/(2M) = ${
        show(outputRate / 2)
      } Hz`,
    );
  }
  if (s < outputRate / 2) {
    return notApplicable(
      "multistage",
      `The stopband starts at ${show(s)} Hz, below the output Nyquist frequency fs/(2M) = ${
        show(outputRate / 2)
      } Hz, where the stage plan puts the final transition band`,
    );
  }
  // The last stage stops from outputRate − edge; it must not start above the spec's stopband.
  const edge = Math.min(outputRate / 2, Math.max(outputRate - s, p + 1e-6 * outputRate));
  const rippleDb = rippleDbOf(layout.passbandDeviation);
  const gain = 10 ** (layout.gainDb / 20);
  return {
    method: "multistage",
    label: LABELS.multistage,
    sizeOf: (t) => t,
    indexOf: (t) => Math.ceil(t),
    minIndex: 0,
    maxIndex: 12,
    startIndex: 0,
    estimateSource:
      "Crochiere–Rabiner split with Herrmann–Rabiner–Chan stage lengths; size = tightening step",
    linearInSize: false,
    build: (step) => {
      const plan = planMultistageDecimator({
        fs,
        factor: decimation,
        passbandEdge: p,
        stopbandEdge: edge,
        passbandRippleDb: rippleDb * 0.8 ** step,
        stopbandAttenuationDb: layout.stopbandAttenuationDb + 1.5 * step,
      });
      const designed = designMultistageDecimator(plan);
      const stages = designed.stages.map((
        st,
        i,
      ) => (i === 0 ? { ...st, taps: scaled(st.taps, gain) } : st));
      return {
        design: { kind: "fir", taps: equivalentTaps(stages) },
        stages: { stages, warnings: designed.warnings },
        warnings: designed.warnings,
      };
    },
    sizeLabel: (step, built) => {
      if (built?.stages === undefined) return `tightening step ${step}`;
      const st = built.stages.stages;
      const factors = st.map((x) => `×${x.factor}`).join("");
      return `${st.length} stage${st.length === 1 ? "" : "s"} ${factors}: ${
        st.map((x) => x.taps.length).join(" + ")
      } taps${step > 0 ? ` (margins tightened, step ${step})` : ""}`;
    },
  };
}

/** The plan for one method. */
export function planMethod(method: SearchMethod, ctx: MethodContext): MethodPlan {
  switch (method) {
    case "equiripple":
      return equiripplePlan(ctx);
    case "kaiser":
      return kaiserPlan(ctx);
    case "leastSquares":
      return leastSquaresPlan(ctx);
    case "halfband":
      return halfbandPlan(ctx);
    case "multistage":
      return multistagePlan(ctx);
    case "butterworth":
    case "chebyshev1":
    case "chebyshev2":
    case "elliptic":
    case "bessel":
      return iirPlan(ctx, method);
  }
}
