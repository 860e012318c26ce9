// Polynomial roots by the Durand–Kerner (Weierstrass) simultaneous iteration.
import type { Complex } from "../types.ts";

/**
 * Roots of c[0]·z^N + c[1]·z^(N−1) + … + c[N] (c[0] ≠ 0), which are also the
 * roots in z of c[0] + c[1] z^−1 + … + c[N] z^−N. Iterates until the largest
 * correction is below 1e−14 of the root size or 2000 sweeps have run.
 */
export function polynomialRoots(c: readonly number[]): Complex[] {
  const n = c.length - 1;
  if (n < 1) return [];
  const lead = c[0] as number;
  const monic = c.map((v) => v / lead);
  // Start on a circle of the Cauchy bound radius, at angles that avoid symmetry.
  let bound = 0;
  for (let k = 1; k <= n; k++) bound = Math.max(bound, Math.abs(monic[k] as number));
  const radius = Math.min(1 + bound, 2);
  const zr = new Float64Array(n);
  const zi = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const t = (2 * Math.PI * k) / n + 0.4;
    zr[k] = radius * Math.cos(t);
    zi[k] = radius * Math.sin(t);
  }
  for (let sweep = 0; sweep < 2000; sweep++) {
    let change = 0;
    for (let i = 0; i < n; i++) {
      const xr = zr[i] as number;
      const xi = zi[i] as number;
      // p(x) by Horner.
      let pr = 1;
      let pi = 0;
      for (let k = 1; k <= n; k++) {
        const r = pr * xr - pi * xi + (monic[k] as number);
        pi = pr * xi + pi * xr;
        pr = r;
      }
      // ∏ (x − z_j), j ≠ i.
      let dr = 1;
      let di = 0;
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const er = xr - (zr[j] as number);
        const ei = xi - (zi[j] as number);
        const r = dr * er - di * ei;
        di = dr * ei + di * er;
        dr = r;
      }
      const d = dr * dr + di * di;
      if (d === 0) continue;
      const qr = (pr * dr + pi * di) / d;
      const qi = (pi * dr - pr * di) / d;
      zr[i] = xr - qr;
      zi[i] = xi - qi;
      change = Math.max(change, Math.hypot(qr, qi) / Math.max(1, Math.hypot(xr, xi)));
    }
    if (change < 1e-14) break;
  }
  const roots: Complex[] = [];
  for (let k = 0; k < n; k++) roots.push({ re: zr[k] as number, im: zi[k] as number });
  return roots;
}
