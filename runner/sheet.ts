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
import type { RequirementResult, WorstCase } from "../lib/verify/requirement.ts";
import type { FilterSpec } from "../lib/verify/requirements.ts";
import { type ConvertedCheck, disagreement, inDeclaredUnit, specOf } from "./requirements.ts";
import {
  costNumberFields,
  type DeclaredRequirement,
  defaultDesign,
  type Exhibit,
  type FigureKind,
  figureKinds,
  type ImplementationCostFigures,
  isExportName,
  type ParamValue,
} from "../record/types.ts";

export type { DesignWarning, MaskSegment } from "../lib/types.ts";
export type { RequirementResult } from "../lib/verify/requirement.ts";
export type { DeclaredRequirement, Exhibit, FigureKind, ParamValue } from "../record/types.ts";
export type { FilterSpec } from "../lib/verify/requirements.ts";

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
let declared: readonly DeclaredRequirement[] = Object.freeze([]);
/** The sample rate of the last {@link sheet.spec}: converts samples to the declared unit. */
let specRate: number | undefined;
/** Requirement id and design of every check so far: each pair is checked once. */
const checked = new Set<string>();

/** Connect the API to the runner (called by the harness, not by worksheets). */
export function connectSheet(
  to: Sink,
  params: Record<string, ParamValue>,
  requirements: readonly DeclaredRequirement[] = [],
): void {
  sink = to;
  parameters = Object.freeze({ ...params });
  declared = Object.freeze(requirements.map((r) => Object.freeze({ ...r })));
  checked.clear();
  specRate = undefined;
}

/** Options of {@link sheet.coefficients} and {@link sheet.sections}. */
export interface CoefficientOptions {
  /** What the values are, for the reader. */
  description?: string;
  /** The integer codes the target holds, one per value (e.g. quantiseValues(...).codes). */
  codes?: ArrayLike<number>;
  /** The fixed-point format of the codes, e.g. "Q1.15". */
  format?: string;
}

function coefficientsExhibit(
  name: string,
  values: number[],
  layout: "list" | "sections",
  options: CoefficientOptions,
): Exhibit {
  const exhibit: Exhibit = { type: "coefficients", name: String(name), values, layout };
  if (options.description !== undefined) exhibit.description = String(options.description);
  if (options.codes !== undefined) {
    const codes = toNumbers(options.codes, "Coefficient codes");
    if (codes.length !== values.length || !codes.every(Number.isInteger)) {
      throw new RangeError(
        `Coefficients '${name}': give one integer code per value (${values.length}), got ${codes.length}`,
      );
    }
    exhibit.codes = codes;
  }
  if (options.format !== undefined) exhibit.format = String(options.format);
  return exhibit;
}

/** Options of {@link sheet.check}. */
export interface CheckOptions {
  /**
   * Which design the check is about, when a requirement is checked on more
   * than one (e.g. "floating point", "Q15 coefficients"). @default "design"
   */
  design?: string;
  /** Where the worst case lies (for a measured value given by id). */
  worst?: WorstCase;
  /**
   * Sample rate in Hz, to convert the library's samples into a requirement
   * written in ms or s. @default the rate given to the last sheet.spec(fs)
   */
  fs?: number;
}

function declaredRequirement(id: unknown): DeclaredRequirement {
  const d = declared.find((r) => r.id === id);
  if (d === undefined) {
    const ids = declared.map((r) => r.id).join(", ") || "none";
    throw new RangeError(
      `Requirement '${String(id)}' is not declared in front matter (declared: ${ids}); ` +
        "declare each requirement once under 'requirements:'",
    );
  }
  return d;
}

/** Record one check, already in the declared requirement's terms. */
function record(d: DeclaredRequirement, converted: ConvertedCheck, design: string): void {
  const problem = disagreement(converted.result, d);
  if (problem !== undefined) throw new RangeError(`Requirement ${d.id}: ${problem}`);
  const key = `${d.id}\u0000${design}`;
  if (checked.has(key)) {
    throw new RangeError(
      `Requirement ${d.id} is already checked for design '${design}'; ` +
        'check it once per design, naming the design: { design: "…" }',
    );
  }
  checked.add(key);
  sink({
    type: "check",
    result: { ...converted.result },
    design,
    ...(converted.equivalent ? { equivalent: { ...converted.equivalent } } : {}),
  });
}

/**
 * Check requirements. Either a measured value against a declared requirement,
 * `check(id, achieved, { worst, design })`, judged against the limit as
 * declared; or results from the library (`checkSpec(design, sheet.spec(fs))`,
 * `judge(...)`), one or a list, `check(results, { design })`: each must carry
 * the id of a declared requirement, and its limit must agree with it.
 */
