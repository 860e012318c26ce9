import type { Complex, DesignWarning, Section, ZerosPolesGain } from "../types.ts";
import { requireSamples } from "../_validate.ts";
import { quadraticRoots } from "../poly/_quadratic.ts";
import { polynomialRoots } from "../poly/roots.ts";
import { requireSections, requireZerosPolesGain, splitConjugates } from "./_sections.ts";

/** Where the overall gain of a section cascade is placed. */
export type GainPlacement = "unit-peak" | "first";

/** Options for {@link zerosPolesToSections}. */
export interface SectionOptions {
  /**
   * "unit-peak": every section but the last is scaled so its peak magnitude
   * over 0..fs/2 is 1 (L∞ scaling, so no intermediate signal can grow beyond
   * the input's level at any single frequency); the last section carries the
   * rest. "first": the whole gain goes into the first section's numerator.
   * @default "unit-peak"
   */
  gainPlacement?: GainPlacement;
}

/** A transfer function as numerator and denominator coefficients. */
export interface RationalFunction {
  /** b[0..M]: highest power of z first, which is also ascending powers of z^−1. */
  numerator: Float64Array;
  /** a[0..N], a[0] = 1. */
  denominator: Float64Array;
  /** Conditioning warnings (high-order polynomials lose pole accuracy). */
  warnings: DesignWarning[];
}

interface Group {
  poles: Complex[];
  zeros: Complex[];
  radius: number;
}

/** Monic quadratic (or linear) coefficients [1, c1, c2] with roots r (0, 1 or 2). */
function monic(roots: readonly Complex[]): [number, number, number] {
  if (roots.length === 0) return [1, 0, 0];
  if (roots.length === 1) return [1, -roots[0]!.re, 0];
  const [a, b] = roots as [Complex, Complex];
  if (a.im !== 0) return [1, -2 * a.re, a.re * a.re + a.im * a.im];
  return [1, -(a.re + b.re), a.re * b.re];
}

/** Peak |H(e^jω)| of one section over a grid on [0, π] plus its pole angles. */
function sectionPeak(s: Section, poleAngles: readonly number[]): number {
  let peak = 0;
  const at = (w: number): void => {
    const c1 = Math.cos(w);
    const s1 = -Math.sin(w);
    const c2 = Math.cos(2 * w);
    const s2 = -Math.sin(2 * w);
    const nr = s.b0 + s.b1 * c1 + s.b2 * c2;
    const ni = s.b1 * s1 + s.b2 * s2;
    const dr = 1 + s.a1 * c1 + s.a2 * c2;
    const di = s.a1 * s1 + s.a2 * s2;
    const m = Math.sqrt((nr * nr + ni * ni) / (dr * dr + di * di));
    if (m > peak) peak = m;
  };
  for (let i = 0; i <= 512; i++) at((Math.PI * i) / 512);
  for (const w of poleAngles) at(w);
  return peak;
}

/**
 * Second-order sections from zeros, poles and gain (digital, z-plane).
 *
 * Pairing and ordering (after L. B. Jackson): poles are grouped as conjugate
 * pairs, real poles two at a time in order of radius, and at most one real
 * pole alone. Working from the pole group nearest the unit circle outwards,
 * each group takes the nearest remaining zeros — a conjugate pair, or one or
 * two real zeros — so that every high-Q pole pair is damped by its own zeros
 * and its section has the smallest possible peak gain. Sections are then
 * ordered by increasing pole radius, so the most resonant section comes last
 * and its round-off noise is not amplified by the sharper sections after it.
 * When there are fewer zeros than poles, zeros at z = 0 fill the sections
 * (the causal form without a pure delay); with more zeros than poles, poles
 * at z = 0 are added.
 *
 * Source: L. B. Jackson, Digital Filters and Signal Processing, 3rd ed.
 * (Kluwer, 1996), chapter on quantization effects: pole–zero pairing, section
 * ordering and scaling (cited from memory).
 *
 * @param zpk Digital zeros, poles and gain; complex values in conjugate pairs.
 * @param options Gain placement.
 * @returns ⌈max(zeros, poles)/2⌉ sections (a0 = 1 each); a first-order
 *   section has b2 = a2 = 0.
 * @throws {TypeError} When a value is not finite or a complex value has no conjugate.
 * @throws {RangeError} When there are no poles and no zeros.
 * @example
 * ```ts
 * import { zerosPolesToSections } from "./sections.ts";
 * const s = zerosPolesToSections({
 *   zeros: [{ re: -1, im: 0 }, { re: -1, im: 0 }],
 *   poles: [{ re: 0.5, im: 0.5 }, { re: 0.5, im: -0.5 }],
 *   gain: 0.25,
 * }, { gainPlacement: "first" });
 * // 0.25(1 + 2z⁻¹ + z⁻²) / (1 − z⁻¹ + 0.5z⁻²)
 * if (s.length !== 1 || s[0]!.b1 !== 0.5 || s[0]!.a1 !== -1 || s[0]!.a2 !== 0.5) throw new Error("one biquad");
 * ```
 */
