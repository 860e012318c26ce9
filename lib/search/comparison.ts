import { requireFinite, requireInteger, show } from "../_validate.ts";
import type { MaskSegment } from "../types.ts";
import { responseOf } from "../verify/filter_design.ts";
import { bandGrid } from "../verify/grid.ts";
import { magnitudeMask } from "../verify/mask.ts";
import type { Arithmetic, CandidateStatus, SearchMethod, SearchResult } from "./types.ts";

/** One row of the comparison of a search's candidates. */
export interface ComparisonRow {
  /** Place in the ranking among the candidates that meet (1 = chosen); undefined for the others. */
  rank?: number;
  /** Method. */
  method: SearchMethod;
  /** Plain name of the method. */
  label: string;
  /** Size in words, e.g. "63 taps". */
  size: string;
  /** Multiplies per output sample. */
  multipliesPerOutput?: number;
  /** Adds per output sample. */
  addsPerOutput?: number;
  /** State plus coefficient words. */
  memoryWords?: number;
  /** Latency in input samples. */
  latencySamples?: number;
  /** Latency in seconds. */
  latencySeconds?: number;
  /** The requirement with the smallest relative margin, e.g. "Stopband attenuation 1500–4000 Hz: +0.8 dB (quantised)". */
  worstMargin?: string;
  /** "chosen", or the candidate's status. */
  verdict: "chosen" | CandidateStatus;
  /** For a candidate that fails: the requirement it misses and by how much, e.g. "… 57.5 dB, 2.5 dB short (quantised)". */
  failing?: string;
  /** Why the method is not applicable, was skipped or stopped. */
  note?: string;
}

/** A comparison table ready for a report: column titles, cell rows and the structured rows. */
export interface ComparisonTable {
  /** Column titles. */
  columns: string[];
  /** One row of cells per candidate, in the result's order (numbers stay numbers). */
  rows: (string | number)[][];
  /** The same rows as objects. */
  entries: ComparisonRow[];
}

function signed(value: number): string {
  return `${value >= 0 ? "+" : "−"}${show(Math.abs(value))}`;
}

function unitSuffix(unit: string): string {
  return unit === "" ? "" : unit === "°" ? "°" : ` ${unit}`;
}

/**
 * The candidates of a search as comparison rows: method, size, cost (multiplies
 * and adds per output sample, memory words, latency in samples and seconds),
 * the worst margin, the verdict, and for a candidate that fails the
 * requirement it misses and by how much. Cells of missing values are "—".
 *
 * @param result A result of searchDesigns.
 * @returns Column titles, cell rows and structured rows, in the result's order.
 * @throws {TypeError} When the result has no candidates array.
 * @example
 * ```ts
 * import { searchComparisonTable } from "./comparison.ts";
 * import { searchDesigns } from "./search_designs.ts";
 * const result = searchDesigns({ fs: 8000, requirements: [
 *   { kind: "passbandRipple", from: 0, to: 1000, atMostDb: 1 },
 *   { kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 40 },
 * ] }, { target: { wordLength: 16, accumulatorBits: 40 }, methods: ["elliptic", "butterworth", "halfband"] });
 * const table = searchComparisonTable(result);
 * if (table.entries[0]!.verdict !== "chosen" || table.rows.length !== 3) throw new Error("3 rows, one chosen");
 * if (table.entries[2]!.verdict !== "not applicable") throw new Error("no half-band: fs/4 is in the stopband");
 * ```
 */
export function searchComparisonTable(result: SearchResult): ComparisonTable {
  if (result === null || typeof result !== "object" || !Array.isArray(result.candidates)) {
    throw new TypeError("Give a result of searchDesigns");
  }
  let rank = 0;
  const entries: ComparisonRow[] = result.candidates.map((c) => {
    const row: ComparisonRow = {
      method: c.method,
      label: c.label,
      size: c.sizeLabel,
      verdict: c === result.chosen ? "chosen" : c.status,
    };
    if (c.status === "meets") row.rank = ++rank;
    if (c.cost !== undefined) {
      row.multipliesPerOutput = c.cost.multipliesPerOutput;
      row.addsPerOutput = c.cost.addsPerOutput;
      row.memoryWords = c.cost.memoryWords;
      row.latencySamples = c.cost.latencySamples;
      row.latencySeconds = c.cost.latencySeconds;
    }
    if (c.worst !== undefined) {
      const r = c.worst.result;
      // A requirement is named by its id when it has one (the table stays narrow).
      row.worstMargin = `${r.id ?? r.name}: ${signed(r.margin)}${
        unitSuffix(r.unit)
      } (${c.worst.arithmetic})`;
    }
    const f = c.failures[0];
    if (c.status === "fails" && f !== undefined) row.failing = shortfall(f.result, f.arithmetic);
    if (c.reason !== undefined && c.reason !== "") row.note = c.reason;
    return row;
  });
  const columns = [
    "Rank",
    "Method",
    "Size",
    "Multiplies / output",
    "Adds / output",
    "Memory (words)",
    "Latency (samples)",
    "Latency (ms)",
    "Worst margin",
    "Verdict",
    "Failing requirement",
  ];
  const dash = "—";
  const rows = entries.map((e) => [
    e.rank ?? dash,
    e.label,
    e.size,
    e.multipliesPerOutput ?? dash,
    e.addsPerOutput ?? dash,
    e.memoryWords ?? dash,
    e.latencySamples ?? dash,
    e.latencySeconds === undefined ? dash : e.latencySeconds * 1000,
    e.worstMargin ?? dash,
    e.verdict,
    e.failing ?? e.note ?? dash,
  ]);
  return { columns, rows, entries };
}

