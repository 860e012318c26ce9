// Two design records side by side: what changed between an old and a new
// report of a worksheet, and whether anything a requirement covers got worse.
// Pure functions of two records read with record/report_record.ts.
//
// "Got worse" (the rule `compare` exits with 1 on, see gotWorse) means any of:
//   - a requirement the old record declares is gone from the new one;
//   - a declared limit is looser (a lower at-least limit, a higher at-most
//     limit), or changed in a way that cannot be ordered (the relation or the
//     unit changed), since either could hide a regression just as a removal can;
//   - a row (requirement × design) that was met is not met, or is no longer
//     checked (a design dropped from the checks, or a run that stopped early);
//   - a row that was checked and not met is no longer checked;
//   - a row that was not met and still is not has a larger shortfall (its
//     margin, in the same unit, fell by more than 1e-9 of the limit).
// Not "worse": a stricter limit by itself, a smaller margin that stays met, a
// new requirement (met or not), a row that was never checked before, and any
// change outside the requirements (coefficients, cost, figures, exports).
import { interpolate } from "./series.ts";
export { interpolate };
import type { MaskSegment } from "../lib/types.ts";
import type { LimitRelation } from "../lib/verify/requirement.ts";
import type { ManifestListing, ManifestRequirement } from "./manifest.ts";
import type { ListingValues, RecordedFigure, ReportRecord } from "./report_record.ts";
import type {
  FigureKind,
  FigureSeries,
  ImplementationCostFigures,
  ParamValue,
  RunOutcome,
  SourceProblem,
  Verdict,
} from "./types.ts";

/** One side of a comparison, as the comparison names it. */
export interface SideFacts {
  /** How the user named the side: a report folder, `w.md`, or `w.md@REV (abc1234)`. */
  label: string;
  /** The report folder the side was read from (absent when it was a temporary one). */
  dir?: string;
  worksheet: string;
  title: string;
  document: string;
  revision: string;
  verdict: Verdict;
  outcome: RunOutcome;
  problem?: SourceProblem;
  date: string;
  fingerprint: string;
  toolSha256: string;
  command: string;
}

/** A front-matter identity field that changed. */
export interface IdentityChange {
  field: "title" | "document" | "revision";
  old: string;
  new: string;
}

/** A setting that was added, removed or changed (absent side: not declared there). */
export interface SettingChange {
  name: string;
  old?: ParamValue;
  new?: ParamValue;
}

/** A requirement's declared limit. */
export interface DeclaredLimit {
  text: string;
  relation: LimitRelation;
  limit: number;
  unit: string;
}

/** How a declared limit moved. */
export type LimitMove = "stricter" | "looser" | "not comparable";

/** A requirement added, removed, or declared differently. */
export interface RequirementChange {
  id: string;
  change: "added" | "removed" | "changed";
  old?: DeclaredLimit;
  new?: DeclaredLimit;
  /** For a changed declaration whose limit, relation or unit differs. */
  limit?: LimitMove;
  textChanged: boolean;
}

/** The state of one row (requirement × design) on one side. */
export interface RowSide {
  status: "met" | "not met" | "not checked";
  relation: LimitRelation;
  limit: number;
  unit: string;
  achieved?: number;
  margin?: number;
}

/** One row of the requirement table, old against new. */
export interface RowComparison {
  id: string;
  text: string;
  /** The design the row is about (the new record's name); undefined when checked on no design. */
  design?: string;
  /** The old record's name of the design, when it differs (paired by order). */
  oldDesign?: string;
  /** Undefined when that side does not declare the requirement. */
  old?: RowSide;
  new?: RowSide;
  verdictChanged: boolean;
  /** new margin − old margin, when both are checked in the same unit (0 within 1e-9 of the limit). */
  marginChange?: number;
  /** Why this row got worse, when it did (see the module comment). */
  worse?: Worsening["why"];
}

/** One thing a requirement covers that got worse. */
export interface Worsening {
  id: string;
  design?: string;
  oldDesign?: string;
  why:
    | "met to not met"
    | "met to not checked"
    | "no longer checked"
    | "shortfall grew"
    | "removed"
    | "limit looser"
    | "limit not comparable";
}

/** A listing's shape: what can change without comparing values. */
export type ListingShape = Pick<ManifestListing, "layout" | "count" | "format" | "hasCodes">;

