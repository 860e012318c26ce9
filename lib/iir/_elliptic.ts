// Jacobi elliptic functions and elliptic integrals by the arithmetic–geometric
// mean (private). Each routine takes the modulus k AND its complement
// k′ = √(1 − k²) so that neither is formed by cancellation near k → 0 or 1.
// Source: M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
// §16.4 (Jacobi functions by the AGM), §17.6 (F and K by the AGM).

const EPS = 2.220446049250313e-16;

/** Arithmetic–geometric mean of two positive numbers. */
export function agm(a: number, b: number): number {
  for (let i = 0; i < 64; i++) {
    const next = (a + b) / 2;
    b = Math.sqrt(a * b);
    a = next;
    if (Math.abs(a - b) <= EPS * a) break;
  }
  return (a + b) / 2;
}

/** Complete elliptic integral K(k) = π / (2·AGM(1, k′)), given k′. */
export function completeK(kPrime: number): number {
  if (kPrime === 0) return Infinity;
  return Math.PI / (2 * agm(1, kPrime));
}

/**
 * Incomplete elliptic integral of the first kind F(φ | k), 0 ≤ φ ≤ π/2, by
 * the Gauss (descending Landen) transformation: tan(φ_{n+1} − φ_n) =
 * (b_n/a_n)·tan φ_n, F = φ_N / (2^N·a_N).
 */
export function incompleteF(phi: number, kPrime: number): number {
  let a = 1;
  let b = kPrime;
  let p = phi;
  let twoN = 1;
  for (let i = 0; i < 64; i++) {
    const delta = Math.atan((b / a) * Math.tan(p));
    p = p + delta + Math.PI * Math.round((p - delta) / Math.PI);
    const next = (a + b) / 2;
    b = Math.sqrt(a * b);
    a = next;
    twoN *= 2;
    if (Math.abs(a - b) <= EPS * a) break;
  }
  return p / (twoN * a);
}

/** sn, cn, dn of real u for modulus k (complement k′), by the descending AGM. */
export function jacobiFunctions(
  u: number,
  k: number,
  kPrime: number,
): { sn: number; cn: number; dn: number } {
  if (k === 0) return { sn: Math.sin(u), cn: Math.cos(u), dn: 1 };
  if (kPrime === 0) {
    const c = 1 / Math.cosh(u);
    return { sn: Math.tanh(u), cn: c, dn: c };
  }
  const as: number[] = [1];
  const cs: number[] = [k];
  let a = 1;
  let b = kPrime;
  for (let i = 0; i < 64; i++) {
    const c = (a - b) / 2;
    const next = (a + b) / 2;
    b = Math.sqrt(a * b);
    a = next;
    as.push(a);
    cs.push(c);
    if (Math.abs(c) <= EPS * a) break;
  }
  const n = as.length - 1;
  let phi = Math.pow(2, n) * as[n]! * u;
  let previous = phi;
  for (let i = n; i >= 1; i--) {
    previous = phi;
    phi = (phi + Math.asin((cs[i]! / as[i]!) * Math.sin(phi))) / 2;
  }
  const sn = Math.sin(phi);
  const cn = Math.cos(phi);
  const dn = n >= 1 ? cn / Math.cos(previous - phi) : Math.sqrt(1 - k * k * sn * sn);
  return { sn, cn, dn };
}

/**
 * Solve the degree equation N·K′(k1)/K(k1) = K′(k)/K(k) for the selectivity
 * k given the order N and the discrimination k1 (with k1′), through nomes:
 * q = q1^(1/N), k² = 16q·(Σ q^(m(m+1)))⁴ / (1 + 2Σ q^(m²))⁴.
 * Returns k² (the parameter m). Source: S. J. Orfanidis, "Lecture notes on
 * elliptic filter design" (Rutgers, 2006), degree equation solved by nomes.
 */
export function ellipticDegreeParameter(order: number, k1: number, k1Prime: number): number {
  const q1 = Math.exp(-Math.PI * completeK(k1) / completeK(k1Prime));
  const q = Math.pow(q1, 1 / order);
  let num = 0;
  let den = 0;
  for (let m = 0; m <= 7; m++) num += Math.pow(q, m * (m + 1));
  for (let m = 1; m <= 8; m++) den += Math.pow(q, m * m);
  den = 1 + 2 * den;
  return 16 * q * Math.pow(num / den, 4);
}
