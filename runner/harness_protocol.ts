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

/** True when a non-finite number is anywhere in `value` (a plain walk, cycles seen once). */
function holdsNonFinite(value: unknown, seen: Set<object>): boolean {
  if (typeof value === "number") return !Number.isFinite(value);
  if (value === null || typeof value !== "object" || seen.has(value)) return false;
  seen.add(value);
  if (Array.isArray(value)) {
    for (const v of value) if (holdsNonFinite(v, seen)) return true;
    return false;
  }
  for (const v of Object.values(value)) if (holdsNonFinite(v, seen)) return true;
  return false;
}

/**
 * A message as JSON text, non-finite numbers marked as {@link encodeNumbers}
 * marks them. The replacer is used only when there is such a number: it
 * costs four times the plain encoding on a figure's long series.
 */
export function encodeMessage(value: unknown): string {
  return holdsNonFinite(value, new Set())
    ? JSON.stringify(value, encodeNumbers)
    : JSON.stringify(value);
}

/**
 * The value of a message's JSON text, marked strings turned back into
 * numbers as {@link decodeNumbers} does. Every marked string holds U+0000,
 * which JSON can only write as `\u0000`; text without that escape has no
 * marked string, and is parsed without the reviver (eight times faster on a
 * figure's long series).
 */
export function decodeMessage(text: string): unknown {
  return text.includes("\\u0000") ? JSON.parse(text, decodeNumbers) : JSON.parse(text);
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
