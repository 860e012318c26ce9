import { requireInteger, requirePositive } from "../_validate.ts";
import { withSymmetry } from "./_symmetry.ts";
import type { WindowOptions } from "./windows.ts";

/** Options for {@link gaussianWindow}. */
export interface GaussianWindowOptions extends WindowOptions {
  /**
   * Standard deviation σ of the Gaussian, in samples, > 0. Harris's parameter
   * α relates to it by σ = N / (2α) for a window of N samples.
   * @default length / 6 (α = 3)
   */
  standardDeviation?: number;
}

/**
 * Gaussian window: w[n] = exp(−½ ((n − (N−1)/2) / σ)²), centred on the middle
 * of the window (between two samples when N is even).
 *
 * Source: Harris 1978 (Proc. IEEE 66(1)), §V-G, eq. (42) (Gaussian window,
 * written there with α = N/(2σ)).
 *
 * @param length Number of samples, ≥ 1.
 * @param options Standard deviation σ in samples and symmetry.
 * @returns The window samples, 1 at the centre when N is odd.
 * @throws {RangeError} When length < 1 or σ ≤ 0.
 * @example
 * ```ts
 * import { gaussianWindow } from "./gaussian.ts";
 * const w = gaussianWindow(5, { standardDeviation: 1 });
 * if (w[2] !== 1 || Math.abs(w[0]! - Math.exp(-2)) > 1e-15) throw new Error("exp(−2) two σ out");
 * ```
 */
export function gaussianWindow(length: number, options: GaussianWindowOptions = {}): Float64Array {
  requireInteger("Window length", length, 1);
  const sigma = options.standardDeviation ?? length / 6;
  requirePositive("Standard deviation", sigma, " samples");
  return withSymmetry(length, options, (n) => {
    const w = new Float64Array(n);
    const centre = (n - 1) / 2;
    for (let i = 0; i < n; i++) {
      const t = (i - centre) / sigma;
      w[i] = Math.exp(-0.5 * t * t);
    }
    return w;
  });
}
