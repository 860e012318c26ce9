// The Remez exchange on a dense frequency grid, for linear-phase FIR filters.
// Private to lib/fir: equiripple.ts validates the input and shapes the result.
//
// Frequencies here are normalised (cycles per sample, 0 … 0.5). The filter's
// amplitude A(f) is written Q(f)·P(f) with P(ω) = Σ_{k<r} α_k cos(kω), and P is
// fitted to D/Q with weight W·Q (McClellan, Parks and Rabiner 1973). P is a
// polynomial in x = cos ω, handled in barycentric Lagrange form (Berrut and
// Trefethen 2004). Differences x_i − x_j are formed from sin²(ω/2) or cos²(ω/2)
// so that points crowded near ω = 0 or π keep their relative precision.

import type { DesignWarning } from "../types.ts";
import { kernel } from "../fft/_fftjs.ts";
import { complexFft } from "../fft/complex_fft.ts";
import type { FftKernel } from "../fft/_fftjs.ts";

/** What the approximation is of: flat bands, a Hilbert transformer or a differentiator. */
export type RemezKind = "multiband" | "hilbert" | "differentiator";

export interface RemezBand {
  /** Normalised band edges, 0 ≤ lo ≤ hi ≤ 0.5. */
  lo: number;
  hi: number;
  /** Flat gain, or the slope g of D(ω) = g·ω for a differentiator. */
  gain: number;
  weight: number;
}

export interface RemezProblem {
  length: number;
  bands: RemezBand[];
  kind: RemezKind;
  gridDensity: number;
  maxIterations: number;
  /** Initial reference: Chebyshev measure of the covered range, or equal grid steps (MPR). */
  start?: "chebyshev" | "uniform";
}

export interface RemezSolution {
  taps: Float64Array;
  /** Weighted deviation |δ| on the final reference. */
  deviation: number;
  /** Normalised frequencies of the final reference (r + 1 of them). */
  extremalFrequencies: Float64Array;
  iterations: number;
  warnings: DesignWarning[];
}

/** Thrown when the exchange cannot produce a trustworthy filter. */
export class RemezFailure extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ConvergenceError";
  }
}

interface Grid {
  f: Float64Array;
  /** sin²(ω/2) and cos²(ω/2), ω = 2πf. */
  s: Float64Array;
  c: Float64Array;
  desired: Float64Array;
  weight: Float64Array;
  /** Index of the band each grid point belongs to. */
  band: Int32Array;
  segments: Segment[];
  /** Grid step Δ = 0.5/(density·r). */
  delta: number;
}

/** A band's run of grid points: `uniform` points first + i·Δ from `start`, then the rest. */
interface Segment {
  start: number;
  uniform: number;
  first: number;
}

const minimumBandPoints = 8;

/**
 * Dense grid: per band lo, lo + Δ, … with the last point moved onto hi (MPR
 * 1973); a band narrower than 7Δ gets 8 evenly spread points instead.
 */
export function buildGrid(p: RemezProblem, r: number, negative: boolean, odd: boolean): Grid {
  const delta = 0.5 / (p.gridDensity * r);
  const f: number[] = [];
  const bandOf: number[] = [];
  const segments: Segment[] = [];
  for (let b = 0; b < p.bands.length; b++) {
    const band = p.bands[b]!;
    let first = band.lo;
    if (b === 0 && negative && first < delta) first = delta;
    const start = f.length;
    if (band.hi - first < (minimumBandPoints - 1) * delta) {
      // A band narrower than a few grid steps (short filters with narrow bands)
      // still gets enough points to hold its share of the extremal frequencies.
      for (let i = 0; i < minimumBandPoints; i++) {
        f.push(
          i === minimumBandPoints - 1
            ? band.hi
            : first + ((band.hi - first) * i) / (minimumBandPoints - 1),
        );
        bandOf.push(b);
      }
      segments.push({ start, uniform: 0, first });
      continue;
    }
    for (let i = 0;; i++) {
      f.push(first + i * delta);
      bandOf.push(b);
      if (first + (i + 1) * delta > band.hi) {
        f[f.length - 1] = Math.max(band.hi, f[f.length - 1]!);
        break;
      }
    }
    // All but the last point of a band lie on first + i·Δ (the chirp-z evaluates those).
    segments.push({ start, uniform: f.length - start - 1, first });
  }
  // Q(f) vanishes at 0.5 for types II and III: keep the grid off it.
  if (negative === odd && f.length > 0 && f[f.length - 1]! > 0.5 - delta) {
    f.pop();
    bandOf.pop();
  }
  const n = f.length;
  const g: Grid = {
    f: Float64Array.from(f),
    s: new Float64Array(n),
    c: new Float64Array(n),
    desired: new Float64Array(n),
    weight: new Float64Array(n),
    band: Int32Array.from(bandOf),
    segments,
    delta,
  };
  for (let i = 0; i < n; i++) {
    const fi = g.f[i]!;
    const band = p.bands[g.band[i]!]!;
    const sh = Math.sin(Math.PI * fi);
    const ch = Math.cos(Math.PI * fi);
    g.s[i] = sh * sh;
    g.c[i] = ch * ch;
    let d = band.gain;
    let w = band.weight;
    if (p.kind === "differentiator") {
      // D(ω) = g·ω; relative error weighting W/f where the slope is not ~0.
      d = band.gain * 2 * Math.PI * fi;
      if (band.gain * 2 * Math.PI >= 1e-4) w = band.weight / fi;
    }
    let q = 1;
    if (!negative && !odd) q = ch;
    else if (negative && odd) q = Math.sin(2 * Math.PI * fi);
    else if (negative && !odd) q = sh;
    g.desired[i] = d / q;
    g.weight[i] = w * q;
  }
  return g;
}

