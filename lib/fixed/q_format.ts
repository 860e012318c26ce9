import { requireInteger, requireSamples, show } from "../_validate.ts";

/**
 * A two's-complement fixed-point format: a word of `wordLength` bits of which
 * `fractionBits` lie right of the binary point. A code k stands for k·2^−n.
 * Written Qm.n with m = wordLength − 1 − n integer bits besides the sign.
 */
export interface QFormat {
  /** Bits in the word, sign included, 2 … 32. */
  wordLength: number;
  /** Bits right of the binary point, 0 … 64 (more than wordLength − 1 for small coefficients). */
  fractionBits: number;
}

/** Largest fraction-bit count a format may have. */
export const MAX_FRACTION_BITS = 64;

/**
 * Make a validated Q format.
 *
 * @param wordLength Bits in the word, sign included, integer 2 … 32.
 * @param fractionBits Bits right of the binary point, integer 0 … 64. @default wordLength − 1 (pure fraction, e.g. Q15)
 * @returns The format.
 * @throws {RangeError} When the word length or fraction bits are out of range or not integers.
 * @example
 * ```ts
 * import { qFormat } from "./q_format.ts";
 * const q15 = qFormat(16);
 * if (q15.fractionBits !== 15) throw new Error("Q15 is a 16-bit word with 15 fraction bits");
 * ```
 */
export function qFormat(wordLength: number, fractionBits: number = wordLength - 1): QFormat {
  requireInteger("Word length", wordLength, 2, 32);
  requireInteger("Fraction bits", fractionBits, 0, MAX_FRACTION_BITS);
  return { wordLength, fractionBits };
}

/**
 * Throw unless `format` is a valid QFormat (word length 2 … 32, fraction bits 0 … 64).
 *
 * @param format The format to check.
 * @throws {TypeError} When it is not an object.
 * @throws {RangeError} When a field is out of range.
 * @example
 * ```ts
 * import { requireQFormat } from "./q_format.ts";
 * let threw = false;
 * try { requireQFormat({ wordLength: 33, fractionBits: 15 }); } catch { threw = true; }
 * if (!threw) throw new Error("33 bits is too long");
 * ```
 */
export function requireQFormat(format: QFormat): void {
  if (format === null || typeof format !== "object") {
    throw new TypeError(`Q format must be { wordLength, fractionBits }, got ${String(format)}`);
  }
  qFormat(format.wordLength, format.fractionBits);
}

/**
 * The range of a Q format: codes −2^(W−1) … 2^(W−1) − 1, values code·2^−n.
 *
 * @param format The format.
 * @returns Smallest and largest value, the step 2^−n, and the code limits.
 * @throws {RangeError} When the format is invalid.
 * @example
 * ```ts
 * import { formatRange, qFormat } from "./q_format.ts";
 * const r = formatRange(qFormat(16, 15));
 * if (r.min !== -1 || r.max !== 1 - 2 ** -15 || r.step !== 2 ** -15) throw new Error("Q15 range");
 * ```
 */
export function formatRange(
  format: QFormat,
): { min: number; max: number; step: number; minCode: number; maxCode: number } {
  requireQFormat(format);
  const step = 2 ** -format.fractionBits;
  const maxCode = 2 ** (format.wordLength - 1) - 1;
  const minCode = -(2 ** (format.wordLength - 1));
  return { min: minCode * step, max: maxCode * step, step, minCode, maxCode };
}

/**
 * The conventional name Qm.n of a format, m = W − 1 − n (negative for
 * formats with more fraction bits than the word holds), e.g. "Q0.15", "Q1.14".
 *
 * @param format The format.
 * @returns The name.
 * @example
 * ```ts
 * import { formatName } from "./q_format.ts";
 * if (formatName({ wordLength: 16, fractionBits: 14 }) !== "Q1.14") throw new Error("Q1.14");
 * ```
 */
export function formatName(format: QFormat): string {
  requireQFormat(format);
  return `Q${format.wordLength - 1 - format.fractionBits}.${format.fractionBits}`;
}

/**
 * The format of a given word length with the most fraction bits that still
 * holds every value without saturating under round-to-nearest: the largest
 * n ≤ 64 with −2^(W−1) ≤ round(v·2^n) ≤ 2^(W−1) − 1 for all v.
 *
 * @param values Values to hold (finite; all zero gives n = W − 1).
 * @param wordLength Bits in the word, 2 … 32.
 * @returns The format.
 * @throws {RangeError} When the values need more than W integer bits (n would be negative).
 * @example
 * ```ts
 * import { formatForRange } from "./q_format.ts";
 * // Biquad feedback coefficients up to |1.9| need one integer bit: Q1.14 in 16 bits.
 * if (formatForRange([1.9, -0.95, 0.2], 16).fractionBits !== 14) throw new Error("Q1.14");
 * ```
 */
export function formatForRange(values: ArrayLike<number>, wordLength: number): QFormat {
  requireSamples("Values", values);
  requireInteger("Word length", wordLength, 2, 32);
  const maxCode = 2 ** (wordLength - 1) - 1;
  const minCode = -(2 ** (wordLength - 1));
  let peak = 0;
  for (let i = 0; i < values.length; i++) peak = Math.max(peak, Math.abs(values[i] as number));
  if (peak === 0) return { wordLength, fractionBits: wordLength - 1 };
  for (let n = MAX_FRACTION_BITS; n >= 0; n--) {
    const scale = 2 ** n;
    let fits = true;
    for (let i = 0; i < values.length && fits; i++) {
      const v = (values[i] as number) * scale;
      const k = Math.sign(v) * Math.floor(Math.abs(v) + 0.5);
      fits = k <= maxCode && k >= minCode;
    }
    if (fits) return { wordLength, fractionBits: n };
  }
  throw new RangeError(
    `Values up to ${show(peak)} do not fit a ${wordLength}-bit word even with 0 fraction bits`,
  );
}
