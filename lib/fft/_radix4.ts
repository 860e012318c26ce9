// Private: tapsheet's own complex FFT kernel for powers of two, on split
// arrays (real parts and imaginary parts in two Float64Arrays).
//
// Decimation in time. The first pass puts the input in bit-reversed order
// and does the twiddle-free butterflies of the first one, two or three
// levels at once (radix 2, 4 or 8, chosen so that the number of levels left is
// even); every later pass is a radix-4 stage with precomputed twiddles, done in
// place on the output arrays. Nothing is allocated per call.
//
// Why it is laid out this way (measured with bench/analysis_bench.ts on the
// development machine, Deno 2.9 on x86-64): the transform is bound by the
// number of arithmetic and memory instructions, not by cache misses, so
// - split arrays need one index per complex value instead of two;
// - a radix-8 first pass saves one pass over the data for odd log2(N);
// - each stage's twiddles W^k, W^2k, W^3k lie next to each other in the
//   order the loop reads them;
// - radix-8 stages throughout were slower (the 8-point butterfly needs more
//   live values than there are registers), as was looping over k outside the
//   blocks (power-of-two strides collide in the cache).
//
// Inverse transforms use the same kernel with real and imaginary parts
// exchanged on the way in and out: swap(DFT(swap(X))) = N·IDFT(X), where
// swap(a + jb) = b + ja (common practice; Lyons, Understanding Digital Signal
// Processing, 3rd ed., §13.6).

/** Precomputed tables for one transform size. */
export interface FftPlan {
  /** Number of complex points N, a power of two ≥ 1. */
  readonly size: number;
  /** Levels done by the first pass: 0 (N = 1), 1, 2 or 3. */
  readonly firstLevels: number;
  /** Bit reversal of i over log2(N) − firstLevels bits, for i < N / 2^firstLevels. */
  readonly reversal: Int32Array;
  /**
   * Per radix-4 stage (quarter span L = 2^firstLevels, 4·2^firstLevels, …),
   * for k = 0 … L−1: Re W^k, Im W^k, Re W^2k, Im W^2k, Re W^3k, Im W^3k with
   * W = e^(−j2π/(4L)).
   */
  readonly twiddles: Float64Array;
}

const plans = new Map<number, FftPlan>();
const maxPlans = 24;

/** The plan for N complex points (N a power of two ≥ 1), cached per N. */
export function fftPlan(size: number): FftPlan {
  const cached = plans.get(size);
  if (cached !== undefined) return cached;
  const levels = Math.round(Math.log2(size));
  const firstLevels = levels <= 3 ? levels : levels % 2 === 1 ? 3 : 2;
  const rest = levels - firstLevels;
  const groups = size >> firstLevels;
  const reversal = new Int32Array(groups);
  for (let i = 0; i < groups; i++) {
    let r = 0;
    for (let b = 0; b < rest; b++) if ((i >> b) & 1) r |= 1 << (rest - 1 - b);
    reversal[i] = r;
  }
  let total = 0;
  for (let quarter = 1 << firstLevels; quarter < size; quarter *= 4) total += 6 * quarter;
  const twiddles = new Float64Array(total);
  let o = 0;
  for (let quarter = 1 << firstLevels; quarter < size; quarter *= 4) {
    const step = (2 * Math.PI) / (4 * quarter);
    for (let k = 0; k < quarter; k++) {
      for (let q = 1; q <= 3; q++) {
        twiddles[o++] = Math.cos(step * q * k);
        twiddles[o++] = -Math.sin(step * q * k);
      }
    }
  }
  const plan: FftPlan = { size, firstLevels, reversal, twiddles };
  if (plans.size >= maxPlans) {
    const oldest = plans.keys().next().value;
    if (oldest !== undefined) plans.delete(oldest);
  }
  plans.set(size, plan);
  return plan;
}

/**
 * Forward DFT X[k] = Σ z[n] e^(−j2πkn/N) of N complex values held interleaved
 * in `input` ([re0, im0, re1, im1, …], 2N values), written to `re` and `im`
 * (N values each, distinct from `input`).
 */