/**
 * Barycentric weights 1/Π_{k≠j}(x_j − x_k), scaled by a common factor so the
 * largest is 1. Products carry a binary exponent, so no length overflows.
 */
function barycentricWeights(s: Float64Array, c: Float64Array): Float64Array {
  const n = s.length;
  const logs = new Float64Array(n);
  const signs = new Float64Array(n);
  const big = 2 ** 200;
  const small = 2 ** -200;
  let lower = 0;
  while (lower < n && s[lower]! <= 0.5) lower++;
  for (let j = 0; j < n; j++) {
    // Π_{k≠j}(x_j − x_k), without the common factor 2^(n−1) (it cancels in every
    // use): s_k − s_j for two points with ω ≤ π/2, c_j − c_k otherwise.
    let m = 1;
    let e = 0;
    const sj = s[j]!;
    const cj = c[j]!;
    const split = j < lower ? lower : 0;
    for (let k = 0; k < n; k += 8) {
      const end = Math.min(n, k + 8);
      for (let i = k; i < end; i++) {
        if (i === j) continue;
        m *= i < split ? s[i]! - sj : cj - c[i]!;
      }
      const a = Math.abs(m);
      if (a > big) {
        m *= small;
        e += 200;
      } else if (a < small) {
        m *= big;
        e -= 200;
      }
    }
    signs[j] = m < 0 ? -1 : 1;
    logs[j] = -(e + Math.log2(Math.abs(m)));
  }
  let top = -Infinity;
  for (let j = 0; j < n; j++) top = Math.max(top, logs[j]!);
  const w = new Float64Array(n);
  for (let j = 0; j < n; j++) w[j] = signs[j]! * 2 ** (logs[j]! - top);
  return w;
}

/**
 * Evaluate the barycentric interpolant (nodes ns/nc, weights bw, values y) at
 * points ps/pc. Nodes are sorted by frequency, so those with ω ≤ π/2 form a prefix.
 */
function interpolate(
  ns: Float64Array,
  nc: Float64Array,
  bw: Float64Array,
  y: Float64Array,
  ps: Float64Array,
  pc: Float64Array,
  out: Float64Array,
  skip?: Int32Array,
): void {
  const n = ns.length;
  let lower = 0;
  while (lower < n && ns[lower]! <= 0.5) lower++;
  for (let i = 0; i < ps.length; i++) {
    if (skip !== undefined && skip[i]! >= 0) {
      out[i] = y[skip[i]!]!;
      continue;
    }
    const si = ps[i]!;
    const ci = pc[i]!;
    let num = 0;
    let den = 0;
    let hit = -1;
    if (si <= 0.5) {
      for (let j = 0; j < lower; j++) {
        const d = 2 * (ns[j]! - si);
        if (d === 0) {
          hit = j;
          break;
        }
        const t = bw[j]! / d;
        num += t * y[j]!;
        den += t;
      }
      if (hit < 0) {
        for (let j = lower; j < n; j++) {
          const d = 2 * (ci - nc[j]!);
          if (d === 0) {
            hit = j;
            break;
          }
          const t = bw[j]! / d;
          num += t * y[j]!;
          den += t;
        }
      }
    } else {
      for (let j = 0; j < n; j++) {
        const d = 2 * (ci - nc[j]!);
        if (d === 0) {
          hit = j;
          break;
        }
        const t = bw[j]! / d;
        num += t * y[j]!;
        den += t;
      }
    }
    out[i] = hit >= 0 ? y[hit]! : num / den;
  }
}

