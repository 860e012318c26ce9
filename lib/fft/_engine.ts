// Private DFT engine on split arrays (real parts and imaginary parts apart):
// tapsheet's radix-4 kernel for powers of two (in WebAssembly, _kernel.ts,
// from 16 complex points where it is available; in TypeScript, _radix4.ts,
// otherwise: the same bits either way), Bluestein's chirp-z algorithm for
// other lengths, and the real transforms by packing N real samples into N/2
// complex ones.
//
// fft.js is no longer used here. Measured per power of two from 1 to 2^17
// (bench/analysis_bench.ts, Deno 2.9 on x86-64, against the previous fft.js
// engine): complexFft takes 0.45–0.8× the time and realFft 0.57–0.85× from 256
// points up, inverseRealFft 0.25–0.4× (it used a full-length complex
// transform); below 256 points the public functions are within the noise of
// the measurement (±25 %), dominated by validating and allocating. The
// kernels alone: fft.js is faster at N = 2 and 4 complex points, by 3–5 ns of
// a call that costs about 400 ns in all, so there is no size worth switching at.
import { type FftPlan, fftPlan, transformInterleaved, transformSplit } from "./_radix4.ts";
import { kernelMinimumSize, wasmKernel } from "./_kernel.ts";

/** Real and imaginary parts of a complex sequence. */
export interface Split {
  re: Float64Array;
  im: Float64Array;
}

/**
 * `count` pairs of zeroed arrays of n values (real and imaginary parts). From
 * 512 values on they share one buffer, each array starting 512 bytes further
 * on, modulo 4 KiB, than the one before: the kernel reads and writes re[i] and
 * im[i] (and the arrays of a fast convolution) together, and when two such
 * addresses agree in their low 12 bits the processor stalls on false
 * store-to-load dependencies (4K aliasing; measured up to 1.8 times slower,
 * for example for 2^15 real points, and 15 % slower for FFT overlap-add).
 */
export function newSplits(n: number, count: number): Split[] {
  const pairs: Split[] = [];
  if (n < 512) {
    for (let p = 0; p < count; p++) {
      pairs.push({ re: new Float64Array(n), im: new Float64Array(n) });
    }
    return pairs;
  }
  const stride = n + ((((64 - n) % 512) + 512) % 512); // ≡ 64 values = 512 bytes (mod 4 KiB)
  const buffer = new ArrayBuffer(8 * (stride * (2 * count - 1) + n));
  for (let p = 0; p < count; p++) {
    pairs.push({
      re: new Float64Array(buffer, 8 * stride * 2 * p, n),
      im: new Float64Array(buffer, 8 * stride * (2 * p + 1), n),
    });
  }
  return pairs;
}

/** One pair of zeroed arrays of n values, laid out as by {@link newSplits}. */
export function newSplit(n: number): Split {
  return newSplits(n, 1)[0]!;
}

/**
 * Forward DFT of the plan's N complex values in inRe/inIm into re/im: the
 * WebAssembly kernel from {@link kernelMinimumSize} points on where it is
 * available, the TypeScript kernel otherwise (the same bits either way).
 */
export function forwardSplit(
  plan: FftPlan,
  inRe: Float64Array,
  inIm: Float64Array,
  re: Float64Array,
  im: Float64Array,
): void {
  const kernel = plan.size >= kernelMinimumSize ? wasmKernel() : undefined;
  if (kernel !== undefined) kernel.forwardSplit(inRe, inIm, re, im);
  else transformSplit(plan, inRe, inIm, re, im);
}

/** True when n is a power of two ≥ 1. */
function powerOfTwo(n: number): boolean {
  return n >= 1 && (n & (n - 1)) === 0;
}

/** Drop the oldest entry of a cache once it holds `limit` entries. */
function makeRoom<K, V>(cache: Map<K, V>, limit: number): void {
  if (cache.size < limit) return;
  const oldest = cache.keys().next().value;
  if (oldest !== undefined) cache.delete(oldest);
}

const maxPlans = 16;