/** One coefficient listing, matched by name. */
export interface ListingComparison {
  /** The new record's name of the listing (the old one's when only it has the listing). */
  name: string;
  /** The old record's name, when no name matched and the listings were paired by order. */
  oldName?: string;
  old?: ListingShape;
  new?: ListingShape;
  /** Which parts of the shape changed. */
  structure: ("layout" | "count" | "format" | "codes")[];
  /** Value by value, when layout and count agree: the largest |new − old| and where. */
  values?: { largest: number; at: number; changed: number };
  /** Code by code, when both have codes in the same format: the largest |Δ| in LSBs. */
  codes?: { largestLsb: number; at: number; changed: number };
  /** Why codes were not compared although one side has them. */
  codesNotCompared?: "format differs" | "codes on one side only" | "values not comparable";
}

/** The cost figures compared field by field. */
export const costFields = [
  "structure",
  "multipliesPerOutput",
  "addsPerOutput",
  "multipliesPerSecond",
  "stateWords",
  "coefficientWords",
  "memoryWords",
  "latencySamples",
  "latencySeconds",
  "inputRate",
  "outputRate",
  "decimation",
] as const satisfies readonly (keyof ImplementationCostFigures)[];

/** One implementation cost, matched by name. */
export interface CostComparison {
  name: string;
  /** The old record's name, when no name matched and the costs were paired by order. */
  oldName?: string;
  old?: ImplementationCostFigures;
  new?: ImplementationCostFigures;
  changed: { field: (typeof costFields)[number]; old: number | string; new: number | string }[];
}

/** An export whose SHA-256 differs, or that only one side has. */
export interface ExportChange {
  path: string;
  change: "changed" | "added" | "removed";
  old?: string;
  new?: string;
}

/** One series of a compared figure. */
export interface SeriesComparison {
  name: string;
  /** The old record's name, when no name matched and the series were paired by order. */
  oldName?: string;
  old?: FigureSeries;
  new?: FigureSeries;
  /** new − old on the new series' points where both are drawn, the old one interpolated. */
  difference?: FigureSeries;
  /** The largest |new − old| and where it lies (x in the figure's units). */
  largest?: { delta: number; at: number };
}

/** The figure kinds that are overlaid: frequency responses. */
export const comparedFigureKinds: readonly FigureKind[] = [
  "magnitude",
  "passband",
  "phase",
  "groupDelay",
  "quantised",
];

/** A figure of the old record matched with one of the new. */
export interface FigureComparison {
  title: string;
  oldTitle: string;
  kind: FigureKind;
  matchedBy: "title" | "kind and order";
  old: { number: number; path: string };
  new: { number: number; path: string };
  /** The new figure's own axis labels, when the worksheet gave them. */
  xLabel?: string;
  yLabel?: string;
  /** The new figure's axis titles as drawn ("Frequency (Hz)"). */
  xTitle: string;
  yTitle: string;
  xScale: "linear" | "log";
  /** The sample rate the new figure divides frequencies by; the series hold Hz. */
  normaliseTo?: number;
  yDomain?: [number, number];
  /** The new record's mask (its limits are the ones the new record is judged against). */
  mask: MaskSegment[];
  maskChanged: boolean;
  series: SeriesComparison[];
}

/** A frequency-response figure that only one side has. */
export interface UnmatchedFigure {
  side: "old" | "new";
  number: number;
  title: string;
  kind: FigureKind;
}

/** Everything `compare` finds between two records. */
export interface Comparison {
  old: SideFacts;
  new: SideFacts;
  identity: IdentityChange[];
  settings: SettingChange[];
  requirements: RequirementChange[];
  /** Every row of either side; worse rows first, then other verdict changes, then the rest. */
  rows: RowComparison[];
  listings: ListingComparison[];
  costs: CostComparison[];
  exports: ExportChange[];
  /** Exports present on both sides with the same SHA-256. */
  exportsUnchanged: number;
  figures: FigureComparison[];
  unmatchedFigures: UnmatchedFigure[];
  /** Everything that got worse; empty when `compare` exits with 0. */
  worse: Worsening[];
  /** Files of either record that could not be read. */
  unreadable: { side: "old" | "new"; path: string; reason: string }[];
}

