// `verify`: prove that a report folder is exactly what its worksheet produces.
// Two independent checks: every file against the SHA-256 its manifest lists
// (catches edits, deletions and additions), and a fresh run of the worksheet
// with the recorded parameters and date, compared byte for byte with every
// file of the report, the manifest included (catches everything else, such
// as an edit whose hashes were written into the manifest too).
import { join } from "node:path";
import {
  checkReportFolder,
  derivedFiles,
  filesUnder,
  type FolderCheck,
  folderIsIntact,
  type Manifest,
  readManifest,
} from "../record/manifest.ts";
import { ParamError } from "./params.ts";
import { worksheetName } from "./provenance.ts";
import { reportFolderName, runWorksheet } from "./run.ts";

/** The result of verifying one report. */
export interface Verification {
  reportDir: string;
  manifest: Manifest;
  /** The folder against its own manifest. */
  folder: FolderCheck;
  /** Files whose bytes differ from what a fresh run writes. */
  differFromRerun: string[];
  /** Files only the existing report has, or only the fresh run wrote. */
  onlyInReport: string[];
  onlyInRerun: string[];
  /** Why the worksheet could not be re-run as recorded, if it could not. */
  rerunProblem?: string;
  /** Derived files present but not part of the record (not checked). */
  unchecked: string[];
  /** True when the folder is intact and the fresh run gives the same bytes everywhere. */
  matches: boolean;
}

/** Raised when there is no report to verify. */
export class NoReportError extends Error {
  override name = "NoReportError";
}

/** Verify the report of `file` in `outDir` (see the module comment). */
export async function verifyReport(file: string, outDir: string): Promise<Verification> {
  const folderName = await reportFolderName(outDir, worksheetName(file), file);
  const reportDir = join(outDir, folderName);
  const manifest = await readManifest(reportDir);
  if (manifest === undefined) throw new NoReportError(join(reportDir, "manifest.json"));
  const folder = await checkReportFolder(reportDir, manifest);
  const present = await filesUnder(reportDir);
  const unchecked = present.filter((p) => derivedFiles.includes(p));
  const result: Verification = {
    reportDir,
    manifest,
    folder,
    differFromRerun: [],
    onlyInReport: [],
    onlyInRerun: [],
    unchecked,
    matches: false,
  };
  const scratch = await Deno.makeTempDir({ prefix: "tapsheet-verify-" });
  try {
    try {
      await runWorksheet(file, {
        outDir: scratch,
        reportName: folderName,
        paramsFromFile: manifest.settings,
        date: manifest.provenance.date,
        force: true,
      });
    } catch (error) {
      if (!(error instanceof ParamError)) throw error;
      result.rerunProblem = error.message;
      return result;
    }
    const fresh = join(scratch, folderName);
    const rerun = await filesUnder(fresh);
    const mine = present.filter((p) => !derivedFiles.includes(p));
    result.onlyInReport = mine.filter((p) => !rerun.includes(p));
    result.onlyInRerun = rerun.filter((p) => !mine.includes(p));
    for (const path of mine.filter((p) => rerun.includes(p))) {
      const [a, b] = await Promise.all([
        Deno.readFile(join(reportDir, path)),
        Deno.readFile(join(fresh, path)),
      ]);
      if (a.length !== b.length || a.some((byte, i) => byte !== b[i])) {
        result.differFromRerun.push(path);
      }
    }
    result.matches = folderIsIntact(folder) && result.differFromRerun.length === 0 &&
      result.onlyInReport.length === 0 && result.onlyInRerun.length === 0;
    return result;
  } finally {
    await Deno.remove(scratch, { recursive: true }).catch(() => {});
  }
}
