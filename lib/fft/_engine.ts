// Private complex DFT engine on interleaved arrays [re0, im0, re1, im1, ...]:
// fft.js for powers of two, Bluestein's chirp-z algorithm for other lengths.
import { kernel } from "./_fftjs.ts";

/** True when n is a power of two ≥ 1. */
function powerOfTwo(n: number): boolean {
  return n >= 1 && (n & (n - 1)) === 0;
}

interface BluesteinPlan {
  /** Convolution length, a power of two ≥ 2N − 1. */
  size: number;
  /** Chirp e^(−jπn²/N), interleaved, n = 0 … N−1. */
  chirp: Float64Array;
  /** FFT of the conjugate chirp arranged for circular convolution, pre-scaled by 1/size. */
  filter: Float64Array;
  /** Work buffers of 2·size values. */
  work: Float64Array;
  spectrum: Float64Array;
}

const plans = new Map<number, BluesteinPlan>();
const maxPlans = 16;

function bluesteinPlan(n: number): BluesteinPlan {
  const cached = plans.get(n);
  if (cached !== undefined) return cached;
  let size = 2;
  while (size < 2 * n - 1) size *= 2;
  const chirp = new Float64Array(2 * n);
  // n² mod 2N by recurrence keeps the angle exact for large n.
  let q = 0;
  const twoN = 2 * n;
  for (let i = 0; i < n; i++) {
    const angle = (Math.PI * q) / n;
    chirp[2 * i] = Math.cos(angle);
    chirp[2 * i + 1] = -Math.sin(angle);
    q = (q + 2 * i + 1) % twoN;
  }
  const b = new Float64Array(2 * size);
  for (let i = 0; i < n; i++) {
    const re = chirp[2 * i]!;
    const im = -chirp[2 * i + 1]!;
    b[2 * i] = re;
    b[2 * i + 1] = im;
    if (i > 0) {
      b[2 * (size - i)] = re;
      b[2 * (size - i) + 1] = im;
    }
  }
  const filter = new Float64Array(2 * size);
  kernel(size).transform(filter, b);
  for (let i = 0; i < 2 * size; i++) filter[i]! /= size;
  const plan: BluesteinPlan = {
    size,
    chirp,
    filter,
    work: new Float64Array(2 * size),
    spectrum: new Float64Array(2 * size),
  };
  if (plans.size >= maxPlans) {
    const oldest = plans.keys().next().value;
    if (oldest !== undefined) plans.delete(oldest);
  }
  plans.set(n, plan);
  return plan;
}

/**
 * Forward DFT X[k] = Σ x[n] e^(−j2πkn/N) of N interleaved complex values.
 * Returns a new interleaved array of 2N values.
 */
export function forwardInterleaved(data: Float64Array, n: number): Float64Array {
  const out = new Float64Array(2 * n);
  if (n === 1) {
    out[0] = data[0]!;
    out[1] = data[1]!;
    return out;
  }
  if (powerOfTwo(n)) {
    kernel(n).transform(out, data);
    return out;
  }
  const plan = bluesteinPlan(n);
  const { size, chirp, filter, work, spectrum } = plan;
  work.fill(0);
  for (let i = 0; i < n; i++) {
    const xr = data[2 * i]!;
    const xi = data[2 * i + 1]!;
    const cr = chirp[2 * i]!;
    const ci = chirp[2 * i + 1]!;
    work[2 * i] = xr * cr - xi * ci;
    work[2 * i + 1] = xr * ci + xi * cr;
  }
  const k = kernel(size);
  k.transform(spectrum, work);
  // Multiply by the filter and conjugate, so a forward transform gives the
  // conjugate of the inverse: ifft(Z) = conj(fft(conj(Z))) / size (1/size is in the filter).
  for (let i = 0; i < size; i++) {
    const ar = spectrum[2 * i]!;
    const ai = spectrum[2 * i + 1]!;
    const br = filter[2 * i]!;
    const bi = filter[2 * i + 1]!;
    work[2 * i] = ar * br - ai * bi;
    work[2 * i + 1] = -(ar * bi + ai * br);
  }
  k.transform(spectrum, work);
  for (let i = 0; i < n; i++) {
    const yr = spectrum[2 * i]!;
    const yi = -spectrum[2 * i + 1]!;
    const cr = chirp[2 * i]!;
    const ci = chirp[2 * i + 1]!;
    out[2 * i] = yr * cr - yi * ci;
    out[2 * i + 1] = yr * ci + yi * cr;
  }
  return out;
}

