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

/**
 * Half spectrum X[0 … ⌊N/2⌋] of N real samples, interleaved (2·(⌊N/2⌋+1) values).
 * `input` must hold exactly N samples.
 */
export function realHalfInterleaved(input: Float64Array, n: number): Float64Array {
  const half = Math.floor(n / 2);
  if (n >= 2 && powerOfTwo(n)) {
    const out = new Float64Array(2 * n);
    kernel(n).realTransform(out, input);
    out[1] = 0;
    out[n + 1] = 0;
    return out.subarray(0, 2 * half + 2);
  }
  const data = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) data[2 * i] = input[i]!;
  const full = forwardInterleaved(data, n);
  full[1] = 0;
  if (n % 2 === 0) full[n + 1] = 0;
  return full.subarray(0, 2 * half + 2);
}