/** Choose r + 1 alternating extrema of the error e (grid order) with |e| ≥ floor. */
function selectExtrema(e: Float64Array, band: Int32Array, floor: number, want: number): number[] {
  const n = e.length;
  const picked: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = e[i]!;
    if (Math.abs(v) < floor) continue;
    const hasLeft = i > 0 && band[i - 1] === band[i];
    const hasRight = i < n - 1 && band[i + 1] === band[i];
    const left = hasLeft ? e[i - 1]! : -Infinity * Math.sign(v);
    const right = hasRight ? e[i + 1]! : -Infinity * Math.sign(v);
    const isPeak = v > 0 ? v >= left && v > right : v <= left && v < right;
    if (isPeak) picked.push(i);
  }
  // Merge runs of one sign, keeping the largest magnitude.
  const merged: number[] = [];
  for (const i of picked) {
    const last = merged[merged.length - 1];
    if (last !== undefined && Math.sign(e[last]!) === Math.sign(e[i]!)) {
      if (Math.abs(e[i]!) > Math.abs(e[last]!)) merged[merged.length - 1] = i;
    } else merged.push(i);
  }
  // Too many: drop the weaker end while one over, else the weakest extremum
  // (an interior one takes a neighbour with it to keep the signs alternating).
  while (merged.length > want) {
    if (merged.length === want + 1) {
      if (Math.abs(e[merged[0]!]!) < Math.abs(e[merged[merged.length - 1]!]!)) merged.shift();
      else merged.pop();
      continue;
    }
    let weakest = 0;
    for (let k = 1; k < merged.length; k++) {
      if (Math.abs(e[merged[k]!]!) < Math.abs(e[merged[weakest]!]!)) weakest = k;
    }
    if (weakest === 0 || weakest === merged.length - 1) {
      merged.splice(weakest, 1);
    } else {
      const a = merged[weakest - 1]!;
      const b = merged[weakest + 1]!;
      const keep = Math.abs(e[a]!) >= Math.abs(e[b]!) ? a : b;
      merged.splice(weakest - 1, 3, keep);
    }
  }
  return merged;
}

/** Σ_{k<r} α_k cos(kω) by Clenshaw's recurrence in x = cos ω. */
export function cosineSum(alpha: Float64Array, r: number, omega: number): number {
  const x = Math.cos(omega);
  let b1 = 0;
  let b2 = 0;
  for (let k = r - 1; k >= 1; k--) {
    const b0 = alpha[k]! + 2 * x * b1 - b2;
    b2 = b1;
    b1 = b0;
  }
  return alpha[0]! + x * b1 - b2;
}

interface ChirpPlan {
  segment: Segment;
  end: number;
  size: number;
  fft: FftKernel;
  /** e^(j2πk·first)·W^(k²/2), k < r, interleaved re/im. */
  pre: Float64Array;
  /** W^(i²/2), i < uniform. */
  post: Float64Array;
  /** Spectrum of the chirp W^(−m²/2). */
  chirpSpectrum: Float64Array;
  work: Float64Array;
  spectrum: Float64Array;
}

/**
 * Evaluates P(ω) = Σ α_k cos kω on the whole grid: each band's evenly spaced
 * points by Bluestein's chirp-z transform (three FFTs, one precomputed), the
 * few others by Clenshaw. O(n log n) per evaluation instead of O(n·r).
 */
export class GridEvaluator {
  readonly plans: ChirpPlan[] = [];
  constructor(readonly grid: Grid, readonly r: number, density: number) {
    const modulus = 4 * density * r; // W^(m²/2) = e^(j2π·m²/modulus), W = e^(j2πΔ)
    const chirp = (m: number, sign: number, out: Float64Array, at: number): void => {
      const q = (m * m) % modulus;
      const angle = (2 * Math.PI * q) / modulus;
      out[at] = Math.cos(angle);
      out[at + 1] = sign * Math.sin(angle);
    };
    const segs = grid.segments;
    for (let b = 0; b < segs.length; b++) {
      const segment = segs[b]!;
      const end = b + 1 < segs.length ? segs[b + 1]!.start : grid.f.length;
      const uniform = Math.min(segment.uniform, end - segment.start);
      const seg = { ...segment, uniform };
      let size = 2;
      while (size < r + uniform - 1) size *= 2;
      const pre = new Float64Array(2 * r);
      for (let k = 0; k < r; k++) {
        chirp(k, 1, pre, 2 * k);
        const turns = (k * segment.first) % 1;
        const cr = Math.cos(2 * Math.PI * turns);
        const ci = Math.sin(2 * Math.PI * turns);
        const ar = pre[2 * k]!;
        const ai = pre[2 * k + 1]!;
        pre[2 * k] = ar * cr - ai * ci;
        pre[2 * k + 1] = ar * ci + ai * cr;
      }
      const post = new Float64Array(2 * Math.max(uniform, 1));
      for (let i = 0; i < uniform; i++) chirp(i, 1, post, 2 * i);
      const v = new Float64Array(2 * size);
      for (let m = 0; m < uniform; m++) chirp(m, -1, v, 2 * m);
      for (let m = 1; m < r && size - m >= uniform; m++) chirp(m, -1, v, 2 * (size - m));
      const fft = kernel(size);
      const chirpSpectrum = new Float64Array(2 * size);
      if (uniform > 0) fft.transform(chirpSpectrum, v);
      this.plans.push({
        segment: seg,
        end,
        size,
        fft,
        pre,
        post,
        chirpSpectrum,
        work: new Float64Array(2 * size),
        spectrum: new Float64Array(2 * size),
      });
    }
  }

