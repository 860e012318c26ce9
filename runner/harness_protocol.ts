// What the parent and the child say to each other (see harness.ts, execute.ts).
// Kept apart from harness.ts, which runs as soon as it is imported.
import type { Exhibit, ParamValue } from "./types.ts";

/** A line the child sends: a block started, an exhibit, an error, or the end. */
export type HarnessMessage =
  | { kind: "block"; index: number }
  | { kind: "exhibit"; block: number; exhibit: Exhibit }
  | { kind: "error"; block: number; name: string; message: string; stack: string }
  | { kind: "done" };

/** Prefix of a string that stands for Infinity, −Infinity or NaN in a message. */
export const nonFiniteMark = "\u0000number:";

/** JSON.parse reviver that turns marked strings back into non-finite numbers. */
export function decodeNumbers(_key: string, value: unknown): unknown {
  return typeof value === "string" && value.startsWith(nonFiniteMark)
    ? Number(value.slice(nonFiniteMark.length))
    : value;
}

/** What the parent writes to the child's standard input. */
export interface HarnessInput {
  moduleUrl: string;
  params: Record<string, ParamValue>;
  /** Prefix of every protocol line, so stray output cannot pose as one. */
  nonce: string;
}