/** Two numbers equal up to 1e-9 of the larger magnitude (or of 1). */
function same(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
}

/** Items of the old and new lists paired up; a side is undefined when the item has no partner. */
export interface Paired<T> {
  old?: T;
  new?: T;
  /** True when the two were paired by position because no name matched. */
  byOrder: boolean;
}

/**
 * Pair the items of two lists: first those with equal names (each used once,
 * in order), then the rest by position (the first unpaired old item with the
 * first unpaired new one…). The result follows the new list, then the old
 * items left over.
 */
export function pairUp<T>(
  was: readonly T[],
  now: readonly T[],
  name: (t: T) => string,
): Paired<T>[] {
  const used = new Set<T>();
  const partner = new Map<T, T>();
  for (const b of now) {
    const a = was.find((x) => !used.has(x) && name(x) === name(b));
    if (a !== undefined) {
      used.add(a);
      partner.set(b, a);
    }
  }
  const leftOld = was.filter((a) => !used.has(a));
  const byOrder = new Set<T>();
  for (const b of now) {
    if (partner.has(b) || leftOld.length === 0) continue;
    const a = leftOld.shift()!;
    partner.set(b, a);
    byOrder.add(b);
  }
  const out: Paired<T>[] = now.map((b) => {
    const a = partner.get(b);
    return a === undefined
      ? { new: b, byOrder: false }
      : { old: a, new: b, byOrder: byOrder.has(b) };
  });
  for (const a of leftOld) out.push({ old: a, byOrder: false });
  return out;
}

function sideFacts(record: ReportRecord, label: string): SideFacts {
  const m = record.manifest;
  const facts: SideFacts = {
    label,
    dir: record.dir,
    worksheet: m.provenance.worksheetPath,
    title: m.title,
    document: m.document,
    revision: m.revision,
    verdict: m.verdict,
    outcome: m.outcome,
    date: m.provenance.date,
    fingerprint: m.fingerprint,
    toolSha256: m.provenance.toolSha256,
    command: m.provenance.command,
  };
  if (m.problem) facts.problem = m.problem;
  return facts;
}

/** Front-matter identity fields that differ. */
export function compareIdentity(
  was: Pick<SideFacts, IdentityChange["field"]>,
  now: Pick<SideFacts, IdentityChange["field"]>,
): IdentityChange[] {
  return (["title", "document", "revision"] as const).flatMap((field) =>
    was[field] === now[field] ? [] : [{ field, old: was[field], new: now[field] }]
  );
}

/** Settings that differ, in the new record's order, then those only the old one has. */
export function compareSettings(
  was: Record<string, ParamValue>,
  now: Record<string, ParamValue>,
): SettingChange[] {
  const names = [...new Set([...Object.keys(now), ...Object.keys(was)])];
  return names.flatMap((name) => {
    const [a, b] = [was[name], now[name]];
    if (JSON.stringify(a) === JSON.stringify(b)) return [];
    const change: SettingChange = { name };
    if (a !== undefined) change.old = a;
    if (b !== undefined) change.new = b;
    return [change];
  });
}

/**
 * How a limit moved from `was` to `now`: stricter, looser, or not comparable
 * (relation or unit differ); undefined when it did not move.
 */
export function limitMove(was: DeclaredLimit, now: DeclaredLimit): LimitMove | undefined {
  if (was.relation !== now.relation || was.unit !== now.unit) return "not comparable";
  if (same(was.limit, now.limit)) return undefined;
  const higher = now.limit > was.limit;
  return (was.relation === "atLeast") === higher ? "stricter" : "looser";
}

/** The declaration of each requirement id, from the first of its rows. */
function declarations(rows: readonly ManifestRequirement[]): Map<string, DeclaredLimit> {
  const out = new Map<string, DeclaredLimit>();
  for (const r of rows) {
    if (!out.has(r.id)) {
      out.set(r.id, { text: r.text, relation: r.relation, limit: r.limit, unit: r.unit });
    }
  }
  return out;
}

