import { show } from "../_validate.ts";
import { powerRatioMinusOne, requireAttenuation, requireRipple } from "./_checks.ts";
import { completeK } from "./_elliptic.ts";
import { type BandShape, prewarp, requireEdges, requireShape, unwarp } from "./_edges.ts";
import type { IirBandShape, IirDesignOptions, IirFamily } from "./design.ts";
import { besselPrototype, MAX_BESSEL_ORDER } from "./prototypes.ts";
import { MAX_ORDER } from "./_checks.ts";

/** A written IIR requirement: band edges, ripple and attenuation. */
export interface IirRequirements {
  /** Approximation family. */
  family: IirFamily;
  /** Band shape. */
  response: IirBandShape;
  /** Sample rate in Hz, > 0. */
  fs: number;
  /** Passband edge(s) in Hz: one, or [low, high] for bandpass/bandstop. */
  passband: number | readonly [number, number];
  /** Stopband edge(s) in Hz: one, or [low, high] for bandpass/bandstop. */
  stopband: number | readonly [number, number];
  /** Largest allowed passband loss in dB, > 0. */
  passbandRippleDb: number;
  /** Smallest allowed stopband attenuation in dB, > passband ripple. */
  stopbandAttenuationDb: number;
}

/** The lowest order meeting a requirement, ready to pass to designIir. */
export interface IirOrderEstimate extends IirDesignOptions {
  /**
   * Stopband edge of the equivalent analog lowpass prototype whose passband
   * edge is 1 (the selectivity ratio the order formula used); > 1.
   */
  prototypeStopband: number;
}

/**
 * The lowest order of an IIR family that meets a passband ripple and
 * stopband attenuation over given band edges, with the edges that
 * {@link designIir} should use so that the passband is met exactly
 * (Chebyshev II: so the passband is met exactly and the stopband with margin).
 *
 * Edges are pre-warped (Ω = 2fs·tan(πf/fs)) and reduced to a lowpass
 * prototype with passband edge 1 and stopband edge λ (bandpass:
 * λ = min |Ω² − Ω₀²|/(B·Ω) over the stopband edges, Ω₀² = Ωp1·Ωp2,
 * B = Ωp2 − Ωp1; bandstop: λ = min B·Ω/|Ω₀² − Ω²|). With
 * Gp = 10^(Ap/10) − 1 and Gs = 10^(As/10) − 1:
 * - Butterworth: N = ⌈log(Gs/Gp) / (2·log λ)⌉ (S. Butterworth 1930; Parks & Burrus)
 * - Chebyshev I and II: N = ⌈acosh(√(Gs/Gp)) / acosh λ⌉ (Parks & Burrus)
 * - elliptic: the degree equation N = ⌈K(1/λ)·K′(k1) / (K′(1/λ)·K(k1))⌉, k1 = √(Gp/Gs)
 *   (Daniels 1974; Orfanidis 2006)
 * - Bessel: no closed form exists; the smallest N ≤ 25 whose −3 dB-normalised
 *   prototype meets both limits, found by evaluating the response
 *   (the result uses besselNormalisation "magnitude").
 * Bandstop passband edges are used as given (no search for a lower order by
 * moving them).
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987),
 * analog approximation chapters (cited from memory); R. W. Daniels, Approximation Methods for Electronic Filter Design
 * (McGraw-Hill, 1974).
 *
 * @param requirements Family, shape, fs, passband and stopband edges, ripple and attenuation.
 * @returns Design options (order, edges, ripple/attenuation) plus the prototype stopband ratio.
 * @throws {RangeError} Edges outside (0, fs/2), a stopband edge inside the
 *   passband, ripple ≤ 0, attenuation ≤ ripple, or an order above the family's limit.
 * @throws {TypeError} Unknown family or shape, wrong number of edges.
 * @example
 * ```ts
 * import { estimateIirOrder } from "./order.ts";
 * const e = estimateIirOrder({
 *   family: "butterworth", response: "lowpass", fs: 2,
 *   passband: 0.2, stopband: 0.3, passbandRippleDb: 3, stopbandAttenuationDb: 40,
 * });
 * // log(9999/0.995)/(2·log(tan(0.15π)/tan(0.1π))) = 10.4 → 11
 * if (e.order !== 11) throw new Error(`order ${e.order}`);
 * ```
 */
