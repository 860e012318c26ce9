// One worksheet from file to report: parse → execute → render.
import { basename } from "node:path";
import { sha256Hex, writeReport, type WrittenReport } from "../render/write.ts";
import { type ExecuteOptions, executeWorksheet } from "./execute.ts";
import { applyOverrides } from "./params.ts";
import { parseWorksheet, WorksheetError } from "./parse.ts";
import { packageVersions, runDate, tapsheetVersion } from "./provenance.ts";
import type { ExecutionResult, ParamValue, Worksheet } from "./types.ts";

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
}

/** The outcome of running one worksheet. */
export interface RunSummary {
  path: string;
  name: string;
  report: WrittenReport;
  execution: ExecutionResult;
  params: Record<string, ParamValue>;
  met: number;
  checked: number;
  durationMs: number;
}

/** The report folder name of a worksheet: its file name without ".md". */
export function reportName(path: string): string {
  return basename(path).replace(/\.md$/i, "");
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
  let worksheet: Worksheet;
  let execution: ExecutionResult;
  let params: Record<string, ParamValue> = {};
  let overridden: string[] = [];
  try {
    const parsed = parseWorksheet(path, text);
    ({ params, overridden } = applyOverrides(
      parsed.params,
      parsed.paramRules,
      options.paramsFromFile ?? {},
      options.settings ?? [],
    ));
    worksheet = parsed;
    execution = await executeWorksheet(parsed, params, options);
  } catch (error) {
    if (!(error instanceof WorksheetError)) throw error;
    worksheet = {
      path,
      source: text,
      meta: { title: name, document: "", revision: "", signoff: [] },
      params: {},
      parts: [],
    };
    execution = { outcome: "rejected", blocks: [], problem: error.problem, durationMs: 0 };
  }
  const report = await writeReport(options.outDir ?? "reports", name, {
    worksheet,
    params,
    overridden,
    execution,
    provenance: {
      worksheetPath: path,
      worksheetSha256: await sha256Hex(text),
      tapsheetVersion: tapsheetVersion(),
      denoVersion: Deno.version.deno,
      packages: packageVersions(),
      date: runDate(options.date),
    },
  });
  const checks = execution.blocks.flatMap((b) => b.exhibits).filter((e) => e.type === "check");
  return {
    path,
    name,
    report,
    execution,
    params,
    met: checks.filter((c) => c.type === "check" && c.result.met).length,
    checked: checks.length,
    durationMs: performance.now() - started,
  };
}
