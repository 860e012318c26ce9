import { requireFinite, requireSamples, show } from "../_validate.ts";

/** Linear-phase FIR type by symmetry and parity of the length. */
export type LinearPhaseType = 1 | 2 | 3 | 4;

/** Result of {@link detectLinearPhase}. */
export interface LinearPhase {
  /** Type I–IV, or null when the taps are neither symmetric nor antisymmetric. */
  type: LinearPhaseType | null;
  /** Which symmetry holds (within the tolerance). */
  symmetry: "symmetric" | "antisymmetric" | "none";
  /** Constant group delay (N − 1)/2 in samples when linear phase, else null. */
  groupDelay: number | null;
  /** Largest |h[n] ∓ h[N−1−n]| for the closer symmetry, relative to max|h|. */
  mismatch: number;
  /** Gains the type forces to zero: "dc" (types III, IV) and/or "nyquist" (types II, III). */
  forcedZeros: ("dc" | "nyquist")[];
}

/** Options for {@link detectLinearPhase}. */
export interface LinearPhaseOptions {
  /** Allowed mismatch relative to max|h|, 0 ≤ tolerance < 1. @default 1e-12 */
  tolerance?: number;
}

/**
 * Detect linear phase from tap symmetry: h[n] = h[N−1−n] (symmetric) or
 * h[n] = −h[N−1−n] (antisymmetric, so the middle tap of an odd length is 0).
 *
 *   symmetric, N odd → type I;   symmetric, N even → type II (zero at fs/2);
 *   antisymmetric, N odd → type III (zeros at 0 and fs/2);
 *   antisymmetric, N even → type IV (zero at 0).
 *
 * Either symmetry gives H(f) = e^(−jπf(N−1)/fs)·A(f) (times j if antisymmetric),
 * a constant group delay of (N − 1)/2 samples.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal Processing,
 * 3rd ed., §5.7.3 "Generalized linear-phase FIR systems".
 *
 * @param taps FIR taps h[0..N−1], N ≥ 1.
 * @param options Tolerance on the symmetry, relative to the largest tap.
 * @returns Type, symmetry, group delay, mismatch and forced zeros.
 * @throws {TypeError} When a tap is not a finite number.
 * @throws {RangeError} When the tolerance is outside [0, 1).
 * @example
 * ```ts
 * import { detectLinearPhase } from "./linear_phase.ts";
 * const lp = detectLinearPhase([1, 2, 3, 2, 1]);
 * if (lp.type !== 1 || lp.groupDelay !== 2) throw new Error("type I, delay 2");
 * if (detectLinearPhase([1, 0, -1]).type !== 3) throw new Error("type III");
 * if (detectLinearPhase([1, 2, 4]).type !== null) throw new Error("not linear phase");
 * ```
 */
export function detectLinearPhase(
  taps: ArrayLike<number>,
  options: LinearPhaseOptions = {},
): LinearPhase {
  requireSamples("Taps", taps);
  const tolerance = options.tolerance ?? 1e-12;
  requireFinite("Tolerance", tolerance);
  if (tolerance < 0 || tolerance >= 1) {
    throw new RangeError(`Tolerance must be at least 0 and below 1, got ${show(tolerance)}`);
  }
  const n = taps.length;
  let peak = 0;
  for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(taps[i]!));
  let even = 0;
  let oddMismatch = 0;
  for (let i = 0; i < n; i++) {
    const a = taps[i]!;
    const b = taps[n - 1 - i]!;
    even = Math.max(even, Math.abs(a - b));
    oddMismatch = Math.max(oddMismatch, Math.abs(a + b) / (i === n - 1 - i ? 2 : 1));
  }
  const scale = peak === 0 ? 1 : peak;
  even /= scale;
  oddMismatch /= scale;
  const odd = n % 2 === 1;
  if (even <= tolerance) {
    return {
      type: odd ? 1 : 2,
      symmetry: "symmetric",
      groupDelay: (n - 1) / 2,
      mismatch: even,
      forcedZeros: odd ? [] : ["nyquist"],
    };
  }
  if (oddMismatch <= tolerance) {
    return {
      type: odd ? 3 : 4,
      symmetry: "antisymmetric",
      groupDelay: (n - 1) / 2,
      mismatch: oddMismatch,
      forcedZeros: odd ? ["dc", "nyquist"] : ["dc"],
    };
  }
  return {
    type: null,
    symmetry: "none",
    groupDelay: null,
    mismatch: Math.min(even, oddMismatch),
    forcedZeros: [],
  };
}
