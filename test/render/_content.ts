// A minimal report to write in tests: one code block holding the given exhibits.
import type { ReportContent } from "../../render/write.ts";
import type { Exhibit } from "../../record/types.ts";

/** Report content whose only block emitted `exhibits`. */
export function reportContent(exhibits: Exhibit[]): ReportContent {
  return {
    worksheet: {
      path: "w.md",
      source: "",
      meta: { title: "W", document: "D", revision: "1", signoff: [] },
      params: {},
      paramRules: {},
      requirements: [],
      parts: [{ kind: "code", index: 0, code: "", fenceLine: 1, startLine: 2, endLine: 1 }],
    },
    params: {},
    overridden: [],
    inputs: "x",
    worksheetId: "w.md",
    execution: {
      outcome: "completed",
      durationMs: 1,
      requirements: [],
      blocks: [{ index: 0, status: "ok", exhibits }],
    },
    provenance: {
      worksheetSha256: "0".repeat(64),
      worksheetPath: "w.md",
      tapsheetVersion: "0",
      toolSha256: "0".repeat(64),
      platform: "test",
      command: "deno task tapsheet run w.md",
      denoVersion: "0",
      packages: [{ name: "vega", version: "6.4.0" }],
      date: "2026-01-01",
    },
  };
}
