import type { Rounding } from "../fixed/quantise.ts";
import { type FilterDesign, requireDesign } from "../verify/filter_design.ts";
import { designGroups, type ExportFormat, resolveFormat } from "./_formats.ts";

/** Options for {@link coefficientsCsv}. */
export interface CsvOptions {
  /**
   * Integer formats to add as columns of codes ("float" and "double" add
   * nothing: the `value` column always holds the exact double).
   * @default []
   */
  formats?: ExportFormat[];
  /** Rounding of the integer columns. @default "nearest" */
  rounding?: Rounding;
}

/**
 * Coefficients as CSV (RFC 4180, comma separated, LF line endings, header row):
 * - FIR: `index,value[,<format>…]`, one row per tap;
 * - sections: `section,coefficient,value[,…]`, five rows per section (b0 b1 b2 a1 a2, sections counted from 1);
 * - rational: `polynomial,index,value[,…]` with polynomial "numerator" or "denominator".
 * Values are written in the shortest form that reads back to the same double;
 * integer columns hold codes (value = code / 2^n, n from the format).
 *
 * Source: RFC 4180, Common Format and MIME Type for CSV Files (2005).
 *
 * @param design The filter.
 * @param options Integer formats to add.
 * @returns The CSV text, ending with a newline.
 * @throws {TypeError} When a format is unknown.
 * @example
 * ```ts
 * import { coefficientsCsv } from "./csv.ts";
 * const csv = coefficientsCsv({ kind: "fir", taps: [0.25, 0.5] }, { formats: ["q15"] });
 * if (csv !== "index,value,q15\n0,0.25,8192\n1,0.5,16384\n") throw new Error(csv);
 * ```
 */
export function coefficientsCsv(design: FilterDesign, options: CsvOptions = {}): string {
  requireDesign(design);
  const rounding = options.rounding ?? "nearest";
  const formats = (options.formats ?? [])
    .map((f) => resolveFormat(design, f, rounding))
    .filter((f) => f.integer !== undefined);
  const groups = designGroups(design);
  const extra = formats.map((f) => f.suffix);
  const lines: string[] = [];
  const codes = (g: number, i: number): string[] =>
    formats.map((f) => String(f.integer!.codes[g]![i]));
  const names = ["b0", "b1", "b2", "a1", "a2"];
  switch (design.kind) {
    case "fir":
      lines.push(["index", "value", ...extra].join(","));
      groups[0]!.forEach((v, i) => lines.push([String(i), String(v), ...codes(0, i)].join(",")));
      break;
    case "sections":
      lines.push(["section", "coefficient", "value", ...extra].join(","));
      groups.forEach((row, g) =>
        row.forEach((v, i) =>
          lines.push([String(g + 1), names[i]!, String(v), ...codes(g, i)].join(","))
        )
      );
      break;
    case "rational":
      lines.push(["polynomial", "index", "value", ...extra].join(","));
      ["numerator", "denominator"].forEach((part, g) =>
        groups[g]!.forEach((v, i) =>
          lines.push([part, String(i), String(v), ...codes(g, i)].join(","))
        )
      );
      break;
  }
  return lines.join("\n") + "\n";
}