/**
 * Inverse DFT x[n] = (1/N) Σ X[k] e^(+j2πkn/N) of N interleaved complex values,
 * by x = conj(DFT(conj(X)))/N. Returns a new interleaved array.
 */
export function inverseInterleaved(data: Float64Array, n: number): Float64Array {
  const conj = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    conj[2 * i] = data[2 * i]!;
    conj[2 * i + 1] = -data[2 * i + 1]!;
  }
  const out = forwardInterleaved(conj, n);
  const scale = 1 / n;
  for (let i = 0; i < n; i++) {
    out[2 * i]! *= scale;
    out[2 * i + 1] = -out[2 * i + 1]! * scale;
  }
  return out;
}

interface RealPlan {
  /** cos(2πk/N), sin(2πk/N) for k = 0 … N/2, interleaved. */
  twiddles: Float64Array;
  /** Work buffer for the N/2-point complex transform. */
  work: Float64Array;
}

const realPlans = new Map<number, RealPlan>();

/** Twiddles and work buffer for a real transform of N points; cached per N. */
function realPlan(n: number): RealPlan {
  let t = realPlans.get(n);
  if (t === undefined) {
    const twiddles = new Float64Array(n + 2);
    for (let k = 0; k <= n / 2; k++) {
      twiddles[2 * k] = Math.cos((2 * Math.PI * k) / n);
      twiddles[2 * k + 1] = Math.sin((2 * Math.PI * k) / n);
    }
    t = { twiddles, work: new Float64Array(n) };
    if (realPlans.size >= maxPlans) {
      const oldest = realPlans.keys().next().value;
      if (oldest !== undefined) realPlans.delete(oldest);
    }
    realPlans.set(n, t);
  }
  return t;
}

/**
 * Half spectrum X[0 … ⌊N/2⌋] of N real samples, written into `re` and `im`
 * (each ⌊N/2⌋ + 1 long). `input` must hold exactly N samples.
 *
 * Powers of two ≥ 4: the N real samples are read as N/2 complex values
 * z[n] = x[2n] + j·x[2n+1], transformed by fft.js, and split into the spectra
 * of the even and odd samples, X[k] = E[k] + e^(−j2πk/N)·O[k] with
 * E[k] = (Z[k] + Z*[N/2−k])/2 and O[k] = (Z[k] − Z*[N/2−k])/(2j)
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., Problem 8.60;
 * common practice). Other lengths: a complex transform of the real signal.
 */
export function realHalf(input: Float64Array, n: number, re: Float64Array, im: Float64Array): void {
  const half = Math.floor(n / 2);
  if (n >= 4 && powerOfTwo(n)) {
    const m = n / 2;
    const { twiddles: t, work: z } = realPlan(n);
    kernel(m).transform(z, input);
    re[0] = z[0]! + z[1]!;
    im[0] = 0;
    re[m] = z[0]! - z[1]!;
    im[m] = 0;
    for (let k = 1; k < m; k++) {
      const ar = z[2 * k]!;
      const ai = z[2 * k + 1]!;
      const br = z[2 * (m - k)]!;
      const bi = -z[2 * (m - k) + 1]!;
      const er = 0.5 * (ar + br);
      const ei = 0.5 * (ai + bi);
      const or = 0.5 * (ai - bi);
      const oi = -0.5 * (ar - br);
      const c = t[2 * k]!;
      const s = t[2 * k + 1]!;
      // e^(−j2πk/N)·O = (c − js)(or + j·oi)
      re[k] = er + or * c + oi * s;
      im[k] = ei + oi * c - or * s;
    }
    return;
  }
  const data = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) data[2 * i] = input[i]!;
  const full = forwardInterleaved(data, n);
  for (let k = 0; k <= half; k++) {
    re[k] = full[2 * k]!;
    im[k] = full[2 * k + 1]!;
  }
  im[0] = 0;
  if (n % 2 === 0) im[half] = 0;
}
