import type { Complex, ZerosPolesGain } from "../types.ts";
import { polynomialRoots } from "../poly/roots.ts";
import { powerRatioMinusOne, requireAttenuation, requireOrder, requireRipple } from "./_checks.ts";
import { completeK, ellipticDegreeParameter, incompleteF, jacobiFunctions } from "./_elliptic.ts";
import { refineBesselRoots } from "./_bessel.ts";

/** How a Bessel prototype is scaled in frequency. */
export type BesselNormalisation = "phase" | "delay" | "magnitude";

/** Highest Bessel order accepted (its polynomial's coefficients grow like (2n)!). */
export const MAX_BESSEL_ORDER = 25;

function realGain(poles: readonly Complex[], zeros: readonly Complex[]): number {
  // Re Π(−p) / Π(−z), the gain that makes |H(0)| = 1 for an all-pole or
  // finite-zero lowpass prototype.
  let nr = 1;
  let ni = 0;
  for (const p of poles) {
    const r = -p.re * nr + p.im * ni;
    ni = -p.re * ni - p.im * nr;
    nr = r;
  }
  let dr = 1;
  let di = 0;
  for (const z of zeros) {
    const r = -z.re * dr + z.im * di;
    di = -z.re * di - z.im * dr;
    dr = r;
  }
  return (nr * dr + ni * di) / (dr * dr + di * di);
}

/** Conjugate pairs from the upper-half-plane members, plus real values. */
function withConjugates(upper: readonly Complex[], real: readonly number[]): Complex[] {
  const out: Complex[] = [];
  for (const z of upper) out.push({ re: z.re, im: z.im }, { re: z.re, im: -z.im });
  for (const r of real) out.push({ re: r, im: 0 });
  return out;
}

/**
 * Analog Butterworth lowpass prototype, −3 dB at 1 rad/s:
 * |H(jΩ)|² = 1/(1 + Ω^(2N)), poles p_k = −e^(jπ(2k − N − 1)/(2N)), k = 1..N, on
 * the unit circle in the left half-plane; no finite zeros; gain 1.
 *
 * Source: S. Butterworth, "On the theory of filter amplifiers", Wireless
 * Engineer 7 (1930); A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 7 and Appendix B (continuous-time filters).
 *
 * @param order Filter order N, 1..40.
 * @returns Zeros (none), poles (conjugate pairs, then the real pole −1 when N is odd) and gain 1.
 * @throws {RangeError} When the order is not an integer in 1..40.
 * @example
 * ```ts
 * import { butterworthPrototype } from "./prototypes.ts";
 * const { poles } = butterworthPrototype(2);
 * // N = 2: poles at (−1 ± j)/√2.
 * if (Math.abs(poles[0]!.re + Math.SQRT1_2) > 1e-15) throw new Error("−1/√2");
 * ```
 */
export function butterworthPrototype(order: number): ZerosPolesGain {
  requireOrder(order);
  const upper: Complex[] = [];
  for (let m = 1 - order; m < 0; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    upper.push({ re: -Math.cos(theta), im: Math.sin(-theta) });
  }
  return { zeros: [], poles: withConjugates(upper, order % 2 ? [-1] : []), gain: 1 };
}

/**
 * Analog Chebyshev type I lowpass prototype: equiripple passband of
 * `rippleDb` up to 1 rad/s, where the gain first leaves the ripple band:
 * |H(jΩ)|² = 1/(1 + ε²·T_N(Ω)²), ε² = 10^(Rp/10) − 1. Poles
 * p_k = −sinh(μ + jθ_k), μ = asinh(1/ε)/N, θ_k = π(2k − N − 1)/(2N): the
 * Butterworth angles on an ellipse. The gain makes the peak passband gain 1
 * (DC gain 1 for odd N, −Rp dB for even N).
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987),
 * Chebyshev approximation (cited from memory); A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., Appendix B.
 *
 * @param order Filter order N, 1..40.
 * @param rippleDb Passband ripple Rp in dB, > 0.
 * @returns Zeros (none), poles and gain.
 * @throws {RangeError} When the order or ripple is out of range.
 * @example
 * ```ts
 * import { chebyshev1Prototype } from "./prototypes.ts";
 * const { poles, gain } = chebyshev1Prototype(1, 3);
 * // N = 1: a single pole at −1/ε with gain 1/ε, ε² = 10^0.3 − 1.
 * const e = Math.sqrt(10 ** 0.3 - 1);
 * if (Math.abs(poles[0]!.re + 1 / e) > 1e-15 || Math.abs(gain - 1 / e) > 1e-15) throw new Error("N=1");
 * ```
 */
