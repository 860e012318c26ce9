// A report folder's manifest: what was run, the verdict, and the SHA-256 of
// every file the report consists of. Reading it, checking a folder against
// it, and the fingerprint that identifies a report.
import { createHash } from "node:crypto";
import { join, relative, sep } from "node:path";
import type { RequirementResult } from "../lib/verify/requirement.ts";
import type {
  ExecutionResult,
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
  requirements: RequirementResult[];
  params: Record<string, ParamValue>;
  provenance: Provenance;
  /** Every file of the report (not the manifest itself), with its SHA-256. */
  files: WrittenFile[];
  /** SHA-256 over every file's path and hash: the report's identity. */
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

/** The report's fingerprint: SHA-256 over "path sha256\n" of every file, in the given order. */
export function fingerprintOf(files: readonly WrittenFile[]): string {
  return sha256Hex(files.map((f) => `${f.path} ${f.sha256}\n`).join(""));
}

/** The manifest as written to disk, its digest filled in. */
export function manifestText(manifest: Omit<Manifest, "digest">): string {
  const body = { ...manifest, digest: "" };
  const digest = sha256Hex(JSON.stringify(body, null, 2));
  return JSON.stringify({ ...body, digest }, null, 2) + "\n";
}

/** True when the manifest's digest matches its text (nobody edited it by hand). */
export function manifestIntact(manifest: Manifest): boolean {
  const body = { ...manifest, digest: "" };
  return manifest.digest === sha256Hex(JSON.stringify(body, null, 2)) &&
    manifest.fingerprint === fingerprintOf(manifest.files);
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
  const check: FolderCheck = {
    changed: [],
    missing: [],
    added: [],
    manifestIntact: manifestIntact(manifest),
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