  evaluate(alpha: Float64Array, out: Float64Array): void {
    const r = this.r;
    for (const plan of this.plans) {
      const { segment, size, pre, post, chirpSpectrum, work, spectrum, fft } = plan;
      const n = segment.uniform;
      if (n > 0) {
        work.fill(0);
        for (let k = 0; k < r; k++) {
          const a = alpha[k]!;
          work[2 * k] = a * pre[2 * k]!;
          work[2 * k + 1] = a * pre[2 * k + 1]!;
        }
        fft.transform(spectrum, work);
        for (let i = 0; i < size; i++) {
          const xr = spectrum[2 * i]!;
          const xi = spectrum[2 * i + 1]!;
          const vr = chirpSpectrum[2 * i]!;
          const vi = chirpSpectrum[2 * i + 1]!;
          spectrum[2 * i] = xr * vr - xi * vi;
          spectrum[2 * i + 1] = xr * vi + xi * vr;
        }
        fft.inverseTransform(work, spectrum);
        for (let i = 0; i < n; i++) {
          out[segment.start + i] = work[2 * i]! * post[2 * i]! -
            work[2 * i + 1]! * post[2 * i + 1]!;
        }
      }
      for (let i = segment.start + n; i < plan.end; i++) {
        out[i] = cosineSum(alpha, r, 2 * Math.PI * this.grid.f[i]!);
      }
    }
  }
}

/**
 * Fits P's cosine coefficients from its values at r Chebyshev points. When the
 * bands leave gaps below their lowest or above their highest frequency, the
 * points are spread over the x-range the bands cover only (x = b + a·t, t ∈
 * [−1, 1]), as McClellan, Parks and Rabiner do: sampling the interpolant
 * outside its nodes would be extrapolation, which is unstable. The Chebyshev
 * series in t is then rewritten in x.
 */
class CosineFit {
  readonly ts: Float64Array;
  readonly tc: Float64Array;
  readonly table: Float64Array;
  readonly values: Float64Array;
  readonly mapped: boolean;
  readonly a: number;
  readonly b: number;
  private readonly work: Float64Array;
  private readonly extended: Float64Array;
  constructor(readonly r: number, sHigh: number, cLow: number) {
    // x ranges over [2cLow − 1, 1 − 2sHigh]; a = half-width, b = centre.
    this.a = 1 - sHigh - cLow;
    this.b = cLow - sHigh;
    // Bands reaching 0 and fs/2 (up to rounding of cos²(π/2)) need no mapping.
    this.mapped = sHigh > 1e-15 || cLow > 1e-15;
    this.ts = new Float64Array(r);
    this.tc = new Float64Array(r);
    for (let m = 0; m < r; m++) {
      const half = (Math.PI * (m + 0.5)) / (2 * r);
      this.ts[m] = sHigh + this.a * Math.sin(half) ** 2;
      this.tc[m] = cLow + this.a * Math.cos(half) ** 2;
    }
    this.table = new Float64Array(4 * r);
    for (let i = 0; i < 4 * r; i++) this.table[i] = Math.cos((Math.PI * i) / (2 * r));
    this.values = new Float64Array(r);
    this.extended = new Float64Array(2 * r);
    this.work = new Float64Array(3 * (r + 2));
  }

  /** α_k with P(ω) = Σ α_k cos kω (exact for degree < r). */
  coefficients(values: Float64Array, alpha: Float64Array): void {
    const r = this.r;
    const period = 4 * r;
    // Chebyshev coefficients in t: (2/r)·Σ_m P(t_m) T_k(t_m), halved for k = 0 — a
    // DCT-II, computed by one complex FFT of the even extension of length 2r:
    // Σ_m v_m cos(πk(2m+1)/(2r)) = ½·Re(e^(−jπk/(2r))·V_k).
    const extended = this.extended;
    for (let m = 0; m < r; m++) extended[m] = extended[2 * r - 1 - m] = values[m]!;
    const spectrum = complexFft({ re: extended });
    for (let k = 0; k < r; k++) {
      const c = this.table[k]!; // cos(πk/(2r))
      const sn = this.table[(k + 3 * r) % period]!; // cos(πk/(2r) − π/2·…) = sin(πk/(2r))
      const sum = 0.5 * (spectrum.re[k]! * c + spectrum.im[k]! * sn);
      alpha[k] = ((k === 0 ? 1 : 2) * sum) / r;
    }
    if (this.mapped) this.rewriteInX(alpha);
  }