function check(id: string, achieved: number, options?: CheckOptions): RequirementResult;
function check(
  results: RequirementResult | readonly RequirementResult[],
  options?: CheckOptions,
): RequirementResult[];
function check(
  what: string | RequirementResult | readonly RequirementResult[],
  achievedOrOptions?: number | CheckOptions,
  maybeOptions?: CheckOptions,
): RequirementResult | RequirementResult[] {
  if (typeof what === "string") {
    const d = declaredRequirement(what);
    const achieved = achievedOrOptions;
    if (typeof achieved !== "number") {
      throw new TypeError(`sheet.check("${what}", achieved): achieved must be a number`);
    }
    const options = maybeOptions ?? {};
    const margin = d.relation === "atMost" ? d.limit - achieved : achieved - d.limit;
    const result: RequirementResult = {
      name: d.text,
      id: d.id,
      achieved,
      limit: d.limit,
      relation: d.relation,
      unit: d.unit,
      margin,
      met: margin >= 0,
    };
    if (options.worst !== undefined) {
      result.worst = { at: Number(options.worst.at), unit: String(options.worst.unit) };
    }
    record(d, { result }, options.design ?? defaultDesign);
    return result;
  }
  const options = (typeof achievedOrOptions === "object" ? achievedOrOptions : undefined) ?? {};
  const list = Array.isArray(what) ? what : [what as RequirementResult];
  return list.map((r) => {
    if (typeof r?.achieved !== "number" || typeof r.relation !== "string") {
      throw new TypeError("sheet.check needs requirement results, e.g. from checkSpec(...)");
    }
    if (r.id === undefined) {
      throw new RangeError(
        `Requirement result "${r.name}" has no id: give it the id of a declared requirement`,
      );
    }
    const d = declaredRequirement(r.id);
    const converted = inDeclaredUnit(r, d, options.fs ?? specRate);
    record(d, converted, options.design ?? defaultDesign);
    return converted.result;
  });
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
      `Setting '${name}' is not declared in front matter under 'settings:' (declared: ${known})`,
    );
  }
  return value;
}

function typed<T>(name: string, value: ParamValue, ok: boolean, expected: string): T {
  if (!ok) {
    throw new TypeError(`Setting '${name}' must be ${expected}, got ${JSON.stringify(value)}`);
  }
  return value as T;
}

/** The API object worksheets use. */
export const sheet = {
  /** Every setting declared in front matter, after `--set` and `--settings`. */
  get settings(): Readonly<Record<string, ParamValue>> {
    return parameters;
  },
  /** An earlier name of {@link sheet.settings}: says so. @deprecated use sheet.settings */
  get params(): never {
    throw new TypeError("sheet.params is now called sheet.settings (front matter 'settings:')");
  },
  /** A number setting. @throws {RangeError|TypeError} when missing or not a number. */
  number(name: string): number {
    const v = param(name);
    return typed<number>(name, v, typeof v === "number", "a number");
  },
  /** A text setting. */
  text(name: string): string {
    const v = param(name);
    return typed<string>(name, v, typeof v === "string", "text");
  },
  /** A true/false setting. */
  flag(name: string): boolean {
    const v = param(name);
    return typed<boolean>(name, v, typeof v === "boolean", "true or false");
  },
  /** A list-of-numbers setting. */
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
  /** The requirements declared in front matter, the settings they name resolved. */
  get requirements(): readonly DeclaredRequirement[] {
    return declared;
  },
  /** One declared requirement, by id. @throws {RangeError} when no requirement has that id. */
  requirement(id: string): DeclaredRequirement {
    return declaredRequirement(id);
  },
  /**
   * The library's FilterSpec of the declared requirements that name a check
   * (`check:` in front matter), limits converted to the library's units, for
   * checkSpec, magnitudeMask and the design search. `ids` picks some of them.
   */
  spec(fs: number, ids?: readonly string[]): FilterSpec {
    if (!(typeof fs === "number" && fs > 0 && Number.isFinite(fs))) {
      throw new RangeError(`sheet.spec needs the sample rate in Hz, got ${fs}`);
    }
    if (ids !== undefined) { for (const id of ids) declaredRequirement(id); }
    specRate = fs;
    return specOf(declared, fs, ids);
  },
  /** Record requirement checks; they appear in the report's requirement table. */
  check,
  /** Record a design choice and the reason for it. */
  choice(name: string, value: string | number, reason: string): void {
    sink({ type: "choice", name: String(name), value, reason: String(reason) });
  },
  /**
   * List a set of coefficients in the report's coefficient section, with the
   * SHA-256 of the listing. Give `codes` (and their `format`) for a quantised
   * design: the integer codes the target holds are listed beside the values.
   */
  coefficients(
    name: string,
    values: ArrayLike<number>,
    options?: string | CoefficientOptions,
  ): void {
    const o = typeof options === "string" ? { description: options } : options ?? {};
    sink(coefficientsExhibit(name, toNumbers(values, "Coefficients"), "list", o));
  },
  /**
   * List second-order sections as a table of b0 b1 b2 a1 a2 per section
   * (a0 = 1), in the order they run.
   */
  sections(
    name: string,
    sections: readonly { b0: number; b1: number; b2: number; a1: number; a2: number }[],
    options: CoefficientOptions = {},
  ): void {
    if (!Array.isArray(sections)) throw new TypeError("sheet.sections needs a list of sections");
    const values = sections.flatMap((s, i) =>
      ["b0", "b1", "b2", "a1", "a2"].map((k) => {
        const v = (s as unknown as Record<string, unknown>)[k];
        if (typeof v !== "number") {
          throw new TypeError(`Section ${i + 1} needs numbers b0, b1, b2, a1 and a2`);
        }
        return v;
      })
    );
    sink(coefficientsExhibit(name, values, "sections", options));
  },
  /**
   * Show what a design costs to run (multiplies and adds per output sample,
   * state and coefficient memory, latency), from the library's
   * implementationCost(design, { fs }).
   */
  cost(name: string, cost: ImplementationCostFigures): void {
    if (cost === null || typeof cost !== "object" || typeof cost.structure !== "string") {
      throw new TypeError("sheet.cost needs the result of implementationCost(design, { fs })");
    }
    const figures = {
      structure: String(cost.structure),
      ...Object.fromEntries(costNumberFields.map((k) => [k, Number(cost[k])])),
    } as ImplementationCostFigures;
    if (typeof cost.latencyFrequency === "number") figures.latencyFrequency = cost.latencyFrequency;
    sink({ type: "cost", name: String(name), cost: figures });
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
