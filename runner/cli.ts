// The command line: tapsheet run | check | new | verify | watch | compare | help.
//
// Only what `run` needs to start a worksheet's sandbox child is imported
// here; everything else is imported where a command needs it, so that the
// child starts early and boots on another core while the rest loads.
import { basename, dirname, join, resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { projectRoot, stopAllRuns } from "./execute.ts";
import { messages } from "./messages.ts";
import { ParamError } from "./params.ts";
import { reportFolderName, type RunOptions, type RunSummary, runWorksheet } from "./run.ts";
import { runDate, worksheetName } from "./provenance.ts";
import type { Verification } from "./verify.ts";

/** Exit codes, documented in `tapsheet run --help`. */
export const exitCodes = { met: 0, notMet: 1, failed: 2 } as const;

class UsageError extends Error {}

const colour = !Deno.noColor && Deno.stdout.isTerminal();
const paint = (code: string, text: string) => (colour ? `\x1b[${code}m${text}\x1b[0m` : text);

/** Expand folders into their *.md files (not recursive), keeping the given order. */
async function collect(paths: string[]): Promise<string[]> {
  if (paths.length === 0) throw new UsageError(messages.cli.noWorksheets);
  const out: string[] = [];
  for (const path of paths) {
    let info: Deno.FileInfo;
    try {
      info = await Deno.stat(path);
    } catch {
      throw new UsageError(messages.cli.notFound(path));
    }
    if (info.isDirectory) {
      const names: string[] = [];
      let subfolders = 0;
      for await (const e of Deno.readDir(path)) {
        if (e.isDirectory) subfolders++;
        if (e.isFile && e.name.endsWith(".md") && e.name.toLowerCase() !== "readme.md") {
          names.push(e.name);
        }
      }
      if (names.length === 0) throw new UsageError(messages.cli.noWorksheetsIn(path, subfolders));
      out.push(...names.sort().map((n) => join(path, n)));
    } else if (!/\.md$/i.test(path)) {
      throw new UsageError(messages.cli.notMarkdown(path));
    } else out.push(path);
  }
  return out;
}

/** Options an earlier version used, with the name they have now. */
const renamedOptions: Record<string, string> = { "--params": "--settings" };

interface Parsed {
  positional: string[];
  options: Map<string, string[]>;
}

function parseArgs(
  command: string,
  args: string[],
  valued: string[],
  flags: string[],
): Parsed {
  const positional: string[] = [];
  const options = new Map<string, string[]>();
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (!arg.startsWith("--")) {
      positional.push(arg);
      continue;
    }
    const [name, inline] = arg.includes("=") && !arg.startsWith("--set=")
      ? [arg.slice(0, arg.indexOf("=")), arg.slice(arg.indexOf("=") + 1)]
      : arg.startsWith("--set=")
      ? ["--set", arg.slice(6)]
      : [arg, undefined];
    if (name in renamedOptions) {
      throw new UsageError(messages.cli.renamedOption(name, renamedOptions[name]!));
    }
    if (flags.includes(name)) {
      options.set(name, ["true"]);
    } else if (valued.includes(name)) {
      const value = inline ?? args[++i];
      if (value === undefined) throw new UsageError(messages.cli.missingValue(name));
      options.set(name, [...(options.get(name) ?? []), value]);
    } else {
      throw new UsageError(messages.cli.unknownOption(name, command));
    }
  }
  return { positional, options };
}

function positiveInteger(name: string, text: string | undefined): number | undefined {
  const v = positiveNumber(name, text);
  if (v !== undefined && !Number.isInteger(v)) {
    throw new UsageError(messages.cli.badNumber(name, text!));
  }
  return v;
}

/**
 * The report folder of each worksheet of one run, chosen in order before any
 * runs, so two same-named worksheets of one batch never take the same folder.
 */
async function reportFolderNames(outDir: string, files: string[]): Promise<string[]> {
  const taken = new Set<string>();
  const out: string[] = [];
  for (const file of files) {
    const name = await reportFolderName(outDir, worksheetName(file), file, taken);
    taken.add(name);
    out.push(name);
  }
  return out;
}

function positiveNumber(name: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (!(v > 0) || !Number.isFinite(v)) throw new UsageError(messages.cli.badNumber(name, text));
  return v;
}