export function zerosPolesToSections(
  zpk: ZerosPolesGain,
  options: SectionOptions = {},
): Section[] {
  requireZerosPolesGain(zpk);
  const placement = options.gainPlacement ?? "unit-peak";
  if (placement !== "unit-peak" && placement !== "first") {
    throw new TypeError(`Gain placement must be "unit-peak" or "first", got ${String(placement)}`);
  }
  const zerosIn = zpk.zeros.slice();
  const polesIn = zpk.poles.slice();
  while (zerosIn.length < polesIn.length) zerosIn.push({ re: 0, im: 0 });
  while (polesIn.length < zerosIn.length) polesIn.push({ re: 0, im: 0 });
  if (polesIn.length === 0) {
    throw new RangeError("Zeros/poles/gain must have at least one zero or pole, got none");
  }
  const p = splitConjugates(polesIn);
  const z = splitConjugates(zerosIn);
  const groups: Group[] = [];
  for (const c of p.pairs) {
    groups.push({ poles: [c, { re: c.re, im: -c.im }], zeros: [], radius: Math.hypot(c.re, c.im) });
  }
  const realPoles = p.reals.slice().sort((a, b) => Math.abs(b) - Math.abs(a));
  for (let i = 0; i < realPoles.length; i += 2) {
    const members = realPoles.slice(i, i + 2).map((re) => ({ re, im: 0 }));
    groups.push({ poles: members, zeros: [], radius: Math.abs(realPoles[i]!) });
  }
  const zeroPairs = z.pairs.slice();
  const realZeros = z.reals.slice();
  const distance = (a: Complex, b: Complex): number => Math.hypot(a.re - b.re, a.im - b.im);
  const takeNearestReal = (target: Complex): Complex | undefined => {
    let best = -1;
    for (let i = 0; i < realZeros.length; i++) {
      if (
        best < 0 ||
        Math.hypot(realZeros[i]! - target.re, target.im) <
          Math.hypot(realZeros[best]! - target.re, target.im)
      ) {
        best = i;
      }
    }
    if (best < 0) return undefined;
    const re = realZeros.splice(best, 1)[0]!;
    return { re, im: 0 };
  };
  // The lone first-order group (if any) reserves its real zero first.
  const single = groups.find((g) => g.poles.length === 1);
  if (single !== undefined) {
    const r = takeNearestReal(single.poles[0]!);
    if (r !== undefined) single.zeros.push(r);
  }
  const byRadius = groups.filter((g) => g !== single).sort((a, b) => b.radius - a.radius);
  for (const g of byRadius) {
    const target = g.poles[0]!;
    let pairIndex = -1;
    for (let i = 0; i < zeroPairs.length; i++) {
      if (
        pairIndex < 0 || distance(zeroPairs[i]!, target) < distance(zeroPairs[pairIndex]!, target)
      ) {
        pairIndex = i;
      }
    }
    let nearestReal = Infinity;
    for (const re of realZeros) {
      nearestReal = Math.min(nearestReal, distance({ re, im: 0 }, target));
    }
    const pairDistance = pairIndex < 0 ? Infinity : distance(zeroPairs[pairIndex]!, target);
    if (pairIndex >= 0 && pairDistance <= nearestReal) {
      const c = zeroPairs.splice(pairIndex, 1)[0]!;
      g.zeros.push(c, { re: c.re, im: -c.im });
    } else {
      for (let k = 0; k < 2; k++) {
        const r = takeNearestReal(target);
        if (r !== undefined) g.zeros.push(r);
      }
    }
  }
  // Leftover zeros can only remain when a first-order group took none.
  for (const g of groups) {
    while (g.zeros.length < g.poles.length && realZeros.length > 0) {
      g.zeros.push({ re: realZeros.shift()!, im: 0 });
    }
  }
  groups.sort((a, b) => a.radius - b.radius);
  const sections: Section[] = groups.map((g) => {
    const b = monic(g.zeros);
    const a = monic(g.poles);
    return { b0: b[0], b1: b[1], b2: b[2], a1: a[1], a2: a[2] };
  });
  // Gain: the monic sections have the zpk's shape; multiply in zpk.gain.
  let remaining = zpk.gain;
  if (placement === "unit-peak" && sections.length > 1) {
    for (let i = 0; i < sections.length - 1; i++) {
      const s = sections[i]!;
      const angles = groups[i]!.poles.map((q) => Math.abs(Math.atan2(q.im, q.re)));
      const peak = sectionPeak(s, angles);
      if (peak > 0 && Number.isFinite(peak)) {
        s.b0 /= peak;
        s.b1 /= peak;
        s.b2 /= peak;
        remaining *= peak;
      }
    }
    const last = sections[sections.length - 1]!;
    last.b0 *= remaining;
    last.b1 *= remaining;
    last.b2 *= remaining;
  } else {
    const first = sections[0]!;
    first.b0 *= remaining;
    first.b1 *= remaining;
    first.b2 *= remaining;
  }
  return sections;
}

