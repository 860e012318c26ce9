// A report folder's manifest: what was run, the verdict, and the SHA-256 of
// every file the report consists of. Reading it, checking a folder against
// it, and the fingerprint that identifies a report.
import { createHash } from "node:crypto";
import { join, relative, sep } from "node:path";
import type { LimitRelation, WorstCase } from "../lib/verify/requirement.ts";
import type {
  ExecutionResult,
  ImplementationCostFigures,
  ParamValue,
  Provenance,
  SourceProblem,
  Verdict,
  WrittenFile,
} from "./types.ts";

/** The manifest's file name inside a report folder. */
export const manifestFile = "manifest.json";

/**
 * Files a report folder may hold that are not part of the report's record:
 * the printed copy made by `run --pdf` (Chromium stamps it with the time, so
 * it cannot be reproduced byte for byte).
 */
export const derivedFiles: readonly string[] = ["report.pdf"];

/** One row of the requirement table, as the manifest keeps it. */
export interface ManifestRequirement {
  id: string;
  text: string;
  /** The design the row is about; absent when the requirement was never checked. */
  design?: string;
  relation: LimitRelation;
  limit: number;
  unit: string;
  checked: boolean;
  met: boolean;
  achieved?: number;
  margin?: number;
  worst?: WorstCase;
}

/** A coefficient listing as the manifest keeps it; the values are in the CSV file `path`. */
export interface ManifestListing {
  name: string;
  path: string;
  layout: "list" | "sections";
  count: number;
  /** Fixed-point format of the codes, when the listing has codes. */
  format?: string;
  hasCodes: boolean;
}

/** Machine-readable results kept beside the report (no timings: it must be reproducible). */
export interface Manifest {
  /** The worksheet, as the report names it (see Provenance.worksheetPath). */
  worksheet: string;
  /** Report folder name. */
  name: string;
  title: string;
  document: string;
  revision: string;
  verdict: Verdict;
  outcome: ExecutionResult["outcome"];
  problem?: SourceProblem;
  /** The requirement table: a row per declared requirement per design checked. */
  requirements: ManifestRequirement[];
  /** Every coefficient listing: its name, layout, code format and the CSV file holding it. */
  listings: ManifestListing[];
  /** The implementation cost of each design the worksheet costed (sheet.cost). */
  costs: { name: string; cost: ImplementationCostFigures }[];
  /** Every setting the run used (after --set and --settings). */
  settings: Record<string, ParamValue>;
  provenance: Provenance;
  /** Every file of the report (not the manifest itself), with its SHA-256. */
  files: WrittenFile[];
  /**
   * The report's identity: SHA-256 over every file's path and SHA-256, the
   * page taken with its own fingerprint blanked (see {@link blankPage}), so
   * the page can print the fingerprint that covers it.
   */
  fingerprint: string;
  /** SHA-256 of everything the result depends on, to skip unchanged re-runs. */
  inputs: string;
  /** SHA-256 of this manifest's own text without this field, to notice hand edits. */
  digest: string;
}

/** SHA-256 of text or bytes, as lowercase hex. */
export function sha256Hex(data: string | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}

/** The page of a report, whose text holds its own fingerprint. */
export const pageFile = "index.html";

/** Stands for the fingerprint in the page while the fingerprint is computed. */
export const fingerprintPlaceholder = "\u2063report-fingerprint\u2063";

/** SHA-256 over "path sha256\n" of every file, in the given order. */
export function fingerprintOf(files: readonly WrittenFile[]): string {
  return sha256Hex(files.map((f) => `${f.path} ${f.sha256}\n`).join(""));
}

/**
 * Where the page lists the approvals of the report. They are not part of the
 * record they approve: the fingerprint is taken with this block empty, so
 * approving a report does not change it.
 */
export const approvalsMarks = ["<!--tapsheet:approvals-->", "<!--/tapsheet:approvals-->"] as const;

/** Put `html` between the page's approval marks. */
export function withApprovalsBlock(page: string, html: string): string {
  const [start, end] = approvalsMarks;
  const i = page.indexOf(start);
  const j = page.indexOf(end, i);
  if (i < 0 || j < 0) return page;
  return page.slice(0, i + start.length) + html + page.slice(j);
}

