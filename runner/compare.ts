// `compare`: two design records side by side. Each side is a report folder, a
// worksheet's working copy, or a worksheet at a git revision (the worksheet
// and its data/ folder written from `git show` into a temporary folder of the
// same layout); worksheets are run in the sandbox into a temporary output
// folder. The records are then compared by record/compare.ts and the page
// written by render/compare_write.ts.
import { makeScratchFolder } from "./scratch.ts";
import { basename, dirname, join, relative, resolve, sep } from "node:path";
import { checkReportFolder, folderIsIntact } from "../record/manifest.ts";
import {
  compareRecords,
  type Comparison,
  type RowComparison,
  type Worsening,
} from "../record/compare.ts";
import { NotAReportError, readReportRecord, type ReportRecord } from "../record/report_record.ts";
import { defaultDesign, type ParamValue } from "../record/types.ts";
import { formatNumber } from "../render/report.ts";
import { comparisonFile, writeComparison } from "../render/compare_write.ts";
import { messages } from "./messages.ts";
import { runDate } from "./provenance.ts";
import { runWorksheet } from "./run.ts";

/** A side that cannot be read or fetched: the command line's mistake, exit code 2. */
export class CompareInputError extends Error {
  override name = "CompareInputError";
}

/** What a side argument names. */
export type SideArgument =
  | { kind: "folder"; path: string }
  | { kind: "worksheet"; path: string }
  | { kind: "revision"; path: string; revision: string };

/**
 * Read a side argument: an existing folder is a report folder, an existing
 * `*.md` file the working copy, and `path.md@REV` the worksheet at revision
 * REV (the first ".md@" splits it, so REV may hold "@", as in HEAD@{1}).
 * @throws {CompareInputError} When it is none of these.
 */
export async function sideArgument(arg: string): Promise<SideArgument> {
  const info = await Deno.stat(arg).catch(() => undefined);
  if (info?.isDirectory) return { kind: "folder", path: arg };
  if (info?.isFile && /\.md$/i.test(arg)) return { kind: "worksheet", path: arg };
  const m = /^(.+?\.md)@(.+)$/i.exec(arg);
  // A revision is never an option of git's: "w.md@--output=x" is refused, not passed on.
  if (m && m[2]!.startsWith("-")) {
    throw new CompareInputError(messages.compare.unknownRevision(m[2]!));
  }
  if (m) return { kind: "revision", path: m[1]!, revision: m[2]! };
  throw new CompareInputError(messages.compare.notFound(arg));
}

/** Time allowed for one git command. */
const gitTimeoutMs = 60_000;

/** Run git in `cwd`; its standard output as bytes, or undefined when it failed. */
async function git(
  cwd: string,
  args: string[],
): Promise<{ ok: true; out: Uint8Array } | { ok: false; err: string }> {
  let output: Deno.CommandOutput;
  try {
    output = await new Deno.Command("git", {
      args,
      cwd,
      stdin: "null",
      stdout: "piped",
      stderr: "piped",
      env: { GIT_TERMINAL_PROMPT: "0", LC_ALL: "C" },
      signal: AbortSignal.timeout(gitTimeoutMs),
    }).output();
  } catch (error) {
    if (error instanceof Deno.errors.NotFound) throw new CompareInputError(messages.compare.noGit);
    throw new CompareInputError(
      messages.compare.gitFailed(args[0]!, error instanceof Error ? error.message : String(error)),
    );
  }
  return output.success
    ? { ok: true, out: output.stdout }
    : { ok: false, err: new TextDecoder().decode(output.stderr).trim() };
}

const text = (bytes: Uint8Array) => new TextDecoder().decode(bytes).trim();

/** A worksheet fetched from git into a temporary folder. */
export interface FetchedWorksheet {
  /** The worksheet's path in the temporary folder. */
  path: string;
  commit: string;
  shortCommit: string;
  /** The commit's date (YYYY-MM-DD), the date the run is pinned to. */
  date: string;
  /** The worksheet's path in the repository. */
  repositoryPath: string;
}