/** Requirements added, removed, or declared with another limit, relation, unit or text. */
export function compareRequirements(
  was: readonly ManifestRequirement[],
  now: readonly ManifestRequirement[],
): RequirementChange[] {
  const [a, b] = [declarations(was), declarations(now)];
  const out: RequirementChange[] = [];
  for (const [id, d] of b) {
    const old = a.get(id);
    if (old === undefined) {
      out.push({ id, change: "added", new: d, textChanged: false });
      continue;
    }
    const move = limitMove(old, d);
    const textChanged = old.text !== d.text;
    if (move === undefined && !textChanged) continue;
    const change: RequirementChange = { id, change: "changed", old, new: d, textChanged };
    if (move !== undefined) change.limit = move;
    out.push(change);
  }
  for (const [id, d] of a) {
    if (!b.has(id)) out.push({ id, change: "removed", old: d, textChanged: false });
  }
  return out;
}

function rowSide(r: ManifestRequirement | undefined, d: DeclaredLimit): RowSide {
  if (r === undefined || !r.checked) {
    return { status: "not checked", relation: d.relation, limit: d.limit, unit: d.unit };
  }
  const side: RowSide = {
    status: r.met ? "met" : "not met",
    relation: r.relation,
    limit: r.limit,
    unit: r.unit,
  };
  if (r.achieved !== undefined) side.achieved = r.achieved;
  if (r.margin !== undefined) side.margin = r.margin;
  return side;
}

/** Why a row got worse from `was` to `now`, or undefined (see the module comment). */
export function rowWorsening(was: RowSide, now: RowSide): Worsening["why"] | undefined {
  if (was.status === "met") {
    if (now.status === "not met") return "met to not met";
    if (now.status === "not checked") return "met to not checked";
    return undefined;
  }
  if (was.status === "not met") {
    if (now.status === "not checked") return "no longer checked";
    if (
      now.status === "not met" && was.unit === now.unit && was.margin !== undefined &&
      now.margin !== undefined &&
      was.margin - now.margin > 1e-9 * Math.max(1, Math.abs(was.limit), Math.abs(now.limit))
    ) {
      return "shortfall grew";
    }
  }
  return undefined;
}

/**
 * Every row of either requirement table, old against new. A row is a
 * requirement on one design. For each requirement, designs are paired by name,
 * then the rest by order (a design renamed with its word length stays one
 * row); a requirement checked on no design on one side stands, as "not
 * checked", for each design the other side checked it on.
 */
export function compareRows(
  was: readonly ManifestRequirement[],
  now: readonly ManifestRequirement[],
): RowComparison[] {
  const [a, b] = [declarations(was), declarations(now)];
  const ids = [...new Set([...b.keys(), ...a.keys()])];
  const out: { row: RowComparison; order: number }[] = [];
  for (const id of ids) {
    const checked = (rows: readonly ManifestRequirement[]) =>
      rows.filter((r) => r.id === id && r.checked);
    const [da, db] = [a.get(id), b.get(id)];
    const pairs: Paired<ManifestRequirement>[] = da && db
      ? pairUp(checked(was), checked(now), (r) => r.design ?? "")
      : [
        ...checked(now).map((r) => ({ new: r, byOrder: false })),
        ...checked(was).map((r) => ({ old: r, byOrder: false })),
      ];
    for (const pair of pairs.length > 0 ? pairs : [{ byOrder: false }]) {
      const row: RowComparison = { id, text: (db ?? da)!.text, verdictChanged: false };
      const design = pair.new?.design ?? pair.old?.design;
      if (design !== undefined) row.design = design;
      if (
        pair.old && pair.new && pair.old.design !== pair.new.design && pair.old.design !== undefined
      ) {
        row.oldDesign = pair.old.design;
      }
      if (da) row.old = rowSide(pair.old, da);
      if (db) row.new = rowSide(pair.new, db);
      if (row.old && row.new) {
        row.verdictChanged = row.old.status !== row.new.status;
        if (
          row.old.margin !== undefined && row.new.margin !== undefined &&
          row.old.unit === row.new.unit
        ) {
          const d = row.new.margin - row.old.margin;
          const rounding = 1e-9 * Math.max(1, Math.abs(row.old.limit), Math.abs(row.new.limit));
          row.marginChange = Math.abs(d) <= rounding ? 0 : d;
        }
        const why = rowWorsening(row.old, row.new);
        if (why !== undefined) row.worse = why;
      }
      out.push({ row, order: out.length });
    }
  }
  const rank = (r: RowComparison) =>
    r.worse === "met to not met" || r.worse === "met to not checked"
      ? 0
      : r.worse !== undefined
      ? 1
      : r.verdictChanged
      ? 2
      : r.old === undefined || r.new === undefined
      ? 3
      : 4;
  return out.sort((x, y) => rank(x.row) - rank(y.row) || x.order - y.order).map((x) => x.row);
}

