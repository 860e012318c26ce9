import { requireInteger, show } from "../_validate.ts";
import type { DesignWarning } from "../types.ts";
import { checkBands } from "./_bands.ts";
import type { DesignBand } from "./types.ts";

/** Specification of a weighted least-squares FIR. */
export interface LeastSquaresOptions {
  /** Number of taps N (order N − 1), 1 ≤ N ≤ 4096. */
  length: number;
  /** Sample rate in Hz. */
  fs: number;
  /**
   * Bands with wanted gain at `from` (`gain`) and at `to` (`endGain`, default
   * `gain`; the wanted gain is linear in between) and a weight.
   */
  bands: readonly DesignBand[];
  /** Symmetric taps (types I, II) or antisymmetric taps (types III, IV). @default "symmetric" */
  symmetry?: "symmetric" | "antisymmetric";
}

/** Result of {@link designLeastSquares}. */
export interface LeastSquaresDesign {
  /** Taps h[0..N−1]. */
  taps: Float64Array;
  /** Weighted integral squared error Σ_b W_b ∫_band (A(ω) − D(ω))² dω / π of the solution. */
  squaredError: number;
  /** Ill-conditioning of the normal equations, when found. */
  warnings: DesignWarning[];
}

/**
 * Linear-phase FIR minimising the weighted integral squared error
 * E = Σ_bands W_b ∫ (A(ω) − D(ω))² dω, where A is the real amplitude and D is
 * linear across each band. A is expanded in the type's basis (cos kω for type I,
 * cos((k − ½)ω) for II, sin kω for III, sin((k − ½)ω) for IV); the normal
 * equations Q·a = d have entries in closed form
 * (Q_kl = Σ W ∫ φ_k φ_l dω, d_k = Σ W ∫ D φ_k dω) and are solved by Cholesky
 * factorisation.
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design, Wiley 1987,
 * §3.2 (least-squared-error design with transition bands); I. W. Selesnick,
 * M. Lang and C. S. Burrus, "Constrained least square design of FIR filters
 * without specified transition bands", IEEE Trans. SP 44(8), 1996, §II.
 *
 * @param options Length, sample rate, bands, symmetry.
 * @returns Taps, the achieved weighted squared error and any warnings.
 * @throws {RangeError} For a length or edge out of range, band edges that do not
 *   increase, a weight ≤ 0, or a band the type cannot follow (an even symmetric
 *   filter with gain at fs/2; antisymmetric taps with gain at 0 Hz, or at fs/2 for odd N).
 * @throws {TypeError} When the bands are not an array of band objects.
 * @example
 * ```ts
 * import { designLeastSquares } from "./least_squares.ts";
 * const d = designLeastSquares({
 *   length: 31,
 *   fs: 1,
 *   bands: [{ from: 0, to: 0.1, gain: 1 }, { from: 0.15, to: 0.5, gain: 0 }],
 * });
 * const dc = d.taps.reduce((a, b) => a + b, 0);
 * if (Math.abs(dc - 1) > 0.02 || d.taps[0] !== d.taps[30]) throw new Error("lowpass");
 * ```
 */
