import type { Section } from "../types.ts";
import { requireDesign } from "../verify/filter_design.ts";
import { sequenceNorms } from "./norms.ts";
import { applyDesign, decayLength } from "../verify/filter_design.ts";
import { peakGainOf } from "./_peak_gain.ts";

/** Which norm the scaling holds to 1 at each section output. */
export type ScalingNorm = "l1" | "l2" | "peakGain";

/**
 * Scale the numerators of a cascade so that the response from the input to
 * each section's output except the last has norm 1 (L1: no overflow for any
 * input within full scale; peakGain: none for a full-scale sine; L2: unit
 * noise-power gain). The last section takes the remaining gain, so the
 * cascade's overall response is unchanged.
 *
 * Source: L. B. Jackson, "On the interaction of roundoff noise and dynamic
 * range in digital filters", Bell Syst. Tech. J. 49 (1970); Jackson, Digital
 * Filters and Signal Processing, 3rd ed., §11.4.
 *
 * @param sections The cascade (a0 = 1), at least one section, stable.
 * @param norm Norm held to 1. @default "peakGain"
 * @returns Scaled sections and the scale factor applied to each numerator.
 * @throws {RangeError} When the cascade is not stable.
 * @example
 * ```ts
 * import { scaleSections } from "./scale_sections.ts";
 * // Two one-pole sections 1/(1 − 0.5 z^−1): DC gain 2 each. L1 scaling makes the first section's L1 norm 1.
 * const s = { b0: 1, b1: 0, b2: 0, a1: -0.5, a2: 0 };
 * const out = scaleSections([s, s], "l1");
 * if (Math.abs(out.factors[0]! - 0.5) > 1e-12 || Math.abs(out.factors[1]! - 2) > 1e-12) throw new Error("0.5 then 2");
 * ```
 */
export function scaleSections(
  sections: readonly Section[],
  norm: ScalingNorm = "peakGain",
): { sections: Section[]; factors: number[] } {
  requireDesign({ kind: "sections", sections });
  if (norm !== "l1" && norm !== "l2" && norm !== "peakGain") {
    throw new TypeError(`Scaling norm must be "l1", "l2" or "peakGain", got ${String(norm)}`);
  }
  const out: Section[] = [];
  const factors: number[] = [];
  let carried = 1;
  for (let k = 0; k < sections.length; k++) {
    const s = sections[k] as Section;
    const last = k === sections.length - 1;
    let f = carried;
    if (!last) {
      const prefix = {
        kind: "sections" as const,
        sections: [...out, { ...s, b0: s.b0 * carried, b1: s.b1 * carried, b2: s.b2 * carried }],
      };
      const length = decayLength(prefix);
      if (!Number.isFinite(length)) {
        throw new RangeError(`Sections must be stable to scale them; section ${k} is not`);
      }
      const value = norm === "peakGain" ? peakGainOf(prefix) : (() => {
        const x = new Float64Array(length);
        x[0] = 1;
        const n = sequenceNorms(applyDesign(prefix, x));
        return norm === "l1" ? n.l1 : n.l2;
      })();
      if (value === 0) {
        throw new RangeError(`Section ${k} output is identically zero; cannot scale`);
      }
      f = carried / value;
      carried = value;
    }
    factors.push(f);
    out.push({ b0: s.b0 * f, b1: s.b1 * f, b2: s.b2 * f, a1: s.a1, a2: s.a2 });
  }
  return { sections: out, factors };
}
