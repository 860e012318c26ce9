// Private: group delay of one polynomial C(z) = Σ c[n] z^−n on the unit circle,
// τ(ω) = Re{ Σ n·c[n] e^(−jωn) / Σ c[n] e^(−jωn) } (Oppenheim & Schafer §5.1.2),
// with the limit at zeros on the unit circle taken by L'Hôpital's rule. The ramp
// is centred, n − m with m = (N−1)/2, and m added back: the same value, but the
// ramp sum no longer shares the large linear-phase term with the plain sum, so
// less cancels near stopband nulls.
import { realFft } from "../fft/real_fft.ts";

/** Relative size below which a sum Σ n^m c[n] e^(−jωn) counts as zero. */
const zeroTolerance = 1e-13;

/**
 * Delay at a frequency where C(e^jω) vanishes: with S_m = Σ n^m c[n] e^(−jωn)
 * and m the multiplicity of the zero (the first S_m that is not zero), the
 * delay tends to Re{S_{m+1} / ((m+1) S_m)} from both sides. Sums use n/L
 * (L = length − 1) to stay in range; the ratio is rescaled by L.
 */
function delayAtZero(c: Float64Array, w: number): number {
  const length = c.length;
  const scale = Math.max(1, length - 1);
  const sums = (m: number): [number, number, number] => {
    let re = 0;
    let im = 0;
    let bound = 0;
    for (let n = 0; n < length; n++) {
      const weight = (n / scale) ** m * c[n]!;
      re += weight * Math.cos(w * n);
      im -= weight * Math.sin(w * n);
      bound += Math.abs(weight);
    }
    return [re, im, bound];
  };
  let [re, im, bound] = sums(0);
  for (let m = 0; m < length; m++) {
    const [nextRe, nextIm, nextBound] = sums(m + 1);
    if (Math.hypot(re, im) > zeroTolerance * bound) {
      const d = re * re + im * im;
      return (scale * (nextRe * re + nextIm * im)) / d / (m + 1);
    }
    re = nextRe;
    im = nextIm;
    bound = nextBound;
  }
  return Number.NaN;
}

/** Group delay in samples of C at radian frequencies w (direct sums). */
export function delayAt(c: Float64Array, w: ArrayLike<number>): Float64Array {
  const out = new Float64Array(w.length);
  let total = 0;
  for (let n = 0; n < c.length; n++) total += Math.abs(c[n]!);
  const centre = (c.length - 1) / 2;
  for (let i = 0; i < w.length; i++) {
    const wi = w[i]!;
    // Horner's rule in z = e^(−jω): rounding acts like a tiny frequency shift,
    // where independent cos(ωn) terms would add independent phase errors.
    const zr = Math.cos(wi);
    const zi = -Math.sin(wi);
    let r0 = 0;
    let i0 = 0;
    let r1 = 0;
    let i1 = 0;
    for (let n = c.length - 1; n >= 0; n--) {
      const t0 = r0 * zr - i0 * zi + c[n]!;
      i0 = r0 * zi + i0 * zr;
      r0 = t0;
      const t1 = r1 * zr - i1 * zi + (n - centre) * c[n]!;
      i1 = r1 * zi + i1 * zr;
      r1 = t1;
    }
    const d = r0 * r0 + i0 * i0;
    out[i] = Math.sqrt(d) > zeroTolerance * total
      ? centre + (r1 * r0 + i1 * i0) / d
      : delayAtZero(c, wi);
  }
  return out;
}

/** Group delay in samples of C on the grid ω_k = πk/(points−1), k = 0 … points−1, by FFT. */
export function delayOnGrid(c: Float64Array, points: number): Float64Array {
  const size = 2 * (points - 1);
  const plain = new Float64Array(size);
  const ramp = new Float64Array(size);
  let total = 0;
  const centre = (c.length - 1) / 2;
  for (let n = 0; n < c.length; n++) {
    plain[n % size]! += c[n]!;
    ramp[n % size]! += (n - centre) * c[n]!;
    total += Math.abs(c[n]!);
  }
  const s0 = realFft(plain);
  const s1 = realFft(ramp);
  const out = new Float64Array(points);
  for (let k = 0; k < points; k++) {
    const r0 = s0.re[k]!;
    const i0 = s0.im[k]!;
    const d = r0 * r0 + i0 * i0;
    out[k] = Math.sqrt(d) > zeroTolerance * total
      ? centre + (s1.re[k]! * r0 + s1.im[k]! * i0) / d
      : delayAtZero(c, (Math.PI * k) / (points - 1));
  }
  return out;
}