export function estimateIirOrder(requirements: IirRequirements): IirOrderEstimate {
  if (requirements === null || typeof requirements !== "object") {
    throw new TypeError(`IIR requirements must be an object, got ${String(requirements)}`);
  }
  const { family, response, fs, passbandRippleDb: ap, stopbandAttenuationDb: as } = requirements;
  requireShape(response);
  requireRipple(ap);
  requireAttenuation(as, ap);
  const pass = requireEdges(
    "Passband edge",
    requirements.passband as number | number[],
    response,
    fs,
  );
  const stop = requireEdges(
    "Stopband edge",
    requirements.stopband as number | number[],
    response,
    fs,
  );
  requireStopbandOutside(response, pass, stop);
  const wp = pass.map((f) => prewarp(f, fs));
  const ws = stop.map((f) => prewarp(f, fs));
  let lambda: number;
  let w0 = 0;
  let bw = 0;
  if (response === "lowpass") lambda = ws[0]! / wp[0]!;
  else if (response === "highpass") lambda = wp[0]! / ws[0]!;
  else {
    w0 = Math.sqrt(wp[0]! * wp[1]!);
    bw = wp[1]! - wp[0]!;
    const ratio = (w: number): number =>
      response === "bandpass"
        ? Math.abs(w * w - w0 * w0) / (bw * w)
        : (bw * w) / Math.abs(w0 * w0 - w * w);
    lambda = Math.min(ratio(ws[0]!), ratio(ws[1]!));
  }
  const gp = powerRatioMinusOne(ap);
  const gs = powerRatioMinusOne(as);
  let order: number;
  let scale = 1; // prototype frequency (passband-normalised) that the design edges map to
  switch (family) {
    case "butterworth":
      order = Math.ceil(Math.log10(gs / gp) / (2 * Math.log10(lambda)));
      break;
    case "chebyshev1":
    case "chebyshev2":
      order = Math.ceil(Math.acosh(Math.sqrt(gs / gp)) / Math.acosh(lambda));
      break;
    case "elliptic": {
      const k = 1 / lambda;
      const k1 = Math.sqrt(gp / gs);
      order = Math.ceil(
        (completeK(Math.sqrt(1 - k * k)) * completeK(k1)) /
          (completeK(k) * completeK(Math.sqrt(1 - k1 * k1))),
      );
      break;
    }
    case "bessel":
      [order, scale] = besselOrder(lambda, ap, as);
      break;
    default:
      throw new TypeError(
        `Family must be one of butterworth, chebyshev1, chebyshev2, elliptic, bessel, got ${
          String(family)
        }`,
      );
  }
  order = Math.max(order, 1);
  const limit = family === "bessel" ? MAX_BESSEL_ORDER : MAX_ORDER;
  if (order > limit) {
    throw new RangeError(
      `Required ${family} order must be at most ${limit}, got ${order}; relax the ripple, attenuation or transition band`,
    );
  }
  if (family === "butterworth") scale = Math.pow(gp, -1 / (2 * order));
  if (family === "chebyshev2") scale = Math.cosh(Math.acosh(Math.sqrt(gs / gp)) / order);
  let edges: number | [number, number];
  if (response === "lowpass") edges = unwarp(wp[0]! * scale, fs);
  else if (response === "highpass") edges = unwarp(wp[0]! / scale, fs);
  else if (response === "bandpass") {
    const root = Math.sqrt(scale * scale * bw * bw + 4 * w0 * w0);
    edges = [unwarp((root - scale * bw) / 2, fs), unwarp((root + scale * bw) / 2, fs)];
  } else {
    const root = Math.sqrt((bw * bw) / (scale * scale) + 4 * w0 * w0);
    edges = [unwarp((root - bw / scale) / 2, fs), unwarp((root + bw / scale) / 2, fs)];
  }
  const estimate: IirOrderEstimate = {
    family,
    response,
    order,
    fs,
    edges,
    prototypeStopband: lambda,
  };
  if (family === "chebyshev1" || family === "elliptic") estimate.passbandRippleDb = ap;
  if (family === "chebyshev2" || family === "elliptic") estimate.stopbandAttenuationDb = as;
  if (family === "bessel") estimate.besselNormalisation = "magnitude";
  return estimate;
}

function requireStopbandOutside(shape: BandShape, pass: number[], stop: number[]): void {
  const [p0, p1] = [pass[0]!, pass[1] ?? 0];
  const [s0, s1] = [stop[0]!, stop[1] ?? 0];
  const ok = shape === "lowpass"
    ? p0 < s0
    : shape === "highpass"
    ? s0 < p0
    : shape === "bandpass"
    ? s0 < p0 && p1 < s1
    : p0 < s0 && s1 < p1;
  if (ok) return;
  const rule = {
    lowpass: "stopband edge above the passband edge",
    highpass: "stopband edge below the passband edge",
    bandpass: "stopband edges outside the passband (s1 < p1 < p2 < s2)",
    bandstop: "stopband edges inside the passband edges (p1 < s1 < s2 < p2)",
  }[shape];
  throw new RangeError(
    `A ${shape} requirement must have its ${rule}, got passband ${
      pass.map(show).join("–")
    } Hz and stopband ${stop.map(show).join("–")} Hz`,
  );
}

/** Loss in dB of a Bessel prototype at ω rad/s. */
function besselLoss(poles: readonly { re: number; im: number }[], gain: number, w: number): number {
  let s = 0;
  for (const p of poles) s += Math.log10(p.re * p.re + (w - p.im) ** 2);
  return 10 * s - 20 * Math.log10(gain);
}

/** Smallest Bessel order meeting the limits, and its passband-normalised −3 dB frequency. */
function besselOrder(lambda: number, ap: number, as: number): [number, number] {
  for (let n = 1; n <= MAX_BESSEL_ORDER; n++) {
    const { poles, gain } = besselPrototype(n, "magnitude");
    // Frequency where the loss reaches ap (monotonic), by bisection.
    let lo = 0;
    let hi = 1;
    while (besselLoss(poles, gain, hi) < ap) hi *= 2;
    for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
      const mid = (lo + hi) / 2;
      if (besselLoss(poles, gain, mid) < ap) lo = mid;
      else hi = mid;
    }
    const wp = (lo + hi) / 2;
    if (besselLoss(poles, gain, wp * lambda) >= as) return [n, 1 / wp];
  }
  return [MAX_BESSEL_ORDER + 1, 1];
}
