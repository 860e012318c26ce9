// `approve`: record an approval of a report, bound to its fingerprint, in the
// approvals file beside the worksheet (record/approvals.ts), optionally signed
// with an Ed25519 key, and show it in the report's page.
import { join } from "node:path";
import {
  appendApproval,
  type Approval,
  approvalsPath,
  type ApprovalStatus,
  readApprovals,
  signApproval,
} from "../record/approvals.ts";
import { checkReportFolder, folderIsIntact, readManifest, sha256Hex } from "../record/manifest.ts";
import { refreshApprovals } from "../render/write.ts";
import { worksheetName } from "./provenance.ts";
import { reportFolderName } from "./run.ts";

/** Raised when the report cannot be approved (missing, altered, out of date). */
export class ApproveError extends Error {
  override name = "ApproveError";
}

/** What to approve, and by whom. */
export interface ApproveRequest {
  worksheet: string;
  outDir: string;
  role: string;
  name: string;
  /** YYYY-MM-DD. */
  date: string;
  /** Ed25519 private key, PEM, to sign the approval with. */
  privateKeyPem?: string;
}

/** The recorded approval and how every approval of the report now stands. */
export interface ApproveResult {
  approval: Approval;
  reportDir: string;
  file: string;
  statuses: ApprovalStatus[];
}

/**
 * Approve the report of a worksheet: only a report whose files are all as its
 * manifest lists them, made from the worksheet as it is now.
 */
export async function approveReport(request: ApproveRequest): Promise<ApproveResult> {
  const folder = await reportFolderName(
    request.outDir,
    worksheetName(request.worksheet),
    request.worksheet,
  );
  const reportDir = join(request.outDir, folder);
  const manifest = await readManifest(reportDir);
  if (manifest === undefined) {
    throw new ApproveError(`there is no report in ${reportDir} to approve`);
  }
  if (!folderIsIntact(await checkReportFolder(reportDir, manifest))) {
    throw new ApproveError(
      `the report in ${reportDir} was altered after it was written; run 'deno task tapsheet verify ${request.worksheet}' and run the worksheet again`,
    );
  }
  const text = await Deno.readTextFile(request.worksheet);
  if (sha256Hex(text) !== manifest.provenance.worksheetSha256) {
    throw new ApproveError(
      `${request.worksheet} has changed since the report was made; run it again before approving`,
    );
  }
  if (manifest.outcome !== "completed") {
    throw new ApproveError(
      `the report in ${reportDir} is incomplete: the worksheet did not run to the end`,
    );
  }
  let approval: Approval = {
    role: request.role,
    name: request.name,
    date: request.date,
    document: manifest.document,
    revision: manifest.revision,
    fingerprint: manifest.fingerprint,
  };
  if (request.privateKeyPem !== undefined) approval = signApproval(approval, request.privateKeyPem);
  const file = approvalsPath(request.worksheet);
  appendApproval(file, worksheetName(request.worksheet).display, approval);
  const statuses = await refreshApprovals(reportDir, readApprovals(file));
  return { approval, reportDir, file, statuses };
}