export function designLeastSquares(options: LeastSquaresOptions): LeastSquaresDesign {
  const { length, fs } = options;
  requireInteger("Number of taps", length, 1, 4096);
  const bands = checkBands(options.bands, fs);
  const symmetry = options.symmetry ?? "symmetric";
  if (symmetry !== "symmetric" && symmetry !== "antisymmetric") {
    throw new TypeError(`Symmetry must be "symmetric" or "antisymmetric", got ${String(symmetry)}`);
  }
  const nyquist = fs / 2;
  const odd = length % 2 === 1;
  const negative = symmetry === "antisymmetric";
  const first = bands[0]!;
  const last = bands[bands.length - 1]!;
  if (!negative && !odd && last.to === nyquist && last.endGain !== 0) {
    throw new RangeError(
      `An even number of symmetric taps forces a zero at fs/2 (type II), but the last band asks for gain ${
        show(last.endGain)
      } there: use an odd length, got ${length}`,
    );
  }
  if (negative && first.from === 0 && first.gain !== 0) {
    throw new RangeError(
      `Antisymmetric taps force a zero at 0 Hz, but band 1 asks for gain ${
        show(first.gain)
      } there: start it above 0 Hz or ask for 0`,
    );
  }
  if (negative && odd && last.to === nyquist && last.endGain !== 0) {
    throw new RangeError(
      `An odd number of antisymmetric taps (type III) forces a zero at fs/2, but the last band asks for gain ${
        show(last.endGain)
      } there: use an even length, got ${length}`,
    );
  }
  // Basis frequencies ν_k (twice ν, to keep them integers) and count r.
  const r = negative ? Math.floor(length / 2) : Math.ceil(length / 2);
  const twiceNu = new Int32Array(r);
  for (let k = 0; k < r; k++) {
    if (!negative && odd) twiceNu[k] = 2 * k; // cos kω, k = 0 … M
    else if (negative && odd) twiceNu[k] = 2 * (k + 1); // sin kω, k = 1 … M
    else twiceNu[k] = 2 * k + 1; // cos/sin (k + ½)ω, k = 0 … N/2 − 1
  }
  // cosineIntegral[c] = Σ_b W_b ∫ cos(c·ω/2) dω over the band (c = 2ν).
  const maxC = 2 * (twiceNu[r - 1] ?? 0) + 2;
  const cosineIntegral = new Float64Array(maxC + 1);
  const edges = bands.map((b) => ({
    a: (2 * Math.PI * b.from) / fs,
    b: (2 * Math.PI * b.to) / fs,
    w: b.weight,
    g0: b.gain,
    g1: b.endGain,
  }));
  for (let c = 0; c <= maxC; c++) {
    let sum = 0;
    for (const e of edges) {
      if (c === 0) sum += e.w * (e.b - e.a);
      else {
        const v = c / 2;
        sum += (e.w * 2 * Math.cos((v * (e.a + e.b)) / 2) * Math.sin((v * (e.b - e.a)) / 2)) / v;
      }
    }
    cosineIntegral[c] = sum;
  }
  const q = new Float64Array(r * r);
  const sign = negative ? -1 : 1; // sin·sin = ½[cos(Δ) − cos(Σ)], cos·cos = ½[cos(Δ) + cos(Σ)]
  for (let k = 0; k < r; k++) {
    for (let l = 0; l <= k; l++) {
      const diff = Math.abs(twiceNu[k]! - twiceNu[l]!);
      const sum = twiceNu[k]! + twiceNu[l]!;
      const v = 0.5 * (cosineIntegral[diff]! + sign * cosineIntegral[sum]!);
      q[k * r + l] = v;
      q[l * r + k] = v;
    }
  }
  const d = new Float64Array(r);
  for (let k = 0; k < r; k++) {
    const v = twiceNu[k]! / 2;
    let sum = 0;
    for (const e of edges) {
      const m = (e.g1 - e.g0) / (e.b - e.a);
      const c0 = e.g0 - m * e.a;
      sum += e.w * integralOfLineTimesBasis(m, c0, v, negative, e.a, e.b);
    }
    d[k] = sum;
  }
  const warnings: DesignWarning[] = [];
  const a = solvePositiveDefinite(q, d, r, warnings);
  // Weighted squared error E = Σ W∫D² − 2 aᵀd + aᵀQa, reported divided by π.
  let dd = 0;
  for (const e of edges) {
    const m = (e.g1 - e.g0) / (e.b - e.a);
    const c0 = e.g0 - m * e.a;
    const f = (w: number) => (m * m * w ** 3) / 3 + m * c0 * w * w + c0 * c0 * w;
    dd += e.w * (f(e.b) - f(e.a));
  }
  let ad = 0;
  let aqa = 0;
  for (let k = 0; k < r; k++) {
    ad += a[k]! * d[k]!;
    let row = 0;
    for (let l = 0; l < r; l++) row += q[k * r + l]! * a[l]!;
    aqa += a[k]! * row;
  }
  const squaredError = Math.max(0, dd - 2 * ad + aqa) / Math.PI;
  const taps = new Float64Array(length);
  if (!negative && odd) {
    const m = (length - 1) / 2;
    taps[m] = a[0]!;
    for (let k = 1; k < r; k++) taps[m - k] = taps[m + k] = a[k]! / 2;
  } else if (!negative) {
    const m = length / 2;
    for (let k = 1; k <= r; k++) taps[m - k] = taps[m - 1 + k] = a[k - 1]! / 2;
  } else if (odd) {
    const m = (length - 1) / 2;
    for (let k = 1; k <= r; k++) {
      taps[m - k] = a[k - 1]! / 2;
      taps[m + k] = -a[k - 1]! / 2;
    }
  } else {
    const m = length / 2;
    for (let k = 1; k <= r; k++) {
      taps[m - k] = a[k - 1]! / 2;
      taps[m - 1 + k] = -a[k - 1]! / 2;
    }
  }
  return { taps, squaredError, warnings };
}