export function chebyshev1Prototype(order: number, rippleDb: number): ZerosPolesGain {
  requireOrder(order);
  requireRipple(rippleDb);
  const eps = Math.sqrt(powerRatioMinusOne(rippleDb));
  const mu = Math.asinh(1 / eps) / order;
  const upper: Complex[] = [];
  for (let m = 1 - order; m < 0; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    upper.push({ re: -Math.sinh(mu) * Math.cos(theta), im: -Math.cosh(mu) * Math.sin(theta) });
  }
  const poles = withConjugates(upper, order % 2 ? [-Math.sinh(mu)] : []);
  let gain = realGain(poles, []);
  if (order % 2 === 0) gain /= Math.sqrt(1 + eps * eps);
  return { zeros: [], poles, gain };
}

/**
 * Analog Chebyshev type II (inverse Chebyshev) lowpass prototype: monotonic
 * passband, equiripple stopband at least `attenuationDb` down from 1 rad/s on,
 * where the gain first reaches −As: |H(jΩ)|² = 1/(1 + 1/(ε²·T_N(1/Ω)²)),
 * ε² = 1/(10^(As/10) − 1). Zeros at ±j/cos(π(2k − 1)/(2N)); poles are the
 * reciprocals of the type I poles for ripple ε. DC gain 1.
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987),
 * inverse Chebyshev approximation (cited from memory).
 *
 * @param order Filter order N, 1..40.
 * @param attenuationDb Minimum stopband attenuation As in dB, > 0.
 * @returns Zeros (N − N mod 2 on the imaginary axis), poles and gain.
 * @throws {RangeError} When the order or attenuation is out of range.
 * @example
 * ```ts
 * import { chebyshev2Prototype } from "./prototypes.ts";
 * const { zeros } = chebyshev2Prototype(2, 40);
 * // N = 2: zeros at ±j/cos(π/4) = ±j√2.
 * if (Math.abs(Math.abs(zeros[0]!.im) - Math.SQRT2) > 1e-15) throw new Error("±j√2");
 * ```
 */
export function chebyshev2Prototype(order: number, attenuationDb: number): ZerosPolesGain {
  requireOrder(order);
  requireAttenuation(attenuationDb);
  const eps = 1 / Math.sqrt(powerRatioMinusOne(attenuationDb));
  const mu = Math.asinh(1 / eps) / order;
  const zerosUpper: Complex[] = [];
  const polesUpper: Complex[] = [];
  for (let m = 1 - order; m < 0; m += 2) {
    const theta = (Math.PI * m) / (2 * order);
    zerosUpper.push({ re: 0, im: -1 / Math.sin(theta) });
    // Reciprocal of the type I pole −sinh(μ)cos θ − j cosh(μ) sin θ.
    const re = -Math.sinh(mu) * Math.cos(theta);
    const im = -Math.cosh(mu) * Math.sin(theta);
    const d = re * re + im * im;
    polesUpper.push({ re: re / d, im: Math.abs(im) / d });
  }
  const zeros = withConjugates(zerosUpper, []);
  const poles = withConjugates(polesUpper, order % 2 ? [-1 / Math.sinh(mu)] : []);
  return { zeros, poles, gain: realGain(poles, zeros) };
}