/** Settings from a YAML or JSON file of name: value pairs. */
async function readParamsFile(path: string): Promise<Record<string, unknown>> {
  let text: string;
  try {
    text = await Deno.readTextFile(path);
  } catch {
    throw new UsageError(messages.cli.paramsFileMissing(path));
  }
  let parsed: unknown;
  try {
    const { parse: parseYaml } = await import("./parsers.ts");
    parsed = parseYaml(text);
  } catch (error) {
    const detail = error instanceof Error ? error.message.split("\n")[0]! : String(error);
    throw new UsageError(messages.cli.paramsFileYaml(path, detail));
  }
  if (parsed === null || typeof parsed !== "object" || Array.isArray(parsed)) {
    throw new UsageError(messages.cli.badParamsFile(path));
  }
  return parsed as Record<string, unknown>;
}

/** The output folder may be missing (it is made) but must not be a file. */
async function checkOutFolder(path: string): Promise<void> {
  try {
    if (!(await Deno.stat(path)).isDirectory) throw new UsageError(messages.cli.outIsFile(path));
  } catch (error) {
    if (error instanceof UsageError) throw error;
  }
}

/** A calendar date YYYY-MM-DD that exists (2026-02-30 does not). */
function checkedDate(text: string): string {
  const ok = /^\d{4}-\d{2}-\d{2}$/.test(text) &&
    !Number.isNaN(Date.parse(`${text}T00:00:00Z`)) &&
    new Date(`${text}T00:00:00Z`).toISOString().slice(0, 10) === text;
  if (!ok) throw new UsageError(messages.cli.badDate(text));
  return text;
}

function formatDuration(ms: number): string {
  return ms < 1000 ? `${Math.round(ms)} ms` : `${(ms / 1000).toFixed(1)} s`;
}

function verdictLabel(s: RunSummary): string {
  switch (s.verdict) {
    case "met":
      return paint("32", "met");
    case "not met":
      return paint("31", "not met");
    case "incomplete":
      return paint("33", "failed");
    default:
      return "no requirements";
  }
}

