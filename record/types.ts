// The design record: what a run produced, as the runner hands it to the
// renderer and to compare and approve. Data only; no stage imports another's
// internals, they all import these types.
import type { DesignWarning, MaskSegment } from "../lib/types.ts";
import type { RequirementResult } from "../lib/verify/requirement.ts";

/** A parameter value a worksheet may declare in front matter. */
export type ParamValue = number | string | boolean | number[];

/** A sign-off role from front matter. */
export interface SignoffRole {
  role: string;
  name?: string;
}

/** The worksheet's identity from front matter. */
export interface WorksheetMeta {
  title: string;
  document: string;
  revision: string;
  signoff: SignoffRole[];
}

/** A run of Markdown prose between code blocks. */
export interface ProsePart {
  kind: "prose";
  markdown: string;
  /** First and last Markdown line (1-based, inclusive). */
  startLine: number;
  endLine: number;
}

/** A fenced `ts` block. */
export interface CodePart {
  kind: "code";
  /** Position among the code blocks, from 0. */
  index: number;
  code: string;
  /** Line of the opening fence (1-based). */
  fenceLine: number;
  /** Lines of the first and last code line (empty block: startLine > endLine). */
  startLine: number;
  endLine: number;
}

/** A parsed worksheet. */
export interface Worksheet {
  path: string;
  /** Source text with line endings normalised to \n. */
  source: string;
  meta: WorksheetMeta;
  params: Record<string, ParamValue>;
  parts: (ProsePart | CodePart)[];
}

/** A problem in a worksheet, located in its own file. */
export interface SourceProblem {
  path: string;
  line: number;
  column?: number;
  message: string;
  /** The offending source line, when known. */
  excerpt?: string;
}

/** A series of (x, y) points in a figure. */
export interface FigureSeries {
  name: string;
  x: number[];
  y: number[];
}

/** The kinds of figure the renderer knows how to draw. */
export const figureKinds = [
  "magnitude",
  "passband",
  "phase",
  "groupDelay",
  "impulse",
  "step",
  "poleZero",
  "spectrum",
  "quantised",
  "line",
] as const;

/** One of {@link figureKinds}. */
export type FigureKind = (typeof figureKinds)[number];

/**
 * A file name a worksheet may export: a plain name of letters, digits, '.',
 * '_' and '-' (no folders, no "..", at most 100 characters).
 */
export const exportNamePattern: RegExp = /^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$/;

/** True when `name` is a plain export file name (see {@link exportNamePattern}). */
export function isExportName(name: unknown): name is string {
  return typeof name === "string" && exportNamePattern.test(name) && !name.includes("..");
}

/** A figure as the worksheet describes it (data only; the renderer styles it). */
export interface FigureExhibit {
  type: "figure";
  kind: FigureKind;
  title: string;
  series: FigureSeries[];
  mask?: MaskSegment[];
  xLabel?: string;
  yLabel?: string;
  xScale?: "linear" | "log";
  /** Show frequency as f / fs instead of Hz: the sample rate to divide by. */
  normaliseTo?: number;
  yDomain?: [number, number];
}

/** A table of values. */
export interface TableExhibit {
  type: "table";
  title: string;
  columns: string[];
  rows: (string | number)[][];
}

/** A requirement check. */
export interface CheckExhibit {
  type: "check";
  result: RequirementResult;
}

/** A recorded design choice. */
export interface ChoiceExhibit {
  type: "choice";
  name: string;
  value: string | number;
  reason: string;
}

/** A named set of coefficients for the report's coefficient section. */
export interface CoefficientsExhibit {
  type: "coefficients";
  name: string;
  values: number[];
  description?: string;
}

/** A file the worksheet hands over (C header, CSV…); the runner writes it. */
export interface ExportExhibit {
  type: "export";
  fileName: string;
  content: string;
  description?: string;
}

/** A soft warning from the design or the worksheet. */
export interface WarningExhibit {
  type: "warning";
  warning: DesignWarning;
}

/** Text the block printed with console.log and friends. */
export interface OutputExhibit {
  type: "output";
  text: string;
}

/** Anything a block can emit. */
export type Exhibit =
  | FigureExhibit
  | TableExhibit
  | CheckExhibit
  | ChoiceExhibit
  | CoefficientsExhibit
  | ExportExhibit
  | WarningExhibit
  | OutputExhibit;

/** How one code block ended. */
export type BlockStatus = "ok" | "failed" | "not run";

/** The result of executing one block. */
export interface BlockResult {
  index: number;
  status: BlockStatus;
  exhibits: Exhibit[];
}

/** How a whole execution ended. */
export type RunOutcome =
  | "completed"
  | "error"
  | "timeout"
  | "memory limit"
  | "output limit"
  | "rejected";

/** Everything the execute stage returns. */
export interface ExecutionResult {
  outcome: RunOutcome;
  blocks: BlockResult[];
  /** The failure, located in the worksheet, when outcome is not "completed". */
  problem?: SourceProblem;
  /** Wall-clock time of the child process in ms (not shown in the report). */
  durationMs: number;
}

/** The overall verdict of a run. */
export type Verdict = "met" | "not met" | "incomplete" | "no requirements";

/** A file written beside the report. */
export interface WrittenFile {
  /** Path relative to the report folder, e.g. "exports/lowpass.h". */
  path: string;
  sha256: string;
  description?: string;
}

/** Facts that make the run reproducible. */
export interface Provenance {
  worksheetSha256: string;
  /** Path of the worksheet as given on the command line. */
  worksheetPath: string;
  tapsheetVersion: string;
  denoVersion: string;
  packages: { name: string; version: string }[];
  /** Run date, ISO 8601 (pinned by SOURCE_DATE_EPOCH or --date for reproducible reports). */
  date: string;
}