function shapeOf(l: ManifestListing): ListingShape {
  const shape: ListingShape = { layout: l.layout, count: l.count, hasCodes: l.hasCodes };
  if (l.format !== undefined) shape.format = l.format;
  return shape;
}

/** The largest |b − a| of two equally long arrays, where, and how many differ. */
function largestDifference(a: number[], b: number[]) {
  let largest = 0;
  let at = 0;
  let changed = 0;
  for (let i = 0; i < a.length; i++) {
    const d = Math.abs(b[i]! - a[i]!);
    if (d !== 0) changed++;
    if (d > largest) {
      largest = d;
      at = i;
    }
  }
  return { largest, at, changed };
}

/**
 * One coefficient listing old against new: the shape (layout, number of
 * values, code format, codes or none), and, when layout and count agree, the
 * largest change of a value and, when both hold codes in the same format, the
 * largest change of a code in LSBs (one LSB is one step of the integer code).
 */
export function compareListing(
  name: string,
  was: ListingValues | undefined,
  now: ListingValues | undefined,
): ListingComparison {
  const out: ListingComparison = { name, structure: [] };
  if (was) out.old = shapeOf(was.listing);
  if (now) out.new = shapeOf(now.listing);
  if (!was || !now) return out;
  const [a, b] = [was.listing, now.listing];
  if (a.layout !== b.layout) out.structure.push("layout");
  if (was.values.length !== now.values.length) out.structure.push("count");
  if ((a.format ?? "") !== (b.format ?? "")) out.structure.push("format");
  if ((was.codes !== undefined) !== (now.codes !== undefined)) out.structure.push("codes");
  const comparable = a.layout === b.layout && was.values.length === now.values.length;
  if (comparable) out.values = largestDifference(was.values, now.values);
  if (was.codes && now.codes) {
    if (!comparable || was.codes.length !== now.codes.length) {
      out.codesNotCompared = "values not comparable";
    } else if ((a.format ?? "") !== (b.format ?? "")) out.codesNotCompared = "format differs";
    else {
      const d = largestDifference(was.codes, now.codes);
      out.codes = { largestLsb: d.largest, at: d.at, changed: d.changed };
    }
  } else if (was.codes || now.codes) out.codesNotCompared = "codes on one side only";
  return out;
}

/** Every listing of either side, paired by name, then the rest by order. */
export function compareListings(
  was: readonly ListingValues[],
  now: readonly ListingValues[],
): ListingComparison[] {
  return pairUp(was, now, (l) => l.listing.name).map((p) => {
    const out = compareListing((p.new ?? p.old)!.listing.name, p.old, p.new);
    if (p.byOrder) out.oldName = p.old!.listing.name;
    return out;
  });
}

/** Every costed design of either side, paired by name, then by order, with the fields that changed. */
export function compareCosts(
  was: readonly { name: string; cost: ImplementationCostFigures }[],
  now: readonly { name: string; cost: ImplementationCostFigures }[],
): CostComparison[] {
  return pairUp(was, now, (c) => c.name).map((p) => {
    const [a, b] = [p.old?.cost, p.new?.cost];
    const out: CostComparison = { name: (p.new ?? p.old)!.name, changed: [] };
    if (p.byOrder) out.oldName = p.old!.name;
    if (a) out.old = a;
    if (b) out.new = b;
    if (a && b) {
      for (const field of costFields) {
        if (a[field] !== b[field]) out.changed.push({ field, old: a[field], new: b[field] });
      }
    }
    return out;
  });
}

/** Exports (files under exports/) whose SHA-256 changed, or that only one side lists. */
export function compareExports(
  was: readonly { path: string; sha256: string }[],
  now: readonly { path: string; sha256: string }[],
): { changes: ExportChange[]; unchanged: number } {
  const exported = (files: readonly { path: string; sha256: string }[]) =>
    new Map(files.filter((f) => f.path.startsWith("exports/")).map((f) => [f.path, f.sha256]));
  const [a, b] = [exported(was), exported(now)];
  const changes: ExportChange[] = [];
  let unchanged = 0;
  for (const [path, sha] of b) {
    const old = a.get(path);
    if (old === undefined) changes.push({ path, change: "added", new: sha });
    else if (old !== sha) changes.push({ path, change: "changed", old, new: sha });
    else unchanged++;
  }
  for (const [path, sha] of a) {
    if (!b.has(path)) changes.push({ path, change: "removed", old: sha });
  }
  return { changes, unchanged };
}