async function commandRun(args: string[]): Promise<number> {
  const { positional, options } = parseArgs(
    "run",
    args,
    ["--out", "--set", "--settings", "--timeout", "--memory", "--date", "--json", "--jobs"],
    ["--help", "--pdf", "--force", "--exit-zero", "--timings"],
  );
  if (options.has("--help")) {
    console.log(messages.cli.runUsage);
    return 0;
  }
  const date = options.get("--date")?.at(-1);
  if (date !== undefined) checkedDate(date);
  const paramsFile = options.get("--settings")?.at(-1);
  const paramsFromFile = paramsFile === undefined ? {} : await readParamsFile(paramsFile);
  const outDir = options.get("--out")?.at(-1) ?? "reports";
  await checkOutFolder(outDir);
  const runOptions: RunOptions = {
    outDir,
    settings: options.get("--set") ?? [],
    paramsFromFile,
  };
  const timeout = positiveNumber("--timeout", options.get("--timeout")?.at(-1));
  if (timeout !== undefined) runOptions.timeoutSeconds = timeout;
  const memory = positiveNumber("--memory", options.get("--memory")?.at(-1));
  if (memory !== undefined) runOptions.memoryMb = memory;
  if (date !== undefined) runOptions.date = date;
  if (options.has("--force")) runOptions.force = true;
  if (options.has("--timings")) runOptions.timings = true;

  const files = await collect(positional);
  // With --json -, standard output carries the JSON alone; the progress lines go to standard error.
  const jsonToStdout = options.get("--json")?.at(-1) === "-";
  const say = jsonToStdout ? console.error : console.log;
  const names = await reportFolderNames(runOptions.outDir!, files);
  // One worksheet per core at a time: while one report's figures are drawn on this
  // thread, the next worksheet's sandbox child computes on another core.
  const jobs = Math.max(
    1,
    Math.min(
      positiveInteger("--jobs", options.get("--jobs")?.at(-1)) ?? navigator.hardwareConcurrency,
      files.length,
    ),
  );
  const summaries: RunSummary[] = new Array(files.length);
  let next = 0;
  const runNext = async (): Promise<void> => {
    while (next < files.length) {
      const i = next++;
      const summary = await runWorksheet(files[i]!, { ...runOptions, reportName: names[i]! });
      summaries[i] = summary;
      await report(files[i]!, summary);
    }
  };
  const report = async (file: string, summary: RunSummary) => {
    const p = summary.problem;
    say(
      `${verdictLabel(summary)}  ${file}  ${summary.met}/${summary.checked} requirements met  ${
        summary.skipped ? "unchanged, not re-run" : formatDuration(summary.durationMs)
      }  → ${join(summary.reportDir, "index.html")}`,
    );
    if (p) {
      console.error(`  ${p.path}:${p.line}${p.column ? `:${p.column}` : ""}: ${p.message}`);
      if (p.excerpt) console.error(`  ${p.line} | ${p.excerpt}`);
    }
    if (summary.rerunBecause) console.error(`  ${messages.cli.rerunBecause(summary.rerunBecause)}`);
    if (summary.timings) printTimings(summary.timings, say);
    if (options.has("--pdf")) await writePdf(summary.reportDir, say);
  };
  await Promise.all(Array.from({ length: jobs }, runNext));
  if (summaries.length > 1) printSummary(summaries, say);
  const { writeReportsIndex } = await import("../render/index_page.ts");
  await writeReportsIndex(runOptions.outDir!);
  const json = options.get("--json")?.at(-1);
  if (json !== undefined) {
    const results = JSON.stringify(
      summaries.map((s) => ({
        worksheet: s.path,
        report: join(s.reportDir, "index.html"),
        verdict: s.verdict,
        outcome: s.outcome,
        requirementsMet: s.met,
        requirementsChecked: s.checked,
        durationMs: Math.round(s.durationMs),
        fingerprint: s.fingerprint,
        problem: s.problem ?? null,
      })),
      null,
      2,
    );
    if (json === "-") console.log(results);
    else await Deno.writeTextFile(json, results + "\n");
  }
  if (summaries.some((s) => s.verdict === "incomplete")) return exitCodes.failed;
  if (summaries.some((s) => s.verdict === "not met") && !options.has("--exit-zero")) {
    return exitCodes.notMet;
  }
  return exitCodes.met;
}

/** Print a report to report.pdf beside it with headless Chromium, when installed. */
async function writePdf(reportDir: string, say: (line: string) => void): Promise<void> {
  const { findChromium, printToPdf } = await import("./chromium.ts");
  if (findChromium() === undefined) {
    console.error(`  ${messages.cli.noChromium}`);
    return;
  }
  const pdf = await printToPdf(pathToFileURL(resolve(reportDir, "index.html")).href);
  const temp = join(reportDir, `.report.pdf.${crypto.randomUUID().slice(0, 8)}`);
  await Deno.writeFile(temp, pdf);
  await Deno.rename(temp, join(reportDir, "report.pdf"));
  say(`  → ${join(reportDir, "report.pdf")}`);
}

/** Where the time of one run went, one step a line. */
function printTimings(timings: [string, number][], say: (line: string) => void): void {
  const width = Math.max(...timings.map(([label]) => label.length));
  say(
    `    ${"start Deno and load the command line".padEnd(width)}  ${
      loadedAt.toFixed(1).padStart(7)
    } ms`,
  );
  for (const [label, ms] of timings) {
    say(`    ${label.padEnd(width)}  ${ms.toFixed(1).padStart(7)} ms`);
  }
  say(
    `    ${"process start to now".padEnd(width)}  ${performance.now().toFixed(1).padStart(7)} ms`,
  );
}

function printSummary(summaries: RunSummary[], say: (line: string) => void): void {
  const rows = summaries.map((s) => [
    s.name,
    s.verdict === "incomplete" ? "failed" : s.verdict,
    `${s.met}/${s.checked}`,
    formatDuration(s.durationMs),
  ]);
  const head = ["Worksheet", "Verdict", "Met", "Time"];
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(widths[i]!)).join("  ").trimEnd();
  say("\n" + line(head));
  say(widths.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) say(line(r));
}

