// Accurate poles of the reverse Bessel polynomial (private).
//
// θ_N(s) = Σ a_k s^k has positive integer coefficients spanning ~30 decades
// at N = 25, and its roots lie in the left half-plane where the terms cancel
// heavily: evaluated in double precision, θ_N is only known to within its
// rounding error near the roots, which limits any root finder to roughly
// ε·Σ|a_k||s|^k / |θ_N′(s)| (1e-7 relative at N = 20, worse beyond). Here the
// double-precision Aberth roots are refined by further Aberth sweeps in which
// θ_N and θ_N′ are evaluated in double-double arithmetic (≈ 106-bit) from the
// exact integer coefficients, which restores full double accuracy.
// Source: T. J. Dekker, "A floating-point technique for extending the
// available precision", Numer. Math. 18 (1971) 224–242 (error-free sums and
// products); O. Aberth, Math. Comp. 27 (1973) 339–344.
import type { Complex } from "../types.ts";

const SPLIT = 134217729; // 2^27 + 1

function twoSum(a: number, b: number): [number, number] {
  const s = a + b;
  const bb = s - a;
  return [s, (a - (s - bb)) + (b - bb)];
}

function twoProd(a: number, b: number): [number, number] {
  const p = a * b;
  let t = SPLIT * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLIT * b;
  const bh = t - (t - b);
  const bl = b - bh;
  return [p, ((ah * bh - p) + ah * bl + al * bh) + al * bl];
}

/** Double-double (hi, lo) plus double-double. */
function ddAdd(ah: number, al: number, bh: number, bl: number): [number, number] {
  const [s, e] = twoSum(ah, bh);
  const [h, l] = twoSum(s, e + al + bl);
  return [h, l];
}

/** Double-double times double. */
function ddMul(ah: number, al: number, b: number): [number, number] {
  const [p, e] = twoProd(ah, b);
  return twoSum(p, e + al * b);
}

/** Exact coefficients a_k = (2N − k)! / (2^(N−k) k! (N − k)!), k = 0..N, as double-doubles. */
function exactCoefficients(order: number): [number, number][] {
  const factorial = (n: number): bigint => {
    let f = 1n;
    for (let i = 2n; i <= BigInt(n); i++) f *= i;
    return f;
  };
  const out: [number, number][] = [];
  for (let k = 0; k <= order; k++) {
    const a = factorial(2 * order - k) /
      ((1n << BigInt(order - k)) * factorial(k) * factorial(order - k));
    const hi = Number(a);
    const lo = Number(a - BigInt(hi));
    out.push([hi, lo]);
  }
  return out;
}

/** θ(z)/θ′(z) with θ and θ′ evaluated by Horner's rule in double-double. */
function newtonRatio(c: readonly [number, number][], zr: number, zi: number): [number, number] {
  // p and d as double-double complex numbers, highest power first.
  let [prh, prl] = c[c.length - 1]!;
  let [pih, pil] = [0, 0];
  let [drh, drl] = [0, 0];
  let [dih, dil] = [0, 0];
  for (let k = c.length - 2; k >= 0; k--) {
    // d = d·z + p
    const [a1h, a1l] = ddMul(drh, drl, zr);
    const [a2h, a2l] = ddMul(dih, dil, -zi);
    const [b1h, b1l] = ddMul(drh, drl, zi);
    const [b2h, b2l] = ddMul(dih, dil, zr);
    [drh, drl] = ddAdd(...ddAdd(a1h, a1l, a2h, a2l), prh, prl);
    [dih, dil] = ddAdd(...ddAdd(b1h, b1l, b2h, b2l), pih, pil);
    // p = p·z + c_k
    const [c1h, c1l] = ddMul(prh, prl, zr);
    const [c2h, c2l] = ddMul(pih, pil, -zi);
    const [e1h, e1l] = ddMul(prh, prl, zi);
    const [e2h, e2l] = ddMul(pih, pil, zr);
    const [ch, cl] = c[k]!;
    [prh, prl] = ddAdd(...ddAdd(c1h, c1l, c2h, c2l), ch, cl);
    [pih, pil] = ddAdd(e1h, e1l, e2h, e2l);
  }
  const pr = prh + prl;
  const pi = pih + pil;
  const dr = drh + drl;
  const di = dih + dil;
  const dd = dr * dr + di * di;
  return [(pr * dr + pi * di) / dd, (pi * dr - pr * di) / dd];
}

/**
 * Refine approximate roots of θ_N by Aberth sweeps with double-double
 * evaluation, then restore exact conjugate symmetry.
 */
export function refineBesselRoots(order: number, start: readonly Complex[]): Complex[] {
  const c = exactCoefficients(order);
  const z = start.map((r) => ({ re: r.re, im: r.im }));
  const n = z.length;
  for (let sweep = 0; sweep < 100; sweep++) {
    let moved = 0;
    for (let i = 0; i < n; i++) {
      const zi = z[i]!;
      const [rr, ri] = newtonRatio(c, zi.re, zi.im);
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const ur = zi.re - z[j]!.re;
        const ui = zi.im - z[j]!.im;
        const uu = ur * ur + ui * ui;
        if (uu === 0) continue;
        sr += ur / uu;
        si -= ui / uu;
      }
      const denR = 1 - (rr * sr - ri * si);
      const denI = -(rr * si + ri * sr);
      const den = denR * denR + denI * denI;
      const wr = (rr * denR + ri * denI) / den;
      const wi = (ri * denR - rr * denI) / den;
      if (!Number.isFinite(wr) || !Number.isFinite(wi)) continue;
      zi.re -= wr;
      zi.im -= wi;
      moved = Math.max(moved, Math.hypot(wr, wi) / Math.hypot(zi.re, zi.im));
    }
    if (moved < 4e-16) break;
  }
  const upper = z.filter((r) => r.im > 0).sort((a, b) => a.re - b.re);
  const out: Complex[] = [];
  for (const r of upper) out.push({ re: r.re, im: r.im }, { re: r.re, im: -r.im });
  if (order % 2 === 1) {
    const real = z.reduce((best, r) => (Math.abs(r.im) < Math.abs(best.im) ? r : best));
    out.push({ re: real.re, im: 0 });
  }
  return out.length === n ? out : z;
}