export function transformInterleaved(
  plan: FftPlan,
  input: Float64Array,
  re: Float64Array,
  im: Float64Array,
): void {
  firstPass(plan, input, input, 2, 1, re, im);
  stages(plan, re, im, plan.size);
}

/**
 * Forward DFT of N complex values held in `inRe` and `inIm`, written to `re`
 * and `im` (all N values; outputs distinct from inputs).
 */
export function transformSplit(
  plan: FftPlan,
  inRe: Float64Array,
  inIm: Float64Array,
  re: Float64Array,
  im: Float64Array,
): void {
  firstPass(plan, inRe, inIm, 1, 0, re, im);
  stages(plan, re, im, plan.size);
}

/** 1/√2, the size of the real and imaginary parts of W8 = e^(−jπ/4). */
const rootHalf = Math.SQRT1_2;

/**
 * The first `firstLevels` levels: the input value of complex index p sits at
 * srcRe[stride·p] and srcIm[stride·p + imOffset]. With R = 2^firstLevels,
 * G = N/R and r the bit reversal over log2 G bits, output group r(i) (values
 * R·r(i) … R·r(i) + R − 1) is the R-point DFT of z[i + n·G], n = 0 … R − 1
 * (O&S §9.3, Fig. 9.11: the bit-reversed input order of decimation in time).
 * Looping over i reads the input in order and writes whole groups; looping
 * over the groups instead (reading at r(i)) made the pass 2.3 times slower at
 * N = 2^15.
 */
function firstPass(
  plan: FftPlan,
  srcRe: Float64Array,
  srcIm: Float64Array,
  stride: number,
  imOffset: number,
  re: Float64Array,
  im: Float64Array,
): void {
  const { size, firstLevels, reversal } = plan;
  const g = stride * (size >> firstLevels);
  if (firstLevels === 3) {
    for (let i = 0; i < reversal.length; i++) {
      const o = 8 * reversal[i]!;
      const b = stride * i;
      const c = b + imOffset;
      // Radix-2 level on (u_n, u_{n+4}), then the twiddles W8^n of the odd half.
      const u0r = srcRe[b]!, u0i = srcIm[c]!;
      const u4r = srcRe[b + 4 * g]!, u4i = srcIm[c + 4 * g]!;
      const a0r = u0r + u4r, a0i = u0i + u4i, b0r = u0r - u4r, b0i = u0i - u4i;
      const u1r = srcRe[b + g]!, u1i = srcIm[c + g]!;
      const u5r = srcRe[b + 5 * g]!, u5i = srcIm[c + 5 * g]!;
      const a1r = u1r + u5r, a1i = u1i + u5i, d1r = u1r - u5r, d1i = u1i - u5i;
      const u2r = srcRe[b + 2 * g]!, u2i = srcIm[c + 2 * g]!;
      const u6r = srcRe[b + 6 * g]!, u6i = srcIm[c + 6 * g]!;
      const a2r = u2r + u6r, a2i = u2i + u6i, d2r = u2r - u6r, d2i = u2i - u6i;
      const u3r = srcRe[b + 3 * g]!, u3i = srcIm[c + 3 * g]!;
      const u7r = srcRe[b + 7 * g]!, u7i = srcIm[c + 7 * g]!;
      const a3r = u3r + u7r, a3i = u3i + u7i, d3r = u3r - u7r, d3i = u3i - u7i;
      // W8 = (1 − j)/√2, W8² = −j, W8³ = −(1 + j)/√2
      const b1r = rootHalf * (d1r + d1i), b1i = rootHalf * (d1i - d1r);
      const b2r = d2i, b2i = -d2r;
      const b3r = rootHalf * (d3i - d3r), b3i = -rootHalf * (d3r + d3i);
      // Even outputs: 4-point DFT of a; odd outputs: 4-point DFT of b.
      let s0r = a0r + a2r, s0i = a0i + a2i, s1r = a0r - a2r, s1i = a0i - a2i;
      let s2r = a1r + a3r, s2i = a1i + a3i, s3r = a1r - a3r, s3i = a1i - a3i;
      re[o] = s0r + s2r, im[o] = s0i + s2i;
      re[o + 4] = s0r - s2r, im[o + 4] = s0i - s2i;
      re[o + 2] = s1r + s3i, im[o + 2] = s1i - s3r;
      re[o + 6] = s1r - s3i, im[o + 6] = s1i + s3r;
      s0r = b0r + b2r, s0i = b0i + b2i, s1r = b0r - b2r, s1i = b0i - b2i;
      s2r = b1r + b3r, s2i = b1i + b3i, s3r = b1r - b3r, s3i = b1i - b3i;
      re[o + 1] = s0r + s2r, im[o + 1] = s0i + s2i;
      re[o + 5] = s0r - s2r, im[o + 5] = s0i - s2i;
      re[o + 3] = s1r + s3i, im[o + 3] = s1i - s3r;
      re[o + 7] = s1r - s3i, im[o + 7] = s1i + s3r;
    }
  } else if (firstLevels === 2) {
    for (let i = 0; i < reversal.length; i++) {
      const o = 4 * reversal[i]!;
      const b = stride * i;
      const c = b + imOffset;
      const u0r = srcRe[b]!, u0i = srcIm[c]!;
      const u1r = srcRe[b + g]!, u1i = srcIm[c + g]!;
      const u2r = srcRe[b + 2 * g]!, u2i = srcIm[c + 2 * g]!;
      const u3r = srcRe[b + 3 * g]!, u3i = srcIm[c + 3 * g]!;
      const s0r = u0r + u2r, s0i = u0i + u2i, s1r = u0r - u2r, s1i = u0i - u2i;
      const s2r = u1r + u3r, s2i = u1i + u3i, s3r = u1r - u3r, s3i = u1i - u3i;
      re[o] = s0r + s2r, im[o] = s0i + s2i;
      re[o + 2] = s0r - s2r, im[o + 2] = s0i - s2i;
      re[o + 1] = s1r + s3i, im[o + 1] = s1i - s3r;
      re[o + 3] = s1r - s3i, im[o + 3] = s1i + s3r;
    }
  } else if (firstLevels === 1) {
    const u0r = srcRe[0]!, u0i = srcIm[imOffset]!;
    const u1r = srcRe[stride]!, u1i = srcIm[stride + imOffset]!;
    re[0] = u0r + u1r, im[0] = u0i + u1i;
    re[1] = u0r - u1r, im[1] = u0i - u1i;
  } else {
    re[0] = srcRe[0]!, im[0] = srcIm[imOffset]!;
  }
}

