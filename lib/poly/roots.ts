import type { Complex } from "../types.ts";
import { requireSamples } from "../_validate.ts";
import { quadraticRoots } from "./_quadratic.ts";

const EPS = 2.220446049250313e-16;
const MAX_ITERATIONS = 500;

/**
 * All complex roots of a real polynomial
 * p(x) = c[0]·x^n + c[1]·x^(n−1) + … + c[n], by the Aberth–Ehrlich
 * simultaneous iteration followed by Newton polishing on the original
 * coefficients.
 *
 * Each sweep updates every estimate z_i by
 * w_i = (p/p′)(z_i) / (1 − (p/p′)(z_i)·Σ_{j≠i} 1/(z_i − z_j)),
 * starting from points on a circle whose radius is the geometric mean of the
 * root moduli |c[n]/c[0]|^(1/n). An estimate stops moving once |p(z_i)| is
 * below the rounding-error bound of Horner's rule, so the result is as
 * accurate as the coefficients allow (simple roots to a few ulps relative to
 * their conditioning; an m-fold root to about ε^(1/m)). Leading zero
 * coefficients are dropped; trailing zero coefficients give exact roots at 0.
 * Because the coefficients are real, non-real roots are returned in exact
 * conjugate pairs (positive imaginary part first) and real roots with an
 * imaginary part of exactly 0. Roots are sorted by real part, then imaginary part.
 *
 * Source: O. Aberth, "Iteration methods for finding all zeros of a
 * polynomial simultaneously", Math. Comp. 27 (1973) 339–344; L. W. Ehrlich,
 * "A modified Newton method for polynomials", Comm. ACM 10 (1967) 107–108;
 * D. A. Bini, "Numerical computation of polynomial zeros by means of Aberth's
 * method", Numer. Algorithms 13 (1996) 179–200 (stopping rule).
 *
 * @param coefficients c[0..n], highest power first; at least one non-zero value.
 * @returns The n roots (n = degree after dropping leading zeros).
 * @throws {TypeError} When a coefficient is not finite.
 * @throws {RangeError} When every coefficient is 0.
 * @example
 * ```ts
 * import { polynomialRoots } from "./roots.ts";
 * // x² + 1 = 0 has roots ±j.
 * const r = polynomialRoots([1, 0, 1]);
 * if (r.length !== 2 || Math.abs(r[0]!.im - 1) > 1e-15 || r[1]!.im !== -r[0]!.im) {
 *   throw new Error("±j");
 * }
 * ```
 */
export function polynomialRoots(coefficients: ArrayLike<number>): Complex[] {
  requireSamples("Polynomial coefficients", coefficients);
  let first = 0;
  while (first < coefficients.length && coefficients[first] === 0) first++;
  if (first === coefficients.length) {
    throw new RangeError("Polynomial must have at least one non-zero coefficient, got all zeros");
  }
  let last = coefficients.length - 1;
  while (coefficients[last] === 0) last--;
  const zerosAtOrigin = coefficients.length - 1 - last;
  const c = new Float64Array(last - first + 1);
  for (let i = first; i <= last; i++) c[i - first] = coefficients[i] as number;
  const roots: Complex[] = [];
  for (let i = 0; i < zerosAtOrigin; i++) roots.push({ re: 0, im: 0 });
  const n = c.length - 1;
  if (n === 1) {
    roots.push({ re: -c[1]! / c[0]!, im: 0 });
  } else if (n === 2) {
    roots.push(...quadraticRoots(c[0]!, c[1]!, c[2]!));
  } else if (n > 2) {
    roots.push(...pairConjugates(aberth(c), c));
  }
  return roots.sort((a, b) => a.re - b.re || b.im - a.im);
}

