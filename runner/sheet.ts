/**
 * The sheet API: what a worksheet calls to put things in its report.
 *
 * A worksheet imports it as `import { sheet } from "tapsheet/sheet";`. Every
 * call records an exhibit that appears in the report right after the block
 * that made it. The API only produces data; it cannot write files.
 *
 * @module
 */
import type { DesignWarning, MaskSegment } from "../lib/types.ts";
import type { RequirementResult } from "../lib/verify/requirement.ts";
import {
  type Exhibit,
  type FigureKind,
  figureKinds,
  isExportName,
  type ParamValue,
} from "../record/types.ts";

export type { DesignWarning, MaskSegment } from "../lib/types.ts";
export type { RequirementResult } from "../lib/verify/requirement.ts";
export type { Exhibit, FigureKind, ParamValue } from "../record/types.ts";

/** A figure as a worksheet describes it. */
export interface FigureSpec {
  /** What the figure shows; sets axis labels, marks and styling. */
  kind: FigureKind;
  /** Title printed above the figure. */
  title: string;
  /** Named (x, y) series; x in Hz for frequency figures, samples or s for time figures. */
  series: { name: string; x: ArrayLike<number>; y: ArrayLike<number> }[];
  /** Requirement limits drawn as shaded forbidden regions. */
  mask?: MaskSegment[];
  /** Axis titles. @default chosen by kind, e.g. "Frequency (Hz)" */
  xLabel?: string;
  /** Y axis title. @default chosen by kind, e.g. "Magnitude (dB)" */
  yLabel?: string;
  /** Frequency axis scale. @default "linear" */
  xScale?: "linear" | "log";
  /**
   * Show the frequency axis as f / fs (cycles per sample) instead of Hz: give
   * the sample rate here. Series and mask stay in Hz. @default Hz
   */
  normaliseTo?: number;
  /** Fixed y range. @default fitted to the data */
  yDomain?: [number, number];
}

/** Where exhibits go: the harness sends each one to the parent process. */
export type Sink = (exhibit: Exhibit) => void;

let sink: Sink = () => {
  throw new Error("The sheet API is only available while the runner executes a worksheet");
};
let parameters: Readonly<Record<string, ParamValue>> = Object.freeze({});

/** Connect the API to the runner (called by the harness, not by worksheets). */
export function connectSheet(to: Sink, params: Record<string, ParamValue>): void {
  sink = to;
  parameters = Object.freeze({ ...params });
}

function toNumbers(values: ArrayLike<number>, what: string): number[] {
  if (values === null || typeof values !== "object" || typeof values.length !== "number") {
    throw new TypeError(`${what} must be an array of numbers`);
  }
  return Array.from(values, (v) => Number(v));
}

function positive(value: number): number {
  if (!(typeof value === "number" && value > 0 && Number.isFinite(value))) {
    throw new RangeError(`normaliseTo must be a sample rate above 0 Hz, got ${value}`);
  }
  return value;
}

function param(name: string): ParamValue {
  const value = parameters[name];
  if (value === undefined) {
    const known = Object.keys(parameters).join(", ") || "none";
    throw new RangeError(
      `Parameter '${name}' is not declared in front matter (declared: ${known})`,
    );
  }
  return value;
}

function typed<T>(name: string, value: ParamValue, ok: boolean, expected: string): T {
  if (!ok) {
    throw new TypeError(`Parameter '${name}' must be ${expected}, got ${JSON.stringify(value)}`);
  }
  return value as T;
}

