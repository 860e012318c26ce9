import { requireSampleRate, show } from "../_validate.ts";
import type { Rounding } from "../fixed/quantise.ts";
import type { FilterDesign } from "../verify/filter_design.ts";
import { requireDesign } from "../verify/filter_design.ts";
import { type ExportFormat, type ResolvedFormat, resolveFormat } from "./_formats.ts";
import { designGroups } from "./_formats.ts";
import { coefficientDigest, DIGEST_RULE } from "./digest.ts";

/** What every export names besides the coefficients. */
export interface ExportInfo {
  /** Base name: a C identifier (letters, digits, underscore; not starting with a digit), ≤ 48 characters. */
  name: string;
  /** Sample rate in Hz. */
  fs: number;
  /** Title line, e.g. "ECG front-end lowpass". @default name */
  title?: string;
  /** Design document id, e.g. "NV-ECG2-FLT-007". */
  document?: string;
  /** Document revision, e.g. "B". */
  revision?: string;
}

/** Options for {@link cHeader}. */
export interface CHeaderOptions extends ExportInfo {
  /**
   * Arrays to emit, in order: "float", "double", "q15", "q31", a Q format
   * `{ wordLength, fractionBits }`, or a quantised design (its codes exactly as verified).
   * @default ["float", "q15"]
   */
  formats?: ExportFormat[];
  /** Rounding used to make the integer arrays of "q15", "q31" and Q formats. @default "nearest" */
  rounding?: Rounding;
}

const identifier = /^[A-Za-z_][A-Za-z0-9_]*$/;

/** Throw unless `name` can serve as a C identifier prefix. */
function requireIdentifier(name: string): void {
  if (typeof name !== "string" || !identifier.test(name) || name.length > 48) {
    throw new TypeError(
      `Export name must be a C identifier of at most 48 letters, digits or underscores, not starting with a digit, got ${
        JSON.stringify(name)
      }`,
    );
  }
}

