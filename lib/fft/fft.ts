import { requireInteger, requireSamples } from "../_validate.ts";
import { kernel } from "./_fftjs.ts";

/**
 * True when n is a power of two (1, 2, 4, …), the lengths fft.js transforms directly.
 *
 * @param n Any number.
 * @returns Whether n is an integer 2^k, k ≥ 0.
 * @example
 * ```ts
 * import { isPowerOfTwo } from "./fft.ts";
 * if (!isPowerOfTwo(1024) || isPowerOfTwo(1000)) throw new Error("1024 yes, 1000 no");
 * ```
 */
export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 1 && (n & (n - 1)) === 0;
}

/**
 * The smallest power of two that is ≥ n.
 *
 * @param n A length, an integer ≥ 1.
 * @returns 2^⌈log2 n⌉.
 * @throws {RangeError} When n is not an integer ≥ 1.
 * @example
 * ```ts
 * import { nextPowerOfTwo } from "./fft.ts";
 * if (nextPowerOfTwo(1000) !== 1024 || nextPowerOfTwo(1) !== 1) throw new Error("1000 → 1024");
 * ```
 */
export function nextPowerOfTwo(n: number): number {
  requireInteger("Length", n, 1);
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/**
 * Spectrum of a real signal at the non-negative frequencies, zero-padded to
 * `size` points: X[k] = Σ x[n] e^(−j2πkn/size), k = 0 … size/2.
 *
 * Uses the radix-4 kernel of fft.js, so `size` must be a power of two ≥ 2.
 *
 * @param signal Real samples; at most `size` of them.
 * @param size Transform length, a power of two ≥ 2. @default next power of two ≥ signal length
 * @returns `{ re, im }`, each of length size/2 + 1 (bin k is frequency k·fs/size).
 * @throws {RangeError} When size is not a power of two or is shorter than the signal.
 * @example
 * ```ts
 * import { realSpectrum } from "./fft.ts";
 * const { re, im } = realSpectrum([1, 1, 1, 1], 4);
 * if (re[0] !== 4 || im[0] !== 0 || re[2] !== 0) throw new Error("DC bin of four ones is 4");
 * ```
 */
export function realSpectrum(
  signal: ArrayLike<number>,
  size: number = nextPowerOfTwo(Math.max(2, signal.length)),
): { re: Float64Array; im: Float64Array } {
  requireSamples("Signal", signal);
  if (!isPowerOfTwo(size) || size < 2) {
    throw new RangeError(`Transform size must be a power of two >= 2, got ${size}`);
  }
  if (signal.length > size) {
    throw new RangeError(
      `Transform size must be at least the signal length ${signal.length}, got ${size}`,
    );
  }
  const input = new Float64Array(size);
  input.set(signal as ArrayLike<number>);
  const k = kernel(size);
  const out = new Float64Array(2 * size);
  k.realTransform(out, input);
  const half = size / 2;
  const re = new Float64Array(half + 1);
  const im = new Float64Array(half + 1);
  for (let i = 0; i <= half; i++) {
    re[i] = out[2 * i] as number;
    im[i] = out[2 * i + 1] as number;
  }
  // fft.js leaves the Nyquist bin's imaginary part unset in some paths; it is 0 for real input.
  im[0] = 0;
  im[half] = 0;
  return { re, im };
}
