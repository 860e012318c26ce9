// Export formats: names, C types and integer codes of a design in each format.
import { formatName, type QFormat, qFormat, requireQFormat } from "../fixed/q_format.ts";
import type { Rounding } from "../fixed/quantise.ts";
import { quantiseValues } from "../fixed/quantise.ts";
import type { QuantisedDesign } from "../fixed/quantise_design.ts";
import type { FilterDesign } from "../verify/filter_design.ts";

/** Floating-point, Q15, Q31, any Qm.n, or a quantised design exactly as verified. */
export type ExportFormat = "float" | "double" | "q15" | "q31" | QFormat | QuantisedDesign;

/** A format resolved to codes grouped like the design (taps; sections; numerator, denominator). */
export interface ResolvedFormat {
  /** Label for comments, e.g. "Q15 (Q0.15, 16-bit)". */
  label: string;
  /** Suffix for identifiers and CSV columns, e.g. "q15", "q1_14", "float". */
  suffix: string;
  /** Undefined for floating-point formats. */
  integer?: {
    wordLength: number;
    /** Fraction bits per group (one for FIR, one per section, two for rational). */
    fractionBits: number[];
    /** Codes per group. */
    codes: Int32Array[];
    saturated: number;
  };
}

export function isQuantised(f: ExportFormat): f is QuantisedDesign {
  return typeof f === "object" && f !== null && "codes" in f && "formats" in f;
}

function groups(design: FilterDesign): number[][] {
  switch (design.kind) {
    case "fir":
      return [Array.from(design.taps)];
    case "sections":
      return design.sections.map((s) => [s.b0, s.b1, s.b2, s.a1, s.a2]);
    case "rational":
      return [Array.from(design.numerator), Array.from(design.denominator)];
  }
}

function qSuffix(format: QFormat): string {
  const m = format.wordLength - 1 - format.fractionBits;
  return `q${m < 0 ? `m${-m}` : m}_${format.fractionBits}`;
}

export function resolveFormat(
  design: FilterDesign,
  format: ExportFormat,
  rounding: Rounding,
): ResolvedFormat {
  if (format === "float") return { label: "float (IEEE-754 binary32)", suffix: "float" };
  if (format === "double") return { label: "double (IEEE-754 binary64)", suffix: "double" };
  if (isQuantised(format)) {
    const shape = groups(design).map((g) => g.length).join();
    const theirs = format.codes.map((c) => c.length).join();
    if (shape !== theirs) {
      throw new RangeError(
        `Quantised design must have the design's shape (${shape} coefficients per group), got ${theirs}`,
      );
    }
    const bits = format.formats.map((f) => f.fractionBits);
    const same = bits.every((b) => b === bits[0]);
    const w = format.wordLength;
    return {
      label: same
        ? `${formatName(format.formats[0] as QFormat)} (${w}-bit, as verified)`
        : `${w}-bit words, fraction bits per ${design.kind === "sections" ? "section" : "group"} ${
          bits.join(", ")
        } (as verified)`,
      suffix: same ? qSuffix(format.formats[0] as QFormat) : `w${w}`,
      integer: {
        wordLength: w,
        fractionBits: bits,
        codes: format.codes.map((c) => Int32Array.from(c)),
        saturated: format.saturated,
      },
    };
  }
  let q: QFormat;
  let label: string;
  let suffix: string;
  if (format === "q15") {
    q = qFormat(16, 15);
    label = "Q15 (Q0.15, 16-bit)";
    suffix = "q15";
  } else if (format === "q31") {
    q = qFormat(32, 31);
    label = "Q31 (Q0.31, 32-bit)";
    suffix = "q31";
  } else if (typeof format === "object" && format !== null) {
    requireQFormat(format);
    q = format;
    label = `${formatName(q)} (${q.wordLength}-bit, ${q.fractionBits} fraction bits)`;
    suffix = qSuffix(q);
  } else {
    throw new TypeError(
      `Export format must be "float", "double", "q15", "q31", a Q format or a quantised design, got ${
        String(format)
      }`,
    );
  }
  const codes: Int32Array[] = [];
  let saturated = 0;
  for (const g of groups(design)) {
    const r = quantiseValues(g, q, rounding);
    codes.push(r.codes);
    saturated += r.saturated;
  }
  return {
    label,
    suffix,
    integer: {
      wordLength: q.wordLength,
      fractionBits: codes.map(() => q.fractionBits),
      codes,
      saturated,
    },
  };
}

export function designGroups(design: FilterDesign): number[][] {
  return groups(design);
}
