// One worksheet from file to report: parse → execute → render.
import { basename, dirname, join } from "node:path";
import { hashOfFiles } from "./fingerprint.ts";
import { libraryBundle } from "./library_bundle.ts";
import { sha256Hex, writeReport } from "../render/write.ts";
import { preloadRenderer } from "../render/svg.ts";
import type { Manifest } from "../render/write.ts";
import type { Verdict } from "../render/report.ts";
import { type ExecuteOptions, executeWorksheet, projectRoot } from "./execute.ts";
import { applyOverrides } from "./params.ts";
import { parseWorksheet, WorksheetError } from "./parse.ts";
import { packageVersions, runDate, tapsheetVersion } from "./provenance.ts";
import type { ExecutionResult, ParamValue, SourceProblem, Worksheet } from "./types.ts";

/** Options for one run. */
export interface RunOptions extends ExecuteOptions {
  /** Output folder. @default "reports" */
  outDir?: string;
  /** `name=value` overrides. @default [] */
  settings?: string[];
  /** Overrides read from a parameters file. @default {} */
  paramsFromFile?: Record<string, unknown>;
  /** Date printed in the report (YYYY-MM-DD). @default SOURCE_DATE_EPOCH or today */
  date?: string;
  /** Run even when the inputs are unchanged since the existing report. @default false */
  force?: boolean;
}

/** The outcome of running one worksheet. */
export interface RunSummary {
  path: string;
  name: string;
  reportDir: string;
  verdict: Verdict;
  outcome: ExecutionResult["outcome"];
  problem?: SourceProblem;
  met: number;
  checked: number;
  fingerprint: string;
  /** True when the report was already up to date and nothing ran. */
  skipped: boolean;
  durationMs: number;
}

/** The report folder name of a worksheet: its file name without ".md". */
export function reportName(path: string): string {
  return basename(path).replace(/\.md$/i, "");
}

let toolHash: string | undefined;

/** SHA-256 over tapsheet's own code and lock file: a new version invalidates every report. */
function hashOfTool(): string {
  toolHash ??= hashOfFiles(projectRoot, ["lib", "runner", "render", "deno.json", "deno.lock"]);
  return toolHash;
}

/**
 * Files a worksheet's result depends on besides its own text: everything
 * under a `data/` folder beside it.
 */
function hashOfData(worksheetPath: string): string {
  return hashOfFiles(dirname(worksheetPath), ["data"]);
}

async function readManifest(dir: string): Promise<Manifest | undefined> {
  try {
    return JSON.parse(await Deno.readTextFile(join(dir, "manifest.json"))) as Manifest;
  } catch {
    return undefined;
  }
}

/**
 * Run a worksheet and write its report. Problems in the worksheet end up in
 * the report; parameter errors (ParamError) are thrown, as they are the
 * caller's mistake, not the worksheet's.
 */
export async function runWorksheet(path: string, options: RunOptions = {}): Promise<RunSummary> {
  const started = performance.now();
  const text = await Deno.readTextFile(path);
  const name = reportName(path);
  const outDir = options.outDir ?? "reports";
  const reportDir = join(outDir, name);
  const date = runDate(options.date);
  let worksheet: Worksheet;
  let params: Record<string, ParamValue> = {};
  let overridden: string[] = [];
  let problem: SourceProblem | undefined;
  try {
    const parsed = parseWorksheet(path, text);
    ({ params, overridden } = applyOverrides(
      parsed.params,
      parsed.paramRules,
      options.paramsFromFile ?? {},
      options.settings ?? [],
    ));
    worksheet = parsed;
  } catch (error) {
    if (!(error instanceof WorksheetError)) throw error;
    problem = error.problem;
    worksheet = {
      path,
      source: text,
      meta: { title: name, document: "", revision: "", signoff: [] },
      params: {},
      parts: [],
    };
  }

  const inputs = await sha256Hex(
    [text, JSON.stringify(params), date, hashOfTool(), hashOfData(path)].join("\n"),
  );
  const existing = await readManifest(reportDir);
  if (!options.force && existing?.inputs === inputs) {
    const summary: RunSummary = {
      path,
      name,
      reportDir,
      verdict: existing.verdict,
      outcome: existing.outcome,
      met: existing.requirements.filter((r) => r.met).length,
      checked: existing.requirements.length,
      fingerprint: existing.fingerprint,
      skipped: true,
      durationMs: performance.now() - started,
    };
    if (existing.problem) summary.problem = existing.problem;
    return summary;
  }

  // Load the plotting packages while the worksheet runs in its child process.
  void preloadRenderer();
  const libraryModule = await libraryBundle();
  const execution: ExecutionResult = problem === undefined
    ? await executeWorksheet(
      worksheet,
      params,
      libraryModule ? { ...options, libraryModule } : options,
    )
    : { outcome: "rejected", blocks: [], problem, durationMs: 0 };
  const report = await writeReport(outDir, name, {
    worksheet,
    params,
    overridden,
    execution,
    inputs,
    provenance: {
      worksheetPath: path,
      worksheetSha256: await sha256Hex(text),
      tapsheetVersion: tapsheetVersion(),
      denoVersion: Deno.version.deno,
      packages: packageVersions(),
      date,
    },
  });
  const checks = execution.blocks.flatMap((b) => b.exhibits).filter((e) => e.type === "check");
  const summary: RunSummary = {
    path,
    name,
    reportDir: report.dir,
    verdict: report.verdict,
    outcome: execution.outcome,
    met: checks.filter((c) => c.type === "check" && c.result.met).length,
    checked: checks.length,
    fingerprint: report.fingerprint,
    skipped: false,
    durationMs: performance.now() - started,
  };
  if (execution.problem) summary.problem = execution.problem;
  return summary;
}
