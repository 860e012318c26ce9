// The design record: what a run produced, as the runner hands it to the
// renderer and to compare and approve. Data only; no stage imports another's
// internals, they all import these types.
import type { DesignWarning, MaskSegment } from "../lib/types.ts";
import type { LimitRelation, RequirementResult } from "../lib/verify/requirement.ts";
import type { Requirement } from "../lib/verify/requirements.ts";

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
  /** Declared parameter rules (unit, range, description), by name. */
  paramRules: Record<string, ParamRule>;
  /** The requirements as declared (limits may still name parameters). */
  requirements: RequirementDeclaration[];
  parts: (ProsePart | CodePart)[];
}

/** Declared rules for a parameter: `fs: { value: 8000, min: 1000, max: 96000, unit: Hz }`. */
export interface ParamRule {
  min?: number;
  max?: number;
  unit?: string;
  description?: string;
}

/** A number as front matter writes it: a value, or the name of a number parameter. */
export type NumberOrParam = number | string;

/** A requirement as front matter writes it, before parameters are resolved. */
export interface RequirementDeclaration {
  id: string;
  text: string;
  relation: LimitRelation;
  limit: NumberOrParam;
  unit: string;
  kind?: Requirement["kind"];
  /** Band edges and other fields for the library requirement ("fs/2" allowed for `to`). */
  fields: Record<string, NumberOrParam>;
  line: number;
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

/**
 * A requirement as the worksheet declares it, once, in its front matter, with
 * every parameter it names resolved. The requirement table, the checks and
 * the masks all come from it: a check whose limit disagrees is an error.
 */
export interface DeclaredRequirement {
  /** Identifier in the product's requirement list, unique in the worksheet. */
  id: string;
  /** The requirement as written, e.g. "Stopband attenuation from 1.6 kHz". */
  text: string;
  relation: LimitRelation;
  /** The limit, in `unit`. */
  limit: number;
  /** The requirement's own unit, e.g. "dB", "ms", "µV" ("" for none). */
  unit: string;
  /** The limit as written: a number, or the parameter it comes from. */
  written: string;
  /** The library requirement that checks it, when the declaration names one (`check:`). */
  kind?: Requirement["kind"];
  /** The library requirement's other fields (band edges, levels), resolved to numbers. */
  fields: Record<string, number>;
  /** Front-matter line of the declaration. */
  line: number;
}

/** The default name of the design a check is about. */
export const defaultDesign = "design";

/** A requirement check. */
export interface CheckExhibit {
  type: "check";
  /** In the declared requirement's unit, named by its text. */
  result: RequirementResult;
  /** Which design the check is about, e.g. "floating point", "Q15 coefficients". */
  design: string;
  /** The achieved value in a second unit shown beside it (samples beside ms). */
  equivalent?: { value: number; unit: string };
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
  /**
   * How the values are laid out: a plain list, or second-order sections of
   * five values each (b0 b1 b2 a1 a2, a0 = 1). @default "list"
   */
  layout?: "list" | "sections";
  /** The integer codes the target holds, one per value (a quantised design). */
  codes?: number[];
  /** The fixed-point format of the codes, e.g. "Q1.15". */
  format?: string;
}

/** What a design costs to run, as the library's implementationCost reports it. */
export interface ImplementationCostFigures {
  structure: string;
  multipliesPerOutput: number;
  addsPerOutput: number;
  multipliesPerSecond: number;
  stateWords: number;
  coefficientWords: number;
  memoryWords: number;
  latencySamples: number;
  latencySeconds: number;
  /** The frequency the latency (group delay) is taken at, Hz; absent for linear phase. */
  latencyFrequency?: number;
  inputRate: number;
  outputRate: number;
  decimation: number;
}

/** The numeric fields of {@link ImplementationCostFigures} that every cost has. */
export const costNumberFields = [
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
] as const;

/** The implementation cost of one design. */
export interface CostExhibit {
  type: "cost";
  name: string;
  cost: ImplementationCostFigures;
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
  | CostExhibit
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
  /** The requirements the run is judged against, as declared, parameters resolved. */
  requirements: DeclaredRequirement[];
  blocks: BlockResult[];
  /** The failure, located in the worksheet, when outcome is not "completed". */
  problem?: SourceProblem;
  /** Wall-clock time of the child process in ms (not shown in the report). */
  durationMs: number;
  /** Where the child's time went, ms from its start (for `run --timings`; not in the report). */
  timings?: Record<string, number>;
}

/** What a run has produced so far: its requirements and the blocks' exhibits. */
export type RunProgress = Pick<ExecutionResult, "requirements" | "blocks">;

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
  /** The worksheet as the report names it: its path in the repository, else its file name. */
  worksheetPath: string;
  tapsheetVersion: string;
  /** SHA-256 over tapsheet's own code (library, record, runner, renderer, lock file). */
  toolSha256: string;
  /** Operating system and processor, e.g. "linux x86_64". */
  platform: string;
  /** The command that reproduces the run: worksheet, date and every parameter set for it. */
  command: string;
  denoVersion: string;
  packages: { name: string; version: string }[];
  /** Run date, ISO 8601 (pinned by SOURCE_DATE_EPOCH or --date for reproducible reports). */
  date: string;
}