/** Type-check worksheets without running them. */
async function commandCheck(args: string[]): Promise<number> {
  const { positional, options } = parseArgs("check", args, [], ["--help"]);
  if (options.has("--help")) {
    console.log(messages.cli.checkUsage);
    return 0;
  }
  const files = await collect(positional);
  const { parseWorksheet, WorksheetError } = await import("./parse.ts");
  const { assembleWorksheet } = await import("./assemble.ts");
  const problems = new Map<string, string[]>(files.map((f) => [f, []]));
  const modules: { file: string; source: string; module: string }[] = [];
  for (const file of files) {
    try {
      const ws = parseWorksheet(file, await Deno.readTextFile(file));
      const assembly = assembleWorksheet(ws);
      for (const p of assembly.problems) {
        problems.get(file)!.push(
          `${p.path}:${p.line}:${p.column ?? 1}: ${p.message}\n  ${p.line} | ${p.excerpt ?? ""}`,
        );
      }
      if (assembly.problems.length === 0) {
        modules.push({ file, source: ws.source, module: assembly.module });
      }
    } catch (error) {
      if (!(error instanceof WorksheetError)) throw error;
      const p = error.problem;
      problems.get(file)!.push(`${p.path}:${p.line}: ${p.message}`);
    }
  }
  for (const [file, found] of await typeCheck(modules)) problems.get(file)!.push(...found);
  let failed = 0;
  for (const file of files) {
    const found = problems.get(file)!;
    if (found.length === 0) console.log(`${paint("32", "ok")}  ${file}`);
    else {
      failed++;
      console.log(`${paint("31", "error")}  ${file}`);
      for (const p of found) console.error(`  ${p}`);
    }
  }
  return failed === 0 ? 0 : exitCodes.failed;
}

/**
 * Type-check assembled worksheets in one `deno check` run (one compiler
 * start for all of them) and map each diagnostic to its worksheet line.
 */
async function typeCheck(
  modules: { file: string; source: string; module: string }[],
): Promise<Map<string, string[]>> {
  const found = new Map<string, string[]>();
  if (modules.length === 0) return found;
  const { blockMarker } = await import("./assemble.ts");
  const dir = await Deno.makeTempDir({ prefix: "tapsheet-check-" });
  try {
    const byUrl = new Map<string, (typeof modules)[number]>();
    const paths: string[] = [];
    for (const [i, m] of modules.entries()) {
      const path = join(dir, `${i}-${basename(m.file).replace(/\.md$/i, "")}.ts`);
      // The harness defines the block marker at run time; declare it for the checker.
      // Appended after the last line, so worksheet line numbers are unchanged.
      await Deno.writeTextFile(
        path,
        `${m.module}declare function ${blockMarker}(index: number): void;\n`,
      );
      byUrl.set(pathToFileURL(path).href, m);
      paths.push(path);
    }
    const out = await new Deno.Command(Deno.execPath(), {
      args: ["check", "--quiet", `--config=${join(projectRoot, "deno.json")}`, ...paths],
      env: { NO_COLOR: "1", RUST_BACKTRACE: "0" },
      stdout: "piped",
      stderr: "piped",
    }).output();
    if (out.success) return found;
    let text = new TextDecoder().decode(out.stderr);
    const re = /(TS\d+ \[ERROR\]|SyntaxError): ([^\n]*)[\s\S]*?at (file:\/\/\S+?):(\d+):(\d+)/g;
    let matched = false;
    for (let m = re.exec(text); m !== null; m = re.exec(text)) {
      const source = byUrl.get(m[3]!);
      if (!source) continue;
      matched = true;
      const line = Number(m[4]);
      const excerpt = source.source.split("\n")[line - 1] ?? "";
      const list = found.get(source.file) ?? [];
      list.push(
        `${source.file}:${line}:${m[5]}: ${m[2]} (${
          m[1]!.replace(" [ERROR]", "")
        })\n  ${line} | ${excerpt}`,
      );
      found.set(source.file, list);
    }
    if (!matched) {
      for (const [url, m] of byUrl) text = text.replaceAll(url, m.file);
      found.set(modules[0]!.file, [text.trim()]);
    }
    return found;
  } finally {
    await Deno.remove(dir, { recursive: true }).catch(() => {});
  }
}

