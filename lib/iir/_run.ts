// The section-cascade inner loop (private), shared by filtering and zero-phase filtering.
import type { Section } from "../types.ts";

/** In-place cascade filter; the hot loop shared with zero-phase filtering. */
export function runSections(
  sections: readonly Section[],
  y: Float64Array,
  memory: Float64Array,
): void {
  const n = y.length;
  for (let j = 0; j < sections.length; j++) {
    const s = sections[j]!;
    const b0 = s.b0;
    const b1 = s.b1;
    const b2 = s.b2;
    const a1 = s.a1;
    const a2 = s.a2;
    let s1 = memory[2 * j]!;
    let s2 = memory[2 * j + 1]!;
    for (let i = 0; i < n; i++) {
      const x = y[i]!;
      const out = b0 * x + s1;
      s1 = b1 * x - a1 * out + s2;
      s2 = b2 * x - a2 * out;
      y[i] = out;
    }
    memory[2 * j] = s1;
    memory[2 * j + 1] = s2;
  }
}
