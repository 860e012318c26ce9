import { requireInRange, requireInteger } from "../_validate.ts";
import { withSymmetry } from "./_symmetry.ts";
import type { WindowOptions } from "./windows.ts";

/** Options for {@link tukeyWindow}. */
export interface TukeyWindowOptions extends WindowOptions {
  /**
   * Fraction α of the window inside the two cosine tapers, 0 … 1
   * (0 is rectangular, 1 is Hann).
   * @default 0.5
   */
  taperFraction?: number;
}

function symmetricTukey(length: number, alpha: number): Float64Array {
  const w = new Float64Array(length).fill(1);
  if (length === 1 || alpha === 0) return w;
  const m = length - 1;
  // Taper over n = 0 … ⌊α(N−1)/2⌋ at each end: w = ½(1 + cos(π(2n/(α(N−1)) − 1))).
  const width = Math.floor((alpha * m) / 2);
  for (let n = 0; n <= width; n++) {
    w[n] = 0.5 * (1 + Math.cos(Math.PI * (-1 + (2 * n) / alpha / m)));
  }
  for (let n = m - width; n < length; n++) {
    w[n] = 0.5 * (1 + Math.cos(Math.PI * (-2 / alpha + 1 + (2 * n) / alpha / m)));
  }
  return w;
}

/**
 * Tukey (tapered-cosine) window: flat in the middle, with half-Hann tapers
 * over a fraction α of its length, α(N−1)/2 samples at each end:
 * w[n] = ½(1 + cos(π(2n/(α(N−1)) − 1))) for n ≤ α(N−1)/2, 1 in the middle,
 * and the mirror image at the far end.
 *
 * Source: Harris 1978 (Proc. IEEE 66(1)), §V-D, eq. (38) (cosine-tapered window).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Taper fraction α in [0, 1] and symmetry.
 * @returns The window samples.
 * @throws {RangeError} When length < 1 or α is outside [0, 1].
 * @example
 * ```ts
 * import { tukeyWindow } from "./tukey.ts";
 * const w = tukeyWindow(9, { taperFraction: 0.5 });
 * if (w[0] !== 0 || w[4] !== 1 || Math.abs(w[1]! - 0.5) > 1e-15) throw new Error("half taper");
 * ```
 */
export function tukeyWindow(length: number, options: TukeyWindowOptions = {}): Float64Array {
  requireInteger("Window length", length, 1);
  const alpha = options.taperFraction ?? 0.5;
  requireInRange("Taper fraction", alpha, 0, 1);
  return withSymmetry(length, options, (n) => symmetricTukey(n, alpha));
}