/**
 * The page as its fingerprint covers it: the fingerprint put back to its
 * placeholder and the approvals block emptied.
 */
export function blankPage(page: string, fingerprint: string): string {
  return withApprovalsBlock(page.replaceAll(fingerprint, fingerprintPlaceholder), "");
}

/**
 * The fingerprint of a report whose files are `files` (the page listed with
 * its final SHA-256) and whose blanked page has SHA-256 `blankPageSha256`.
 */
export function reportFingerprint(files: readonly WrittenFile[], blankPageSha256: string): string {
  return fingerprintOf(
    files.map((f) => (f.path === pageFile ? { ...f, sha256: blankPageSha256 } : f)),
  );
}

/** The manifest as written to disk, its digest filled in. */
export function manifestText(manifest: Omit<Manifest, "digest">): string {
  const body = { ...manifest, digest: "" };
  const digest = sha256Hex(JSON.stringify(body, null, 2));
  return JSON.stringify({ ...body, digest }, null, 2) + "\n";
}

/**
 * True when the manifest's digest matches its text (nobody edited it by hand)
 * and its fingerprint is the one its files and the given page make.
 */
export function manifestIntact(manifest: Manifest, page: string | undefined): boolean {
  const body = { ...manifest, digest: "" };
  if (manifest.digest !== sha256Hex(JSON.stringify(body, null, 2))) return false;
  if (page === undefined) return false;
  const blank = sha256Hex(blankPage(page, manifest.fingerprint));
  return manifest.fingerprint === reportFingerprint(manifest.files, blank);
}

/** Read a report folder's manifest; undefined when it is missing or not JSON. */
export async function readManifest(dir: string): Promise<Manifest | undefined> {
  try {
    const value = JSON.parse(await Deno.readTextFile(join(dir, manifestFile)));
    return value && typeof value === "object" && Array.isArray(value.files)
      ? value as Manifest
      : undefined;
  } catch {
    return undefined;
  }
}

/** How a report folder differs from its manifest. */
export interface FolderCheck {
  /** Listed files whose bytes no longer have the listed SHA-256. */
  changed: string[];
  /** Listed files that are gone. */
  missing: string[];
  /** Files in the folder the manifest does not list (derived files aside). */
  added: string[];
  /** False when the manifest's own digest or fingerprint does not match its content. */
  manifestIntact: boolean;
}

/** True when the folder is exactly what its manifest lists. */
export function folderIsIntact(check: FolderCheck): boolean {
  return check.manifestIntact && check.changed.length + check.missing.length +
          check.added.length === 0;
}

/** Hash every file of a report folder and compare with its manifest. */
export async function checkReportFolder(dir: string, manifest: Manifest): Promise<FolderCheck> {
  const page = await Deno.readTextFile(join(dir, pageFile)).catch(() => undefined);
  const check: FolderCheck = {
    changed: [],
    missing: [],
    added: [],
    manifestIntact: manifestIntact(manifest, page),
  };
  const listed = new Set<string>();
  for (const file of manifest.files) {
    listed.add(file.path);
    let bytes: Uint8Array;
    try {
      bytes = await Deno.readFile(join(dir, file.path));
    } catch {
      check.missing.push(file.path);
      continue;
    }
    if (sha256Hex(bytes) !== file.sha256) check.changed.push(file.path);
  }
  for (const path of await filesUnder(dir)) {
    if (path === manifestFile || derivedFiles.includes(path) || listed.has(path)) continue;
    check.added.push(path);
  }
  return check;
}

/** Every file under `dir`, as paths relative to it with "/" separators, sorted. */
export async function filesUnder(dir: string): Promise<string[]> {
  const out: string[] = [];
  const visit = async (folder: string) => {
    for await (const entry of Deno.readDir(folder)) {
      const path = join(folder, entry.name);
      if (entry.isDirectory) await visit(path);
      else out.push(relative(dir, path).split(sep).join("/"));
    }
  };
  await visit(dir);
  return out.sort();
}