interface BluesteinPlan {
  /** Convolution length, a power of two ≥ 2N − 1. */
  plan: FftPlan;
  /** Chirp e^(−jπn²/N), n = 0 … N−1. */
  chirpRe: Float64Array;
  chirpIm: Float64Array;
  /** DFT of the conjugate chirp arranged for circular convolution, scaled by 1/size. */
  filterRe: Float64Array;
  filterIm: Float64Array;
  /** Chirped input, zero beyond N (only the first N values are ever written). */
  inRe: Float64Array;
  inIm: Float64Array;
  /** Spectrum and product buffers, `size` values each. */
  specRe: Float64Array;
  specIm: Float64Array;
  prodRe: Float64Array;
  prodIm: Float64Array;
}

const bluesteinPlans = new Map<number, BluesteinPlan>();

function bluesteinPlan(n: number): BluesteinPlan {
  const cached = bluesteinPlans.get(n);
  if (cached !== undefined) return cached;
  let size = 2;
  while (size < 2 * n - 1) size *= 2;
  const chirpRe = new Float64Array(n);
  const chirpIm = new Float64Array(n);
  // n² mod 2N by recurrence keeps the angle exact for large n.
  let q = 0;
  const twoN = 2 * n;
  for (let i = 0; i < n; i++) {
    const angle = (Math.PI * q) / n;
    chirpRe[i] = Math.cos(angle);
    chirpIm[i] = -Math.sin(angle);
    q = (q + 2 * i + 1) % twoN;
  }
  const [b, filter, input, product] = newSplits(size, 4) as [Split, Split, Split, Split];
  const { re: bRe, im: bIm } = b;
  for (let i = 0; i < n; i++) {
    bRe[i] = chirpRe[i]! / size;
    bIm[i] = -chirpIm[i]! / size;
    if (i > 0) {
      bRe[size - i] = bRe[i]!;
      bIm[size - i] = bIm[i]!;
    }
  }
  const plan = fftPlan(size);
  forwardSplit(plan, bRe, bIm, filter.re, filter.im);
  const bluestein: BluesteinPlan = {
    plan,
    chirpRe,
    chirpIm,
    filterRe: filter.re,
    filterIm: filter.im,
    inRe: input.re,
    inIm: input.im,
    specRe: bRe,
    specIm: bIm,
    prodRe: product.re,
    prodIm: product.im,
  };
  makeRoom(bluesteinPlans, maxPlans);
  bluesteinPlans.set(n, bluestein);
  return bluestein;
}

/**
 * Bluestein: X[k] = c[k]·Σ (x[n]c[n])·c*[k−n] with c[n] = e^(−jπn²/N), the sum a
 * circular convolution of power-of-two size done by FFT. Writes into outRe/outIm.
 */
function bluestein(
  re: Float64Array,
  im: Float64Array,
  outRe: Float64Array,
  outIm: Float64Array,
): void {
  const n = re.length;
  const b = bluesteinPlan(n);
  const { plan, chirpRe, chirpIm, filterRe, filterIm, inRe, inIm } = b;
  const { specRe, specIm, prodRe, prodIm } = b;
  for (let i = 0; i < n; i++) {
    const xr = re[i]!, xi = im[i]!;
    const cr = chirpRe[i]!, ci = chirpIm[i]!;
    inRe[i] = xr * cr - xi * ci;
    inIm[i] = xr * ci + xi * cr;
  }
  forwardSplit(plan, inRe, inIm, specRe, specIm);
  for (let i = 0; i < plan.size; i++) {
    const ar = specRe[i]!, ai = specIm[i]!;
    const br = filterRe[i]!, bi = filterIm[i]!;
    prodRe[i] = ar * br - ai * bi;
    prodIm[i] = ar * bi + ai * br;
  }
  // Inverse by exchanging real and imaginary parts on the way in and out
  // (the 1/size is in the filter): the convolution is specRe + j·specIm.
  forwardSplit(plan, prodIm, prodRe, specIm, specRe);
  for (let i = 0; i < n; i++) {
    const yr = specRe[i]!, yi = specIm[i]!;
    const cr = chirpRe[i]!, ci = chirpIm[i]!;
    outRe[i] = yr * cr - yi * ci;
    outIm[i] = yr * ci + yi * cr;
  }
}

/**
 * Forward DFT X[k] = Σ x[n] e^(−j2πkn/N) of the N values in re and im (equal
 * lengths, N ≥ 1). Returns new arrays; the inputs are not changed.
 */
