import { requireInteger, show } from "../_validate.ts";
import type { DesignWarning } from "../types.ts";
import { checkBands } from "./_bands.ts";
import { remezExchange, RemezFailure } from "./_remez.ts";
import { realSpectrum } from "../fft/fft.ts";
import type { DesignBand } from "./types.ts";

/**
 * What an equiripple design approximates:
 * - "multiband": flat gains in each band, symmetric taps (type I for an odd
 *   length, type II for an even length);
 * - "hilbert": flat gains with antisymmetric taps (type III odd, type IV even),
 *   a 90° phase shifter when the gain is 1;
 * - "differentiator": D(ω) = g·ω in each band (g = the band's `gain`), antisymmetric
 *   taps, error weighted relative to the wanted gain.
 */
export type EquirippleKind = "multiband" | "hilbert" | "differentiator";

/** Specification of an equiripple (Parks–McClellan) design. */
export interface EquirippleOptions {
  /** Number of taps N (order N − 1), 3 ≤ N ≤ 65536. */
  length: number;
  /** Sample rate in Hz. */
  fs: number;
  /** Bands with wanted gain and weight, increasing and not touching. */
  bands: readonly DesignBand[];
  /** Kind of approximation. @default "multiband" */
  kind?: EquirippleKind;
  /** Dense-grid points per extremal frequency, 4 … 1024. @default 16 */
  gridDensity?: number;
  /** Limit on exchange iterations, 1 … 1000. @default 100 */
  maxIterations?: number;
}

/** Result of {@link designEquiripple}. */
export interface EquirippleDesign {
  /** Taps h[0..N−1]. */
  taps: Float64Array;
  /**
   * The weighted equiripple deviation δ (the minimised maximum of W·|A − D|) on the
   * design grid; the true peak between grid points can be slightly (≲1%) larger.
   */
  deviation: number;
  /** Peak unweighted deviation per band on the design grid, δ / weight (linear). */
  bandDeviations: number[];
  /** Frequencies (Hz) where the final error peaks alternate. */
  extremalFrequencies: Float64Array;
  /** Exchange iterations used. */
  iterations: number;
  /** Soft trouble: a design that only just converged. */
  warnings: DesignWarning[];
}

/**
 * The Remez exchange could not produce a trustworthy filter for this
 * specification; the message says what failed and what to change.
 *
 * @example
 * ```ts
 * import { ConvergenceError, designEquiripple } from "./equiripple.ts";
 * // 301 taps for a 0.1·fs transition band would need ripple far below double precision.
 * let refused = false;
 * try {
 *   designEquiripple({
 *     length: 301,
 *     fs: 1,
 *     bands: [{ from: 0, to: 0.2, gain: 1 }, { from: 0.3, to: 0.5, gain: 0 }],
 *   });
 * } catch (e) {
 *   refused = e instanceof ConvergenceError && e.message.includes("fewer taps");
 * }
 * if (!refused) throw new Error("an over-met specification ends in a clear error");
 * ```
 */
export class ConvergenceError extends Error {
  /**
   * Create the error.
   *
   * @param message What failed and what to change.
   */
  constructor(message: string) {
    super(message);
    this.name = "ConvergenceError";
  }
}

