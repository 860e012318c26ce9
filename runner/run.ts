// One worksheet from file to report: parse → execute → render.
//
// The parser, the report writer and the approvals are imported only once the
// worksheet's sandbox child is started, and the writer only once the child
// has its input, so the child boots and runs while they load.
import { basename, dirname, join } from "node:path";
import { hashOfFiles, toolFileDigests } from "./fingerprint.ts";
import { libraryBundle } from "./bundles.ts";
import {
  checkReportFolder,
  folderIsIntact,
  type Manifest,
  readManifest,
  sha256Hex,
} from "../record/manifest.ts";
import type {
  ExecutionResult,
  Exhibit,
  ParamValue,
  RunProgress,
  SourceProblem,
  Verdict,
  Worksheet,
} from "../record/types.ts";
import type { FigureDraft } from "../render/write.ts";
import { requirementRows } from "../record/verdict.ts";
import {
  disposeSandbox,
  type ExecuteOptions,
  executeWorksheet,
  projectRoot,
  type Sandbox,
  startSandbox,
} from "./execute.ts";
import { applyOverrides } from "./params.ts";
import {
  packageVersions,
  runDate,
  tapsheetVersion,
  type WorksheetName,
  worksheetName,
} from "./provenance.ts";

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
  /** Report folder name inside outDir. @default chosen by {@link reportFolderName} */
  reportName?: string;
  /** Record where the time goes (RunSummary.timings). @default false */
  timings?: boolean;
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
  /** Why an existing report with the same inputs was run again (tampered, incomplete). */
  rerunBecause?: string;
  durationMs: number;
  /** Steps and their durations in ms, when RunOptions.timings asked for them. */
  timings?: [string, number][];
}

/** The plain report folder name of a worksheet: its file name without ".md". */
export function reportName(path: string): string {
  return basename(path).replace(/\.md$/i, "");
}

/**
 * The report folder of a worksheet inside `outDir`: its file name without
 * ".md", unless that folder holds the report of another worksheet of the same
 * name (from another folder); then the name gets a short hash of the
 * worksheet's identity, so neither report overwrites the other.
 */
export async function reportFolderName(
  outDir: string,
  name: WorksheetName,
  path: string,
  /** Folders already given to other worksheets of the same run. */
  takenInRun: ReadonlySet<string> = new Set(),
): Promise<string> {
  const plain = reportName(path);
  const other = `${plain}-${sha256Hex(name.identity).slice(0, 8)}`;
  for (const candidate of [plain, other]) {
    if (takenInRun.has(candidate)) continue;
    if ((await readManifest(join(outDir, candidate)))?.worksheet === name.identity) {
      return candidate;
    }
  }
  const taken = takenInRun.has(plain) || (await readManifest(join(outDir, plain))) !== undefined;
  return taken ? other : plain;
}

/**
 * Import a module once per process: runs of one batch share the promise.
 * (Deno 2.9 can panic when two imports of a module that awaits at its top
 * level, like parsers.ts, are under way at once.)
 */
function importOnce<T>(load: () => Promise<T>): () => Promise<T> {
  let loaded: Promise<T> | undefined;
  return () => (loaded ??= load());
}
const parser = importOnce(() => import("./parse.ts"));
const reportWriter = importOnce(() => import("../render/write.ts"));
const approvalsModule = importOnce(() => import("../record/approvals.ts"));
const proseRenderer = importOnce(() => import("../render/html.ts"));

let toolHash: string | undefined;

/** SHA-256 over tapsheet's own code and lock file: a new version invalidates every report. */
function hashOfTool(): string {
  toolHash ??= hashOfFiles(projectRoot, [
    "lib",
    "record",
    "runner",
    "render",
    "deno.json",
    "deno.lock",
  ], toolFileDigests);
  return toolHash;
}

/**
 * Files a worksheet's result depends on besides its own text: everything
 * under a `data/` folder beside it.
 */
function hashOfData(worksheetPath: string): string {
  return hashOfFiles(dirname(worksheetPath), ["data"]);
}

/**
 * Why an existing report cannot stand for a run with these inputs, or
 * undefined when it can (same inputs, every file as its manifest lists).
 */