  /**
   * Rewrite Σ c_k T_k(t), t = (x − b)/a, as Σ α_j T_j(x) by Clenshaw's recurrence
   * on coefficient vectors: B_k = c_k + 2t·B_{k+1} − B_{k+2}, P = c_0 + t·B_1 − B_2,
   * with x·T_0 = T_1 and x·T_j = (T_{j+1} + T_{j−1})/2.
   */
  private rewriteInX(c: Float64Array): void {
    const r = this.r;
    const w = r + 2;
    const { a, b } = this;
    let b1 = this.work.subarray(0, w).fill(0);
    let b2 = this.work.subarray(w, 2 * w).fill(0);
    let b0 = this.work.subarray(2 * w, 3 * w).fill(0);
    // t·V written into out (scaled by `scale`), then `out = scale·t·V + add`.
    const timesT = (v: Float64Array, scale: number, out: Float64Array, degree: number): void => {
      out.fill(0);
      for (let j = 0; j <= degree; j++) {
        const vj = v[j]!;
        if (vj === 0) continue;
        if (j === 0) out[1]! += vj;
        else {
          out[j + 1]! += vj / 2;
          out[j - 1]! += vj / 2;
        }
        out[j]! -= b * vj;
      }
      for (let j = 0; j <= degree + 1; j++) out[j]! *= scale / a;
    };
    for (let k = r - 1; k >= 1; k--) {
      // b0 = c_k + 2t·b1 − b2 (b1 has degree r − 1 − k at most)
      const degree = r - 1 - (k + 1);
      timesT(b1, 2, b0, Math.max(0, degree));
      b0[0]! += c[k]!;
      for (let j = 0; j < w; j++) b0[j]! -= b2[j]!;
      const t = b2;
      b2 = b1;
      b1 = b0;
      b0 = t;
    }
    // P = c_0 + t·b1 − b2
    timesT(b1, 1, b0, Math.max(0, r - 2));
    b0[0]! += c[0]!;
    for (let j = 0; j < r; j++) c[j] = b0[j]! - b2[j]!;
    c[r] = 0;
    c[r + 1] = 0;
  }
}

/**
 * Initial reference: r + 1 grid points at equal steps of the equilibrium
 * (potential-theory) measure of the bands seen as a set E = ∪[a_i, b_i] of
 * x = cos 2πf. Its density is |q(x)| / (π·√|Π_i (x − a_i)(x − b_i)|), with q
 * monic of degree K − 1 chosen so that every gap between bands carries zero
 * mass; for one interval it is the arcsine (Chebyshev) density. The extremal
 * points of best approximations on E are distributed like this measure, so
 * the exchange starts near the answer, with points crowded at band edges.
 *
 * Sources: H. Widom, "Extremal polynomials associated with a system of curves
 * in the complex plane", Adv. Math. 3, 1969; E. B. Saff and V. Totik,
 * Logarithmic Potentials with External Fields, Springer 1997, §IV.
 */