/** Start a worksheet from a template. */
async function commandNew(args: string[]): Promise<number> {
  const { positional, options } = parseArgs("new", args, [], ["--help", "--force"]);
  const templates = join(projectRoot, "worksheets", "templates");
  const available: string[] = [];
  try {
    for await (const e of Deno.readDir(templates)) {
      if (e.name.endsWith(".md")) available.push(e.name.replace(/\.md$/, ""));
    }
  } catch {
    // no templates folder
  }
  available.sort();
  if (options.has("--help") || positional.length !== 2) {
    console.log(messages.cli.newUsage(available));
    return options.has("--help") ? 0 : exitCodes.failed;
  }
  const [template, target] = positional as [string, string];
  if (!available.includes(template)) {
    throw new UsageError(messages.cli.noTemplate(template, available));
  }
  if (!options.has("--force")) {
    try {
      await Deno.stat(target);
      throw new UsageError(messages.cli.exists(target));
    } catch (e) {
      if (e instanceof UsageError) throw e;
    }
  }
  await Deno.mkdir(dirname(resolve(target)), { recursive: true });
  await Deno.copyFile(join(templates, `${template}.md`), target);
  console.log(messages.cli.wroteTemplate(target, template));
  return 0;
}

/**
 * Prove a report is what its worksheet produces: every file against its
 * manifest, then a fresh run compared byte for byte (runner/verify.ts).
 */
async function commandVerify(args: string[]): Promise<number> {
  const { positional, options } = parseArgs("verify", args, ["--out"], ["--help"]);
  if (options.has("--help") || positional.length !== 1) {
    console.log(messages.cli.verifyUsage);
    return options.has("--help") ? 0 : exitCodes.failed;
  }
  const file = positional[0]!;
  await collect([file]);
  const outDir = options.get("--out")?.at(-1) ?? "reports";
  const { NoReportError, verifyReport } = await import("./verify.ts");
  let v: Verification;
  try {
    v = await verifyReport(file, outDir);
  } catch (error) {
    if (error instanceof NoReportError) throw new UsageError(messages.cli.noReport(error.message));
    throw error;
  }
  const m = messages.cli.verify;
  const lines: string[] = [];
  if (!v.folder.manifestIntact) lines.push(m.manifestEdited);
  for (const path of v.folder.changed) lines.push(m.changed(path));
  for (const path of v.folder.missing) lines.push(m.missing(path));
  for (const path of v.folder.added) lines.push(m.added(path));
  if (v.rerunProblem !== undefined) lines.push(m.cannotRerun(v.rerunProblem));
  for (const path of v.differFromRerun) lines.push(m.differsFromRerun(path));
  for (const path of v.onlyInReport) lines.push(m.notProduced(path));
  for (const path of v.onlyInRerun) lines.push(m.notInReport(path));
  for (const path of v.unchecked) lines.push(m.unchecked(path));
  for (const a of v.approvals) lines.push(m.approval(a));
  console.log(
    v.matches
      ? `${paint("32", "matches")}  ${m.matches(file, v.reportDir, v.manifest.fingerprint)}`
      : `${paint("31", "differs")}  ${m.differs(file, v.reportDir)}`,
  );
  for (const line of lines) console.log(`  ${line}`);
  // An approval of this revision that no longer holds fails verification, loudly.
  const broken = v.approvals.filter((a) => a.state === "void" || a.state === "bad signature");
  if (broken.length > 0) console.log(`${paint("31", "VOID")}  ${m.voided(broken.length)}`);
  return v.matches && broken.length === 0 ? 0 : exitCodes.notMet;
}