async function staleBecause(dir: string, existing: Manifest | undefined, inputs: string) {
  if (existing === undefined) return "no report";
  if (existing.inputs !== inputs) return "inputs changed";
  const check = await checkReportFolder(dir, existing);
  if (folderIsIntact(check)) return undefined;
  const files = [...check.changed, ...check.missing, ...check.added];
  return `the existing report was altered or is incomplete (${
    files.length > 0 ? files.join(", ") : "manifest.json"
  })`;
}

/** The command line that runs the worksheet again as this run did. */
function reproducingCommand(
  display: string,
  date: string,
  params: Record<string, ParamValue>,
  overridden: string[],
): string {
  const quote = (
    text: string,
  ) => (/^[\w./:=,+-]+$/.test(text) ? text : `'${text.replaceAll("'", "'\\''")}'`);
  const sets = overridden.map((n) => {
    const v = params[n]!;
    return `--set ${quote(`${n}=${Array.isArray(v) ? v.join(",") : String(v)}`)}`;
  });
  return ["deno task tapsheet run", quote(display), "--date", date, ...sets].join(" ");
}

/** Problems as the report shows them: located in the worksheet by its report name. */
function withDisplayPath(execution: ExecutionResult, path: string, display: string) {
  const problem = execution.problem;
  if (problem === undefined) return execution;
  return {
    ...execution,
    problem: { ...problem, path: display, message: problem.message.replaceAll(path, display) },
  };
}

/**
 * Run a worksheet and write its report. Problems in the worksheet end up in
 * the report; parameter errors (ParamError) are thrown, as they are the
 * caller's mistake, not the worksheet's.
 */
