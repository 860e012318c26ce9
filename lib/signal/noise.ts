import { requireInteger, requirePositive } from "../_validate.ts";
import { Xoshiro128 } from "./_random.ts";

/** Options for {@link whiteNoise}. */
export interface WhiteNoiseOptions {
  /** Seed, an integer in [0, 2^53); the same seed gives the same samples everywhere. @default 1 */
  seed?: number;
  /** Standard deviation (RMS value) of the samples, > 0. @default 1 */
  standardDeviation?: number;
  /** Amplitude distribution: Gaussian, or uniform on [−σ√3, σ√3). @default "gaussian" */
  distribution?: "gaussian" | "uniform";
}

function checkSeed(seed: number): void {
  requireInteger("Seed", seed, 0, Number.MAX_SAFE_INTEGER);
}

/**
 * White noise: independent samples with zero mean and standard deviation σ,
 * Gaussian or uniform, from a seeded generator that gives the same samples on
 * every machine.
 *
 * Generator: xoshiro128** (Blackman and Vigna, "Scrambled linear pseudorandom
 * number generators", ACM Trans. Math. Softw. 47(4), 2021), seeded by SplitMix64
 * (Steele, Lea and Flood, OOPSLA 2014); doubles carry 53 random bits. Gaussian
 * samples by Marsaglia's polar method (Marsaglia and Bray, SIAM Review 6(3),
 * 1964) with a logarithm built from basic arithmetic, so no math-library
 * rounding differences can creep in.
 *
 * @param length Number of samples, ≥ 1.
 * @param options Seed, standard deviation and distribution.
 * @returns `length` samples.
 * @throws {RangeError} When length < 1, the seed is not an integer in [0, 2^53) or σ ≤ 0.
 * @throws {TypeError} When the distribution is unknown.
 * @example
 * ```ts
 * import { whiteNoise } from "./noise.ts";
 * const x = whiteNoise(20000, { seed: 7 });
 * const mean = x.reduce((s, v) => s + v, 0) / x.length;
 * const rms = Math.sqrt(x.reduce((s, v) => s + v * v, 0) / x.length);
 * if (Math.abs(mean) > 0.03 || Math.abs(rms - 1) > 0.03) throw new Error("zero mean, unit RMS");
 * if (whiteNoise(3, { seed: 7 }).join() !== x.slice(0, 3).join()) throw new Error("repeatable");
 * ```
 */
export function whiteNoise(length: number, options: WhiteNoiseOptions = {}): Float64Array {
  requireInteger("Length", length, 1);
  const seed = options.seed ?? 1;
  checkSeed(seed);
  const sigma = options.standardDeviation ?? 1;
  requirePositive("Standard deviation", sigma);
  const distribution = options.distribution ?? "gaussian";
  if (distribution !== "gaussian" && distribution !== "uniform") {
    throw new TypeError(
      `Distribution must be "gaussian" or "uniform", got ${JSON.stringify(distribution)}`,
    );
  }
  const rng = new Xoshiro128(seed);
  const x = new Float64Array(length);
  if (distribution === "gaussian") {
    for (let i = 0; i < length; i++) x[i] = sigma * rng.gaussian();
  } else {
    const half = sigma * Math.sqrt(3);
    for (let i = 0; i < length; i++) x[i] = half * (2 * rng.uniform() - 1);
  }
  return x;
}

/** Options for {@link pinkNoise}. */
export interface PinkNoiseOptions {
  /** Seed, an integer in [0, 2^53). @default 1 */
  seed?: number;
  /** Standard deviation (RMS value) of the samples, > 0. @default 1 */
  standardDeviation?: number;
  /**
   * Number of Voss–McCartney rows R, 1 … 30: the spectrum falls at 3 dB per
   * octave from fs/2 down to about fs/2^(R+1), and is flat below.
   * @default 16
   */
  rows?: number;
}

/**
 * Pink (1/f) noise by the Voss–McCartney algorithm: the sum of R + 1 Gaussian
 * sources, where row r is redrawn every 2^(r+1) samples (row r at the samples
 * whose index has exactly r trailing zero bits) and one extra source is redrawn
 * every sample. The power spectral density falls by about 3 dB per octave
 * (10 dB per decade) with a small ripple about that line. Samples are scaled by
 * 1/√(R + 1), so the standard deviation is σ.
 *
 * Source: M. Gardner, "White and brown music, fractal curves and one-over-f
 * fluctuations", Scientific American 238(4), 1978 (Voss's dice algorithm);
 * J. McCartney's trailing-zeros schedule (music-dsp mailing list, 1999), as
 * described by P. Burk, "Generation of pink noise" (common practice).
 * Random numbers as in {@link whiteNoise}.
 *
 * @param length Number of samples, ≥ 1.
 * @param options Seed, standard deviation, number of rows.
 * @returns `length` samples.
 * @throws {RangeError} When length < 1, the seed is invalid, σ ≤ 0 or rows is outside 1 … 30.
 * @example
 * ```ts
 * import { pinkNoise } from "./noise.ts";
 * const x = pinkNoise(4096, { seed: 3 });
 * const rms = Math.sqrt(x.reduce((s, v) => s + v * v, 0) / x.length);
 * if (Math.abs(rms - 1) > 0.2) throw new Error("about unit RMS");
 * ```
 */
export function pinkNoise(length: number, options: PinkNoiseOptions = {}): Float64Array {
  requireInteger("Length", length, 1);
  const seed = options.seed ?? 1;
  checkSeed(seed);
  const sigma = options.standardDeviation ?? 1;
  requirePositive("Standard deviation", sigma);
  const rows = options.rows ?? 16;
  requireInteger("Number of rows", rows, 1, 30);
  const rng = new Xoshiro128(seed);
  const value = new Float64Array(rows);
  let sum = 0;
  for (let r = 0; r < rows; r++) {
    value[r] = rng.gaussian();
    sum += value[r]!;
  }
  const scale = sigma / Math.sqrt(rows + 1);
  const x = new Float64Array(length);
  for (let n = 0; n < length; n++) {
    if (n > 0) {
      // Row to redraw: the number of trailing zero bits of n (rows ≥ R are never redrawn).
      const r = 31 - Math.clz32(n & -n);
      if (r < rows) {
        sum -= value[r]!;
        value[r] = rng.gaussian();
        sum += value[r]!;
      }
    }
    x[n] = scale * (sum + rng.gaussian());
  }
  return x;
}