/** Record an approval of a report, bound to its fingerprint (runner/approve.ts). */
async function commandApprove(args: string[]): Promise<number> {
  const { positional, options } = parseArgs(
    "approve",
    args,
    ["--out", "--role", "--name", "--date", "--key"],
    ["--help"],
  );
  if (options.has("--help")) {
    console.log(messages.cli.approveUsage);
    return 0;
  }
  const role = options.get("--role")?.at(-1);
  const name = options.get("--name")?.at(-1);
  if (positional.length !== 1 || !role || !name) {
    throw new UsageError(messages.cli.approveNeeds);
  }
  const file = positional[0]!;
  await collect([file]);
  const keyFile = options.get("--key")?.at(-1);
  let privateKeyPem: string | undefined;
  if (keyFile !== undefined) {
    try {
      privateKeyPem = await Deno.readTextFile(keyFile);
    } catch {
      throw new UsageError(messages.cli.noKey(keyFile));
    }
  }
  const date = options.get("--date")?.at(-1);
  const { ApproveError, approveReport } = await import("./approve.ts");
  const { ApprovalsError } = await import("../record/approvals.ts");
  try {
    const r = await approveReport({
      worksheet: file,
      outDir: options.get("--out")?.at(-1) ?? "reports",
      role,
      name,
      date: date === undefined ? runDate() : checkedDate(date),
      ...(privateKeyPem === undefined ? {} : { privateKeyPem }),
    });
    console.log(messages.cli.approved(r.approval, r.file, r.reportDir));
    return 0;
  } catch (error) {
    if (error instanceof ApproveError || error instanceof ApprovalsError) {
      throw new UsageError(error.message);
    }
    throw error;
  }
}

/**
 * Compare two design records (report folders, worksheets, or worksheets at a
 * git revision) and write a comparison page (runner/compare.ts). Exit code 1
 * when anything a requirement covers got worse (record/compare.ts says what
 * that means), so CI can gate a merge on it.
 */
async function commandCompare(args: string[]): Promise<number> {
  const { positional, options } = parseArgs("compare", args, ["--out"], ["--help"]);
  if (options.has("--help") || positional.length !== 2) {
    console.log(messages.compare.usage);
    return options.has("--help") ? 0 : exitCodes.failed;
  }
  const [oldArg, newArg] = positional as [string, string];
  const outDir = options.get("--out")?.at(-1);
  const { changeLines, CompareInputError, compareSides, worseLines } = await import("./compare.ts");
  let result: Awaited<ReturnType<typeof compareSides>>;
  try {
    result = await compareSides(oldArg, newArg, {
      ...(outDir === undefined ? {} : { outDir }),
      say: (line) => console.error(line),
    });
  } catch (error) {
    if (error instanceof CompareInputError) throw new UsageError(error.message);
    throw error;
  }
  const { comparison: c, dir, notes } = result;
  for (const note of notes) console.error(`  ${note}`);
  const worse = worseLines(c.worse);
  const changes = changeLines(c);
  const m = messages.compare;
  const word = worse.length > 0
    ? paint("31", m.headline.worse)
    : changes.length > 0
    ? paint("32", m.headline.changed)
    : paint("32", m.headline.unchanged);
  console.log(
    `${word}  ${c.old.label} → ${c.new.label}  ${m.counts(worse.length, changes.length)}  ${
      m.wrote(join(dir, "index.html"))
    }`,
  );
  for (const line of [...worse, ...changes]) console.log(`  ${line}`);
  return worse.length > 0 ? exitCodes.notMet : 0;
}

/** Quiet time after the last change before a re-run starts, in ms. */
const watchDebounceMs = 150;

/**
 * Re-run a worksheet whenever it or a file under its data/ folder changes.
 * Runs until interrupted. The watcher is registered before the first run and
 * before the "Watching" line, so no save is lost: changes during a run queue
 * exactly one more run, and a burst of saves within the debounce time makes one.
 */