export async function runWorksheet(path: string, options: RunOptions = {}): Promise<RunSummary> {
  const started = performance.now();
  const timings: [string, number][] = [];
  let clock = started;
  const step = (label: string) => {
    const now = performance.now();
    timings.push([label, now - clock]);
    clock = now;
  };
  const text = await Deno.readTextFile(path);
  const name = worksheetName(path);
  const outDir = options.outDir ?? "reports";
  const folderName = options.reportName ?? await reportFolderName(outDir, name, path);
  const reportDir = join(outDir, folderName);
  const date = runDate(options.date);
  const libraryModule = await libraryBundle();
  const existing = await readManifest(reportDir);
  // The sandbox child starts now and boots while the worksheet is parsed, unless the report
  // was made from this very text (the run is then most likely skipped). Once started, it runs.
  const sandbox = options.force || existing?.provenance.worksheetSha256 !== sha256Hex(text)
    ? await startSandbox(path, { ...options, ...(libraryModule ? { libraryModule } : {}) })
    : undefined;
  step("find the bundled library, start the sandbox child");
  let running: Promise<ExecutionResult> | undefined;
  let finished = false;
  try {
    const { parseWorksheet, WorksheetError } = await parser();
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
        meta: { title: reportName(path), document: "", revision: "", signoff: [] },
        params: {},
        paramRules: {},
        requirements: [],
        parts: [],
      };
    }
    step("read and parse the worksheet, apply settings");
    // Figures are drawn as they arrive, while the worksheet still computes (write.ts
    // takes a draft only when its context is unchanged at the end).
    const drafts = new Map<Exhibit, FigureDraft>();
    let drafting: Promise<void> = Promise.resolve();
    const onExhibit = (exhibit: Exhibit, progress: RunProgress) => {
      if (exhibit.type !== "figure") return;
      drafting = drafting.then(async () => {
        const { draftFigure } = await reportWriter();
        drafts.set(exhibit, await draftFigure(exhibit, progress));
      }).catch(() => {}); // a figure that cannot be drafted is drawn with the report
    };
    const execute = (early?: Sandbox, onInputSent?: () => void) =>
      executeWorksheet(worksheet, params, {
        ...options,
        ...(libraryModule ? { libraryModule } : {}),
        ...(early ? { sandbox: early } : {}),
        ...(onInputSent ? { onInputSent } : {}),
        onExhibit,
      });
    // A child started early runs now: the text differs from the report's (or the run is
    // forced), so the report cannot stand. The hashing below overlaps with the run.
    if (sandbox !== undefined && problem === undefined) {
      let sent = () => {};
      const inputSent = new Promise<void>((resolve) => (sent = resolve));
      running = execute(sandbox, sent);
      await Promise.race([inputSent, running]);
      step("give the sandbox child its input");
    }
    const writer = reportWriter();
    const { approvalsPath, readApprovals } = await approvalsModule();

    const inputs = sha256Hex(
      [text, JSON.stringify(params), date, hashOfTool(), hashOfData(path)].join("\n"),
    );
    const stale = options.force ? "forced" : await staleBecause(reportDir, existing, inputs);
    step("hash the inputs, check the existing report");
    const approvals = readApprovals(approvalsPath(path));
    if (running === undefined && stale === undefined && existing !== undefined) {
      // Up to date: only the approvals shown may have changed (they are outside the record).
      await (await writer).refreshApprovals(reportDir, approvals);
      const summary: RunSummary = {
        path,
        name: folderName,
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
      finished = true;
      return summary;
    }

    if (running !== undefined) {
      // The page's prose does not depend on the run: rendered while the child computes.
      const { proseToHtml } = await proseRenderer();
      for (const part of worksheet.parts) if (part.kind === "prose") proseToHtml(part.markdown);
      step("render the prose while the child computes");
    }
    const execution: ExecutionResult = running !== undefined
      ? await running
      : problem === undefined
      ? await execute()
      : { outcome: "rejected", requirements: [], blocks: [], problem, durationMs: 0 };
    finished = true;
    step("run the worksheet in its sandbox child");
    if (execution.timings) {
      const t = execution.timings;
      const lines: [string, number | undefined][] = [
        ["  child: Deno start to harness", t.harnessStarted],
        [
          "  child: waiting for the input (worker and library loading)",
          sub(t.inputRead, t.harnessStarted),
        ],
        ["  child: input to first block (worksheet module loaded)", sub(t.firstBlock, t.inputRead)],
        ["  child: worksheet code", sub(t.done, t.firstBlock)],
      ];
      for (const [label, ms] of lines) if (ms !== undefined) timings.push([label, ms]);
    }
    const { writeReport } = await writer;
    await drafting;
    const report = await writeReport(outDir, folderName, {
      worksheet,
      params,
      overridden,
      execution: withDisplayPath(execution, path, name.display),
      inputs,
      worksheetId: name.identity,
      approvals,
      drafts,
      provenance: {
        worksheetPath: name.display,
        worksheetSha256: sha256Hex(text),
        tapsheetVersion: tapsheetVersion(),
        toolSha256: hashOfTool(),
        platform: `${Deno.build.os} ${Deno.build.arch}`,
        command: reproducingCommand(name.display, date, params, overridden),
        denoVersion: Deno.version.deno,
        packages: packageVersions(),
        date,
      },
    }, (label, ms) => timings.push([label, ms]));
    clock = performance.now();
    const rows = requirementRows(execution);
    const summary: RunSummary = {
      path,
      name: folderName,
      reportDir: report.dir,
      verdict: report.verdict,
      outcome: execution.outcome,
      met: rows.filter((r) => r.check?.result.met === true).length,
      checked: rows.length,
      fingerprint: report.fingerprint,
      skipped: false,
      durationMs: performance.now() - started,
    };
    if (existing !== undefined && stale !== "inputs changed" && stale !== "forced") {
      summary.rerunBecause = stale;
    }
    if (execution.problem) summary.problem = execution.problem;
    if (options.timings) summary.timings = timings;
    return summary;
  } finally {
    // A child the run did not hand to executeWorksheet (rejected, or a settings error), or
    // one still running when the run ended by an error: ended, its folder removed.
    if (sandbox !== undefined && (running === undefined || !finished)) {
      await disposeSandbox(sandbox);
      await running?.catch(() => {});
    }
  }
}

function sub(a: number | undefined, b: number | undefined): number | undefined {
  return a === undefined || b === undefined ? undefined : a - b;
}
