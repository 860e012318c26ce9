// Write a report folder: figures (SVG + vega-lite spec), exports, index.html,
// manifest.json. Built in a hidden folder and swapped in whole, so a run that
// is killed at any moment leaves the previous report intact.
import { join, resolve, sep } from "node:path";
import {
  type CoefficientsExhibit,
  defaultDesign,
  type Exhibit,
  type FigureExhibit,
  isExportName,
  type RunProgress,
} from "../record/types.ts";
import { type FigureContext, figureToVegaLite } from "./figures.ts";
import {
  fingerprintPlaceholder,
  type Manifest,
  manifestFile,
  manifestText,
  pageFile,
  readManifest,
  reportFingerprint,
  sha256Hex,
  withApprovalsBlock,
} from "../record/manifest.ts";
import type { Provenance, Verdict, WrittenFile } from "../record/types.ts";
import { manifestRequirements, overallVerdict, requirementRows } from "../record/verdict.ts";
import { approvalsHtml, listingCsv, reportHtml, type ReportInput } from "./report.ts";
import { type Approval, approvalStatuses } from "../record/approvals.ts";
import { figureSvg } from "./svg.ts";

/** A short file-name stem from a title: lowercase letters, digits and dashes. */
export function slug(title: string): string {
  const s = title.toLowerCase().normalize("NFKD").replace(/[^a-z0-9]+/g, "-").replace(
    /^-+|-+$/g,
    "",
  );
  return s.slice(0, 48) || "figure";
}

/** What was written, for the command line and machine-readable results. */
export interface WrittenReport {
  dir: string;
  verdict: Verdict;
  files: WrittenFile[];
  /** Fingerprint of the report: SHA-256 over every file's path and hash. */
  fingerprint: string;
}

/** Everything needed to write one report. */
export type ReportContent =
  & Omit<ReportInput, "figures" | "exports" | "listings" | "fingerprint">
  & {
    /** SHA-256 of everything the result depends on, to skip unchanged re-runs. */
    inputs: string;
    /** Tells this worksheet apart from others of the same name (Manifest.worksheet). */
    worksheetId: string;
    /** Approvals recorded beside the worksheet; shown, but not covered by the fingerprint. */
    approvals?: Approval[];
    /** Figures made while the run was under way ({@link draftFigure}), by exhibit. */
    drafts?: ReadonlyMap<Exhibit, FigureDraft>;
  };

/**
 * A figure's specification and drawing, made from the run's exhibits so far
 * while the worksheet still computes. The report takes them only when the
 * figure's context (the worst points it marks) is the same at the end; both
 * are pure functions of the figure and its context, so they are then exactly
 * what the report would make.
 */
export interface FigureDraft {
  /** The figure's context as JSON, as it was when drafted. */
  context: string;
  spec: Record<string, unknown>;
  specText: string;
  svg: string;
}

/** The saved text of a figure's vega-lite specification. */
function specTextOf(spec: Record<string, unknown>): string {
  return JSON.stringify(spec, null, 1) + "\n";
}

/** Make a figure's specification and drawing ahead of the report (see {@link FigureDraft}). */
export async function draftFigure(
  exhibit: FigureExhibit,
  progress: RunProgress,
): Promise<FigureDraft> {
  const context = figureContext(exhibit, progress);
  const spec = figureToVegaLite(exhibit, context);
  return {
    context: JSON.stringify(context),
    spec,
    specText: specTextOf(spec),
    svg: await figureSvg(spec),
  };
}

/**
 * Render and write the report for one run into `<outDir>/<name>/`.
 */