/** A series' finite points in increasing x. */
function sortedFinite(s: FigureSeries): { x: number[]; y: number[] } {
  const order = s.x.map((_, i) => i).filter((i) => Number.isFinite(s.x[i]!));
  order.sort((i, j) => s.x[i]! - s.x[j]!);
  return { x: order.map((i) => s.x[i]!), y: order.map((i) => s.y[i]!) };
}

/**
 * new − old on one grid: the new series' own x values where both series are
 * drawn, the old series interpolated linearly onto them. NaN (a gap) where
 * either series has no value.
 */
export function seriesDifference(was: FigureSeries, now: FigureSeries): FigureSeries {
  const a = sortedFinite(was);
  const b = sortedFinite(now);
  const x: number[] = [];
  const y: number[] = [];
  if (a.x.length === 0 || b.x.length === 0) return { name: now.name, x, y };
  const lo = Math.max(a.x[0]!, b.x[0]!);
  const hi = Math.min(a.x[a.x.length - 1]!, b.x[b.x.length - 1]!);
  for (let i = 0; i < b.x.length; i++) {
    const at = b.x[i]!;
    if (at < lo || at > hi || at === x[x.length - 1]) continue;
    const old = interpolate(a.x, a.y, at);
    const d = b.y[i]! - old;
    x.push(at);
    y.push(Number.isFinite(d) ? d : NaN);
  }
  return { name: now.name, x, y };
}

/**
 * Whether two masks draw the same limits: the same segments up to rounding,
 * with the same labels when both carry labels (a mask read from an older
 * spec's drawing has none).
 */
export function sameMask(a: readonly MaskSegment[], b: readonly MaskSegment[]): boolean {
  const labelled = (m: readonly MaskSegment[]) => m.some((s) => s.label !== undefined);
  const labels = labelled(a) && labelled(b);
  return a.length === b.length && a.every((m, i) => {
    const n = b[i]!;
    return m.bound === n.bound && same(m.from, n.from) && same(m.to, n.to) &&
      same(m.level, n.level) && same(m.toLevel ?? m.level, n.toLevel ?? n.level) &&
      (!labels || (m.label ?? "") === (n.label ?? ""));
  });
}

/** Two matched figures, series paired by name, then by order. */
export function compareFigure(
  was: RecordedFigure,
  now: RecordedFigure,
  matchedBy: FigureComparison["matchedBy"],
): FigureComparison {
  const series = pairUp(was.series, now.series, (s) => s.name).map((p) => {
    const [a, b] = [p.old, p.new];
    const out: SeriesComparison = { name: (b ?? a)!.name };
    if (p.byOrder) out.oldName = a!.name;
    if (a) out.old = a;
    if (b) out.new = b;
    if (a && b) {
      const d = seriesDifference(a, b);
      out.difference = d;
      let best = -1;
      for (let i = 0; i < d.y.length; i++) {
        const v = Math.abs(d.y[i]!);
        if (Number.isFinite(v) && (best < 0 || v > Math.abs(d.y[best]!))) best = i;
      }
      if (best >= 0) out.largest = { delta: d.y[best]!, at: d.x[best]! };
    }
    return out;
  });
  const out: FigureComparison = {
    title: now.title,
    oldTitle: was.title,
    kind: now.kind ?? was.kind ?? "line",
    matchedBy,
    old: { number: was.number, path: was.path },
    new: { number: now.number, path: now.path },
    xTitle: now.xTitle,
    yTitle: now.yTitle,
    xScale: now.xScale,
    mask: now.mask,
    maskChanged: !sameMask(was.mask, now.mask),
    series,
  };
  if (now.xLabel !== undefined) out.xLabel = now.xLabel;
  if (now.yLabel !== undefined) out.yLabel = now.yLabel;
  if (now.normaliseTo !== undefined) out.normaliseTo = now.normaliseTo;
  if (now.yDomain !== undefined) out.yDomain = now.yDomain;
  return out;
}