/** ∫_a^b (m ω + c) · (cos or sin)(v ω) dω in closed form. */
function integralOfLineTimesBasis(
  m: number,
  c: number,
  v: number,
  sine: boolean,
  a: number,
  b: number,
): number {
  if (v === 0) return sine ? 0 : (m * (b * b - a * a)) / 2 + c * (b - a);
  const antiderivative = (w: number): number => {
    const line = m * w + c;
    return sine
      ? (-line * Math.cos(v * w)) / v + (m * Math.sin(v * w)) / (v * v)
      : (line * Math.sin(v * w)) / v + (m * Math.cos(v * w)) / (v * v);
  };
  return antiderivative(b) - antiderivative(a);
}

/**
 * Solve Q x = d for symmetric positive (semi)definite Q by Cholesky. A tiny
 * diagonal load is added, with a warning, when a pivot is not safely positive.
 */
function solvePositiveDefinite(
  q: Float64Array,
  d: Float64Array,
  n: number,
  warnings: DesignWarning[],
): Float64Array {
  let trace = 0;
  for (let i = 0; i < n; i++) trace += q[i * n + i]!;
  const tryFactor = (load: number): Float64Array | null => {
    const l = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j <= i; j++) {
        let s = q[i * n + j]! + (i === j ? load : 0);
        for (let k = 0; k < j; k++) s -= l[i * n + k]! * l[j * n + k]!;
        if (i === j) {
          if (!(s > 1e-13 * (trace / n + load))) return null;
          l[i * n + i] = Math.sqrt(s);
        } else l[i * n + j] = s / l[j * n + j]!;
      }
    }
    return l;
  };
  let load = 0;
  let l = tryFactor(0);
  if (l === null) {
    load = (1e-12 * trace) / n;
    l = tryFactor(load);
    while (l === null && load < trace) {
      load *= 100;
      l = tryFactor(load);
    }
    warnings.push({
      code: "ill-conditioned",
      message:
        `The least-squares normal equations are ill-conditioned (too many taps for the bands given); a diagonal load of ${
          (load / (trace / n)).toExponential(1)
        } × the mean diagonal was added.`,
    });
  }
  const f = l!;
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = d[i]!;
    for (let k = 0; k < i; k++) s -= f[i * n + k]! * y[k]!;
    y[i] = s / f[i * n + i]!;
  }
  const x = new Float64Array(n);
  for (let i = n - 1; i >= 0; i--) {
    let s = y[i]!;
    for (let k = i + 1; k < n; k++) s -= f[k * n + i]! * x[k]!;
    x[i] = s / f[i * n + i]!;
  }
  return x;
}
