import { requireFinite, requireSamples } from "../_validate.ts";
import { formatRange, type QFormat, requireQFormat } from "./q_format.ts";
import { requireRounding, roundToCode } from "./_rounding.ts";

/**
 * How a value between two codes is rounded:
 * - "nearest": to the nearest code, ties away from zero;
 * - "floor": toward −∞ (truncation of a two's-complement word);
 * - "convergent": to the nearest code, ties to the even code.
 */
export type Rounding = "nearest" | "floor" | "convergent";

/**
 * Quantise one value to a Q format: code = round(v·2^n), saturated to
 * [−2^(W−1), 2^(W−1) − 1].
 *
 * Source: common practice; see R. G. Lyons, Understanding Digital Signal
 * Processing, 3rd ed., §12.1 (fixed-point binary formats).
 *
 * @param value Real value (finite).
 * @param format Target format.
 * @param rounding Rounding mode. @default "nearest"
 * @returns The integer code, its value code·2^−n, and whether it saturated.
 * @throws {RangeError} When the format is invalid.
 * @example
 * ```ts
 * import { quantiseValue } from "./quantise.ts";
 * const q15 = { wordLength: 16, fractionBits: 15 };
 * if (quantiseValue(0.5, q15).code !== 16384) throw new Error("0.5 → 16384");
 * const s = quantiseValue(1, q15);
 * if (!s.saturated || s.code !== 32767) throw new Error("1 saturates to 32767");
 * ```
 */
export function quantiseValue(
  value: number,
  /** The Q format of the codes. */
  format: QFormat,
  /** Rounding used. */
  rounding: Rounding = "nearest",
): { code: number; value: number; saturated: boolean } {
  requireFinite("Value", value);
  requireQFormat(format);
  requireRounding(rounding);
  const { minCode, maxCode, step } = formatRange(format);
  let code = roundToCode(value * 2 ** format.fractionBits, rounding);
  let saturated = false;
  if (code > maxCode) {
    code = maxCode;
    saturated = true;
  } else if (code < minCode) {
    code = minCode;
    saturated = true;
  }
  return { code, value: code * step, saturated };
}

/** Values quantised to one Q format. */
export interface QuantisedValues {
  /** The Q format of the codes. */
  format: QFormat;
  /** Rounding used. */
  rounding: Rounding;
  /** Integer codes, one per value. */
  codes: Int32Array;
  /** code·2^−n, one per value. */
  values: Float64Array;
  /** How many values saturated. */
  saturated: number;
  /** Largest |quantised − original|. */
  maxError: number;
}

/**
 * Quantise an array of values to one Q format (see {@link quantiseValue}).
 *
 * @param values Real values (finite).
 * @param format Target format.
 * @param rounding Rounding mode. @default "nearest"
 * @returns Codes, values, saturation count and largest error.
 * @throws {TypeError} When a value is not finite.
 * @example
 * ```ts
 * import { quantiseValues } from "./quantise.ts";
 * const q = quantiseValues([0.1, -0.1], { wordLength: 8, fractionBits: 7 }, "floor");
 * // 0.1·128 = 12.8 → 12; −12.8 → −13 toward −∞.
 * if (q.codes.join() !== "12,-13") throw new Error("12, −13");
 * ```
 */
export function quantiseValues(
  values: ArrayLike<number>,
  /** The Q format of the codes. */
  format: QFormat,
  /** Rounding used. */
  rounding: Rounding = "nearest",
): QuantisedValues {
  requireSamples("Values", values, 0);
  requireQFormat(format);
  requireRounding(rounding);
  const n = values.length;
  const out: QuantisedValues = {
    format: { wordLength: format.wordLength, fractionBits: format.fractionBits },
    rounding,
    codes: new Int32Array(n),
    values: new Float64Array(n),
    saturated: 0,
    maxError: 0,
  };
  for (let i = 0; i < n; i++) {
    const v = values[i] as number;
    const q = quantiseValue(v, format, rounding);
    out.codes[i] = q.code;
    out.values[i] = q.value;
    if (q.saturated) out.saturated++;
    out.maxError = Math.max(out.maxError, Math.abs(q.value - v));
  }
  return out;
}