function initialReference(grid: Grid, ext: Int32Array): void {
  const n = grid.f.length;
  const want = ext.length;
  // Band intervals in x (ascending x = descending f), from the grid's own extents.
  const intervals: { lo: number; hi: number; first: number; last: number }[] = [];
  for (let i = 0; i < n;) {
    let j = i;
    while (j + 1 < n && grid.band[j + 1] === grid.band[i]) j++;
    intervals.push({ lo: 1 - 2 * grid.s[j]!, hi: 1 - 2 * grid.s[i]!, first: i, last: j });
    i = j + 1;
  }
  intervals.reverse();
  const k = intervals.length;
  const edges = intervals.flatMap((v) => [v.lo, v.hi]);
  // √|Π over the edges except the two of the interval (or gap) the point lies in|
  const restRoot = (x: number, skipA: number, skipB: number): number => {
    let p = 1;
    for (let e = 0; e < edges.length; e++) {
      if (e !== skipA && e !== skipB) p *= Math.abs(x - edges[e]!);
    }
    return Math.sqrt(p);
  };
  // q(x) = x^(K−1) + Σ_{j<K−1} c_j x^j with zero mass in each gap (b_i, a_{i+1}).
  const c = new Float64Array(Math.max(k - 1, 0));
  if (k > 1) {
    const m = k - 1;
    const matrix = new Float64Array(m * (m + 1));
    const nodes = 64;
    for (let g = 0; g < m; g++) {
      const lo = edges[2 * g + 1]!;
      const hi = edges[2 * g + 2]!;
      const mid = (lo + hi) / 2;
      const half = (hi - lo) / 2;
      for (let t = 0; t < nodes; t++) {
        // x = mid + half·cos φ turns the end singularities into a smooth integrand.
        const x = mid + half * Math.cos((Math.PI * (t + 0.5)) / nodes);
        const w = 1 / restRoot(x, 2 * g + 1, 2 * g + 2);
        let power = 1;
        for (let j = 0; j <= m; j++) {
          matrix[g * (m + 1) + j]! += power * w;
          power *= x;
        }
      }
    }
    // Solve Σ_j c_j I_gj = −I_g,m by Gaussian elimination with partial pivoting.
    for (let col = 0; col < m; col++) {
      let pivot = col;
      for (let row = col + 1; row < m; row++) {
        if (Math.abs(matrix[row * (m + 1) + col]!) > Math.abs(matrix[pivot * (m + 1) + col]!)) {
          pivot = row;
        }
      }
      for (let j = 0; j <= m; j++) {
        const t = matrix[col * (m + 1) + j]!;
        matrix[col * (m + 1) + j] = matrix[pivot * (m + 1) + j]!;
        matrix[pivot * (m + 1) + j] = t;
      }
      const d = matrix[col * (m + 1) + col]!;
      for (let row = col + 1; row < m; row++) {
        const factor = matrix[row * (m + 1) + col]! / d;
        for (let j = col; j <= m; j++) {
          matrix[row * (m + 1) + j]! -= factor * matrix[col * (m + 1) + j]!;
        }
      }
    }
    for (let row = m - 1; row >= 0; row--) {
      let sum = -matrix[row * (m + 1) + m]!;
      for (let j = row + 1; j < m; j++) sum -= matrix[row * (m + 1) + j]! * c[j]!;
      c[row] = sum / matrix[row * (m + 1) + row]!;
    }
  }
  const q = (x: number): number => {
    let v = 1;
    for (let j = k - 2; j >= 0; j--) v = v * x + c[j]!;
    return k > 1 ? v : 1;
  };
  // Mass of each grid point's cell, measured in φ within its interval (smooth there).
  const mass = new Float64Array(n);
  intervals.forEach((v, index) => {
    const mid = (v.lo + v.hi) / 2;
    const half = (v.hi - v.lo) / 2;
    const phi = (i: number): number => {
      const x = 1 - 2 * grid.s[i]!;
      return half > 0 ? Math.acos(Math.min(1, Math.max(-1, (x - mid) / half))) : Math.PI / 2;
    };
    for (let i = v.first; i <= v.last; i++) {
      const left = i === v.first ? 0 : (phi(i - 1) + phi(i)) / 2;
      const right = i === v.last ? Math.PI : (phi(i) + phi(i + 1)) / 2;
      const x = 1 - 2 * grid.s[i]!;
      const density = Math.abs(q(x)) / restRoot(x, 2 * index, 2 * index + 1);
      mass[i] = Number.isFinite(density) ? density * Math.abs(right - left) : 0;
    }
  });
  const cumulative = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) cumulative[i + 1] = cumulative[i]! + mass[i]!;
  const total = cumulative[n]!;
  let i = 0;
  for (let kk = 0; kk < want; kk++) {
    const target = (total * (kk + 0.5)) / want;
    while (i < n - 1 && cumulative[i + 1]! < target) i++;
    // Keep indices strictly increasing with room left for the points still to come.
    const lowest = kk === 0 ? 0 : ext[kk - 1]! + 1;
    const highest = n - (want - kk);
    ext[kk] = Math.min(Math.max(i, lowest), highest);
  }
}