async function commandWatch(args: string[]): Promise<number> {
  const { positional, options } = parseArgs("watch", args, ["--out", "--set", "--date"], [
    "--help",
  ]);
  if (options.has("--help") || positional.length !== 1) {
    console.log(messages.cli.watchUsage);
    return options.has("--help") ? 0 : exitCodes.failed;
  }
  const file = positional[0]!;
  await collect([file]);
  const runOptions: RunOptions = {
    outDir: options.get("--out")?.at(-1) ?? "reports",
    settings: options.get("--set") ?? [],
  };
  await checkOutFolder(runOptions.outDir!);
  const date = options.get("--date")?.at(-1);
  if (date !== undefined) runOptions.date = checkedDate(date);
  const worksheet = resolve(file);
  const folder = dirname(worksheet);
  const data = join(folder, "data");
  const watcher = Deno.watchFs(folder, { recursive: true });

  const once = async () => {
    const stamp = () => new Date().toISOString().slice(11, 19);
    try {
      await Deno.stat(worksheet);
    } catch {
      // Editors that save by rename delete the file for a moment; its return re-runs it.
      console.log(`${stamp()}  ${messages.cli.watchedFileGone(file)}`);
      return;
    }
    console.log(`${stamp()}  ${messages.cli.watchRunning(file)}`);
    const s = await runWorksheet(file, runOptions);
    const { writeReportsIndex } = await import("../render/index_page.ts");
    await writeReportsIndex(runOptions.outDir!);
    console.log(
      `${stamp()}  ${verdictLabel(s)}  ${file}  ${s.met}/${s.checked} requirements met  ${
        s.skipped ? "unchanged" : formatDuration(s.durationMs)
      }`,
    );
    if (s.problem) {
      console.error(`  ${s.problem.path}:${s.problem.line}: ${s.problem.message}`);
    }
  };
  let dirty = false;
  let running: Promise<void> | undefined;
  const start = () => {
    if (running) {
      dirty = true; // the run under way saw the old text: one more run follows it
      return;
    }
    running = (async () => {
      do {
        dirty = false;
        await once().catch((e) => console.error(`tapsheet: ${e.message}`));
      } while (dirty);
    })().finally(() => (running = undefined));
  };
  let timer: ReturnType<typeof setTimeout> | undefined;
  const relevant = (path: string) => {
    const p = resolve(path);
    // data/ itself too: a file written into a folder just made can come before its watch.
    return p === worksheet || p === data || p.startsWith(data + "/");
  };

  start();
  await running;
  console.log(messages.cli.watching(folder));
  for await (const event of watcher) {
    if (!event.paths.some(relevant)) continue;
    clearTimeout(timer);
    timer = setTimeout(start, watchDebounceMs);
  }
  return 0;
}

/** When the command line's own modules had loaded (ms since the process started). */
const loadedAt = performance.now();

/** Entry point; returns the exit code. */
export async function main(args: string[]): Promise<number> {
  const [command, ...rest] = args;
  try {
    switch (command) {
      case "run":
        return await commandRun(rest);
      case "check":
        return await commandCheck(rest);
      case "new":
        return await commandNew(rest);
      case "verify":
        return await commandVerify(rest);
      case "approve":
        return await commandApprove(rest);
      case "watch":
        return await commandWatch(rest);
      case "compare":
        return await commandCompare(rest);
      case undefined:
      case "help":
      case "--help":
      case "-h":
        if (rest[0] === "run") console.log(messages.cli.runUsage);
        else if (rest[0] === "approve") console.log(messages.cli.approveUsage);
        else if (rest[0] === "compare") console.log(messages.compare.usage);
        else console.log(messages.cli.usage);
        return command === undefined ? exitCodes.failed : 0;
      default:
        throw new UsageError(messages.cli.unknownCommand(command));
    }
  } catch (error) {
    const { ApprovalsError } = await import("../record/approvals.ts");
    if (
      error instanceof UsageError || error instanceof ParamError || error instanceof ApprovalsError
    ) {
      console.error(`tapsheet: ${error.message}`);
      return exitCodes.failed;
    }
    // The file system refused something the command line asked for (a folder
    // that cannot be written, a file that vanished): say so, without a trace.
    if (Object.values(Deno.errors).some((kind) => error instanceof kind)) {
      console.error(`tapsheet: ${(error as Error).message}`);
      return exitCodes.failed;
    }
    throw error;
  }
}

/**
 * Ctrl-C, a terminal hang-up or a kill: stop the sandbox children and remove
 * their temporary folders before exiting (128 + the signal's number). A report
 * being written is staged in a hidden folder, which the next run clears.
 */
function stopOnSignals(): void {
  const signals: [Deno.Signal, number][] = [["SIGINT", 130], ["SIGTERM", 143], ["SIGHUP", 129]];
  for (const [signal, code] of signals) {
    Deno.addSignalListener(signal, () => {
      stopAllRuns();
      console.error(messages.cli.interrupted(signal));
      Deno.exit(code);
    });
  }
}

if (import.meta.main) {
  stopOnSignals();
  Deno.exit(await main(Deno.args));
}