export function forwardComplex(re: Float64Array, im: Float64Array): Split {
  const n = re.length;
  const out = newSplit(n);
  if (powerOfTwo(n)) forwardSplit(fftPlan(n), re, im, out.re, out.im);
  else bluestein(re, im, out.re, out.im);
  return out;
}

/**
 * Inverse DFT x[n] = (1/N) Σ X[k] e^(+j2πkn/N), by exchanging real and
 * imaginary parts: x = swap(DFT(swap(X)))/N. Returns new arrays.
 */
export function inverseComplex(re: Float64Array, im: Float64Array): Split {
  const n = re.length;
  const swapped = forwardComplex(im, re);
  const scale = 1 / n;
  for (let i = 0; i < n; i++) {
    swapped.re[i]! *= scale;
    swapped.im[i]! *= scale;
  }
  return { re: swapped.im, im: swapped.re };
}

interface RealPlan {
  /** Complex plan of N/2 points. */
  plan: FftPlan;
  /** cos(2πk/N), sin(2πk/N) for k = 0 … N/4 − 1, interleaved. */
  twiddles: Float64Array;
  /** Work arrays of N/2 values for the inverse. */
  workRe: Float64Array;
  workIm: Float64Array;
  outRe: Float64Array;
  outIm: Float64Array;
}

const realPlans = new Map<number, RealPlan>();

/** Tables and work arrays for a real transform of N = 2^k ≥ 2 points; cached per N. */
function realPlan(n: number): RealPlan {
  const cached = realPlans.get(n);
  if (cached !== undefined) return cached;
  const m = n / 2;
  const quarter = Math.max(1, m >> 1);
  const twiddles = new Float64Array(2 * quarter);
  for (let k = 0; k < quarter; k++) {
    twiddles[2 * k] = Math.cos((2 * Math.PI * k) / n);
    twiddles[2 * k + 1] = Math.sin((2 * Math.PI * k) / n);
  }
  const [work, out] = newSplits(m, 2) as [Split, Split];
  const plan: RealPlan = {
    plan: fftPlan(m),
    twiddles,
    workRe: work.re,
    workIm: work.im,
    outRe: out.re,
    outIm: out.im,
  };
  makeRoom(realPlans, maxPlans);
  realPlans.set(n, plan);
  return plan;
}

/**
 * Half spectrum X[0 … ⌊N/2⌋] of N real samples in new arrays (which may share
 * one buffer): the WebAssembly kernel's real transform for powers of two from
 * 2·{@link kernelMinimumSize} on where it is available, {@link realHalf}
 * otherwise (the same bits either way). `input` must hold exactly N samples.
 */
export function realHalfSpectrum(input: Float64Array, n: number): Split {
  const kernel = powerOfTwo(n) && n >= 2 * kernelMinimumSize ? wasmKernel() : undefined;
  if (kernel !== undefined) return kernel.realForward(input, n);
  const out = newSplit(Math.floor(n / 2) + 1);
  realHalf(input, n, out.re, out.im);
  return out;
}

/**
 * Half spectrum X[0 … ⌊N/2⌋] of N real samples, written into `re` and `im`
 * (each ⌊N/2⌋ + 1 long). `input` must hold exactly N samples.
 *
 * Powers of two ≥ 2: the N real samples are read as M = N/2 complex values
 * z[n] = x[2n] + j·x[2n+1] and transformed (into `re` and `im` themselves),
 * then split into the spectra of the even and odd samples,
 * E[k] = (Z[k] + Z*[M−k])/2 and O[k] = (Z[k] − Z*[M−k])/(2j), and joined as
 * X[k] = E[k] + W^k·O[k] and X[M−k] = (E[k] − W^k·O[k])*, W = e^(−j2π/N), one
 * pair (k, M−k) per step, in place (Oppenheim & Schafer, Discrete-Time Signal
 * Processing, 3rd ed., Problem 8.60; common practice). Other lengths: a
 * complex transform of the real signal.
 */