/**
 * Zeros, poles and gain of a section cascade, each section's quadratics
 * solved in closed form (no high-order polynomial is formed). Section k
 * contributes the roots of b0·z² + b1·z + b2 and z² + a1·z + a2; a zero and a
 * pole both exactly at z = 0 cancel (first-order sections), and b0 = 0 drops
 * zeros (they lie at infinity, i.e. a pure delay). Gain = Π of each
 * section's leading numerator coefficient.
 *
 * Source: elementary algebra; quadratic roots without cancellation as in
 * W. H. Press et al., Numerical Recipes, 3rd ed., §5.6.
 *
 * @param sections The cascade, a0 = 1 in each.
 * @returns Zeros, poles (z-plane) and gain.
 * @throws {TypeError} When a coefficient is not finite or the list is malformed.
 * @example
 * ```ts
 * import { sectionsToZerosPoles } from "./sections.ts";
 * const zpk = sectionsToZerosPoles([{ b0: 1, b1: 0, b2: 1, a1: 0, a2: 0.25 }]);
 * // Zeros ±j, poles ±0.5j.
 * if (Math.abs(zpk.poles[0]!.im) !== 0.5 || Math.abs(zpk.zeros[0]!.im) !== 1) throw new Error("±0.5j");
 * ```
 */
export function sectionsToZerosPoles(sections: readonly Section[]): ZerosPolesGain {
  requireSections(sections);
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  let gain = 1;
  for (const s of sections) {
    let z: Complex[];
    if (s.b0 !== 0) {
      z = quadraticRoots(s.b0, s.b1, s.b2);
      gain *= s.b0;
    } else if (s.b1 !== 0) {
      z = [{ re: -s.b2 / s.b1, im: 0 }];
      gain *= s.b1;
    } else {
      z = [];
      gain *= s.b2;
    }
    const p = quadraticRoots(1, s.a1, s.a2);
    // Cancel coincident roots at the origin (first-order sections).
    for (let i = z.length - 1; i >= 0; i--) {
      const zi = z[i]!;
      if (zi.re !== 0 || zi.im !== 0) continue;
      const j = p.findIndex((q) => q.re === 0 && q.im === 0);
      if (j < 0) break;
      z.splice(i, 1);
      p.splice(j, 1);
    }
    zeros.push(...z);
    poles.push(...p);
  }
  return { zeros, poles, gain };
}

/** Estimated relative pole movement from rounding monic coefficients to double precision. */
function poleSensitivity(denominator: Float64Array, poles: readonly Complex[]): number {
  const n = denominator.length - 1;
  let worst = 0;
  for (let i = 0; i < poles.length; i++) {
    const p = poles[i]!;
    const r = Math.hypot(p.re, p.im);
    let bound = 0;
    for (let k = 0; k <= n; k++) bound += Math.abs(denominator[k]!) * Math.pow(r, n - k);
    let dr = 1;
    let di = 0;
    for (let j = 0; j < poles.length; j++) {
      if (j === i) continue;
      const er = p.re - poles[j]!.re;
      const ei = p.im - poles[j]!.im;
      const t = dr * er - di * ei;
      di = dr * ei + di * er;
      dr = t;
    }
    const derivative = Math.hypot(dr, di);
    const movement = derivative === 0 ? Infinity : (2.22e-16 * bound) / derivative;
    worst = Math.max(worst, movement / Math.max(r, 1e-300));
  }
  return worst;
}