function shortfall(
  r: {
    name: string;
    id?: string;
    achieved: number;
    limit: number;
    relation: string;
    unit: string;
    margin: number;
  },
  arithmetic: Arithmetic,
): string {
  const u = unitSuffix(r.unit);
  const side = r.relation === "atMost" ? "at most" : "at least";
  const by = Number.isFinite(r.margin) ? `${show(Math.abs(r.margin))}${u} short` : "not reached";
  const achieved = Number.isFinite(r.achieved) ? `${show(r.achieved)}${u}` : String(r.achieved);
  return `${r.id ?? r.name}: ${achieved} against ${side} ${
    show(r.limit)
  }${u}, ${by} (${arithmetic})`;
}

/** Options for {@link searchResponseOverlay}. */
export interface OverlayOptions {
  /** Points on the shared grid from 0 to fs/2, 2 … 65537. @default 1024 */
  points?: number;
  /** Lowest magnitude drawn, in dB (exact zeros would be −∞). @default -200 */
  floorDb?: number;
  /** Which coefficients to draw. @default "quantised" */
  arithmetic?: Arithmetic;
}

/** One candidate's magnitude response on the overlay grid. */
export interface OverlaySeries {
  /** Series name, e.g. "Elliptic IIR, order 5 (3 sections) (chosen)". */
  name: string;
  /** Method. */
  method: SearchMethod;
  /** Whether this is the chosen candidate. */
  chosen: boolean;
  /** Whether the candidate meets every requirement. */
  meets: boolean;
  /** Frequencies in Hz (the shared grid). */
  x: Float64Array;
  /** Magnitude in dB, 20·log10|H|, floored at floorDb. */
  y: Float64Array;
}

/** Data for a figure overlaying every candidate's magnitude response. */
export interface ResponseOverlay {
  /** The shared frequency grid in Hz, 0 … fs/2. */
  frequencies: Float64Array;
  /** One series per candidate that has a design, in the result's order. */
  series: OverlaySeries[];
  /** The spec's magnitude mask (from magnitudeMask), in dB. */
  mask: MaskSegment[];
}

/**
 * Every candidate's magnitude response in dB on one shared grid from 0 to
 * fs/2, with the spec's magnitude mask, ready for an overlay figure.
 *
 * @param result A result of searchDesigns.
 * @param options Grid size, floor in dB, floating-point or quantised coefficients.
 * @returns The grid, one series per designed candidate, and the mask.
 * @throws {RangeError} When points or floorDb are out of range.
 * @throws {TypeError} When the result has no candidates array.
 * @example
 * ```ts
 * import { searchResponseOverlay } from "./comparison.ts";
 * import { searchDesigns } from "./search_designs.ts";
 * const result = searchDesigns({ fs: 8000, requirements: [
 *   { kind: "passbandRipple", from: 0, to: 1000, atMostDb: 1 },
 *   { kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 40 },
 * ] }, { target: { wordLength: 16, accumulatorBits: 40 }, methods: ["elliptic", "chebyshev1"] });
 * const overlay = searchResponseOverlay(result, { points: 81 });
 * // Every series is on the same grid; at 0 Hz each lowpass is within its 1 dB ripple.
 * if (overlay.series.length !== 2 || overlay.series.some((s) => s.x !== overlay.frequencies)) throw new Error("shared grid");
 * if (overlay.series.some((s) => !(s.y[0]! > -1.0001 && s.y[0]! < 0.0001))) throw new Error("DC gain");
 * ```
 */
export function searchResponseOverlay(
  result: SearchResult,
  options: OverlayOptions = {},
): ResponseOverlay {
  if (result === null || typeof result !== "object" || !Array.isArray(result.candidates)) {
    throw new TypeError("Give a result of searchDesigns");
  }
  const points = options.points ?? 1024;
  requireInteger("Overlay points", points, 2, 65537);
  const floorDb = options.floorDb ?? -200;
  requireFinite("Floor", floorDb);
  const arithmetic = options.arithmetic ?? "quantised";
  if (arithmetic !== "quantised" && arithmetic !== "floating point") {
    throw new TypeError(
      `arithmetic must be "quantised" or "floating point", got ${String(arithmetic)}`,
    );
  }
  const fs = result.spec.fs;
  const frequencies = bandGrid(0, fs / 2, points);
  const series: OverlaySeries[] = [];
  for (const c of result.candidates) {
    const design = arithmetic === "quantised" ? c.quantisedDesign ?? c.design : c.design;
    if (design === undefined) continue;
    const h = responseOf(design, frequencies, fs);
    const y = new Float64Array(points);
    for (let i = 0; i < points; i++) {
      const db = 20 * Math.log10(Math.hypot(h.re[i]!, h.im[i]!));
      y[i] = Number.isNaN(db) ? floorDb : Math.max(floorDb, db);
    }
    const chosen = c === result.chosen;
    series.push({
      name: `${c.label}, ${c.sizeLabel}${
        chosen ? " (chosen)" : c.status === "fails" ? " (fails)" : ""
      }`,
      method: c.method,
      chosen,
      meets: c.status === "meets",
      x: frequencies,
      y,
    });
  }
  return { frequencies, series, mask: magnitudeMask(result.spec) };
}