export async function writeReport(
  outDir: string,
  name: string,
  content: ReportContent,
  /** Called with each step's name and duration in ms (for `run --timings`). */
  onStep: (step: string, ms: number) => void = () => {},
): Promise<WrittenReport> {
  let clock = performance.now();
  const step = (label: string) => {
    const now = performance.now();
    onStep(label, now - clock);
    clock = now;
  };
  await Deno.mkdir(outDir, { recursive: true });
  const finalDir = join(outDir, name);
  await recoverInterruptedSwap(outDir, name);
  const stage = join(outDir, `.${name}.partial-${crypto.randomUUID().slice(0, 8)}`);
  try {
    await Deno.mkdir(join(stage, "figures"), { recursive: true });
    const files: WrittenFile[] = [];
    const write = async (path: string, data: string, description?: string) => {
      await Deno.writeTextFile(join(stage, path), data);
      const file: WrittenFile = { path, sha256: sha256Hex(data) };
      if (description !== undefined) file.description = description;
      files.push(file);
      return file;
    };

    const figures = new Map<Exhibit, WrittenFile>();
    const previous = await previousFigures(finalDir, content.provenance);
    // Specifications first, in order; then the figures, written in order so the file list
    // stays the same.
    const drawn = content.execution.blocks.flatMap((b) =>
      b.exhibits.filter((e): e is FigureExhibit => e.type === "figure")
    ).map((exhibit, i) => {
      const stem = `figures/${String(i + 1).padStart(2, "0")}-${slug(exhibit.title)}`;
      const context = figureContext(exhibit, content.execution);
      // A draft made in the same context is what would be made now.
      const draft = content.drafts?.get(exhibit);
      const made = draft?.context === JSON.stringify(context) ? draft : undefined;
      const spec = made?.spec ?? figureToVegaLite(exhibit, context);
      const specText = made?.specText ?? specTextOf(spec);
      // A figure whose specification is unchanged is not rendered again.
      const reused = previous.get(specText);
      const svg = reused ?? made?.svg;
      const how = reused ? "reused" : made ? "drawn while the worksheet ran" : "drawn";
      return { exhibit, stem, spec, specText, svg, how };
    });
    step(`${drawn.length} figure specifications`);
    for (const [i, f] of drawn.entries()) {
      await write(`${f.stem}.vl.json`, f.specText);
      const svg = f.svg ?? await figureSvg(f.spec);
      figures.set(f.exhibit, await write(`${f.stem}.svg`, svg, f.exhibit.title));
      step(`figure ${i + 1}: ${f.how} (${f.exhibit.kind})`);
    }

    // Every coefficient listing is also a CSV file of the report: its SHA-256 is the listing's.
    const listings = new Map<Exhibit, WrittenFile>();
    const listed = content.execution.blocks.flatMap((b) =>
      b.exhibits.filter((e): e is CoefficientsExhibit => e.type === "coefficients")
    );
    if (listed.length > 0) await Deno.mkdir(join(stage, "listings"));
    for (const [i, exhibit] of listed.entries()) {
      const path = `listings/${String(i + 1).padStart(2, "0")}-${slug(exhibit.name)}.csv`;
      listings.set(exhibit, await write(path, listingCsv(exhibit), exhibit.name));
    }

    const exports: WrittenFile[] = [];
    const used = new Set<string>();
    for (const block of content.execution.blocks) {
      for (const exhibit of block.exhibits) {
        if (exhibit.type !== "export") continue;
        // Checked here too: the name came from the worksheet's side of the sandbox.
        const folder = resolve(stage, "exports");
        if (
          !isExportName(exhibit.fileName) ||
          !resolve(folder, exhibit.fileName).startsWith(folder + sep)
        ) {
          throw new Error(`Export '${exhibit.fileName}' is not a plain file name`);
        }
        if (used.size === 0) await Deno.mkdir(join(stage, "exports"));
        let fileName = exhibit.fileName;
        for (let k = 2; used.has(fileName); k++) fileName = `${k}-${exhibit.fileName}`;
        used.add(fileName);
        exports.push(await write(`exports/${fileName}`, exhibit.content, exhibit.description));
      }
    }

    // The page shows the fingerprint that covers it: hashed with a placeholder, then filled in.
    const page = reportHtml({
      ...content,
      figures,
      listings,
      exports,
      fingerprint: fingerprintPlaceholder,
    });
    const blank = sha256Hex(page);
    const fingerprint = reportFingerprint([...files, { path: pageFile, sha256: blank }], blank);
    const statuses = approvalStatuses(
      content.approvals ?? [],
      fingerprint,
      content.worksheet.meta.revision,
    );
    await write(
      pageFile,
      withApprovalsBlock(
        page.replaceAll(fingerprintPlaceholder, fingerprint),
        approvalsHtml(statuses),
      ),
    );
    step("listings, exports, page");
    const verdict = overallVerdict(content.execution);
    const manifest = manifestOf(name, content, verdict, files, fingerprint, listings);
    await Deno.writeTextFile(join(stage, manifestFile), manifestText(manifest));

    // Swap in: move the old report aside, move the new one in, drop the old one.
    const old = join(outDir, `.${name}.old`);
    await Deno.remove(old, { recursive: true }).catch(() => {});
    const hadOld = await exists(finalDir);
    if (hadOld) await Deno.rename(finalDir, old);
    await Deno.rename(stage, finalDir);
    if (hadOld) await Deno.remove(old, { recursive: true });
    step("manifest and swap into place");
    return { dir: finalDir, verdict, files, fingerprint };
  } catch (error) {
    await Deno.remove(stage, { recursive: true }).catch(() => {});
    throw error;
  }
}

/** Kinds of figure whose x axis is frequency in Hz. */
const frequencyKinds: readonly FigureExhibit["kind"][] = [
  "magnitude",
  "passband",
  "phase",
  "groupDelay",
  "spectrum",
  "quantised",
];

/**
 * What a figure marks besides its data: the worst point of every checked
 * requirement its mask is labelled with (frequency figures, worst case in Hz).
 */
export function figureContext(figure: FigureExhibit, execution: RunProgress): FigureContext {
  if (!frequencyKinds.includes(figure.kind)) return {};
  const ids = new Set((figure.mask ?? []).flatMap((m) => (m.label ? [m.label] : [])));
  const worst = requirementRows(execution).flatMap(({ requirement, check }) => {
    const w = check?.result.worst;
    if (!ids.has(requirement.id) || w === undefined || w.unit !== "Hz") return [];
    const id = check!.design === defaultDesign
      ? requirement.id
      : `${requirement.id} (${check!.design})`;
    return [{ id, at: w.at, met: check!.result.met }];
  });
  return worst.length > 0 ? { worst } : {};
}

