// The parent's rules for what a sandbox child may hand over. Everything the
// child sends is untrusted: the sheet API's own checks ran in the same realm
// as the worksheet, which can replace any of them. So the parent rebuilds each
// exhibit from the fields it knows, with their types checked, and recomputes
// every requirement verdict from its achieved value and limit.
import type { MaskSegment } from "../lib/types.ts";
import type { RequirementResult } from "../lib/verify/requirement.ts";
import {
  costNumberFields,
  type Exhibit,
  figureKinds,
  type ImplementationCostFigures,
  isExportName,
} from "../record/types.ts";

/** Raised when a message breaks the rules; the run is then reported as failed. */
export class ProtocolError extends Error {
  override name = "ProtocolError";
}

type Fields = Record<string, unknown>;

function fail(what: string): never {
  throw new ProtocolError(what);
}

function record(value: unknown, what: string): Fields {
  if (value === null || typeof value !== "object" || Array.isArray(value)) {
    fail(`${what}: not an object`);
  }
  return value as Fields;
}

function text(value: unknown, what: string, max = 100_000): string {
  if (typeof value !== "string" || value.length > max) fail(`${what}: not a text`);
  return value as string;
}

function optionalText(value: unknown, what: string): string | undefined {
  return value === undefined ? undefined : text(value, what);
}

function number(value: unknown, what: string): number {
  if (typeof value !== "number") fail(`${what}: not a number`);
  return value as number;
}

function finite(value: unknown, what: string): number {
  const v = number(value, what);
  if (!Number.isFinite(v)) fail(`${what}: not a finite number`);
  return v;
}

function numbers(value: unknown, what: string): number[] {
  if (!Array.isArray(value) || !value.every((v) => typeof v === "number")) {
    fail(`${what}: not a list of numbers`);
  }
  return (value as number[]).slice();
}

function oneOf<T extends string>(value: unknown, allowed: readonly T[], what: string): T {
  if (!allowed.includes(value as T)) fail(`${what}: not one of ${allowed.join(", ")}`);
  return value as T;
}

/** Copy `value` into `into[key]` only when it is defined. */
function put<T extends object, K extends keyof T>(into: T, key: K, value: T[K] | undefined): void {
  if (value !== undefined) into[key] = value;
}

function maskSegment(value: unknown, what: string): MaskSegment {
  const m = record(value, what);
  const out: MaskSegment = {
    from: finite(m.from, `${what}.from`),
    to: finite(m.to, `${what}.to`),
    level: finite(m.level, `${what}.level`),
    bound: oneOf(m.bound, ["upper", "lower"] as const, `${what}.bound`),
  };
  if (m.toLevel !== undefined) out.toLevel = finite(m.toLevel, `${what}.toLevel`);
  put(out, "label", optionalText(m.label, `${what}.label`));
  return out;
}

/**
 * A requirement result as the parent accepts it: the fields checked, and the
 * margin and verdict recomputed from achieved value, limit and relation.
 * A value that is not a number (NaN) never meets its limit.
 */
export function checkedRequirement(value: unknown): RequirementResult {
  const r = record(value, "check");
  const relation = oneOf(r.relation, ["atMost", "atLeast"] as const, "check.relation");
  const achieved = number(r.achieved, "check.achieved");
  const limit = finite(r.limit, "check.limit");
  const margin = relation === "atMost" ? limit - achieved : achieved - limit;
  const out: RequirementResult = {
    name: text(r.name, "check.name", 1000),
    achieved,
    limit,
    relation,
    unit: text(r.unit, "check.unit", 100),
    margin,
    met: margin >= 0,
  };
  put(out, "id", optionalText(r.id, "check.id"));
  if (r.worst !== undefined) {
    const w = record(r.worst, "check.worst");
    out.worst = { at: number(w.at, "check.worst.at"), unit: text(w.unit, "check.worst.unit", 100) };
  }
  return out;
}