/**
 * The radix-4 stages, in place. A span of 4L values holds, in its four
 * quarters, the L-point DFTs A, C, B, D of the span's samples 4n, 4n+2, 4n+1,
 * 4n+3 (bit-reversed order); with b = W^k·B, c = W^2k·C, d = W^3k·D:
 *   X[k] = (A + c) + (b + d),      X[k+2L] = (A + c) − (b + d),
 *   X[k+L] = (A − c) − j(b − d),   X[k+3L] = (A − c) + j(b − d)
 * (O&S §9.3 generalised to radix 4; Burrus & Parks, DFT/FFT and Convolution
 * Algorithms, 1985, ch. 4). Runs every stage whose quarter span is below
 * `below`, and returns the quarter span and twiddle offset of the next one.
 */
function stages(
  plan: FftPlan,
  re: Float64Array,
  im: Float64Array,
  below: number,
): { quarter: number; offset: number } {
  const { size, firstLevels, twiddles: tw } = plan;
  let t = 0;
  let quarter = 1 << firstLevels;
  for (; quarter < below; quarter *= 4) {
    const span = 4 * quarter;
    for (let start = 0; start < size; start += span) {
      for (let i0 = start, w = t, end = start + quarter; i0 < end; i0++, w += 6) {
        const i1 = i0 + quarter, i2 = i1 + quarter, i3 = i2 + quarter;
        const w1r = tw[w]!, w1i = tw[w + 1]!;
        const w2r = tw[w + 2]!, w2i = tw[w + 3]!;
        const w3r = tw[w + 4]!, w3i = tw[w + 5]!;
        const ar = re[i0]!, ai = im[i0]!;
        const xr = re[i1]!, xi = im[i1]!;
        const yr = re[i2]!, yi = im[i2]!;
        const zr = re[i3]!, zi = im[i3]!;
        const cr = xr * w2r - xi * w2i, ci = xr * w2i + xi * w2r;
        const br = yr * w1r - yi * w1i, bi = yr * w1i + yi * w1r;
        const dr = zr * w3r - zi * w3i, di = zr * w3i + zi * w3r;
        const t0r = ar + cr, t0i = ai + ci, t1r = ar - cr, t1i = ai - ci;
        const t2r = br + dr, t2i = bi + di, t3r = br - dr, t3i = bi - di;
        re[i0] = t0r + t2r, im[i0] = t0i + t2i;
        re[i2] = t0r - t2r, im[i2] = t0i - t2i;
        re[i1] = t1r + t3i, im[i1] = t1i - t3r;
        re[i3] = t1r - t3i, im[i3] = t1i + t3r;
      }
    }
    t += 6 * quarter;
  }
  return { quarter, offset: t };
}

