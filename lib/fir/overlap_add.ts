import { requireInteger, requireSamples } from "../_validate.ts";
import { kernel } from "../fft/_fftjs.ts";

/** Options for {@link applyFirOverlapAdd}. */
export interface OverlapAddOptions {
  /**
   * FFT length M, a power of two greater than the number of taps N; each
   * block then takes M − N + 1 new input samples.
   * @default the power of two that minimises the work per output sample
   */
  fftLength?: number;
}

/** Power of two M ≥ 2N minimising M(log2 M + 1)/(M − N + 1), capped near the signal length. */
function bestFftLength(taps: number, signal: number): number {
  let best = 2;
  while (best < 2 * taps) best *= 2;
  let bestCost = Infinity;
  const limit = Math.max(best, 2 ** Math.ceil(Math.log2(taps + signal)));
  for (let m = best; m <= Math.min(limit, 1 << 20); m *= 2) {
    const cost = (m * (Math.log2(m) + 1)) / (m - taps + 1);
    if (cost < bestCost) {
      bestCost = cost;
      best = m;
    }
  }
  return best;
}

/**
 * Filter a signal with an FIR filter by FFT overlap-add: the input is cut into
 * blocks of L = M − N + 1 samples, each block is convolved with the taps by an
 * M-point FFT, and the overlapping tails are added. Two real blocks share one
 * complex FFT (one as the real part, one as the imaginary part), so each pair
 * costs one forward and one inverse transform. Same result as
 * {@link applyFirDirect} up to rounding (about 1e-15 relative to Σ|h|·max|x|),
 * at O(log N) instead of O(N) work per sample.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §8.7.3 (block convolution, overlap-add); the two-for-one real-FFT packing is
 * common practice (Oppenheim & Schafer, Problem 8.60).
 *
 * @param taps FIR coefficients h[0..N−1], N ≥ 1.
 * @param signal Input samples x (may be empty).
 * @param options FFT length.
 * @returns y[n] = Σ h[k]·x[n−k] for n = 0 … length−1 (same length as the signal).
 * @throws {TypeError} When taps or signal hold a non-finite value.
 * @throws {RangeError} When fftLength is not a power of two above the number of taps.
 * @example
 * ```ts
 * import { applyFirOverlapAdd } from "./overlap_add.ts";
 * const y = applyFirOverlapAdd([0.5, 0.5], [2, 4, 6, 8, 10], { fftLength: 4 });
 * if (y.some((v, i) => Math.abs(v - [1, 3, 5, 7, 9][i]!) > 1e-12)) throw new Error("two-tap average");
 * ```
 */
export function applyFirOverlapAdd(
  taps: ArrayLike<number>,
  signal: ArrayLike<number>,
  options: OverlapAddOptions = {},
): Float64Array {
  requireSamples("Taps", taps);
  requireSamples("Signal", signal, 0);
  const n = taps.length;
  const length = signal.length;
  const y = new Float64Array(length);
  if (length === 0) return y;
  const m = options.fftLength ?? bestFftLength(n, length);
  requireInteger("FFT length", m, n + 1);
  if ((m & (m - 1)) !== 0) throw new RangeError(`FFT length must be a power of two, got ${m}`);
  const block = m - n + 1;
  const fft = kernel(m);

  // Filter spectrum, scaled by 1/M so the inverse needs no extra pass.
  const padded = new Float64Array(2 * m);
  for (let k = 0; k < n; k++) padded[2 * k] = (taps[k] as number) / m;
  const filter = new Float64Array(2 * m);
  fft.transform(filter, padded);

  const work = new Float64Array(2 * m);
  const spectrum = new Float64Array(2 * m);
  for (let start = 0; start < length; start += 2 * block) {
    const second = start + block;
    const count0 = Math.min(block, length - start);
    const count1 = Math.max(0, Math.min(block, length - second));
    // Pack block 0 as real parts and block 1 as imaginary parts; zero the rest.
    for (let i = 0; i < count1; i++) {
      work[2 * i] = signal[start + i] as number;
      work[2 * i + 1] = signal[second + i] as number;
    }
    for (let i = count1; i < count0; i++) {
      work[2 * i] = signal[start + i] as number;
      work[2 * i + 1] = 0;
    }
    work.fill(0, 2 * count0);
    fft.transform(spectrum, work);
    // Z·H, conjugated, so that a forward transform yields the conjugate of the inverse.
    for (let k = 0; k < m; k++) {
      const zr = spectrum[2 * k]!;
      const zi = spectrum[2 * k + 1]!;
      const hr = filter[2 * k]!;
      const hi = filter[2 * k + 1]!;
      work[2 * k] = zr * hr - zi * hi;
      work[2 * k + 1] = -(zr * hi + zi * hr);
    }
    fft.transform(spectrum, work);
    // Real part: block 0 convolved with h; imaginary part (sign flipped back): block 1.
    const end0 = Math.min(length, start + count0 + n - 1);
    for (let i = start; i < end0; i++) y[i]! += spectrum[2 * (i - start)]!;
    if (count1 > 0) {
      const end1 = Math.min(length, second + count1 + n - 1);
      for (let i = second; i < end1; i++) y[i]! -= spectrum[2 * (i - second) + 1]!;
    }
  }
  return y;
}
