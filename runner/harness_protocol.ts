// What the parent, the sandbox child and the worksheet's worker say to each
// other (see execute.ts, harness.ts, worksheet_host.ts). Kept apart from
// those files, which run as soon as they are imported.
//
//   parent ──stdin: one line of HarnessInput, then held open──▶ child main thread
//     (the child starts its worker, which loads the library, before that line comes)
//   child main thread ──private MessagePort: HostStart──▶ worker (worksheet runs here)
//   worker ──that port: HarnessMessage──▶ child main thread
//   child main thread ──stdout: "\n" + nonce + JSON line──▶ parent
//
// The worksheet runs in the worker, a separate JavaScript realm: it never sees
// the nonce or the child's standard input, and the port it cannot reach is the
// only way into the main thread. Whatever the worksheet prints itself arrives
// without the nonce and is shown as output, never taken as a message.
import type { DeclaredRequirement, Exhibit, ParamValue } from "../record/types.ts";

/** A message about the run: a block started, an exhibit, an error, or the end. */
export type HarnessMessage =
  | { kind: "block"; index: number }
  | { kind: "exhibit"; block: number; exhibit: Exhibit }
  | { kind: "error"; block: number; name: string; message: string; stack: string }
  | { kind: "done"; timings?: Record<string, number> };

/** Prefix of a string that stands for Infinity, −Infinity or NaN in a message. */
export const nonFiniteMark = "\u0000number:";

/** JSON.parse reviver that turns marked strings back into non-finite numbers. */
export function decodeNumbers(_key: string, value: unknown): unknown {
  return typeof value === "string" && value.startsWith(nonFiniteMark)
    ? Number(value.slice(nonFiniteMark.length))
    : value;
}

/** JSON.stringify replacer that marks non-finite numbers (JSON has none). */
export function encodeNumbers(_key: string, value: unknown): unknown {
  return typeof value === "number" && !Number.isFinite(value) ? `${nonFiniteMark}${value}` : value;
}

/** What the parent writes, as one line, to the child's standard input. */
export interface HarnessInput {
  moduleUrl: string;
  params: Record<string, ParamValue>;
  requirements: DeclaredRequirement[];
  /** Prefix of every protocol line, so stray output cannot pose as one. */
  nonce: string;
  /** The child's own backstop: it ends itself this long after starting. */
  timeoutSeconds: number;
}

/** What the child's main thread sends the worker, with the port to answer on. */
export interface HostStart {
  port: MessagePort;
  moduleUrl: string;
  params: Record<string, ParamValue>;
  requirements: DeclaredRequirement[];
}

/** The name of the function the worker defines; called on each fence line. */
export const blockMarker = "__tapsheetBlock";