/** Horner evaluation of p and p′ at z, with the running error bound of p. */
function horner(
  c: Float64Array,
  zr: number,
  zi: number,
): [number, number, number, number, number] {
  let pr = c[0]!;
  let pi = 0;
  let dr = 0;
  let di = 0;
  let bound = Math.abs(pr);
  const m = Math.hypot(zr, zi);
  for (let k = 1; k < c.length; k++) {
    const ndr = dr * zr - di * zi + pr;
    di = dr * zi + di * zr + pi;
    dr = ndr;
    const npr = pr * zr - pi * zi + c[k]!;
    pi = pr * zi + pi * zr;
    pr = npr;
    bound = bound * m + Math.hypot(pr, pi);
  }
  return [pr, pi, dr, di, bound];
}

/**
 * Bini's starting points: circles whose radii come from the upper convex hull
 * of the points (k, log|a_k|), a_k the coefficient of x^k, so that roots of
 * very different sizes each get starting points near their own modulus.
 */
function startingPoints(c: Float64Array, zr: Float64Array, zi: Float64Array): void {
  const n = c.length - 1;
  const logs: number[] = [];
  for (let k = 0; k <= n; k++) {
    const a = Math.abs(c[n - k]!);
    logs.push(a === 0 ? -Infinity : Math.log(a));
  }
  const hull: number[] = [];
  for (let k = 0; k <= n; k++) {
    if (logs[k] === -Infinity) continue;
    while (hull.length >= 2) {
      const i = hull[hull.length - 2]!;
      const j = hull[hull.length - 1]!;
      // Drop j when it lies on or below the chord from i to k.
      if ((logs[j]! - logs[i]!) * (k - i) <= (logs[k]! - logs[i]!) * (j - i)) hull.pop();
      else break;
    }
    hull.push(k);
  }
  let index = 0;
  for (let h = 0; h + 1 < hull.length; h++) {
    const i = hull[h]!;
    const j = hull[h + 1]!;
    const count = j - i;
    const radius = Math.exp((logs[i]! - logs[j]!) / count);
    for (let m = 0; m < count; m++) {
      const t = (2 * Math.PI * m) / count + (2 * Math.PI * h) / n + 0.4;
      zr[index] = radius * Math.cos(t);
      zi[index] = radius * Math.sin(t);
      index++;
    }
  }
}

/**
 * The Newton correction p(z)/p′(z), or null when |p(z)| is already below the
 * rounding-error bound. Outside the unit circle the reversed polynomial
 * q(w) = w^n p(1/w) is used, so that large |z| cannot overflow:
 * p′/p = n/z − q′(w)/(q(w)·z²).
 */
function newtonStep(
  c: Float64Array,
  reversed: Float64Array,
  zr: number,
  zi: number,
): [number, number] | null {
  const n = c.length - 1;
  if (zr * zr + zi * zi <= 1) {
    const [pr, pi, dr, di, bound] = horner(c, zr, zi);
    if (Math.hypot(pr, pi) <= 4 * n * EPS * bound) return null;
    const dd = dr * dr + di * di;
    if (dd === 0) return [pr, pi];
    return [(pr * dr + pi * di) / dd, (pi * dr - pr * di) / dd];
  }
  const zz = zr * zr + zi * zi;
  const wr = zr / zz;
  const wi = -zi / zz;
  const [qr, qi, dr, di, bound] = horner(reversed, wr, wi);
  if (Math.hypot(qr, qi) <= 4 * n * EPS * bound) return null;
  // t = q'/q
  const qq = qr * qr + qi * qi;
  const tr = (dr * qr + di * qi) / qq;
  const ti = (di * qr - dr * qi) / qq;
  // p'/p = n·w − t·w²
  const w2r = wr * wr - wi * wi;
  const w2i = 2 * wr * wi;
  const gr = n * wr - (tr * w2r - ti * w2i);
  const gi = n * wi - (tr * w2i + ti * w2r);
  const gg = gr * gr + gi * gi;
  if (gg === 0) return [0, 0];
  return [gr / gg, -gi / gg];
}

