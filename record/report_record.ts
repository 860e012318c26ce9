// A report folder read back as data, for comparing two records: the manifest,
// the values and codes of every coefficient listing (listings/*.csv), and the
// series and masks of every figure (figures/*.vl.json). Only the folder's own
// files are read; nothing is re-run.
import { join } from "node:path";
import type { MaskSegment } from "../lib/types.ts";
import { type Manifest, type ManifestListing, readManifest } from "./manifest.ts";
import { type FigureKind, figureKinds, type FigureSeries } from "./types.ts";

/** A coefficient listing with its values, as its CSV file holds them. */
export interface ListingValues {
  listing: ManifestListing;
  values: number[];
  /** The integer codes, when the listing has them. */
  codes?: number[];
}

/**
 * A figure as its vega-lite spec holds it. The series are the points the
 * figure draws, which for a dense series are the extremes of each of about 600
 * buckets (see `thin` in render/figures.ts), not every point computed.
 */
export interface RecordedFigure {
  /** Position among the report's figures, from 1. */
  number: number;
  /** The spec's path in the report folder, e.g. "figures/01-magnitude.vl.json". */
  path: string;
  title: string;
  /** The figure's kind; undefined when neither the spec nor its axis titles tell it. */
  kind?: FigureKind;
  /** True when the kind was worked out from the axis titles (a spec without usermeta). */
  kindInferred: boolean;
  /** The axis labels the worksheet gave (for a spec without usermeta: the titles drawn). */
  xLabel?: string;
  yLabel?: string;
  /** The axis titles as drawn, e.g. "Frequency (Hz)", "Magnitude (dB)". */
  xTitle: string;
  yTitle: string;
  xScale: "linear" | "log";
  /** x values are in the exhibit's units (Hz) when this is set, else as drawn. */
  normaliseTo?: number;
  yDomain?: [number, number];
  series: FigureSeries[];
  mask: MaskSegment[];
}

/** What compare reads from one report folder. */
export interface ReportRecord {
  dir: string;
  manifest: Manifest;
  listings: ListingValues[];
  figures: RecordedFigure[];
  /** Files the manifest lists that could not be read or understood, with why. */
  unreadable: { path: string; reason: string }[];
}

/** Raised when a folder holds no readable manifest. */
export class NotAReportError extends Error {
  override name = "NotAReportError";
}

/**
 * Parse a listing's CSV (`index,value[,code]`, or
 * `section,coefficient,value[,code]` for sections) into values and codes.
 * @throws {TypeError} When the header is not one of those or a value is not a number.
 */
export function parseListingCsv(text: string): { values: number[]; codes?: number[] } {
  const lines = text.split(/\r?\n/).filter((l) => l !== "");
  const header = (lines[0] ?? "").split(",");
  const valueAt = header.indexOf("value");
  const codeAt = header.indexOf("code");
  if (valueAt < 0 || !(header[0] === "index" || header[0] === "section")) {
    throw new TypeError(`A listing starts with 'index,value' or 'section,…', got '${lines[0]}'`);
  }
  const values: number[] = [];
  const codes: number[] = [];
  for (const [i, line] of lines.slice(1).entries()) {
    const cells = line.split(",");
    const v = Number(cells[valueAt]);
    if (cells[valueAt] === undefined || cells[valueAt] === "" || Number.isNaN(v)) {
      throw new TypeError(`Listing line ${i + 2} has no number in its value column: '${line}'`);
    }
    values.push(v);
    if (codeAt >= 0) {
      const c = Number(cells[codeAt]);
      if (!Number.isInteger(c)) {
        throw new TypeError(`Listing line ${i + 2} has no integer in its code column: '${line}'`);
      }
      codes.push(c);
    }
  }
  return codeAt >= 0 ? { values, codes } : { values };
}

type Json = Record<string, unknown>;

const isObject = (v: unknown): v is Json =>
  v !== null && typeof v === "object" && !Array.isArray(v);

/** A title as vega-lite holds it (one string, or wrapped lines) as one line. */
function titleOf(value: unknown): string | undefined {
  if (typeof value === "string") return value;
  if (Array.isArray(value)) return value.map(String).join(" ");
  if (isObject(value)) return titleOf(value.text);
  return undefined;
}