/**
 * Equiripple linear-phase FIR by the Parks–McClellan algorithm: the Remez
 * exchange finds the taps that minimise max_f W(f)·|A(f) − D(f)| over the bands,
 * where A is the real amplitude of the linear-phase response
 * H(f) = e^(−jπf(N−1)/fs)·A(f) (times j for antisymmetric taps).
 *
 * The error alternates in sign at r + 1 extremal frequencies with equal
 * weighted size δ (the alternation theorem). The exchange starts from points
 * spread by the bands' equilibrium measure (crowded at band edges, where the
 * answer's extrema lie), evaluates the approximation in barycentric Lagrange
 * form in x = cos ω, and on the dense grid through its cosine coefficients by
 * chirp-z transforms, confirming the chosen extrema exactly; the grid is the
 * one of McClellan, Parks and Rabiner (density 16 by default), so results
 * agree with that program's to rounding. A final check on a grid 8 times
 * denser refuses designs that are equiripple only on the grid (wide transition
 * bands where the response explodes), after retrying on denser grids.
 *
 * Types: symmetric taps with odd N (I) or even N (II, zero forced at fs/2);
 * antisymmetric taps with odd N (III, zeros at 0 and fs/2) or even N (IV, zero at 0).
 *
 * Sources: T. W. Parks and J. H. McClellan, "Chebyshev approximation for
 * nonrecursive digital filters with linear phase", IEEE Trans. Circuit Theory
 * 19(2), 1972; J. H. McClellan, T. W. Parks and L. R. Rabiner, "A computer
 * program for designing optimum FIR linear phase digital filters", IEEE Trans.
 * Audio Electroacoust. 21(6), 1973; J.-P. Berrut and L. N. Trefethen,
 * "Barycentric Lagrange interpolation", SIAM Review 46(3), 2004.
 *
 * @param options Length, sample rate, bands, kind, grid density, iteration limit.
 * @returns Taps, achieved deviation per band, extremal frequencies, warnings.
 * @throws {RangeError} For a length, edge, weight or density out of range, band
 *   edges that do not increase, or a band the chosen type cannot follow (an even
 *   length with gain at fs/2; antisymmetric taps with gain at 0 Hz, or at fs/2 for odd N).
 * @throws {TypeError} When the bands are not an array of band objects.
 * @throws {ConvergenceError} When the exchange fails (e.g. the specification asks
 *   for ripple below double precision); the message says what to change.
 * @example
 * ```ts
 * import { designEquiripple } from "./equiripple.ts";
 * const d = designEquiripple({
 *   length: 31,
 *   fs: 8000,
 *   bands: [{ from: 0, to: 800, gain: 1 }, { from: 1200, to: 4000, gain: 0 }],
 * });
 * const dc = d.taps.reduce((a, b) => a + b, 0);
 * // Equal weights: the passband and stopband deviations are the same δ.
 * if (Math.abs(dc - 1) > d.deviation * 1.0001 || d.taps[0] !== d.taps[30]) {
 *   throw new Error("DC within the ripple, symmetric taps");
 * }
 * ```
 */
export function designEquiripple(options: EquirippleOptions): EquirippleDesign {
  const { length, fs } = options;
  const kind = options.kind ?? "multiband";
  const gridDensity = options.gridDensity ?? 16;
  const maxIterations = options.maxIterations ?? 100;
  requireInteger("Number of taps", length, 3, 65536);
  requireInteger("Grid density", gridDensity, 4, 1024);
  requireInteger("Maximum iterations", maxIterations, 1, 1000);
  if (kind !== "multiband" && kind !== "hilbert" && kind !== "differentiator") {
    throw new TypeError(
      `Kind must be "multiband", "hilbert" or "differentiator", got ${String(kind)}`,
    );
  }
  const bands = checkBands(options.bands, fs);
  const nyquist = fs / 2;
  const odd = length % 2 === 1;
  const antisymmetric = kind !== "multiband";
  const first = bands[0]!;
  const last = bands[bands.length - 1]!;
  if (!antisymmetric && !odd && last.to === nyquist && last.gain !== 0) {
    throw new RangeError(
      `An even number of taps forces a zero at fs/2 (type II), but the band reaching fs/2 = ${
        show(nyquist)
      } Hz asks for gain ${show(last.gain)}: use an odd length, got ${length}`,
    );
  }
  if (kind === "hilbert" && first.from === 0 && first.gain !== 0) {
    throw new RangeError(
      `Antisymmetric taps (types III and IV) force a zero at 0 Hz, but band 1 starts at 0 Hz with gain ${
        show(first.gain)
      }: start the band above 0 Hz`,
    );
  }
  const gainAtNyquist = kind === "differentiator" ? last.gain * Math.PI : last.gain;
  if (antisymmetric && odd && last.to === nyquist && gainAtNyquist !== 0) {
    throw new RangeError(
      `An odd number of antisymmetric taps (type III) forces a zero at fs/2 = ${
        show(nyquist)
      } Hz, but the last band reaches it with a non-zero wanted response: use an even length, got ${length}`,
    );
  }
  // A failed exchange is retried from the classic equally spaced start; a
  // design that blows up between grid points is retried on a denser grid.
  const remezBands = bands.map((b) => ({
    lo: b.from / fs,
    hi: b.to / fs,
    gain: b.gain,
    weight: b.weight,
  }));
  let lastError: Error | undefined;
  let solution: ReturnType<typeof remezExchange> | undefined;
  const warnings: DesignWarning[] = [];
  for (let density = gridDensity; density <= Math.max(gridDensity, 128); density *= 2) {
    if (density > gridDensity && density * length > 1 << 16) break;
    for (const start of ["chebyshev", "uniform"] as const) {
      try {
        const s = remezExchange({
          length,
          kind,
          gridDensity: density,
          maxIterations,
          bands: remezBands,
          start,
        });
        const check = checkBetweenGridPoints(s.taps, s.deviation, bands, kind, fs);
        if (check.refusal !== undefined) {
          lastError = new ConvergenceError(check.refusal);
          break; // a denser grid, not another start, is what helps here
        }
        solution = s;
        warnings.push(...s.warnings, ...check.warnings);
        if (density > gridDensity) {
          warnings.push({
            code: "grid-density-raised",
            message:
              `The grid density was raised from ${gridDensity} to ${density} to keep the error equiripple between grid points.`,
          });
        }
        break;
      } catch (error) {
        if (!(error instanceof RemezFailure)) throw error;
        lastError = new ConvergenceError(error.message);
      }
    }
    if (solution !== undefined || !(lastError?.message.includes("between grid points") ?? false)) {
      break;
    }
  }
  if (solution === undefined) throw lastError ?? new ConvergenceError("The Remez exchange failed");
  const extremalFrequencies = solution.extremalFrequencies.map((f) => f * fs);
  return {
    taps: solution.taps,
    deviation: solution.deviation,
    bandDeviations: bands.map((b) => solution.deviation / b.weight),
    extremalFrequencies,
    iterations: solution.iterations,
    warnings,
  };
}

