import { requireSampleRate } from "../_validate.ts";
import type { Rounding } from "../fixed/quantise.ts";
import { type FilterDesign, requireDesign } from "../verify/filter_design.ts";
import { designGroups, type ExportFormat, resolveFormat } from "./_formats.ts";
import type { ExportInfo } from "./c_header.ts";
import { coefficientDigest, DIGEST_RULE } from "./digest.ts";

/** Options for {@link coefficientsJson}. */
export interface JsonOptions extends ExportInfo {
  /** Integer formats to add ("float" and "double" add nothing). @default [] */
  formats?: ExportFormat[];
  /** Rounding of the integer codes. @default "nearest" */
  rounding?: Rounding;
}

/**
 * Coefficients as a JSON document: identity (name, title, document, revision),
 * sample rate, structure, the coefficients as exact doubles, the SHA-256 of
 * the coefficients (see {@link coefficientDigest}) with the rule it follows,
 * and for each integer format its word length, fraction bits, saturation
 * count and codes in the same shape as the coefficients.
 *
 * Shapes: FIR `{ taps: [...] }`; sections `{ sections: [{ b0, b1, b2, a1, a2 }, ...] }`;
 * rational `{ numerator: [...], denominator: [...] }`.
 *
 * Source: RFC 8259, The JSON Data Interchange Format (2017).
 *
 * @param design The filter.
 * @param options Identity, sample rate and integer formats.
 * @returns JSON text (two-space indent, ends with a newline).
 * @throws {RangeError} When fs ≤ 0.
 * @example
 * ```ts
 * import { coefficientsJson } from "./json.ts";
 * const doc = JSON.parse(coefficientsJson({ kind: "fir", taps: [0.25, 0.5] }, { name: "f", fs: 1000, formats: ["q15"] }));
 * if (doc.coefficients.taps[1] !== 0.5 || doc.fixedPoint[0].codes.taps[0] !== 8192) throw new Error("json");
 * ```
 */
export function coefficientsJson(design: FilterDesign, options: JsonOptions): string {
  requireDesign(design);
  requireSampleRate(options.fs);
  if (typeof options.name !== "string" || options.name === "") {
    throw new TypeError(`Export name must be a non-empty string, got ${String(options.name)}`);
  }
  const rounding = options.rounding ?? "nearest";
  const groups = designGroups(design);
  const shape = <T>(g: (k: number) => T[]): Record<string, unknown> => {
    switch (design.kind) {
      case "fir":
        return { taps: g(0) };
      case "sections":
        return {
          sections: groups.map((_, k) => {
            const [b0, b1, b2, a1, a2] = g(k);
            return { b0, b1, b2, a1, a2 };
          }),
        };
      case "rational":
        return { numerator: g(0), denominator: g(1) };
    }
  };
  const fixedPoint = (options.formats ?? [])
    .map((f) => resolveFormat(design, f, rounding))
    .filter((f) => f.integer !== undefined)
    .map((f) => ({
      name: f.suffix,
      label: f.label,
      wordLength: f.integer!.wordLength,
      fractionBits: f.integer!.fractionBits,
      saturated: f.integer!.saturated,
      codes: shape((k) => Array.from(f.integer!.codes[k]!)),
    }));
  const doc = {
    name: options.name,
    title: options.title ?? options.name,
    document: options.document ?? null,
    revision: options.revision ?? null,
    sampleRateHz: options.fs,
    structure: design.kind,
    sha256: coefficientDigest(design),
    sha256Rule: DIGEST_RULE,
    coefficients: shape((k) => groups[k]!),
    fixedPoint,
  };
  return JSON.stringify(doc, null, 2) + "\n";
}