/** Every layer of a spec, nested layers included, in drawing order. */
function layersOf(spec: Json): Json[] {
  const out: Json[] = [];
  const visit = (node: Json) => {
    out.push(node);
    if (Array.isArray(node.layer)) { for (const l of node.layer) if (isObject(l)) visit(l); }
  };
  visit(spec);
  return out;
}

function rowsOf(layer: Json): Json[] {
  const data = layer.data;
  if (!isObject(data) || !Array.isArray(data.values)) return [];
  return data.values.filter(isObject);
}

/** The encoding of a layer or of its first sub-layer that has one. */
function encodingOf(layer: Json): Json | undefined {
  if (isObject(layer.encoding)) return layer.encoding;
  for (const l of Array.isArray(layer.layer) ? layer.layer : []) {
    if (isObject(l) && isObject(l.encoding)) return l.encoding;
  }
  return undefined;
}

function axisTitle(spec: Json, channel: "x" | "y"): string | undefined {
  for (const layer of layersOf(spec)) {
    const e = encodingOf(layer)?.[channel];
    if (isObject(e) && e.field === channel) {
      const t = titleOf(e.title);
      if (t !== undefined) return t;
    }
  }
  return undefined;
}

/** The kind of a figure drawn before specs kept usermeta, from its axis titles. */
function inferKind(spec: Json, yLabel: string): FigureKind | undefined {
  const hasDifferencePanel = layersOf(spec).some((l) => rowsOf(l).some((r) => "d" in r));
  if (/^Magnitude\b/i.test(yLabel)) return hasDifferencePanel ? "quantised" : "magnitude";
  if (/^Phase\b/i.test(yLabel)) return "phase";
  if (/^Group delay\b/i.test(yLabel)) return "groupDelay";
  return undefined;
}

/** Mask segments from the shaded mask layer (a spec without usermeta; no labels). */
function maskFromLayers(spec: Json): MaskSegment[] {
  for (const layer of layersOf(spec)) {
    const rows = rowsOf(layer);
    if (rows.length === 0 || !rows.every((r) => "edge" in r && "piece" in r)) continue;
    const domain = (encodingOf(layer)?.y as Json | undefined)?.scale as Json | undefined;
    const top = Array.isArray(domain?.domain) ? Number(domain.domain[1]) : NaN;
    const out: MaskSegment[] = [];
    for (let i = 0; i + 1 < rows.length; i += 2) {
      const [a, b] = [rows[i]!, rows[i + 1]!];
      const segment: MaskSegment = {
        from: Number(a.x),
        to: Number(b.x),
        level: Number(a.y),
        bound: Number(a.edge) === top ? "upper" : "lower",
      };
      if (Number(b.y) !== segment.level) segment.toLevel = Number(b.y);
      out.push(segment);
    }
    return out;
  }
  return [];
}

/** The series a figure draws: rows with x, y and a series name (null y is a gap, NaN here). */
function seriesFromLayers(spec: Json, scale: number): FigureSeries[] {
  const bySeries = new Map<string, { layer: Json; series: FigureSeries }>();
  for (const layer of layersOf(spec)) {
    for (const r of rowsOf(layer)) {
      if (typeof r.series !== "string" || !("y" in r) || "d" in r) continue;
      const own = bySeries.get(r.series);
      if (own !== undefined && own.layer !== layer) continue; // stems draw each point twice
      const entry = own ?? { layer, series: { name: r.series, x: [], y: [] } };
      bySeries.set(r.series, entry);
      entry.series.x.push(Number(r.x) * scale);
      entry.series.y.push(r.y === null ? NaN : Number(r.y));
    }
  }
  return [...bySeries.values()].map((e) => e.series);
}

function numberPair(v: unknown): [number, number] | undefined {
  return Array.isArray(v) && v.length === 2 && v.every((n) => typeof n === "number")
    ? [v[0] as number, v[1] as number]
    : undefined;
}

function maskOf(v: unknown): MaskSegment[] | undefined {
  if (!Array.isArray(v)) return undefined;
  return v.filter(isObject).flatMap((m) => {
    if (typeof m.from !== "number" || typeof m.to !== "number" || typeof m.level !== "number") {
      return [];
    }
    const s: MaskSegment = {
      from: m.from,
      to: m.to,
      level: m.level,
      bound: m.bound === "lower" ? "lower" : "upper",
    };
    if (typeof m.toLevel === "number") s.toLevel = m.toLevel;
    if (typeof m.label === "string") s.label = m.label;
    return [s];
  });
}

