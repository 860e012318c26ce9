// Approvals of a report, bound to its fingerprint, kept in version control
// beside the worksheet in a plain YAML file of tapsheet's own:
//
//   # Approvals of hum_removal.md, written by `deno task tapsheet approve`.
//   approvals:
//     - role: Reviewer
//       name: A. Reviewer
//       date: 2026-12-02
//       document: KBS-KB8-DSP-014
//       revision: B
//       fingerprint: 5f89…
//       publicKey: MCowBQYDK2VwAyEA…   # optional: Ed25519, SPKI DER in base64
//       signature: 3mK9…               # optional: over the statement below
//
// An approval holds while the report it names (by fingerprint) is the one the
// worksheet produces; any change to the record gives a new fingerprint and
// voids it. A signature, when given, is Ed25519 over approvalStatement().
import { Buffer } from "node:buffer";
import { createPrivateKey, createPublicKey, sign, verify } from "node:crypto";
import { basename, dirname, join } from "node:path";
import { parse as parseYaml, stringify as stringifyYaml } from "../runner/parsers.ts";

/** One approval of one report. */
export interface Approval {
  role: string;
  name: string;
  /** YYYY-MM-DD. */
  date: string;
  document: string;
  revision: string;
  /** The fingerprint of the report approved. */
  fingerprint: string;
  /** Ed25519 public key, SPKI DER in base64, when the approval is signed. */
  publicKey?: string;
  /** Ed25519 signature of approvalStatement(approval), base64. */
  signature?: string;
}

/** How an approval stands against a report. */
export type ApprovalState =
  | "holds"
  | "void"
  | "superseded"
  | "bad signature";

/** An approval with its state and, when it does not hold, why. */
export interface ApprovalStatus {
  approval: Approval;
  state: ApprovalState;
  why?: string;
}

/** The approvals file of a worksheet: `<name>.approvals.yaml` beside it. */
export function approvalsPath(worksheetPath: string): string {
  return join(
    dirname(worksheetPath),
    `${basename(worksheetPath).replace(/\.md$/i, "")}.approvals.yaml`,
  );
}

/** Raised when an approvals file cannot be read as one. */
export class ApprovalsError extends Error {
  override name = "ApprovalsError";
}

/** The approvals recorded for a worksheet, oldest first ([] when there is no file). */
export function readApprovals(path: string): Approval[] {
  let text: string;
  try {
    text = Deno.readTextFileSync(path);
  } catch {
    return [];
  }
  let parsed: unknown;
  try {
    parsed = parseYaml(text);
  } catch (error) {
    throw new ApprovalsError(
      `${path} is not valid YAML: ${(error as Error).message.split("\n")[0]}`,
    );
  }
  const list = (parsed as { approvals?: unknown } | null)?.approvals;
  if (!Array.isArray(list)) throw new ApprovalsError(`${path} must hold a list under 'approvals:'`);
  return list.map((item, i) => {
    const a = item as Record<string, unknown>;
    for (const key of ["role", "name", "date", "fingerprint"]) {
      if (typeof a?.[key] !== "string" && typeof a?.[key] !== "number") {
        throw new ApprovalsError(`${path}: approval ${i + 1} needs '${key}:'`);
      }
    }
    const approval: Approval = {
      role: String(a.role),
      name: String(a.name),
      date: String(a.date),
      document: String(a.document ?? ""),
      revision: String(a.revision ?? ""),
      fingerprint: String(a.fingerprint),
    };
    if (a.publicKey !== undefined) approval.publicKey = String(a.publicKey);
    if (a.signature !== undefined) approval.signature = String(a.signature);
    return approval;
  });
}

/** Write the approvals file with one more approval at its end. */
export function appendApproval(path: string, worksheetName: string, approval: Approval): void {
  const all = [...readApprovals(path), approval];
  const text = `# Approvals of ${worksheetName}, written by \`deno task tapsheet approve\`.\n` +
    "# Each approval names the report it approves by its fingerprint; keep this file in version\n" +
    "# control beside the worksheet.\n" + stringifyYaml({ approvals: all }, { lineWidth: 0 });
  const temp = `${path}.${crypto.randomUUID().slice(0, 8)}`;
  Deno.writeTextFileSync(temp, text);
  Deno.renameSync(temp, path);
}

/** The exact text an approval's signature covers. */
export function approvalStatement(a: Approval): string {
  return [
    "tapsheet approval",
    `fingerprint ${a.fingerprint}`,
    `document ${a.document}`,
    `revision ${a.revision}`,
    `role ${a.role}`,
    `name ${a.name}`,
    `date ${a.date}`,
    "",
  ].join("\n");
}

/** Sign an approval with an Ed25519 private key (PEM); fills publicKey and signature. */
export function signApproval(a: Approval, privateKeyPem: string): Approval {
  const key = createPrivateKey(privateKeyPem);
  if (key.asymmetricKeyType !== "ed25519") {
    throw new ApprovalsError(
      `The signing key must be an Ed25519 key, got ${key.asymmetricKeyType}`,
    );
  }
  const publicKey = createPublicKey(key).export({ type: "spki", format: "der" });
  const unsigned = { ...a, publicKey: Buffer.from(publicKey).toString("base64") };
  const signature = sign(null, new TextEncoder().encode(approvalStatement(unsigned)), key);
  return { ...unsigned, signature: Buffer.from(signature).toString("base64") };
}

/** True when the approval is unsigned, or its signature verifies with its own public key. */
export function signatureVerifies(a: Approval): boolean {
  if (a.signature === undefined && a.publicKey === undefined) return true;
  if (a.signature === undefined || a.publicKey === undefined) return false;
  try {
    const key = createPublicKey({
      key: Buffer.from(a.publicKey, "base64"),
      format: "der",
      type: "spki",
    });
    return verify(
      null,
      new TextEncoder().encode(approvalStatement(a)),
      key,
      Buffer.from(a.signature, "base64"),
    );
  } catch {
    return false;
  }
}

/**
 * How each approval stands against the report with `fingerprint` of document
 * `revision`: it holds when it names that fingerprint (and its signature, if
 * any, verifies); an approval of an earlier revision is superseded; one of this
 * revision that names another fingerprint is void.
 */
export function approvalStatuses(
  approvals: readonly Approval[],
  fingerprint: string,
  revision: string,
): ApprovalStatus[] {
  return approvals.map((approval) => {
    if (!signatureVerifies(approval)) {
      return { approval, state: "bad signature", why: "the signature does not verify" };
    }
    if (approval.fingerprint === fingerprint) return { approval, state: "holds" };
    if (approval.revision !== revision) {
      return {
        approval,
        state: "superseded",
        why: `approved revision ${approval.revision || "(none)"}, this is revision ${
          revision || "(none)"
        }`,
      };
    }
    return {
      approval,
      state: "void",
      why: `approved the report with fingerprint ${
        approval.fingerprint.slice(0, 16)
      }…, but this record is ${fingerprint.slice(0, 16)}…`,
    };
  });
}
