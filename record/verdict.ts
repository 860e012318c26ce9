// The verdict of a run, from its requirement results.
import type { RequirementResult } from "../lib/verify/requirement.ts";
import type { CheckExhibit, ExecutionResult, Verdict } from "./types.ts";

/** All requirement results of a run, in the order they were checked. */
export function requirementResults(execution: ExecutionResult): RequirementResult[] {
  return execution.blocks.flatMap((b) =>
    b.exhibits.filter((e): e is CheckExhibit => e.type === "check").map((e) => e.result)
  );
}

/** Overall verdict: incomplete unless every block ran, then met only if every check is met. */
export function overallVerdict(execution: ExecutionResult): Verdict {
  if (execution.outcome !== "completed") return "incomplete";
  const results = requirementResults(execution);
  if (results.length === 0) return "no requirements";
  return results.every((r) => r.met) ? "met" : "not met";
}