/**
 * Show the given approvals in an existing report's page, in place: the page
 * and the manifest's listing of it change, the fingerprint does not (the
 * approvals block is outside what it covers). Returns the approvals' states.
 */
export async function refreshApprovals(
  reportDir: string,
  approvals: readonly Approval[],
): Promise<ReturnType<typeof approvalStatuses>> {
  const manifest = await readManifest(reportDir);
  if (manifest === undefined) throw new Error(`${reportDir} holds no report`);
  const pagePath = join(reportDir, pageFile);
  const page = await Deno.readTextFile(pagePath);
  const statuses = approvalStatuses(approvals, manifest.fingerprint, manifest.revision);
  const updated = withApprovalsBlock(page, approvalsHtml(statuses));
  if (updated !== page) {
    const files = manifest.files.map((f) =>
      f.path === pageFile ? { ...f, sha256: sha256Hex(updated) } : f
    );
    const { digest: _digest, ...rest } = manifest;
    const temp = `${pagePath}.${crypto.randomUUID().slice(0, 8)}`;
    await Deno.writeTextFile(temp, updated);
    await Deno.rename(temp, pagePath);
    const manifestPath = join(reportDir, manifestFile);
    await Deno.writeTextFile(`${manifestPath}.new`, manifestText({ ...rest, files }));
    await Deno.rename(`${manifestPath}.new`, manifestPath);
  }
  return statuses;
}

/** SVG of each figure in an existing report, keyed by its vega-lite specification text. */
async function previousFigures(
  dir: string,
  provenance: Provenance,
): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  try {
    // Reuse only figures drawn by the same code and package versions.
    const old = await readManifest(dir);
    if (
      !old || old.provenance.toolSha256 !== provenance.toolSha256 ||
      JSON.stringify(old.provenance.packages) !== JSON.stringify(provenance.packages)
    ) return out;
    // Only files still as the old manifest lists them: an edited figure is drawn anew.
    const listed = new Map(old.files.map((f) => [f.path, f.sha256]));
    for await (const e of Deno.readDir(join(dir, "figures"))) {
      if (!e.name.endsWith(".vl.json")) continue;
      const specPath = `figures/${e.name}`;
      const svgPath = specPath.replace(/\.vl\.json$/, ".svg");
      const spec = await Deno.readTextFile(join(dir, specPath));
      const svg = await Deno.readTextFile(join(dir, svgPath));
      if (listed.get(specPath) === sha256Hex(spec) && listed.get(svgPath) === sha256Hex(svg)) {
        out.set(spec, svg);
      }
    }
  } catch {
    // no previous report, or an incomplete one: render everything
  }
  return out;
}

/** If a previous run died between the two renames, put the old report back. */
async function recoverInterruptedSwap(outDir: string, name: string): Promise<void> {
  const old = join(outDir, `.${name}.old`);
  if (!(await exists(join(outDir, name))) && (await exists(old))) {
    await Deno.rename(old, join(outDir, name));
  }
  for await (const entry of Deno.readDir(outDir)) {
    if (entry.name.startsWith(`.${name}.partial-`)) {
      await Deno.remove(join(outDir, entry.name), { recursive: true }).catch(() => {});
    }
  }
}

async function exists(path: string): Promise<boolean> {
  try {
    await Deno.lstat(path);
    return true;
  } catch {
    return false;
  }
}

function manifestOf(
  name: string,
  content: ReportContent,
  verdict: Verdict,
  files: WrittenFile[],
  fingerprint: string,
  listings: Map<Exhibit, WrittenFile>,
): Omit<Manifest, "digest"> {
  const exhibits = content.execution.blocks.flatMap((b) => b.exhibits);
  const m: Omit<Manifest, "digest"> = {
    worksheet: content.worksheetId,
    name,
    title: content.worksheet.meta.title,
    document: content.worksheet.meta.document,
    revision: content.worksheet.meta.revision,
    verdict,
    outcome: content.execution.outcome,
    requirements: manifestRequirements(content.execution),
    listings: [...listings].map(([e, file]) => {
      const c = e as CoefficientsExhibit;
      const listing: Manifest["listings"][number] = {
        name: c.name,
        path: file.path,
        layout: c.layout ?? "list",
        count: c.values.length,
        hasCodes: c.codes !== undefined,
      };
      if (c.format !== undefined) listing.format = c.format;
      return listing;
    }),
    costs: exhibits.flatMap((e) => (e.type === "cost" ? [{ name: e.name, cost: e.cost }] : [])),
    settings: content.params,
    provenance: content.provenance,
    files,
    fingerprint,
    inputs: content.inputs,
  };
  if (content.execution.problem) m.problem = content.execution.problem;
  return m;
}
