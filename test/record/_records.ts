// Hand-built design records for compare's tests: a manifest with the fields
// compare reads, and report folders written from it. The scenario is invented:
// a vibration-sensor lowpass for a conveyor-belt idler monitor ("IDL-7").
import { join } from "node:path";
import type { Manifest, ManifestRequirement } from "../../record/manifest.ts";
import { manifestText, sha256Hex } from "../../record/manifest.ts";
import type { ListingValues, RecordedFigure, ReportRecord } from "../../record/report_record.ts";
import type { FigureExhibit, ImplementationCostFigures } from "../../record/types.ts";
import { figureToVegaLite } from "../../render/figures.ts";

/** A checked row of the requirement table, judged as the runner judges it. */
export function row(
  id: string,
  achieved: number,
  o: {
    relation?: "atMost" | "atLeast";
    limit?: number;
    unit?: string;
    design?: string;
    text?: string;
  } = {},
): ManifestRequirement {
  const relation = o.relation ?? "atLeast";
  const limit = o.limit ?? 50;
  const margin = relation === "atMost" ? limit - achieved : achieved - limit;
  const r: ManifestRequirement = {
    id,
    text: o.text ?? `Requirement ${id}`,
    relation,
    limit,
    unit: o.unit ?? "dB",
    checked: true,
    met: margin >= 0,
    achieved,
    margin,
  };
  if (o.design !== undefined) r.design = o.design;
  return r;
}

/** A declared requirement no check reached. */
export function unchecked(
  id: string,
  o: { relation?: "atMost" | "atLeast"; limit?: number; unit?: string } = {},
): ManifestRequirement {
  return {
    id,
    text: `Requirement ${id}`,
    relation: o.relation ?? "atLeast",
    limit: o.limit ?? 50,
    unit: o.unit ?? "dB",
    checked: false,
    met: false,
  };
}

/** An FIR's cost, as implementationCost reports it. */
export function firCost(taps: number, fs = 4000): ImplementationCostFigures {
  const half = Math.ceil(taps / 2);
  return {
    structure: `symmetric FIR, ${taps} taps`,
    multipliesPerOutput: half,
    addsPerOutput: taps - 1,
    multipliesPerSecond: half * fs,
    stateWords: taps - 1,
    coefficientWords: half,
    memoryWords: taps - 1 + half,
    latencySamples: (taps - 1) / 2,
    latencySeconds: (taps - 1) / 2 / fs,
    inputRate: fs,
    outputRate: fs,
    decimation: 1,
  };
}

/** A manifest with the fields compare reads; the rest filled with plausible values. */
export function manifest(o: Partial<Manifest> = {}): Manifest {
  return {
    worksheet: "sensors/idler_lowpass.md",
    name: "idler_lowpass",
    title: "IDL-7 idler vibration lowpass",
    document: "IDL-7-DSP-002",
    revision: "A",
    verdict: "met",
    outcome: "completed",
    requirements: [],
    listings: [],
    costs: [],
    settings: { fs: 4000 },
    provenance: {
      worksheetSha256: "0".repeat(64),
      worksheetPath: "sensors/idler_lowpass.md",
      tapsheetVersion: "0.1.0",
      toolSha256: "1".repeat(64),
      platform: "linux x86_64",
      command: "deno task tapsheet run sensors/idler_lowpass.md --date 2026-02-01",
      denoVersion: "2.9.6",
      packages: [],
      date: "2026-02-01",
    },
    files: [],
    fingerprint: "2".repeat(64),
    inputs: "3".repeat(64),
    digest: "",
    ...o,
  };
}

/** A listing with its values (and codes), as compare reads it. */
export function listing(
  name: string,
  values: number[],
  o: { codes?: number[]; format?: string; layout?: "list" | "sections" } = {},
): ListingValues {
  const l: ListingValues = {
    listing: {
      name,
      path: `listings/01-${name}.csv`,
      layout: o.layout ?? "list",
      count: values.length,
      hasCodes: o.codes !== undefined,
    },
    values,
  };
  if (o.format !== undefined) l.listing.format = o.format;
  if (o.codes !== undefined) l.codes = o.codes;
  return l;
}

/** A recorded frequency-response figure. */
export function figure(
  number: number,
  title: string,
  series: { name: string; x: number[]; y: number[] }[],
  o: Partial<RecordedFigure> = {},
): RecordedFigure {
  return {
    number,
    path: `figures/${String(number).padStart(2, "0")}-f.vl.json`,
    title,
    kind: "magnitude",
    kindInferred: false,
    xTitle: "Frequency (Hz)",
    yTitle: "Magnitude (dB)",
    xScale: "linear",
    series,
    mask: [],
    ...o,
  };
}

/** A record built in memory. */
export function record(
  m: Manifest,
  o: { listings?: ListingValues[]; figures?: RecordedFigure[] } = {},
): ReportRecord {
  return {
    dir: `/reports/${m.name}`,
    manifest: m,
    listings: o.listings ?? [],
    figures: o.figures ?? [],
    unreadable: [],
  };
}

/**
 * Write a report folder compare can read: listings as CSV, figures as
 * vega-lite specs drawn by the renderer, exports, and the manifest listing
 * them all with their SHA-256.
 */
export async function writeRecordFolder(
  dir: string,
  m: Manifest,
  o: {
    listings?: {
      name: string;
      csv: string;
      layout?: "list" | "sections";
      format?: string;
      count: number;
      hasCodes: boolean;
    }[];
    figures?: FigureExhibit[];
    exports?: Record<string, string>;
  } = {},
): Promise<void> {
  await Deno.mkdir(join(dir, "figures"), { recursive: true });
  await Deno.mkdir(join(dir, "listings"), { recursive: true });
  await Deno.mkdir(join(dir, "exports"), { recursive: true });
  const files: Manifest["files"] = [];
  const write = async (path: string, text: string, description?: string) => {
    await Deno.writeTextFile(join(dir, path), text);
    files.push({ path, sha256: sha256Hex(text), ...(description ? { description } : {}) });
  };
  for (const [i, f] of (o.figures ?? []).entries()) {
    const stem = `figures/${String(i + 1).padStart(2, "0")}-figure`;
    await write(`${stem}.vl.json`, JSON.stringify(figureToVegaLite(f), null, 1) + "\n");
    await write(`${stem}.svg`, "<svg></svg>", f.title);
  }
  const listings: Manifest["listings"] = [];
  for (const [i, l] of (o.listings ?? []).entries()) {
    const path = `listings/${String(i + 1).padStart(2, "0")}-listing.csv`;
    await write(path, l.csv, l.name);
    listings.push({
      name: l.name,
      path,
      layout: l.layout ?? "list",
      count: l.count,
      hasCodes: l.hasCodes,
      ...(l.format ? { format: l.format } : {}),
    });
  }
  for (const [name, text] of Object.entries(o.exports ?? {})) await write(`exports/${name}`, text);
  await write("index.html", "<!DOCTYPE html><title>stand-in page</title>");
  const { digest: _, ...rest } = { ...m, listings, files };
  await Deno.writeTextFile(join(dir, "manifest.json"), manifestText(rest));
}
