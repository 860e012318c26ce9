import { requireInteger } from "../_validate.ts";

/**
 * Frequencies of the bins of an N-point DFT, f_k = k·fs/N, for the one-sided
 * half (k = 0 … ⌊N/2⌋, the bins {@link realFft} returns) or all N bins.
 *
 * @param size DFT length N ≥ 1.
 * @param fs Sample rate in Hz, > 0.
 * @param oneSided Only the non-negative half. @default true
 * @returns Frequencies in Hz; with oneSided = false the bins above N/2 are
 *   given as negative frequencies (k − N)·fs/N.
 * @throws {RangeError} When size < 1 or fs ≤ 0.
 * @example
 * ```ts
 * import { binFrequencies } from "./bin_frequencies.ts";
 * if (binFrequencies(4, 8000).join() !== "0,2000,4000") throw new Error("one-sided");
 * if (binFrequencies(4, 8000, false).join() !== "0,2000,-4000,-2000") throw new Error("two-sided");
 * ```
 */
export function binFrequencies(size: number, fs: number, oneSided = true): Float64Array {
  requireInteger("DFT size", size, 1);
  if (!(fs > 0) || !Number.isFinite(fs)) {
    throw new RangeError(`Sample rate fs must be greater than 0 Hz, got ${String(fs)} Hz`);
  }
  const count = oneSided ? Math.floor(size / 2) + 1 : size;
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const index = oneSided || k < size / 2 ? k : k - size;
    out[k] = (index * fs) / size;
  }
  return out;
}