/**
 * Multiply a section cascade out into one numerator and denominator,
 * B(z)/A(z) = Π (b0 + b1 z⁻¹ + b2 z⁻²) / Π (1 + a1 z⁻¹ + a2 z⁻²).
 *
 * Forming high-order polynomials loses accuracy: the result carries a
 * "polynomial-ill-conditioned" warning when rounding the denominator to
 * double precision would move a pole by more than 1e-6 of its radius
 * (first-order perturbation bound ε·Σ|a_k||p|^(N−k) / |A′(p)|).
 *
 * Source: J. H. Wilkinson, Rounding Errors in Algebraic Processes (1963),
 * ch. 2 (sensitivity of polynomial roots to their coefficients).
 *
 * @param sections The cascade.
 * @returns Numerator, denominator (a[0] = 1) in ascending powers of z⁻¹, and warnings.
 * @throws {TypeError} When a coefficient is not finite or the list is malformed.
 * @example
 * ```ts
 * import { sectionsToPolynomial } from "./sections.ts";
 * const { numerator, denominator } = sectionsToPolynomial([
 *   { b0: 1, b1: 1, b2: 0, a1: -0.5, a2: 0 },
 *   { b0: 1, b1: -1, b2: 0, a1: 0.5, a2: 0 },
 * ]);
 * // (1 + z⁻¹)(1 − z⁻¹) = 1 − z⁻², (1 − 0.5z⁻¹)(1 + 0.5z⁻¹) = 1 − 0.25z⁻²
 * if (numerator.join() !== "1,0,-1,0,0" || denominator.join() !== "1,0,-0.25,0,0") throw new Error("product");
 * ```
 */
export function sectionsToPolynomial(sections: readonly Section[]): RationalFunction {
  requireSections(sections);
  let b: Float64Array = new Float64Array([1]);
  let a: Float64Array = new Float64Array([1]);
  for (const s of sections) {
    b = times(b, [s.b0, s.b1, s.b2]);
    a = times(a, [1, s.a1, s.a2]);
  }
  const warnings: DesignWarning[] = [];
  const poles = sections.flatMap((s) => quadraticRoots(1, s.a1, s.a2));
  const movement = poleSensitivity(a, poles);
  if (movement > 1e-6) {
    warnings.push({
      code: "polynomial-ill-conditioned",
      message: `Rounding the order-${
        a.length - 1
      } denominator to double precision can move a pole by about ${
        movement.toPrecision(2)
      } of its radius; filter in sections instead.`,
    });
  }
  return { numerator: b, denominator: a, warnings };
}

function times(p: Float64Array, q: readonly number[]): Float64Array {
  const out = new Float64Array(p.length + q.length - 1);
  for (let i = 0; i < p.length; i++) {
    for (let j = 0; j < q.length; j++) out[i + j]! += p[i]! * q[j]!;
  }
  return out;
}

/**
 * Numerator and denominator of k·Π(x − z_i)/Π(x − p_i), highest power first
 * (for a digital filter with as many zeros as poles this is also ascending
 * powers of z⁻¹, the form {@link applyIir} takes). Carries the same
 * conditioning warning as {@link sectionsToPolynomial}.
 *
 * Source: elementary algebra; conditioning as in J. H. Wilkinson, Rounding
 * Errors in Algebraic Processes (1963), ch. 2.
 *
 * @param zpk Zeros, poles and gain; complex values in conjugate pairs.
 * @returns Numerator (length zeros + 1), denominator (length poles + 1, leading 1) and warnings.
 * @throws {TypeError} When a value is not finite or a complex value has no conjugate.
 * @example
 * ```ts
 * import { zerosPolesToPolynomial } from "./sections.ts";
 * const r = zerosPolesToPolynomial({ zeros: [{ re: 1, im: 0 }], poles: [{ re: 0, im: 0.5 }, { re: 0, im: -0.5 }], gain: 2 });
 * if (r.numerator.join() !== "2,-2" || r.denominator.join() !== "1,0,0.25") throw new Error("expanded");
 * ```
 */