/**
 * Forward DFT of N complex values in `inRe`/`inIm`, multiplied bin by bin by
 * H = hRe + j·hIm, written to `re` and `im`: the product of spectra in fast
 * convolution. The last radix-4 stage multiplies as it writes, which saves the
 * separate pass over the spectrum (about 6 % of FFT overlap-add's time).
 */
export function transformSplitTimes(
  plan: FftPlan,
  inRe: Float64Array,
  inIm: Float64Array,
  hRe: Float64Array,
  hIm: Float64Array,
  re: Float64Array,
  im: Float64Array,
): void {
  firstPass(plan, inRe, inIm, 1, 0, re, im);
  const size = plan.size;
  const { quarter, offset } = stages(plan, re, im, size / 4);
  const tw = plan.twiddles;
  if (quarter >= size) {
    // No radix-4 stage (N ≤ 8): multiply after the first pass.
    for (let k = 0; k < size; k++) {
      const zr = re[k]!, zi = im[k]!, fr = hRe[k]!, fi = hIm[k]!;
      re[k] = zr * fr - zi * fi, im[k] = zr * fi + zi * fr;
    }
    return;
  }
  // The last stage: one span of 4·quarter = N values.
  for (let i0 = 0, w = offset; i0 < quarter; i0++, w += 6) {
    const i1 = i0 + quarter, i2 = i1 + quarter, i3 = i2 + quarter;
    const w1r = tw[w]!, w1i = tw[w + 1]!;
    const w2r = tw[w + 2]!, w2i = tw[w + 3]!;
    const w3r = tw[w + 4]!, w3i = tw[w + 5]!;
    const ar = re[i0]!, ai = im[i0]!;
    const xr = re[i1]!, xi = im[i1]!;
    const yr = re[i2]!, yi = im[i2]!;
    const zr = re[i3]!, zi = im[i3]!;
    const cr = xr * w2r - xi * w2i, ci = xr * w2i + xi * w2r;
    const br = yr * w1r - yi * w1i, bi = yr * w1i + yi * w1r;
    const dr = zr * w3r - zi * w3i, di = zr * w3i + zi * w3r;
    const t0r = ar + cr, t0i = ai + ci, t1r = ar - cr, t1i = ai - ci;
    const t2r = br + dr, t2i = bi + di, t3r = br - dr, t3i = bi - di;
    let pr = t0r + t2r, pi = t0i + t2i, fr = hRe[i0]!, fi = hIm[i0]!;
    re[i0] = pr * fr - pi * fi, im[i0] = pr * fi + pi * fr;
    pr = t0r - t2r, pi = t0i - t2i, fr = hRe[i2]!, fi = hIm[i2]!;
    re[i2] = pr * fr - pi * fi, im[i2] = pr * fi + pi * fr;
    pr = t1r + t3i, pi = t1i - t3r, fr = hRe[i1]!, fi = hIm[i1]!;
    re[i1] = pr * fr - pi * fi, im[i1] = pr * fi + pi * fr;
    pr = t1r - t3i, pi = t1i + t3r, fr = hRe[i3]!, fi = hIm[i3]!;
    re[i3] = pr * fr - pi * fi, im[i3] = pr * fi + pi * fr;
  }
}
