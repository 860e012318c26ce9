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
  pageFile,
  readManifest,
  withApprovalsBlock,
} from "../record/manifest.ts";
import {
  approvalsPath,
  type ApprovalStatus,
  approvalStatuses,
  readApprovals,
} from "../record/approvals.ts";
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
  /**
   * Every approval recorded beside the worksheet, judged against the report the
   * worksheet produces now: it holds only for that fingerprint.
   */
  approvals: ApprovalStatus[];
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
    approvals: [],
  };
  const approvals = readApprovals(approvalsPath(file));
  const scratch = await Deno.makeTempDir({ prefix: "tapsheet-verify-" });
  try {
    let fresh: string;
    try {
      fresh = (await runWorksheet(file, {
        outDir: scratch,
        reportName: folderName,
        paramsFromFile: manifest.settings,
        date: manifest.provenance.date,
        force: true,
      })).fingerprint;
    } catch (error) {
      if (!(error instanceof ParamError)) throw error;
      result.rerunProblem = error.message;
      result.approvals = approvalStatuses(approvals, "", manifest.revision);
      return result;
    }
    result.approvals = approvalStatuses(approvals, fresh, manifest.revision);
    const freshDir = join(scratch, folderName);
    const rerun = await filesUnder(freshDir);
    const mine = present.filter((p) => !derivedFiles.includes(p));
    result.onlyInReport = mine.filter((p) => !rerun.includes(p));
    result.onlyInRerun = rerun.filter((p) => !mine.includes(p));
    for (const path of mine.filter((p) => rerun.includes(p))) {
      // The page is compared without its approvals block: approvals are not part of the record.
      if (path === pageFile) {
        const [a, b] = await Promise.all([
          Deno.readTextFile(join(reportDir, path)),
          Deno.readTextFile(join(freshDir, path)),
        ]);
        if (withApprovalsBlock(a, "") !== withApprovalsBlock(b, "")) {
          result.differFromRerun.push(path);
        }
        continue;
      }
      const [a, b] = await Promise.all([
        Deno.readFile(join(reportDir, path)),
        Deno.readFile(join(freshDir, path)),
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