function realHalf(input: Float64Array, n: number, re: Float64Array, im: Float64Array): void {
  const half = Math.floor(n / 2);
  if (n === 1) {
    re[0] = input[0]!;
    im[0] = 0;
    return;
  }
  if (!powerOfTwo(n)) {
    const full = forwardComplex(input, new Float64Array(n));
    re.set(full.re.subarray(0, half + 1));
    im.set(full.im.subarray(0, half + 1));
    im[0] = 0;
    if (n % 2 === 0) im[half] = 0;
    return;
  }
  const m = half;
  const { plan, twiddles: t } = realPlan(n);
  transformInterleaved(plan, input, re, im);
  const z0r = re[0]!, z0i = im[0]!;
  re[0] = z0r + z0i;
  im[0] = 0;
  re[m] = z0r - z0i;
  im[m] = 0;
  if (m === 1) return;
  const h = m >> 1;
  // k = M/2 pairs with itself: X[M/2] = Z*[M/2].
  im[h] = -im[h]!;
  for (let k = 1, j = m - 1; k < h; k++, j--) {
    const ar = re[k]!, ai = im[k]!;
    const br = re[j]!, bi = -im[j]!;
    const er = 0.5 * (ar + br), ei = 0.5 * (ai + bi);
    const or = 0.5 * (ai - bi), oi = -0.5 * (ar - br);
    const c = t[2 * k]!, s = t[2 * k + 1]!;
    // W^k·O = (c − js)(or + j·oi)
    const pr = c * or + s * oi, pi = c * oi - s * or;
    re[k] = er + pr;
    im[k] = ei + pi;
    re[j] = er - pr;
    im[j] = pi - ei;
  }
}

/**
 * The N real samples whose DFT has the half spectrum re/im (⌊N/2⌋ + 1 bins,
 * X[N−k] = X*[k]); the imaginary parts of the DC bin and, for even N, of the
 * Nyquist bin are ignored.
 *
 * Powers of two ≥ 2 undo {@link realHalf} step by step: E[k] = (X[k] + X*[M−k])/2,
 * O[k] = W^(−k)·(X[k] − X*[M−k])/2, Z[k] = E[k] + j·O[k], then an M-point
 * inverse transform gives z[n] = x[2n] + j·x[2n+1]. Other lengths: the full
 * Hermitian spectrum through the complex inverse.
 */
export function inverseRealHalf(re: Float64Array, im: Float64Array, n: number): Float64Array {
  const half = Math.floor(n / 2);
  if (n === 1) return Float64Array.of(re[0]!);
  if (!powerOfTwo(n)) {
    const fullRe = new Float64Array(n);
    const fullIm = new Float64Array(n);
    fullRe[0] = re[0]!;
    for (let k = 1; k <= half; k++) {
      const nyquist = 2 * k === n;
      fullRe[k] = re[k]!;
      fullIm[k] = nyquist ? 0 : im[k]!;
      if (!nyquist) {
        fullRe[n - k] = re[k]!;
        fullIm[n - k] = -im[k]!;
      }
    }
    const x = inverseComplex(fullRe, fullIm).re;
    return x;
  }
  const m = half;
  const kernel = n >= 2 * kernelMinimumSize ? wasmKernel() : undefined;
  if (kernel !== undefined) return kernel.realInverse(re, im, n);
  const { plan, twiddles: t, workRe: zr, workIm: zi, outRe, outIm } = realPlan(n);
  zr[0] = 0.5 * (re[0]! + re[m]!);
  zi[0] = 0.5 * (re[0]! - re[m]!);
  if (m > 1) {
    const h = m >> 1;
    zr[h] = re[h]!;
    zi[h] = -im[h]!;
    for (let k = 1, j = m - 1; k < h; k++, j--) {
      const ar = re[k]!, ai = im[k]!;
      const br = re[j]!, bi = -im[j]!;
      const er = 0.5 * (ar + br), ei = 0.5 * (ai + bi);
      const dr = 0.5 * (ar - br), di = 0.5 * (ai - bi);
      const c = t[2 * k]!, s = t[2 * k + 1]!;
      // O = W^(−k)·D = (c + js)(dr + j·di)
      const or = c * dr - s * di, oi = c * di + s * dr;
      zr[k] = er - oi;
      zi[k] = ei + or;
      zr[j] = er + oi;
      zi[j] = or - ei;
    }
  }
  // Inverse M-point transform with real and imaginary parts exchanged: z = outRe + j·outIm.
  transformSplit(plan, zi, zr, outIm, outRe);
  const out = new Float64Array(n);
  const scale = 1 / m;
  for (let i = 0; i < m; i++) {
    out[2 * i] = outRe[i]! * scale;
    out[2 * i + 1] = outIm[i]! * scale;
  }
  return out;
}
