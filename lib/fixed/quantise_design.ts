import { requireInteger } from "../_validate.ts";
import type { Section } from "../types.ts";
import { type FilterDesign, requireDesign } from "../verify/filter_design.ts";
import { formatForRange, type QFormat, qFormat } from "./q_format.ts";
import { quantiseValues, type Rounding } from "./quantise.ts";
import { requireRounding } from "./_rounding.ts";

/** Options for {@link quantiseDesign}. */
export interface QuantiseOptions {
  /** Rounding of each coefficient. @default "nearest" */
  rounding?: Rounding;
  /**
   * Fraction bits for every coefficient word. By default they are derived from
   * the coefficient range: one format for FIR taps, one per section (its five
   * coefficients share it), one each for a rational numerator and denominator.
   * @default derived
   */
  fractionBits?: number;
}

/** A design whose coefficients were quantised, with its codes and formats. */
export interface QuantisedDesign {
  /** The quantised design (coefficient values code·2^−n), to verify or run in floating point. */
  design: FilterDesign;
  /** Coefficient word length in bits. */
  wordLength: number;
  /** Rounding used for every coefficient. */
  rounding: Rounding;
  /**
   * Formats: `[taps]` for FIR, one per section for sections,
   * `[numerator, denominator]` for rational.
   */
  formats: QFormat[];
  /**
   * Integer codes, grouped like `formats`: FIR taps; per section
   * [b0, b1, b2, a1, a2]; numerator then denominator.
   */
  codes: Int32Array[];
  /** Number of coefficients that saturated (0 with derived formats). */
  saturated: number;
}

/**
 * Quantise every coefficient of a design to a word of `wordLength` bits, with
 * the fraction bits chosen or derived from the coefficient range. Sections get
 * per-section formats (per-section scaling of the coefficient words).
 *
 * Source: common practice; L. B. Jackson, Digital Filters and Signal
 * Processing, 3rd ed., §11.5 (coefficient quantisation).
 *
 * @param design FIR taps, sections or rational.
 * @param wordLength Coefficient word length in bits, 2 … 32.
 * @param options Rounding and optional fixed fraction bits (0 … 64).
 * @returns The quantised design.
 * @throws {RangeError} When the word length or fraction bits are out of range.
 * @example
 * ```ts
 * import { quantiseDesign } from "./quantise_design.ts";
 * const q = quantiseDesign({ kind: "fir", taps: [0.3, 0.4, 0.3] }, 8);
 * // Largest tap 0.4 allows 8 fraction bits in 8 bits: codes round(0.3·256) = 77, round(0.4·256) = 102.
 * if (q.formats[0]!.fractionBits !== 8 || q.codes[0]!.join() !== "77,102,77") throw new Error("Q-1.8");
 * ```
 */
export function quantiseDesign(
  design: FilterDesign,
  wordLength: number,
  options: QuantiseOptions = {},
): QuantisedDesign {
  requireDesign(design);
  requireInteger("Word length", wordLength, 2, 32);
  const rounding = options.rounding ?? "nearest";
  requireRounding(rounding);
  const formatFor = (values: ArrayLike<number>): QFormat =>
    options.fractionBits === undefined
      ? formatForRange(values, wordLength)
      : qFormat(wordLength, options.fractionBits);
  const formats: QFormat[] = [];
  const codes: Int32Array[] = [];
  let saturated = 0;
  const take = (values: ArrayLike<number>): Float64Array => {
    const format = formatFor(values);
    const q = quantiseValues(values, format, rounding);
    formats.push(format);
    codes.push(q.codes);
    saturated += q.saturated;
    return q.values;
  };
  let quantised: FilterDesign;
  switch (design.kind) {
    case "fir":
      quantised = { kind: "fir", taps: take(design.taps) };
      break;
    case "sections": {
      const sections: Section[] = design.sections.map((s) => {
        const [b0, b1, b2, a1, a2] = take([s.b0, s.b1, s.b2, s.a1, s.a2]) as unknown as number[];
        return { b0, b1, b2, a1, a2 } as Section;
      });
      quantised = { kind: "sections", sections };
      break;
    }
    case "rational":
      quantised = {
        kind: "rational",
        numerator: take(design.numerator),
        denominator: take(design.denominator),
      };
      break;
  }
  return { design: quantised, wordLength, rounding, formats, codes, saturated };
}