/**
 * Analog elliptic (Cauer) lowpass prototype: equiripple passband of
 * `rippleDb` up to 1 rad/s and equiripple stopband at least `attenuationDb`
 * down from Ω_s = 1/k on, where k solves the degree equation
 * N·K′(k1)/K(k1) = K′(k)/K(k) with discrimination k1 = ε_p/ε_s. With
 * K = K(k), u_i = (2i − 1)K/N (i = 1..⌊N/2⌋) and s, c, d = sn, cn, dn(u_i | k²):
 * zeros ±j/(k·s); poles −(c·d·s_v·c_v + j·s·d_v)/(1 − d²·s_v²) with
 * s_v, c_v, d_v = sn, cn, dn(v₀ | 1 − k²), v₀ = K·F(atan(1/ε_p) | 1 − k1²)/(N·K(k1)).
 * Peak passband gain 1 (DC gain −Rp dB for even N). Jacobi functions and
 * complete integrals come from the arithmetic–geometric mean, carrying each
 * modulus with its complement, so the result is accurate to a few ulps.
 *
 * Source: R. W. Daniels, Approximation Methods for Electronic Filter Design
 * (McGraw-Hill, 1974), elliptic approximation; S. J. Orfanidis, "Lecture notes on elliptic
 * filter design" (Rutgers, 2006), degree equation solved by nomes.
 *
 * @param order Filter order N, 1..40.
 * @param rippleDb Passband ripple Rp in dB, > 0.
 * @param attenuationDb Minimum stopband attenuation As in dB, > Rp.
 * @returns Zeros, poles and gain.
 * @throws {RangeError} When the order, ripple or attenuation is out of range.
 * @example
 * ```ts
 * import { ellipticPrototype } from "./prototypes.ts";
 * const { zeros, poles } = ellipticPrototype(4, 0.5, 60);
 * if (zeros.length !== 4 || poles.length !== 4 || poles.some((p) => p.re >= 0)) {
 *   throw new Error("4 zeros, 4 stable poles");
 * }
 * ```
 */
export function ellipticPrototype(
  order: number,
  rippleDb: number,
  attenuationDb: number,
): ZerosPolesGain {
  requireOrder(order);
  requireRipple(rippleDb);
  requireAttenuation(attenuationDb, rippleDb);
  const epsSquared = powerRatioMinusOne(rippleDb);
  const eps = Math.sqrt(epsSquared);
  if (order === 1) {
    return { zeros: [], poles: [{ re: -1 / eps, im: 0 }], gain: 1 / eps };
  }
  const k1Squared = epsSquared / powerRatioMinusOne(attenuationDb);
  const k1 = Math.sqrt(k1Squared);
  const k1Prime = Math.sqrt(1 - k1Squared);
  const m = ellipticDegreeParameter(order, k1, k1Prime);
  const k = Math.sqrt(m);
  const kPrime = Math.sqrt(1 - m);
  const bigK = completeK(kPrime);
  // v0 from sc(r | 1 − k1²) = 1/ε: r = F(atan(1/ε) | modulus k1′), complement k1.
  const r = incompleteF(Math.atan(1 / eps), k1);
  const v0 = (bigK * r) / (order * completeK(k1Prime));
  const v = jacobiFunctions(v0, kPrime, k);
  const zerosUpper: Complex[] = [];
  const polesUpper: Complex[] = [];
  const realPoles: number[] = [];
  for (let j = 1 - (order % 2); j < order; j += 2) {
    const f = jacobiFunctions((j * bigK) / order, k, kPrime);
    const den = 1 - (f.dn * v.sn) ** 2;
    const pole = { re: -(f.cn * f.dn * v.sn * v.cn) / den, im: -(f.sn * v.dn) / den };
    if (j === 0) {
      realPoles.push(pole.re);
      continue;
    }
    zerosUpper.push({ re: 0, im: 1 / (k * f.sn) });
    polesUpper.push({ re: pole.re, im: Math.abs(pole.im) });
  }
  const zeros = withConjugates(zerosUpper, []);
  const poles = withConjugates(polesUpper, realPoles);
  let gain = realGain(poles, zeros);
  if (order % 2 === 0) gain /= Math.sqrt(1 + epsSquared);
  return { zeros, poles, gain };
}

/**
 * Coefficients of the reverse Bessel polynomial θ_N(s) = Σ a_k s^k,
 * a_k = (2N − k)! / (2^(N−k)·k!·(N − k)!), returned highest power first.
 */
