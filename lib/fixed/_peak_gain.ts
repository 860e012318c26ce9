// Peak gain max|H(f)| over the whole band, from the verification vocabulary.
import { checkRequirement } from "../verify/check.ts";
import type { FilterDesign } from "../verify/filter_design.ts";

/** max over 0 ≤ f ≤ fs/2 of |H(f)| (linear), on the verification grid with refinement. */
export function peakGainOf(design: FilterDesign): number {
  const r = checkRequirement(design, 2, { kind: "maximumGain", atMostDb: 0 });
  return 10 ** (r.achieved / 20);
}