/**
 * The exchange works on a grid; check the weighted error on a grid at least
 * 8 times denser (by FFT). A design whose error between grid points is far
 * above δ (the response blows up in wide transition bands) is refused; a
 * small excess or a large transition-band peak becomes a warning.
 */
function checkBetweenGridPoints(
  taps: Float64Array,
  deviation: number,
  bands: ReturnType<typeof checkBands>,
  kind: EquirippleKind,
  fs: number,
): { refusal?: string; warnings: DesignWarning[] } {
  const warnings: DesignWarning[] = [];
  let size = 8192;
  while (size < 16 * taps.length) size *= 2;
  const { re, im } = realSpectrum(taps, size);
  let worst = 0;
  let worstAt = 0;
  let peakOutside = 0;
  let peakAt = 0;
  let b = 0;
  for (let k = 0; k <= size / 2; k++) {
    const f = (k * fs) / size;
    const mag = Math.hypot(re[k]!, im[k]!);
    while (b < bands.length && bands[b]!.to < f) b++;
    const band = bands[b];
    if (band === undefined || f < band.from) {
      if (mag > peakOutside) {
        peakOutside = mag;
        peakAt = f;
      }
      continue;
    }
    let wanted = Math.abs(band.gain);
    let weight = band.weight;
    if (kind === "differentiator") {
      const fn = f / fs;
      wanted = Math.abs(band.gain) * 2 * Math.PI * fn;
      if (Math.abs(band.gain) * 2 * Math.PI >= 1e-4) weight = fn > 0 ? band.weight / fn : 0;
    }
    const e = weight * Math.abs(mag - wanted);
    if (e > worst) {
      worst = e;
      worstAt = f;
    }
  }
  const ratio = worst / deviation;
  if (ratio > 2) {
    return {
      warnings,
      refusal:
        `The design is equiripple only on its frequency grid: between grid points the weighted error reaches ${
          worst.toExponential(2)
        } at ${show(worstAt)} Hz, ${ratio.toPrecision(3)} times the equiripple level ${
          deviation.toExponential(2)
        }${
          peakOutside > 10
            ? `, and the gain in a transition band climbs to ${peakOutside.toExponential(2)}`
            : ""
        }. The transition bands are too wide for this many taps: narrow them or use fewer taps`,
    };
  }
  if (ratio > 1.05) {
    warnings.push({
      code: "grid-resolution",
      message: `Between the design grid's points the weighted error reaches ${
        ((ratio - 1) * 100).toPrecision(2)
      }% above the equiripple level (at ${
        show(worstAt)
      } Hz); a higher grid density would even it out.`,
    });
  }
  const largestGain = Math.max(...bands.map((x) => Math.abs(x.gain)), 1e-300);
  if (kind !== "differentiator" && peakOutside > 2 * largestGain) {
    warnings.push({
      code: "transition-peak",
      message: `The gain peaks at ${(20 * Math.log10(peakOutside)).toFixed(1)} dB at ${
        show(peakAt)
      } Hz in a transition band, where the design leaves the response free.`,
    });
  }
  return { warnings };
}