function reverseBesselPolynomial(order: number): Float64Array {
  const c = new Float64Array(order + 1);
  let a = 1; // a_N
  c[0] = 1;
  for (let k = order - 1; k >= 0; k--) {
    // a_k = a_{k+1} · (2N − k)(k + 1) / (2(N − k))
    a = (a * (2 * order - k) * (k + 1)) / (2 * (order - k));
    c[order - k] = a;
  }
  return c;
}

/**
 * Analog Bessel–Thomson lowpass prototype (maximally flat group delay):
 * H(s) = θ_N(0)/θ_N(s) with θ_N the reverse Bessel polynomial. Its poles are
 * found by Aberth iteration, then refined by Aberth sweeps that evaluate θ_N
 * in double-double arithmetic from its exact integer coefficients (in plain
 * double precision the cancellation between its terms limits the poles to
 * ~1e-7 at N = 20 and worse beyond); then they are scaled:
 * "delay" keeps the group delay at DC equal to 1 s; "phase" scales the poles
 * by θ_N(0)^(−1/N) so the phase response matches the Butterworth asymptote
 * (phase −Nπ/4 reached near 1 rad/s); "magnitude" puts the −3 dB point at 1 rad/s.
 * DC gain 1 in every case.
 *
 * Source: W. E. Thomson, "Delay networks having maximally flat frequency
 * characteristics", Proc. IEE 96 (1949) 487–490; A. B. Williams and F. J.
 * Taylor, Electronic Filter Design Handbook, 4th ed., ch. 2 (Bessel filters; cited from memory).
 *
 * @param order Filter order N, 1..25.
 * @param normalisation "phase", "delay" or "magnitude". @default "phase"
 * @returns Zeros (none), poles and gain.
 * @throws {RangeError} When the order is not an integer in 1..25.
 * @throws {TypeError} When the normalisation is not one of the three names.
 * @example
 * ```ts
 * import { besselPrototype } from "./prototypes.ts";
 * // N = 2 delay-normalised: H(s) = 3/(s² + 3s + 3), poles (−3 ± j√3)/2.
 * const { poles, gain } = besselPrototype(2, "delay");
 * if (Math.abs(poles[0]!.re + 1.5) > 1e-14 || gain !== 3) throw new Error("θ₂");
 * ```
 */
export function besselPrototype(
  order: number,
  normalisation: BesselNormalisation = "phase",
): ZerosPolesGain {
  requireOrder(order, MAX_BESSEL_ORDER);
  if (normalisation !== "phase" && normalisation !== "delay" && normalisation !== "magnitude") {
    throw new TypeError(
      `Bessel normalisation must be "phase", "delay" or "magnitude", got ${String(normalisation)}`,
    );
  }
  const c = reverseBesselPolynomial(order);
  const a0 = c[order]!;
  let poles: Complex[] = refineBesselRoots(order, polynomialRoots(c));
  let gain = a0;
  if (normalisation === "phase") {
    const s = Math.pow(a0, -1 / order);
    poles = poles.map((p) => ({ re: p.re * s, im: p.im * s }));
    gain = 1;
  } else if (normalisation === "magnitude") {
    const w = halfPowerFrequency(poles, a0);
    poles = poles.map((p) => ({ re: p.re / w, im: p.im / w }));
    gain = a0 / Math.pow(w, order);
  }
  return { zeros: [], poles, gain };
}

/** ω where |a0/Π(jω − p)|² = 1/2, by bisection then Newton on the log. */
function halfPowerFrequency(poles: readonly Complex[], a0: number): number {
  const f = (w: number): number => {
    let s = 0;
    for (const p of poles) s += Math.log(p.re * p.re + (w - p.im) ** 2);
    return s - 2 * Math.log(a0) - Math.LN2;
  };
  const df = (w: number): number => {
    let s = 0;
    for (const p of poles) s += (2 * (w - p.im)) / (p.re * p.re + (w - p.im) ** 2);
    return s;
  };
  let lo = 0;
  let hi = 1;
  while (f(hi) < 0) hi *= 2;
  for (let i = 0; i < 60 && hi - lo > 1e-3 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  let w = (lo + hi) / 2;
  for (let i = 0; i < 20; i++) {
    const step = f(w) / df(w);
    w -= step;
    if (Math.abs(step) <= 1e-16 * w) break;
  }
  return w;
}