/**
 * Write the worksheet `path` and every file of the data/ folder beside it, as
 * they are at `revision`, into `into` with the repository's layout.
 * @throws {CompareInputError} Outside a repository, for an unknown revision, a
 * worksheet missing at that revision, or a link under data/.
 */
export async function fetchAtRevision(
  path: string,
  revision: string,
  into: string,
): Promise<FetchedWorksheet> {
  const folder = dirname(resolve(path));
  const real = await Deno.realPath(folder).catch(() => undefined);
  if (real === undefined) throw new CompareInputError(messages.compare.folderMissing(folder));
  const top = await git(real, ["rev-parse", "--show-toplevel"]);
  if (!top.ok) throw new CompareInputError(messages.compare.notInRepository(path));
  const root = await Deno.realPath(text(top.out));
  const repositoryPath = relative(root, join(real, basename(path))).split(sep).join("/");
  const commit = await git(root, ["rev-parse", "--verify", "--quiet", `${revision}^{commit}`]);
  if (!commit.ok || text(commit.out) === "") {
    throw new CompareInputError(messages.compare.unknownRevision(revision));
  }
  const hash = text(commit.out);
  const worksheet = await git(root, ["cat-file", "blob", `${hash}:${repositoryPath}`]);
  if (!worksheet.ok) {
    throw new CompareInputError(messages.compare.notAtRevision(repositoryPath, revision));
  }
  const target = join(into, ...repositoryPath.split("/"));
  await Deno.mkdir(dirname(target), { recursive: true });
  await Deno.writeFile(target, worksheet.out);

  const dataFolder = [dirname(repositoryPath), "data"].filter((p) => p !== ".").join("/");
  const tree = await git(root, ["ls-tree", "-r", "-z", hash, "--", `${dataFolder}/`]);
  if (!tree.ok) throw new CompareInputError(messages.compare.gitFailed("list data/", tree.err));
  for (const entry of new TextDecoder().decode(tree.out).split("\0").filter((e) => e !== "")) {
    // "<mode> <type> <object>\t<path>"
    const tab = entry.indexOf("\t");
    const [mode, type, object] = entry.slice(0, tab).split(" ");
    const file = entry.slice(tab + 1);
    if (mode === "120000") {
      throw new CompareInputError(messages.compare.linkAtRevision(file, revision));
    }
    if (type !== "blob") continue; // a submodule: nothing the sandbox could read
    const blob = await git(root, ["cat-file", "blob", object!]);
    if (!blob.ok) throw new CompareInputError(messages.compare.gitFailed(`read ${file}`, blob.err));
    const out = join(into, ...file.split("/"));
    await Deno.mkdir(dirname(out), { recursive: true });
    await Deno.writeFile(out, blob.out);
  }
  const short = await git(root, ["rev-parse", "--short", hash]);
  const date = await git(root, ["show", "-s", "--format=%cs", hash]);
  return {
    path: target,
    commit: hash,
    shortCommit: short.ok ? text(short.out) : hash.slice(0, 7),
    date: date.ok && /^\d{4}-\d{2}-\d{2}$/.test(text(date.out)) ? text(date.out) : runDate(),
    repositoryPath,
  };
}

const scratchPrefix = "tapsheet-compare-";
/** One side, read: its label, its record, and anything the user should be told about it. */
export interface PreparedSide {
  label: string;
  record: ReportRecord;
  notes: string[];
  /** True when the side was run into the scratch folder (its folder is gone afterwards). */
  ran: boolean;
}

/**
 * Turn a side argument into a record: read a report folder as it is, or run
 * a worksheet (working copy, or fetched at a revision) into `scratch`.
 * @param side "old" or "new", for messages and the report folder's name.
 * @param say Progress lines (the runs take a second or two each).
 */