/** Run the exchange and return the taps. */
export function remezExchange(p: RemezProblem): RemezSolution {
  const negative = p.kind !== "multiband";
  const odd = p.length % 2 === 1;
  const r = Math.floor(p.length / 2) + (odd && !negative ? 1 : 0);
  const grid = buildGrid(p, r, negative, odd);
  const n = grid.f.length;
  if (n < r + 1) {
    throw new RemezFailure(
      `The bands hold too few grid points (${n}) for ${
        r + 1
      } extremal frequencies; widen the bands or raise the grid density`,
    );
  }
  const warnings: DesignWarning[] = [];
  let ext: Int32Array = new Int32Array(r + 1);
  if (p.start === "uniform") {
    for (let j = 0; j < r; j++) ext[j] = Math.floor((j * (n - 1)) / r);
    ext[r] = n - 1;
  } else initialReference(grid, ext);

  const nz = r + 1;
  const ns = new Float64Array(nz);
  const nc = new Float64Array(nz);
  const y = new Float64Array(nz);
  const values = new Float64Array(n);
  const error = new Float64Array(n);
  const skip = new Int32Array(n).fill(-1);
  let fast = 0;
  const fit = new CosineFit(r, grid.s[0]!, grid.c[n - 1]!);
  const evaluator = new GridEvaluator(grid, r, p.gridDensity);
  const alpha = new Float64Array(r + 2);
  let delta = 0;
  let previous = 0;
  let bw: Float64Array = new Float64Array(0);
  let iterations = 0;
  let converged = false;
  let gap = Infinity;
  // Rounding noise in the weighted error W·(P − D) is about ε·max|W·D|.
  let scale = 1e-300;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(grid.weight[i]! * grid.desired[i]!));
  const noise = 64 * Number.EPSILON * scale;

  const probeS = new Float64Array(r + 1);
  const probeC = new Float64Array(r + 1);
  const probeValues = new Float64Array(r + 1);
  const confirmed = (picked: number[]): boolean => {
    for (let j = 0; j < picked.length; j++) {
      probeS[j] = grid.s[picked[j]!]!;
      probeC[j] = grid.c[picked[j]!]!;
    }
    interpolate(ns, nc, bw, y, probeS, probeC, probeValues);
    const floor = Math.abs(delta) * (1 - 1e-9) - noise;
    let sign = 0;
    for (let j = 0; j < picked.length; j++) {
      const i = picked[j]!;
      const e = grid.weight[i]! * (probeValues[j]! - grid.desired[i]!);
      if (!(Math.abs(e) >= floor) || Math.sign(e) === sign) return false;
      sign = Math.sign(e);
    }
    return true;
  };
  let unresolvedRun = 0;
  let runStart = 0;
  let previousResolved = false;
  const fail = (what: string): never => {
    if (Math.abs(delta) < 1e-12 * scale) {
      throw new RemezFailure(
        `The Remez exchange cannot resolve this specification: the equiripple deviation it approaches is below 1e-12 of the band gains, the limit of double precision (${what}). The specification is over-met for this many taps: use fewer taps or a narrower transition band`,
      );
    }
    throw new RemezFailure(
      `The Remez exchange failed to converge: ${what}; try a wider transition band, more taps or less extreme weights`,
    );
  };

  for (; iterations < p.maxIterations;) {
    iterations++;
    for (let j = 0; j < nz; j++) {
      ns[j] = grid.s[ext[j]!]!;
      nc[j] = grid.c[ext[j]!]!;
    }
    bw = barycentricWeights(ns, nc);
    let num = 0;
    let den = 0;
    for (let j = 0; j < nz; j++) {
      const l = ext[j]!;
      num += bw[j]! * grid.desired[l]!;
      den += ((j % 2 === 0 ? 1 : -1) * bw[j]!) / grid.weight[l]!;
    }
    delta = -num / den;
    for (let j = 0; j < nz; j++) {
      const l = ext[j]!;
      y[j] = grid.desired[l]! + ((j % 2 === 0 ? 1 : -1) * delta) / grid.weight[l]!;
    }
    const size = Math.abs(delta);
    if (!Number.isFinite(delta)) fail(`the deviation is not finite at iteration ${iterations}`);
    // While |δ| sits at the rounding level (a poor early reference, or a
    // specification over-met for the length) its value means little: keep
    // exchanging, but give up after a run of such iterations.
    const unresolved = size < 100 * noise;
    unresolvedRun = unresolved ? unresolvedRun + 1 : 0;
    if (unresolvedRun === 1) runStart = size;
    // Growing out of the noise (tenfold per eight iterations) is progress; flat is not.
    if (unresolvedRun > 0 && unresolvedRun % 8 === 0 && !(size > 10 * runStart)) {
      throw new RemezFailure(
        `The Remez exchange cannot resolve this specification: after ${iterations} iterations the equiripple deviation stays at the rounding level of double precision (${
          size.toExponential(2)
        }). The specification is over-met for this many taps: use fewer taps or a narrower transition band`,
      );
    }
    if (unresolvedRun > 0 && unresolvedRun % 8 === 0) runStart = size;
    if (iterations > 1 && !unresolved && previousResolved && size < previous * (1 - 1e-9)) {
      // In exact arithmetic |δ| never falls: rounding has taken over.
      if (gap < 1e-3) {
        warnings.push({
          code: "barely-converged",
          message:
            `The Remez exchange stopped at iteration ${iterations} when rounding made the deviation fall; the error peaks exceed the equiripple level by ${
              (gap * 100).toPrecision(2)
            }%.`,
        });
        break;
      }
      fail(
        `at iteration ${iterations} the deviation fell from ${previous.toExponential(3)} to ${
          size.toExponential(3)
        }`,
      );
    }
    previous = size;
    previousResolved = !unresolved;
    interpolate(ns, nc, bw, y, fit.ts, fit.tc, fit.values);
    fit.coefficients(fit.values, alpha);
    // The chirp-z path carries an absolute error of about ε·Σ|α_k|; while the
    // reference is poor (early iterations) that can swamp |δ|, and the exact
    // barycentric form is used instead.
    let sumAbs = 0;
    for (let k = 0; k < r; k++) sumAbs += Math.abs(alpha[k]!);
    const direct = (): void => {
      skip.fill(-1);
      for (let j = 0; j < nz; j++) skip[ext[j]!] = j;
      interpolate(ns, nc, bw, y, grid.s, grid.c, values, skip);
    };
    const search = (): number[] => {
      let peak = 0;
      for (let i = 0; i < n; i++) {
        const e = grid.weight[i]! * (values[i]! - grid.desired[i]!);
        error[i] = e;
        if (Math.abs(e) > peak) peak = Math.abs(e);
      }
      gap = (peak - size) / size;
      return selectExtrema(error, grid.band, size * (1 - 1e-9) - noise, nz);
    };
    let next: number[];
    if (1e6 * Number.EPSILON * sumAbs < size) {
      evaluator.evaluate(alpha, values);
      // On the reference itself the interpolant is known exactly.
      for (let j = 0; j < nz; j++) values[ext[j]!] = y[j]!;
      next = search();
      // Confirm the chosen points with the exact barycentric form: they must
      // alternate with |E| ≥ |δ|, or the exchange could go backwards.
      if (next.length === nz && !confirmed(next)) {
        direct();
        next = search();
      } else fast++;
    } else {
      direct();
      next = search();
    }
    if (next.length < nz) {
      if (gap < 1e-3) {
        warnings.push({
          code: "barely-converged",
          message:
            `The Remez exchange found too few alternations at iteration ${iterations}; the error peaks exceed the equiripple level by ${
              (gap * 100).toPrecision(2)
            }%.`,
        });
        break;
      }
      fail(
        `only ${next.length} of ${nz} alternating extrema were found at iteration ${iterations}`,
      );
    }
    let same = true;
    for (let j = 0; j < nz; j++) {
      if (next[j] !== ext[j]) {
        same = false;
        break;
      }
    }
    if (same || gap <= 1e-12) {
      converged = true;
      break;
    }
    ext = Int32Array.from(next);
  }
  if (!converged && warnings.length === 0) {
    if (gap < 1e-2) {
      warnings.push({
        code: "not-converged",
        message:
          `The Remez exchange reached its limit of ${p.maxIterations} iterations; the error peaks exceed the equiripple level by ${
            (gap * 100).toPrecision(2)
          }%.`,
      });
    } else {
      fail(
        `after ${p.maxIterations} iterations the error peaks are still ${
          (gap * 100).toPrecision(3)
        }% above the equiripple level`,
      );
    }
  }

  // Cosine coefficients of P from its values at r Chebyshev points (exact for degree < r).
  interpolate(ns, nc, bw, y, fit.ts, fit.tc, fit.values);
  fit.coefficients(fit.values, alpha);
  const taps = tapsFromCosines(alpha, r, p.length, negative, odd);
  const extremalFrequencies = new Float64Array(nz);
  for (let j = 0; j < nz; j++) extremalFrequencies[j] = grid.f[ext[j]!]!;
  return { taps, deviation: Math.abs(delta), extremalFrequencies, iterations, warnings };
}