/** Rebuild an exhibit from a message, keeping only known fields of the right types. */
export function checkedExhibit(value: unknown): Exhibit {
  const e = record(value, "exhibit");
  switch (e.type) {
    case "figure": {
      if (!Array.isArray(e.series)) fail("figure.series: not a list");
      const out: Exhibit = {
        type: "figure",
        kind: oneOf(e.kind, figureKinds, "figure.kind"),
        title: text(e.title, "figure.title", 1000),
        series: (e.series as unknown[]).map((s, i) => {
          const series = record(s, `figure.series[${i}]`);
          const x = numbers(series.x, `figure.series[${i}].x`);
          const y = numbers(series.y, `figure.series[${i}].y`);
          if (x.length !== y.length) fail(`figure.series[${i}]: x and y differ in length`);
          return { name: text(series.name, `figure.series[${i}].name`, 1000), x, y };
        }),
      };
      if (e.mask !== undefined) {
        if (!Array.isArray(e.mask)) fail("figure.mask: not a list");
        out.mask = (e.mask as unknown[]).map((m, i) => maskSegment(m, `figure.mask[${i}]`));
      }
      put(out, "xLabel", optionalText(e.xLabel, "figure.xLabel"));
      put(out, "yLabel", optionalText(e.yLabel, "figure.yLabel"));
      if (e.xScale !== undefined) {
        out.xScale = oneOf(e.xScale, ["linear", "log"] as const, "figure.xScale");
      }
      if (e.normaliseTo !== undefined) {
        const fs = finite(e.normaliseTo, "figure.normaliseTo");
        if (!(fs > 0)) fail("figure.normaliseTo: not above 0");
        out.normaliseTo = fs;
      }
      if (e.yDomain !== undefined) {
        const d = numbers(e.yDomain, "figure.yDomain");
        if (d.length !== 2) fail("figure.yDomain: not two numbers");
        out.yDomain = [finite(d[0], "figure.yDomain[0]"), finite(d[1], "figure.yDomain[1]")];
      }
      return out;
    }
    case "table": {
      const columns = e.columns;
      if (!Array.isArray(columns) || !Array.isArray(e.rows)) {
        fail("table: columns or rows not a list");
      }
      const heads = (columns as unknown[]).map((c, i) => text(c, `table.columns[${i}]`, 1000));
      const rows = (e.rows as unknown[]).map((row, i) => {
        if (!Array.isArray(row) || row.length !== heads.length) {
          fail(`table.rows[${i}]: not ${heads.length} cells`);
        }
        return (row as unknown[]).map((c, j) =>
          typeof c === "number" ? c : text(c, `table.rows[${i}][${j}]`)
        );
      });
      return { type: "table", title: text(e.title, "table.title", 1000), columns: heads, rows };
    }
    case "check": {
      const out: Exhibit = {
        type: "check",
        result: checkedRequirement(e.result),
        design: text(e.design, "check.design", 200),
      };
      if (e.equivalent !== undefined) {
        const q = record(e.equivalent, "check.equivalent");
        out.equivalent = {
          value: number(q.value, "check.equivalent.value"),
          unit: text(q.unit, "check.equivalent.unit", 100),
        };
      }
      return out;
    }
    case "choice":
      return {
        type: "choice",
        name: text(e.name, "choice.name", 1000),
        value: typeof e.value === "number" ? e.value : text(e.value, "choice.value"),
        reason: text(e.reason, "choice.reason"),
      };
    case "coefficients": {
      const out: Exhibit = {
        type: "coefficients",
        name: text(e.name, "coefficients.name", 1000),
        values: numbers(e.values, "coefficients.values"),
      };
      put(out, "description", optionalText(e.description, "coefficients.description"));
      if (e.layout !== undefined) {
        out.layout = oneOf(e.layout, ["list", "sections"] as const, "coefficients.layout");
        if (out.layout === "sections" && out.values.length % 5 !== 0) {
          fail("coefficients: sections need five values each");
        }
      }
      if (e.codes !== undefined) {
        out.codes = numbers(e.codes, "coefficients.codes");
        if (out.codes.length !== out.values.length || !out.codes.every(Number.isInteger)) {
          fail("coefficients.codes: not one integer per value");
        }
      }
      put(out, "format", optionalText(e.format, "coefficients.format"));
      return out;
    }
    case "cost": {
      const c = record(e.cost, "cost");
      const n = (k: string) => finite(c[k], `cost.${k}`);
      const out: Exhibit = {
        type: "cost",
        name: text(e.name, "cost.name", 1000),
        cost: {
          structure: text(c.structure, "cost.structure", 1000),
          ...Object.fromEntries(costNumberFields.map((k) => [k, n(k)])),
        } as ImplementationCostFigures,
      };
      if (c.latencyFrequency !== undefined && c.latencyFrequency !== null) {
        out.cost.latencyFrequency = finite(c.latencyFrequency, "cost.latencyFrequency");
      }
      return out;
    }
    case "export": {
      if (!isExportName(e.fileName)) {
        fail(`export: '${String(e.fileName)}' is not a plain file name`);
      }
      const out: Exhibit = {
        type: "export",
        fileName: e.fileName as string,
        content: text(e.content, "export.content", 64 * 1024 * 1024),
      };
      put(out, "description", optionalText(e.description, "export.description"));
      return out;
    }
    case "warning": {
      const w = record(e.warning, "warning");
      return {
        type: "warning",
        warning: { code: text(w.code, "warning.code", 200), message: text(w.message, "warning") },
      };
    }
    case "output":
      return { type: "output", text: text(e.text, "output.text", 16 * 1024 * 1024) };
    default:
      return fail(`exhibit: unknown type '${String(e.type)}'`);
  }
}