/**
 * Match the frequency-response figures of two records: first by title (each
 * figure used once, in order), then the rest by kind and order (the first
 * unmatched magnitude figure of the old record with the first of the new…).
 */
export function matchFigures(
  was: readonly RecordedFigure[],
  now: readonly RecordedFigure[],
): {
  pairs: [RecordedFigure, RecordedFigure, FigureComparison["matchedBy"]][];
  unmatched: UnmatchedFigure[];
} {
  const eligible = (f: RecordedFigure) =>
    f.kind !== undefined && comparedFigureKinds.includes(f.kind);
  const left = was.filter(eligible);
  const right = now.filter(eligible);
  const pairs: [RecordedFigure, RecordedFigure, FigureComparison["matchedBy"]][] = [];
  const used = new Set<RecordedFigure>();
  const taken = new Set<RecordedFigure>();
  for (const b of right) {
    const a = left.find((f) => !used.has(f) && f.title === b.title);
    if (a) {
      pairs.push([a, b, "title"]);
      used.add(a);
      taken.add(b);
    }
  }
  for (const b of right) {
    if (taken.has(b)) continue;
    const a = left.find((f) => !used.has(f) && f.kind === b.kind);
    if (a) {
      pairs.push([a, b, "kind and order"]);
      used.add(a);
      taken.add(b);
    }
  }
  pairs.sort((p, q) => p[1].number - q[1].number);
  const unmatched: UnmatchedFigure[] = [
    ...left.filter((f) => !used.has(f)).map((f) => ({ side: "old" as const, f })),
    ...right.filter((f) => !taken.has(f)).map((f) => ({ side: "new" as const, f })),
  ].map(({ side, f }) => ({ side, number: f.number, title: f.title, kind: f.kind! }));
  return { pairs, unmatched };
}

/**
 * Compare two records. `labels` name the sides as the user gave them.
 * @returns Every change, and in `worse` everything a requirement covers that got worse.
 */
export function compareRecords(
  was: ReportRecord,
  now: ReportRecord,
  labels: { old: string; new: string },
): Comparison {
  const [ma, mb] = [was.manifest, now.manifest];
  const requirements = compareRequirements(ma.requirements, mb.requirements);
  const rows = compareRows(ma.requirements, mb.requirements);
  const { changes, unchanged } = compareExports(ma.files, mb.files);
  const { pairs, unmatched } = matchFigures(was.figures, now.figures);
  const worse: Worsening[] = [];
  for (const r of requirements) {
    if (r.change === "removed") worse.push({ id: r.id, why: "removed" });
    else if (r.limit === "looser") worse.push({ id: r.id, why: "limit looser" });
    else if (r.limit === "not comparable") worse.push({ id: r.id, why: "limit not comparable" });
  }
  for (const r of rows) {
    if (r.worse === undefined) continue;
    const w: Worsening = { id: r.id, why: r.worse };
    if (r.design !== undefined) w.design = r.design;
    if (r.oldDesign !== undefined) w.oldDesign = r.oldDesign;
    worse.push(w);
  }
  const first = (
    w: Worsening,
  ) => (w.why === "met to not met" || w.why === "met to not checked" ? 0 : 1);
  worse.sort((p, q) => first(p) - first(q));
  return {
    old: sideFacts(was, labels.old),
    new: sideFacts(now, labels.new),
    identity: compareIdentity(ma, mb),
    settings: compareSettings(ma.settings, mb.settings),
    requirements,
    rows,
    listings: compareListings(was.listings, now.listings),
    costs: compareCosts(ma.costs ?? [], mb.costs ?? []),
    exports: changes,
    exportsUnchanged: unchanged,
    figures: pairs.map(([a, b, by]) => compareFigure(a, b, by)),
    unmatchedFigures: unmatched,
    worse,
    unreadable: [
      ...was.unreadable.map((u) => ({ side: "old" as const, ...u })),
      ...now.unreadable.map((u) => ({ side: "new" as const, ...u })),
    ],
  };
}

/** True when anything a requirement covers got worse: `compare` then exits with 1. */
export function gotWorse(comparison: Comparison): boolean {
  return comparison.worse.length > 0;
}