/** Impulse response from P's cosine coefficients α (α[r] = α[r+1] = 0). */
function tapsFromCosines(
  a: Float64Array,
  r: number,
  length: number,
  negative: boolean,
  odd: boolean,
): Float64Array {
  const h = new Float64Array(length);
  const at = (k: number): number => (k >= 0 && k < r ? a[k]! : 0);
  if (!negative && odd) {
    // Type I: A = Σ α_k cos kω; h[M] = α_0, h[M ± k] = α_k/2.
    const m = (length - 1) / 2;
    h[m] = at(0);
    for (let k = 1; k < r; k++) h[m - k] = h[m + k] = at(k) / 2;
  } else if (!negative) {
    // Type II: cos(ω/2)·P = Σ_{k=1}^{r} b_k cos((k − ½)ω).
    const m = length / 2;
    for (let k = 1; k <= r; k++) {
      const b = k === 1 ? at(0) + at(1) / 2 : (at(k - 1) + at(k)) / 2;
      h[m - k] = h[m - 1 + k] = b / 2;
    }
  } else if (odd) {
    // Type III: sin(ω)·P = Σ_{k=1}^{r} c_k sin(kω).
    const m = (length - 1) / 2;
    for (let k = 1; k <= r; k++) {
      const c = k === 1 ? at(0) - at(2) / 2 : (at(k - 1) - at(k + 1)) / 2;
      h[m - k] = c / 2;
      h[m + k] = -c / 2;
    }
  } else {
    // Type IV: sin(ω/2)·P = Σ_{k=1}^{r} d_k sin((k − ½)ω).
    const m = length / 2;
    for (let k = 1; k <= r; k++) {
      const d = k === 1 ? at(0) - at(1) / 2 : (at(k - 1) - at(k)) / 2;
      h[m - k] = d / 2;
      h[m - 1 + k] = -d / 2;
    }
  }
  return h;
}
