// Loads test/reference/iir.json (made by test/reference/make_iir.py with Debian SciPy 1.10.1).
import type { Complex, Section } from "../../../lib/types.ts";

// deno-lint-ignore no-explicit-any
export type Json = any;

export const fixture: Json = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/iir.json", import.meta.url)),
);

/** [[re, im], …] → Complex[]. */
export function complexList(pairs: number[][]): Complex[] {
  return pairs.map(([re, im]) => ({ re: re!, im: im! }));
}

/** SciPy sos rows [b0 b1 b2 1 a1 a2] → Section[]. */
export function sectionsFromRows(rows: number[][]): Section[] {
  return rows.map((r) => ({ b0: r[0]!, b1: r[1]!, b2: r[2]!, a1: r[4]!, a2: r[5]! }));
}