/** The API object worksheets use. */
export const sheet = {
  /** All parameters after command-line overrides. */
  get params(): Readonly<Record<string, ParamValue>> {
    return parameters;
  },
  /** A number parameter. @throws {RangeError|TypeError} when missing or not a number. */
  number(name: string): number {
    const v = param(name);
    return typed<number>(name, v, typeof v === "number", "a number");
  },
  /** A text parameter. */
  text(name: string): string {
    const v = param(name);
    return typed<string>(name, v, typeof v === "string", "text");
  },
  /** A true/false parameter. */
  flag(name: string): boolean {
    const v = param(name);
    return typed<boolean>(name, v, typeof v === "boolean", "true or false");
  },
  /** A list-of-numbers parameter. */
  numbers(name: string): number[] {
    const v = param(name);
    return typed<number[]>(name, v, Array.isArray(v), "a list of numbers").slice();
  },
  /** Show a figure. */
  figure(spec: FigureSpec): void {
    if (typeof spec?.title !== "string" || !Array.isArray(spec.series)) {
      throw new TypeError("sheet.figure needs { kind, title, series: [{ name, x, y }] }");
    }
    if (!figureKinds.includes(spec.kind)) {
      throw new TypeError(
        `Figure kind must be one of ${figureKinds.join(", ")}, got '${String(spec.kind)}'`,
      );
    }
    sink({
      type: "figure",
      kind: spec.kind,
      title: spec.title,
      series: spec.series.map((s, i) => {
        const x = toNumbers(s.x, `Figure series ${i} x`);
        const y = toNumbers(s.y, `Figure series ${i} y`);
        if (x.length !== y.length) {
          throw new RangeError(
            `Figure series '${s.name}' needs as many x as y values, got ${x.length} and ${y.length}`,
          );
        }
        return { name: String(s.name), x, y };
      }),
      ...(spec.mask ? { mask: spec.mask.map((m) => ({ ...m })) } : {}),
      ...(spec.xLabel ? { xLabel: spec.xLabel } : {}),
      ...(spec.yLabel ? { yLabel: spec.yLabel } : {}),
      ...(spec.xScale ? { xScale: spec.xScale } : {}),
      ...(spec.normaliseTo !== undefined ? { normaliseTo: positive(spec.normaliseTo) } : {}),
      ...(spec.yDomain ? { yDomain: [spec.yDomain[0], spec.yDomain[1]] } : {}),
    });
  },
  /** Show a table. */
  table(title: string, columns: string[], rows: (string | number)[][]): void {
    rows.forEach((row, i) => {
      if (!Array.isArray(row) || row.length !== columns.length) {
        throw new RangeError(
          `Table '${title}' has ${columns.length} columns, but row ${i + 1} has ${
            Array.isArray(row) ? row.length : "no"
          } cells`,
        );
      }
    });
    sink({
      type: "table",
      title: String(title),
      columns: columns.map(String),
      rows: rows.map((r) => r.map((c) => (typeof c === "number" ? c : String(c)))),
    });
  },
  /** Record a requirement check; it appears in the report's requirement table. */
  check(result: RequirementResult): void {
    if (typeof result?.met !== "boolean" || typeof result.name !== "string") {
      throw new TypeError("sheet.check needs a requirement result, e.g. from judge(...)");
    }
    sink({ type: "check", result: { ...result } });
  },
  /** Record a design choice and the reason for it. */
  choice(name: string, value: string | number, reason: string): void {
    sink({ type: "choice", name: String(name), value, reason: String(reason) });
  },
  /** List a set of coefficients in the report's coefficient section. */
  coefficients(name: string, values: ArrayLike<number>, description?: string): void {
    sink({
      type: "coefficients",
      name: String(name),
      values: toNumbers(values, "Coefficients"),
      ...(description === undefined ? {} : { description: String(description) }),
    });
  },
  /** Hand over a file (C header, CSV…); the runner writes it beside the report. */
  exportFile(fileName: string, content: string, description?: string): void {
    if (!isExportName(fileName)) {
      throw new RangeError(
        `Export file names may hold only letters, digits, '.', '_' and '-', got '${fileName}'`,
      );
    }
    sink({
      type: "export",
      fileName,
      content: String(content),
      ...(description === undefined ? {} : { description: String(description) }),
    });
  },
  /** Show a warning in the report. */
  warn(warning: DesignWarning | string): void {
    sink({
      type: "warning",
      warning: typeof warning === "string"
        ? { code: "worksheet", message: warning }
        : { code: String(warning.code), message: String(warning.message) },
    });
  },
};