function aberth(c: Float64Array): Complex[] {
  const n = c.length - 1;
  const zr = new Float64Array(n);
  const zi = new Float64Array(n);
  const done = new Uint8Array(n);
  const reversed = c.slice().reverse();
  startingPoints(c, zr, zi);
  let remaining = n;
  for (let iter = 0; iter < MAX_ITERATIONS && remaining > 0; iter++) {
    for (let i = 0; i < n; i++) {
      if (done[i]) continue;
      const step = newtonStep(c, reversed, zr[i]!, zi[i]!);
      if (step === null) {
        done[i] = 1;
        remaining--;
        continue;
      }
      const [rr, ri] = step;
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const ur = zr[i]! - zr[j]!;
        const ui = zi[i]! - zi[j]!;
        const uu = ur * ur + ui * ui;
        if (uu === 0) continue;
        sr += ur / uu;
        si -= ui / uu;
      }
      // w = ratio / (1 − ratio·s)
      const den_r = 1 - (rr * sr - ri * si);
      const den_i = -(rr * si + ri * sr);
      const den = den_r * den_r + den_i * den_i;
      const wr = den === 0 ? rr : (rr * den_r + ri * den_i) / den;
      const wi = den === 0 ? ri : (ri * den_r - rr * den_i) / den;
      zr[i]! -= wr;
      zi[i]! -= wi;
      if (Math.hypot(wr, wi) <= EPS * Math.hypot(zr[i]!, zi[i]!)) {
        done[i] = 1;
        remaining--;
      }
    }
  }
  const out: Complex[] = [];
  for (let i = 0; i < n; i++) out.push(polish(c, zr[i]!, zi[i]!));
  return out;
}

/** A few Newton steps on the original polynomial, kept only while |p| falls. */
function polish(c: Float64Array, zr: number, zi: number): Complex {
  let [pr, pi, dr, di] = horner(c, zr, zi);
  let best = Math.hypot(pr, pi);
  for (let k = 0; k < 3 && best > 0; k++) {
    const dd = dr * dr + di * di;
    if (dd === 0) break;
    const nr = zr - (pr * dr + pi * di) / dd;
    const ni = zi - (pi * dr - pr * di) / dd;
    const h = horner(c, nr, ni);
    const m = Math.hypot(h[0], h[1]);
    if (!(m < best)) break;
    zr = nr;
    zi = ni;
    [pr, pi, dr, di] = h;
    best = m;
  }
  return { re: zr, im: zi };
}

/**
 * Make the root set exactly conjugate-symmetric: a root whose mirror image is
 * nearer to itself than to any other root is real; otherwise it is averaged
 * with the nearest mirror partner.
 */
function pairConjugates(roots: Complex[], c: Float64Array): Complex[] {
  const n = roots.length;
  const used = new Uint8Array(n);
  const out: Complex[] = [];
  const order = roots.map((_, i) => i).sort((a, b) =>
    Math.abs(roots[a]!.im) - Math.abs(roots[b]!.im)
  );
  // Real roots first (smallest |imag|), so they are not taken as partners.
  for (const i of order) {
    if (used[i]) continue;
    used[i] = 1;
    const z = roots[i]!;
    let best = -1;
    let bestDistance = Infinity;
    for (let j = 0; j < n; j++) {
      if (used[j]) continue;
      const d = Math.hypot(roots[j]!.re - z.re, roots[j]!.im + z.im);
      if (d < bestDistance) {
        bestDistance = d;
        best = j;
      }
    }
    if (best < 0 || 2 * Math.abs(z.im) <= bestDistance) {
      out.push(polishReal(c, z.re));
      continue;
    }
    used[best] = 1;
    const w = roots[best]!;
    const re = (z.re + w.re) / 2;
    const im = Math.abs(z.im - w.im) / 2;
    out.push({ re, im }, { re, im: -im });
  }
  return out;
}

/** Newton polishing of a real root in real arithmetic. */
function polishReal(c: Float64Array, x: number): Complex {
  let [p, , d] = horner(c, x, 0);
  let best = Math.abs(p);
  for (let k = 0; k < 3 && best > 0 && d !== 0; k++) {
    const nx = x - p / d;
    const h = horner(c, nx, 0);
    if (!(Math.abs(h[0]) < best)) break;
    x = nx;
    p = h[0];
    d = h[2];
    best = Math.abs(p);
  }
  return { re: x, im: 0 };
}
