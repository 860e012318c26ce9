// The verdict of a run, from its declared requirements and their checks.
// One row per declared requirement per design it was checked on; a declared
// requirement no check reached is a row of its own, and keeps the verdict
// from being "met".
import type { ManifestRequirement } from "./manifest.ts";
import type {
  CheckExhibit,
  DeclaredRequirement,
  ExecutionResult,
  RunProgress,
  Verdict,
} from "./types.ts";

/** One row of the requirement table. */
export interface RequirementRow {
  requirement: DeclaredRequirement;
  /** The check of this requirement on one design; undefined when it was never checked. */
  check?: CheckExhibit;
}

/** Every check of a run, in the order the worksheet made them. */
export function checksOf(execution: RunProgress): CheckExhibit[] {
  return execution.blocks.flatMap((b) => b.exhibits.filter((e) => e.type === "check"));
}

/**
 * The requirement table: declared requirements in their declared order, each
 * with one row per design it was checked on (in check order), or one
 * unchecked row.
 */
export function requirementRows(execution: RunProgress): RequirementRow[] {
  const checks = checksOf(execution);
  return execution.requirements.flatMap((requirement) => {
    const own = checks.filter((c) => c.result.id === requirement.id);
    return own.length === 0 ? [{ requirement }] : own.map((check) => ({ requirement, check }));
  });
}

/** The designs the checks were about, in the order they first appear. */
export function designsChecked(execution: ExecutionResult): string[] {
  return [...new Set(checksOf(execution).map((c) => c.design))];
}

/**
 * Overall verdict: incomplete unless every block ran; no requirements when
 * none is declared; met only when every declared requirement was checked and
 * every check is met.
 */
export function overallVerdict(execution: ExecutionResult): Verdict {
  if (execution.outcome !== "completed") return "incomplete";
  const rows = requirementRows(execution);
  if (rows.length === 0) return "no requirements";
  return rows.every((r) => r.check?.result.met === true) ? "met" : "not met";
}

/** The requirement table as the manifest keeps it. */
export function manifestRequirements(execution: ExecutionResult): ManifestRequirement[] {
  return requirementRows(execution).map(({ requirement: d, check }) => {
    const row: ManifestRequirement = {
      id: d.id,
      text: d.text,
      relation: d.relation,
      limit: d.limit,
      unit: d.unit,
      checked: check !== undefined,
      met: check?.result.met === true,
    };
    if (check !== undefined) {
      row.design = check.design;
      row.achieved = check.result.achieved;
      row.margin = check.result.margin;
      if (check.result.worst) row.worst = check.result.worst;
    }
    return row;
  });
}