/** Make user text safe inside a C block comment: no comment delimiters, trigraphs or control characters. */
function commentText(text: string): string {
  const printable = Array.from(text, (c) => {
    const code = c.codePointAt(0) ?? 32;
    return code < 32 || code === 127 ? " " : c;
  }).join("");
  return printable
    .replace(/\*\//g, "* /")
    .replace(/\/\*/g, "/ *")
    .replace(/\?\?/g, "? ?");
}

function floatLiteral(v: number, digits: number, suffix: string): string {
  if (Math.abs(v) > 3.4e38 && suffix === "f") {
    throw new RangeError(`Coefficient ${show(v)} is beyond the range of float`);
  }
  let s = v.toPrecision(digits);
  if (!/[.e]/.test(s)) s += ".0";
  return s + suffix;
}

function intLiteral(code: number, wordLength: number): string {
  if (wordLength > 16 && code === -2147483648) return "(-2147483647 - 1)";
  return String(code);
}

function cType(wordLength: number): string {
  return wordLength <= 8 ? "int8_t" : wordLength <= 16 ? "int16_t" : "int32_t";
}

/** Lay out values `perLine` to a line, indented, comma separated. */
function rows(values: string[], perLine: number, indent: string): string {
  const lines: string[] = [];
  for (let i = 0; i < values.length; i += perLine) {
    lines.push(indent + values.slice(i, i + perLine).join(", "));
  }
  return lines.join(",\n");
}

/**
 * A C99 header holding a design's coefficients as `static const` arrays in
 * floating point and in integer Q formats, with a comment block naming the
 * formats, the sample rate, the design document and revision, and the
 * SHA-256 of the coefficients (see {@link coefficientDigest}; computed here in
 * TypeScript). It compiles cleanly with `gcc -std=c99 -Wall -Wextra -Werror`,
 * both included from a C file and compiled on its own (the arrays are marked
 * unused for GCC and Clang).
 *
 * Layout: FIR taps `<name>_taps_<format>[N]`; sections
 * `<name>_sections_<format>[K][5]`, each row b0, b1, b2, a1, a2 (a0 = 1);
 * rational `<name>_numerator_<format>[]` and `<name>_denominator_<format>[]`.
 * Each integer format gets `<NAME>_<FORMAT>_FRACTION_BITS` (value = code / 2^n),
 * or a per-section array `<name>_sections_<format>_fraction_bits[K]` when the
 * sections were quantised with their own formats.
 *
 * Source: ISO/IEC 9899:1999 (C99) §7.18 exact-width integer types; Q-format
 * conventions are common practice.
 *
 * @param design The filter.
 * @param options Name, sample rate, document identity, formats, rounding.
 * @returns The header text (LF line endings, ends with a newline).
 * @throws {TypeError} When the name is not a C identifier or a format is unknown.
 * @throws {RangeError} When two formats would give the same array name, or fs ≤ 0.
 * @example
 * ```ts
 * import { cHeader } from "./c_header.ts";
 * const h = cHeader({ kind: "fir", taps: [0.25, 0.5, 0.25] }, { name: "smooth3", fs: 1000, formats: ["q15"] });
 * if (!h.includes("static const int16_t smooth3_taps_q15[3]") || !h.includes("8192, 16384, 8192")) {
 *   throw new Error("Q15 codes");
 * }
 * ```
 */
export function cHeader(design: FilterDesign, options: CHeaderOptions): string {
  requireDesign(design);
  requireIdentifier(options.name);
  requireSampleRate(options.fs);
  const rounding = options.rounding ?? "nearest";
  const formats = (options.formats ?? ["float", "q15"]).map((f) =>
    resolveFormat(design, f, rounding)
  );
  const seen = new Set<string>();
  for (const f of formats) {
    if (seen.has(f.suffix)) {
      throw new RangeError(`Export formats must differ, got "${f.suffix}" twice`);
    }
    seen.add(f.suffix);
  }
  const name = options.name;
  const upper = name.toUpperCase();
  const digest = coefficientDigest(design);
  const groups = designGroups(design);
  const structure = design.kind === "fir"
    ? `FIR, ${groups[0]!.length} taps: y[n] = sum over k of h[k] x[n-k]`
    : design.kind === "sections"
    ? `${groups.length} second-order sections in cascade, rows b0 b1 b2 a1 a2 (a0 = 1);\n *                  transposed direct form II: y = b0 x + s1; s1 = b1 x - a1 y + s2; s2 = b2 x - a2 y`
    : `rational B(z)/A(z) in powers of z^-1, ${groups[0]!.length} numerator and ${
      groups[1]!.length
    } denominator coefficients`;
  const out: string[] = [];
  out.push("/*");
  out.push(` * ${commentText(options.title ?? name)}`);
  out.push(" *");
  out.push(" * Filter coefficients written by tapsheet. Do not edit by hand: change the");
  out.push(" * worksheet and run it again.");
  out.push(" *");
  if (options.document !== undefined) {
    out.push(` * Design document: ${commentText(options.document)}`);
  }
  if (options.revision !== undefined) {
    out.push(` * Revision:        ${commentText(options.revision)}`);
  }
  out.push(` * Sample rate:     ${show(options.fs)} Hz`);
  out.push(` * Structure:       ${structure}`);
  out.push(" * Formats:");
  for (const f of formats) {
    const detail = f.integer === undefined
      ? ""
      : `: value = code / 2^n, n = ${
        [...new Set(f.integer.fractionBits)].join(" or ")
      }; ${f.integer.saturated} coefficient(s) saturated`;
    out.push(` *   ${f.suffix}: ${f.label}${detail}`);
  }
  out.push(` * Coefficient SHA-256: ${digest}`);
  out.push(` *   (${DIGEST_RULE})`);
  out.push(" */");
  out.push(`#ifndef ${upper}_H`);
  out.push(`#define ${upper}_H`);
  out.push("");
  if (formats.some((f) => f.integer !== undefined)) {
    out.push("#include <stdint.h>");
    out.push("");
  }
  out.push("#if defined(__GNUC__) || defined(__clang__)");
  out.push(`#define ${upper}_UNUSED __attribute__((unused))`);
  out.push("#else");
  out.push(`#define ${upper}_UNUSED`);
  out.push("#endif");
  out.push("");
  const rate = String(options.fs);
  out.push(`#define ${upper}_SAMPLE_RATE_HZ ${/[.e]/.test(rate) ? rate : `${rate}.0`}`);
  if (design.kind === "fir") out.push(`#define ${upper}_TAP_COUNT ${groups[0]!.length}`);
  if (design.kind === "sections") out.push(`#define ${upper}_SECTION_COUNT ${groups.length}`);
  if (design.kind === "rational") {
    out.push(`#define ${upper}_NUMERATOR_COUNT ${groups[0]!.length}`);
    out.push(`#define ${upper}_DENOMINATOR_COUNT ${groups[1]!.length}`);
  }
  for (const f of formats) {
    out.push("");
    out.push(...arrays(design.kind, name, upper, f, groups));
  }
  out.push("");
  out.push(`#endif /* ${upper}_H */`);
  return out.join("\n") + "\n";
}

function arrays(
  kind: FilterDesign["kind"],
  name: string,
  upper: string,
  f: ResolvedFormat,
  groups: number[][],
): string[] {
  const out: string[] = [];
  const unused = `${upper}_UNUSED`;
  const literal = (g: number, i: number): string => {
    if (f.integer === undefined) {
      const v = groups[g]![i]!;
      return f.suffix === "float" ? floatLiteral(v, 9, "f") : floatLiteral(v, 17, "");
    }
    return intLiteral(f.integer.codes[g]![i]!, f.integer.wordLength);
  };
  const type = f.integer === undefined ? f.suffix : cType(f.integer.wordLength);
  const bits = f.integer?.fractionBits ?? [];
  const uniform = bits.every((b) => b === bits[0]);
  if (f.integer !== undefined && uniform) {
    out.push(`#define ${upper}_${f.suffix.toUpperCase()}_FRACTION_BITS ${bits[0]}`);
  }
  const line = (g: number) => groups[g]!.map((_, i) => literal(g, i));
  switch (kind) {
    case "fir": {
      const n = groups[0]!.length;
      out.push(`static const ${type} ${name}_taps_${f.suffix}[${n}] ${unused} = {`);
      out.push(rows(line(0), f.integer === undefined ? 4 : 8, "    "));
      out.push("};");
      break;
    }
    case "sections": {
      if (f.integer !== undefined && !uniform) {
        out.push(
          `static const int ${name}_sections_${f.suffix}_fraction_bits[${groups.length}] ${unused} = {`,
        );
        out.push(rows(bits.map(String), 16, "    "));
        out.push("};");
      }
      out.push(
        `static const ${type} ${name}_sections_${f.suffix}[${groups.length}][5] ${unused} = {`,
      );
      out.push(groups.map((_, g) => `    { ${line(g).join(", ")} }`).join(",\n"));
      out.push("};");
      break;
    }
    case "rational": {
      ["numerator", "denominator"].forEach((part, g) => {
        if (f.integer !== undefined && !uniform) {
          out.push(
            `#define ${upper}_${f.suffix.toUpperCase()}_${part.toUpperCase()}_FRACTION_BITS ${
              bits[g]
            }`,
          );
        }
        out.push(
          `static const ${type} ${name}_${part}_${f.suffix}[${groups[g]!.length}] ${unused} = {`,
        );
        out.push(rows(line(g), f.integer === undefined ? 4 : 8, "    "));
        out.push("};");
      });
      break;
    }
  }
  return out;
}