export async function prepareSide(
  arg: string,
  side: "old" | "new",
  scratch: string,
  say: (line: string) => void = () => {},
): Promise<PreparedSide> {
  const what = await sideArgument(arg);
  const notes: string[] = [];
  if (what.kind === "folder") {
    let record: ReportRecord;
    try {
      record = await readReportRecord(what.path);
    } catch (error) {
      if (error instanceof NotAReportError) {
        throw new CompareInputError(messages.compare.notAReport(what.path));
      }
      throw error;
    }
    const check = await checkReportFolder(what.path, record.manifest);
    if (!folderIsIntact(check)) {
      const files = [...check.changed, ...check.missing, ...check.added];
      notes.push(
        messages.compare.sideAltered(side, what.path, files.join(", ") || "manifest.json"),
      );
    }
    return { label: what.path, record, notes, ran: false };
  }
  let worksheet = what.path;
  let date = runDate();
  let label = what.path;
  if (what.kind === "revision") {
    const fetched = await fetchAtRevision(what.path, what.revision, join(scratch, "worksheet"));
    worksheet = fetched.path;
    date = fetched.date;
    label = `${what.path}@${what.revision} (${fetched.shortCommit})`;
  }
  say(messages.compare.running(label));
  const summary = await runWorksheet(worksheet, {
    outDir: join(scratch, "reports"),
    reportName: side,
    date,
    force: true,
  });
  if (summary.problem) {
    const p = summary.problem;
    notes.push(messages.compare.sideIncomplete(side, label, `${p.path}:${p.line}`, p.message));
  }
  return { label, record: await readReportRecord(summary.reportDir), notes, ran: true };
}

/** What `compare` did. */
export interface CompareResult {
  comparison: Comparison;
  /** The comparison folder written. */
  dir: string;
  notes: string[];
}

/** The output folder may be new, empty, or an earlier comparison (it is replaced whole). */
async function checkOut(dir: string): Promise<void> {
  const info = await Deno.stat(dir).catch(() => undefined);
  if (info === undefined) return;
  if (!info.isDirectory) throw new CompareInputError(messages.compare.outIsFile(dir));
  let empty = true;
  for await (const _ of Deno.readDir(dir)) {
    empty = false;
    break;
  }
  const earlier = await Deno.stat(join(dir, comparisonFile)).then(() => true, () => false);
  if (!empty && !earlier) throw new CompareInputError(messages.compare.outNotComparison(dir));
}

/**
 * Compare two sides and write the comparison folder.
 * @param outDir The comparison folder. @default reports/<new report name>-comparison
 */
export async function compareSides(
  oldArg: string,
  newArg: string,
  options: { outDir?: string; say?: (line: string) => void } = {},
): Promise<CompareResult> {
  // Both arguments are read before anything runs, so a mistake in the second costs no run.
  await sideArgument(oldArg);
  await sideArgument(newArg);
  if (options.outDir !== undefined) await checkOut(options.outDir);
  const scratch = await makeScratchFolder(scratchPrefix);
  try {
    const was = await prepareSide(oldArg, "old", join(scratch, "old"), options.say);
    const now = await prepareSide(newArg, "new", join(scratch, "new"), options.say);
    const comparison = compareRecords(was.record, now.record, { old: was.label, new: now.label });
    if (was.ran) delete comparison.old.dir;
    if (now.ran) delete comparison.new.dir;
    const outDir = options.outDir ?? join("reports", `${reportStem(now.record)}-comparison`);
    if (options.outDir === undefined) await checkOut(outDir);
    const dir = await writeComparison(outDir, comparison);
    const unreadable = comparison.unreadable.map((u) =>
      messages.compare.unreadable(u.side, u.path, u.reason)
    );
    return { comparison, dir, notes: [...was.notes, ...now.notes, ...unreadable] };
  } finally {
    await Deno.remove(scratch, { recursive: true }).catch(() => {});
  }
}

/** The plain name of a record's worksheet, for the default output folder. */
function reportStem(record: ReportRecord): string {
  const name = basename(record.manifest.provenance.worksheetPath).replace(/\.md$/i, "");
  return name.replace(/[^A-Za-z0-9._-]+/g, "-") || "worksheet";
}

