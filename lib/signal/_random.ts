// Private: a seeded pseudo-random generator whose output depends only on
// IEEE-754 basic arithmetic and 32-bit integer operations, so the same seed
// gives the same samples on every machine and JavaScript engine.
//
// Generator: xoshiro128** 1.1 (D. Blackman and S. Vigna, "Scrambled linear
// pseudorandom number generators", ACM Trans. Math. Softw. 47(4), 2021;
// reference C code at https://prng.di.unimi.it/xoshiro128starstar.c), its
// 128-bit state filled from the seed by SplitMix64 (G. Steele, D. Lea and
// C. Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014;
// https://prng.di.unimi.it/splitmix64.c), as the xoshiro authors recommend.

const mask64 = (1n << 64n) - 1n;

/** SplitMix64 outputs for a seed, as 32-bit words (high word first per output). */
function splitMixWords(seed: number, count: number): number[] {
  let x = BigInt(seed) & mask64;
  const words: number[] = [];
  while (words.length < count) {
    x = (x + 0x9e3779b97f4a7c15n) & mask64;
    let z = x;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & mask64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & mask64;
    z = z ^ (z >> 31n);
    words.push(Number(z >> 32n), Number(z & 0xffffffffn));
  }
  return words.slice(0, count);
}

/** xoshiro128** generator with helpers for uniform and Gaussian doubles. */
export class Xoshiro128 {
  #s0: number;
  #s1: number;
  #s2: number;
  #s3: number;
  #spare: number | undefined = undefined;

  /** Seed: an integer in [0, 2^53). */
  constructor(seed: number) {
    const [a, b, c, d] = splitMixWords(seed, 4) as [number, number, number, number];
    this.#s0 = a | 0;
    this.#s1 = b | 0;
    this.#s2 = c | 0;
    this.#s3 = d | 0;
  }

  /** Next 32-bit output as an unsigned integer. */
  nextUint32(): number {
    const s1 = this.#s1;
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    this.#s2 ^= this.#s0;
    this.#s3 ^= this.#s1;
    this.#s1 ^= this.#s2;
    this.#s0 ^= this.#s3;
    this.#s2 ^= t;
    this.#s3 = rotl(this.#s3, 11);
    return result;
  }

  /** Uniform double in [0, 1) with 53 random bits: (a >> 5)·2^26 + (b >> 6), over 2^53. */
  uniform(): number {
    const a = this.nextUint32() >>> 5;
    const b = this.nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  }

  /**
   * Standard normal deviate by Marsaglia's polar method (G. Marsaglia and
   * T. A. Bray, "A convenient method for generating normal variables", SIAM
   * Review 6(3), 1964): u, v uniform in (−1, 1), s = u² + v² accepted in (0, 1),
   * then u·√(−2 ln s / s) and v·√(−2 ln s / s) are two independent deviates.
   * ln is computed here with basic arithmetic only, so results are bit-exact everywhere.
   */
  gaussian(): number {
    if (this.#spare !== undefined) {
      const g = this.#spare;
      this.#spare = undefined;
      return g;
    }
    for (;;) {
      const u = 2 * this.uniform() - 1;
      const v = 2 * this.uniform() - 1;
      const s = u * u + v * v;
      if (s > 0 && s < 1) {
        const factor = Math.sqrt((-2 * portableLog(s)) / s);
        this.#spare = v * factor;
        return u * factor;
      }
    }
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

const ln2 = 0.6931471805599453;

/**
 * Natural logarithm of x > 0 using only +, −, ×, ÷ (correctly rounded in
 * IEEE-754), so it gives the same bits on every machine: x = m·2^e with
 * m in [√½, √2), ln m = 2·atanh(t), t = (m − 1)/(m + 1), by its Taylor series
 * (|t| ≤ 0.172, 14 terms reach 1e-19). Accurate to about 1 ulp.
 */
export function portableLog(x: number): number {
  let m = x;
  let e = 0;
  while (m < Math.SQRT1_2) {
    m *= 2;
    e--;
  }
  while (m >= Math.SQRT2) {
    m /= 2;
    e++;
  }
  const t = (m - 1) / (m + 1);
  const t2 = t * t;
  let sum = 0;
  for (let k = 27; k >= 3; k -= 2) sum = (sum + 1 / k) * t2;
  return e * ln2 + 2 * t * (1 + sum);
}