/**
 * A figure from its vega-lite spec. The figure's own facts come from the
 * spec's `usermeta.figure` (kind, title, labels, mask in the exhibit's units);
 * a spec written before that existed is read from its drawing (title, axis
 * titles, the shaded mask in drawn units, the kind guessed from the y axis).
 *
 * @param spec The parsed `.vl.json`.
 * @param where Its number among the report's figures and its path.
 * @param title The figure's title as the manifest lists it, if known.
 */
export function figureFromSpec(
  spec: unknown,
  where: { number: number; path: string },
  title?: string,
): RecordedFigure {
  if (!isObject(spec)) throw new TypeError(`${where.path} is not a vega-lite specification`);
  const facts = isObject(spec.usermeta) && isObject(spec.usermeta.figure)
    ? spec.usermeta.figure
    : undefined;
  const kindGiven = figureKinds.find((k) => k === facts?.kind);
  const normaliseTo = typeof facts?.normaliseTo === "number" ? facts.normaliseTo : undefined;
  const xTitle = axisTitle(spec, "x") ?? "x";
  const yTitle = axisTitle(spec, "y") ?? "y";
  const given = (v: unknown) => (typeof v === "string" ? v : undefined);
  const xLabel = facts === undefined ? xTitle : given(facts.xLabel);
  const yLabel = facts === undefined ? yTitle : given(facts.yLabel);
  const kind = kindGiven ?? (facts === undefined ? inferKind(spec, yTitle) : undefined);
  const figure: RecordedFigure = {
    number: where.number,
    path: where.path,
    title: (typeof facts?.title === "string" ? facts.title : undefined) ?? title ??
      titleOf(spec.title) ?? "",
    kindInferred: kindGiven === undefined && kind !== undefined,
    xTitle,
    yTitle,
    xScale: facts?.xScale === "log" ? "log" : "linear",
    series: seriesFromLayers(spec, normaliseTo ?? 1),
    mask: facts === undefined ? maskFromLayers(spec) : maskOf(facts.mask) ?? [],
  };
  if (kind !== undefined) figure.kind = kind;
  if (xLabel !== undefined) figure.xLabel = xLabel;
  if (yLabel !== undefined) figure.yLabel = yLabel;
  if (normaliseTo !== undefined) figure.normaliseTo = normaliseTo;
  const yDomain = numberPair(facts?.yDomain);
  if (yDomain !== undefined) figure.yDomain = yDomain;
  return figure;
}

/**
 * Read a report folder as compare needs it. Files the manifest lists but that
 * cannot be read are noted in `unreadable`, not thrown.
 * @throws {NotAReportError} When the folder has no readable manifest.json.
 */
export async function readReportRecord(dir: string): Promise<ReportRecord> {
  const manifest = await readManifest(dir);
  if (manifest === undefined) throw new NotAReportError(join(dir, "manifest.json"));
  const unreadable: ReportRecord["unreadable"] = [];
  const reason = (error: unknown) => (error instanceof Error ? error.message : String(error));
  const listings: ListingValues[] = [];
  for (const listing of manifest.listings ?? []) {
    try {
      const parsed = parseListingCsv(await Deno.readTextFile(join(dir, listing.path)));
      listings.push({ listing, ...parsed });
    } catch (error) {
      unreadable.push({ path: listing.path, reason: reason(error) });
    }
  }
  const titles = new Map(manifest.files.map((f) => [f.path, f.description]));
  const figures: RecordedFigure[] = [];
  const specs = manifest.files.filter((f) => /^figures\/.*\.vl\.json$/.test(f.path));
  for (const [i, file] of specs.entries()) {
    try {
      const spec = JSON.parse(await Deno.readTextFile(join(dir, file.path)));
      const title = titles.get(file.path.replace(/\.vl\.json$/, ".svg")) ?? undefined;
      figures.push(figureFromSpec(spec, { number: i + 1, path: file.path }, title));
    } catch (error) {
      unreadable.push({ path: file.path, reason: reason(error) });
    }
  }
  return { dir, manifest, listings, figures, unreadable };
}