// ---------------------------------------------------------------------------
// The summary the command line prints.

const show = (v: ParamValue | undefined) =>
  v === undefined ? "—" : Array.isArray(v) ? `[${v.join(", ")}]` : String(v);

/** A limit as the report writes it: "≥ 50 dB". */
export function limitText(l: { relation: string; limit: number; unit: string }): string {
  return `${l.relation === "atMost" ? "≤" : "≥"} ${formatNumber(l.limit)}${
    l.unit ? ` ${l.unit}` : ""
  }`;
}

/** A signed margin: "+2.1", "−1.3". */
function signed(v: number): string {
  return `${v >= 0 ? "+" : "−"}${formatNumber(Math.abs(v))}`;
}

/** "R-1", "R-1 [Q15 coefficients]", or "R-1 [16-bit → 14-bit]" for a design paired by order. */
export function rowName(r: { id: string; design?: string; oldDesign?: string }): string {
  if (r.oldDesign !== undefined) return `${r.id} [${r.oldDesign} → ${r.design}]`;
  return r.design === undefined || r.design === defaultDesign ? r.id : `${r.id} [${r.design}]`;
}

/** A quoted name, with the old one beside it when the two were paired by order. */
export function quotedName(name: string, oldName?: string): string {
  return oldName === undefined ? `"${name}"` : `"${name}" (was "${oldName}")`;
}

function margins(r: RowComparison): string {
  const [a, b] = [r.old?.margin, r.new?.margin];
  if (a === undefined || b === undefined || r.old!.unit !== r.new!.unit) return "";
  const unit = r.new!.unit ? ` ${r.new!.unit}` : "";
  return ` (margin ${signed(a)} → ${signed(b)}${unit})`;
}

/** The unit in an axis title's last parentheses: "Magnitude (dB)" → "dB". */
export function unitOf(axisTitle: string): string {
  return /\(([^()]+)\)\s*$/.exec(axisTitle)?.[1] ?? "";
}

const withUnit = (v: string, unit: string) => (unit === "" ? v : `${v} ${unit}`);

/** One line per thing that got worse. */
export function worseLines(worse: readonly Worsening[]): string[] {
  return worse.map((w) => messages.compare.worse[w.why](rowName(w)));
}

