import { requireInteger, requireSamples } from "../_validate.ts";
import { nextPowerOfTwo } from "./fft.ts";

/**
 * Extend a signal with zeros at its end to `length` samples:
 * y[n] = x[n] for n < N, 0 for N ≤ n < length. Zero-padding before a DFT
 * samples the same spectrum on a finer grid; it adds no resolution.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §10.2 (common practice).
 *
 * @param signal Samples, at least 1.
 * @param length Output length ≥ the signal length.
 * @returns A new Float64Array of `length` samples.
 * @throws {RangeError} When length is below the signal length.
 * @example
 * ```ts
 * import { zeroPad } from "./zero_pad.ts";
 * if (zeroPad([1, 2], 4).join() !== "1,2,0,0") throw new Error("two zeros appended");
 * ```
 */
export function zeroPad(signal: ArrayLike<number>, length: number): Float64Array {
  requireSamples("Signal", signal);
  requireInteger("Padded length", length, signal.length);
  const out = new Float64Array(length);
  out.set(signal);
  return out;
}

/**
 * Zero-pad a signal to the next power of two, optionally after first asking
 * for at least `minimumLength` samples (e.g. 2N − 1 for a linear convolution).
 *
 * @param signal Samples, at least 1.
 * @param minimumLength The padded length is the smallest power of two ≥ max(N, minimumLength). @default signal length
 * @returns A new Float64Array whose length is a power of two.
 * @throws {RangeError} When minimumLength is not a positive integer.
 * @example
 * ```ts
 * import { zeroPadToPowerOfTwo } from "./zero_pad.ts";
 * if (zeroPadToPowerOfTwo([1, 2, 3]).length !== 4) throw new Error("3 → 4");
 * if (zeroPadToPowerOfTwo([1, 2, 3], 9).length !== 16) throw new Error("9 → 16");
 * ```
 */
export function zeroPadToPowerOfTwo(
  signal: ArrayLike<number>,
  minimumLength: number = signal.length,
): Float64Array {
  requireSamples("Signal", signal);
  requireInteger("Minimum length", minimumLength, 1);
  return zeroPad(signal, nextPowerOfTwo(Math.max(signal.length, minimumLength)));
}