export function zerosPolesToPolynomial(zpk: ZerosPolesGain): RationalFunction {
  requireZerosPolesGain(zpk);
  const expand = (values: readonly Complex[]): Float64Array => {
    const { pairs, reals } = splitConjugates(values);
    let c: Float64Array = new Float64Array([1]);
    for (const q of pairs) c = times(c, [1, -2 * q.re, q.re * q.re + q.im * q.im]);
    for (const r of reals) c = times(c, [1, -r]);
    return c;
  };
  const numerator = expand(zpk.zeros).map((v) => v * zpk.gain);
  const denominator = expand(zpk.poles);
  const warnings: DesignWarning[] = [];
  const movement = poleSensitivity(denominator, zpk.poles);
  if (movement > 1e-6) {
    warnings.push({
      code: "polynomial-ill-conditioned",
      message: `Rounding the order-${
        denominator.length - 1
      } denominator to double precision can move a pole by about ${
        movement.toPrecision(2)
      } of its radius; keep the filter as zeros/poles or sections.`,
    });
  }
  return { numerator, denominator, warnings };
}

/**
 * Zeros, poles and gain of B(x)/A(x) (coefficients highest power first), the
 * roots found by {@link polynomialRoots}; gain = b[0]/a[0] after dropping
 * leading zeros.
 *
 * Source: polynomial roots by Aberth–Ehrlich iteration (see polynomialRoots).
 *
 * @param numerator b[0..M], at least one non-zero value.
 * @param denominator a[0..N], at least one non-zero value.
 * @returns Zeros, poles and gain.
 * @throws {TypeError} When a coefficient is not finite.
 * @throws {RangeError} When a polynomial is all zeros.
 * @example
 * ```ts
 * import { polynomialToZerosPoles } from "./sections.ts";
 * const zpk = polynomialToZerosPoles([2, -2], [1, 0, 0.25]);
 * if (zpk.gain !== 2 || zpk.zeros[0]!.re !== 1 || Math.abs(zpk.poles[0]!.im) !== 0.5) throw new Error("zpk");
 * ```
 */
export function polynomialToZerosPoles(
  numerator: ArrayLike<number>,
  denominator: ArrayLike<number>,
): ZerosPolesGain {
  requireSamples("Numerator", numerator);
  requireSamples("Denominator", denominator);
  const lead = (c: ArrayLike<number>): number => {
    for (let i = 0; i < c.length; i++) if (c[i] !== 0) return c[i] as number;
    return 0;
  };
  const zeros = polynomialRoots(numerator);
  const poles = polynomialRoots(denominator);
  return { zeros, poles, gain: lead(numerator) / lead(denominator) };
}

/**
 * Second-order sections from a numerator and denominator (highest power
 * first, i.e. ascending powers of z⁻¹): the polynomials' roots by
 * Aberth–Ehrlich iteration, then the pairing, ordering and gain placement of
 * {@link zerosPolesToSections}. Avoids ever filtering with the fragile
 * high-order direct form. An m-fold root (e.g. the N-fold zero at z = −1 of
 * a Butterworth lowpass) is only determined to about ε^(1/m) by the
 * polynomial's coefficients, so keep designs as sections where you can.
 *
 * Source: L. B. Jackson, Digital Filters and Signal Processing, 3rd ed.,
 * pairing and ordering (cited from memory); roots as in polynomialRoots.
 *
 * @param numerator b[0..M], at least one non-zero value.
 * @param denominator a[0..N], a[0] ≠ 0.
 * @param options Gain placement.
 * @returns The sections.
 * @throws {TypeError} When a coefficient is not finite.
 * @throws {RangeError} When a[0] = 0 or a polynomial is all zeros.
 * @example
 * ```ts
 * import { polynomialToSections } from "./sections.ts";
 * // (1 + z⁻¹)² / (1 − z⁻¹ + 0.5z⁻²) as one biquad.
 * const [s] = polynomialToSections([1, 2, 1], [1, -1, 0.5], { gainPlacement: "first" });
 * if (Math.abs(s!.a1 + 1) > 1e-15 || Math.abs(s!.b1 - 2) > 1e-12) throw new Error("biquad");
 * ```
 */
export function polynomialToSections(
  numerator: ArrayLike<number>,
  denominator: ArrayLike<number>,
  options: SectionOptions = {},
): Section[] {
  requireSamples("Denominator", denominator);
  if (denominator[0] === 0) throw new RangeError("Denominator a[0] must not be 0, got 0");
  return zerosPolesToSections(polynomialToZerosPoles(numerator, denominator), options);
}