/** One line per change, in the order of the comparison page (worse rows first among verdicts). */
export function changeLines(c: Comparison): string[] {
  const m = messages.compare;
  const lines: string[] = [];
  for (const i of c.identity) lines.push(m.identity(i.field, i.old || "—", i.new || "—"));
  for (const s of c.settings) {
    if (s.old === undefined) lines.push(m.settingAdded(s.name, show(s.new)));
    else if (s.new === undefined) lines.push(m.settingRemoved(s.name, show(s.old)));
    else lines.push(m.settingChanged(s.name, show(s.old), show(s.new)));
  }
  for (const r of c.requirements) {
    if (r.change === "added") lines.push(m.requirementAdded(r.id, r.new!.text, limitText(r.new!)));
    else if (r.change === "removed") {
      lines.push(m.requirementRemoved(r.id, r.old!.text, limitText(r.old!)));
    } else {
      if (r.limit !== undefined) {
        lines.push(m.requirementLimit(r.id, limitText(r.old!), limitText(r.new!), r.limit));
      }
      if (r.textChanged) lines.push(m.requirementText(r.id, r.old!.text, r.new!.text));
    }
  }
  const renamed = new Set<string>();
  for (const r of c.rows) {
    if (r.oldDesign === undefined || renamed.has(`${r.oldDesign}\n${r.design}`)) continue;
    renamed.add(`${r.oldDesign}\n${r.design}`);
    lines.push(m.designPaired(r.oldDesign, r.design!));
  }
  for (const r of c.rows) {
    if (r.old === undefined || r.new === undefined) continue;
    if (r.verdictChanged) lines.push(m.verdict(rowName(r), r.old.status, r.new.status, margins(r)));
    else if (r.worse === "shortfall grew") lines.push(m.shortfall(rowName(r), margins(r)));
  }
  for (const l of c.listings) {
    const name = quotedName(l.name, l.oldName);
    if (!l.old) {
      lines.push(m.listingAdded(name, l.new!.count));
      continue;
    }
    if (!l.new) {
      lines.push(m.listingRemoved(name, l.old.count));
      continue;
    }
    const shape: string[] = [];
    if (l.structure.includes("count")) shape.push(`${l.old.count} → ${l.new.count} values`);
    if (l.structure.includes("layout")) shape.push(`layout ${l.old.layout} → ${l.new.layout}`);
    if (l.structure.includes("format")) {
      shape.push(`format ${l.old.format ?? "none"} → ${l.new.format ?? "none"}`);
    }
    if (l.structure.includes("codes")) {
      shape.push(l.new.hasCodes ? "codes added" : "codes dropped");
    }
    if (shape.length > 0) lines.push(m.listingShape(name, shape.join(", ")));
    const at = (i: number) =>
      l.new!.layout === "sections"
        ? `section ${Math.floor(i / 5) + 1} ${["b0", "b1", "b2", "a1", "a2"][i % 5]}`
        : `index ${i}`;
    if (l.values && l.values.changed > 0) {
      lines.push(
        m.listingValues(
          name,
          formatNumber(l.values.largest),
          at(l.values.at),
          l.values.changed,
          l.new.count,
        ),
      );
    }
    if (l.codes && l.codes.changed > 0) {
      lines.push(
        m.listingCodes(
          name,
          l.codes.largestLsb,
          at(l.codes.at),
          l.codes.changed,
          l.new.format ?? "the codes",
        ),
      );
    }
    if (
      l.codesNotCompared === "format differs" || l.codesNotCompared === "codes on one side only"
    ) {
      lines.push(m.listingCodesNotCompared(name, l.codesNotCompared));
    }
  }
  for (const k of c.costs) {
    const name = quotedName(k.name, k.oldName);
    if (!k.old) lines.push(m.costAdded(name));
    else if (!k.new) lines.push(m.costRemoved(name));
    else if (k.changed.length > 0) {
      const fields = k.changed.map((f) =>
        `${costFieldNames[f.field]} ${typeof f.old === "number" ? formatNumber(f.old) : f.old} → ${
          typeof f.new === "number" ? formatNumber(f.new) : f.new
        }`
      );
      lines.push(m.costChanged(name, fields.join(", ")));
    }
  }
  for (const e of c.exports) lines.push(m.exportChange(e.path, e.change));
  for (const f of c.figures) {
    const title = quotedName(f.title, f.oldTitle === f.title ? undefined : f.oldTitle);
    const changed = f.series.filter((s) => s.largest !== undefined && s.largest.delta !== 0);
    const worst = changed.sort((a, b) =>
      Math.abs(b.largest!.delta) - Math.abs(a.largest!.delta)
    )[0];
    if (worst) {
      lines.push(
        m.figure(
          title,
          withUnit(formatNumber(worst.largest!.delta), unitOf(f.yTitle)),
          withUnit(formatNumber(worst.largest!.at), f.normaliseTo ? "Hz" : unitOf(f.xTitle)),
          f.series.length > 1 ? ` (${worst.name})` : "",
        ),
      );
    }
    if (f.maskChanged) lines.push(m.figureMask(title));
  }
  for (const f of c.unmatchedFigures) lines.push(m.figureOnly(quotedName(f.title), f.side));
  return lines;
}

/** Plain names of the cost fields, as the report's cost table names them. */
export const costFieldNames: Record<string, string> = {
  structure: "structure",
  multipliesPerOutput: "multiplies per output",
  addsPerOutput: "adds per output",
  multipliesPerSecond: "multiplies per second",
  stateWords: "state words",
  coefficientWords: "coefficient words",
  memoryWords: "memory words",
  latencySamples: "latency samples",
  latencySeconds: "latency s",
  inputRate: "input rate Hz",
  outputRate: "output rate Hz",
  decimation: "decimation",
};
