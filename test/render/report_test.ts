import assert from "node:assert/strict";
import { judge } from "../../lib/verify/requirement.ts";
import { formatNumber, reportHtml } from "../../render/report.ts";
import { overallVerdict } from "../../record/verdict.ts";
import { proseToHtml } from "../../render/html.ts";
import type { ExecutionResult, Worksheet } from "../../record/types.ts";

const attack = `<script>alert(1)</script><img src=x onerror=alert(2)>`;

function input(execution: ExecutionResult, worksheet?: Partial<Worksheet>) {
  return {
    worksheet: {
      path: "w.md",
      source: "",
      meta: {
        title: `Title ${attack}`,
        document: `D-${attack}`,
        revision: "A",
        signoff: [{ role: `Role ${attack}` }],
      },
      params: { label: `p ${attack}` },
      parts: [
        {
          kind: "prose" as const,
          markdown:
            `# Heading\n\n${attack}\n\n[link](javascript:alert(3)) and [ok](https://example.com)\n`,
          startLine: 4,
          endLine: 8,
        },
        {
          kind: "code" as const,
          index: 0,
          code: `const s = "${attack}";`,
          fenceLine: 9,
          startLine: 10,
          endLine: 10,
        },
      ],
      ...worksheet,
    },
    params: { label: `p ${attack}` },
    overridden: [],
    execution,
    figures: new Map(),
    exports: [{ path: "exports/a.h", sha256: "ab".repeat(32), description: attack }],
    provenance: {
      worksheetSha256: "cd".repeat(32),
      worksheetPath: "w.md",
      tapsheetVersion: "0.1.0",
      denoVersion: "2.9.6",
      packages: [{ name: "vega", version: "6.4.0" }],
      date: "2026-01-01",
    },
  };
}

const completed = (met: boolean): ExecutionResult => ({
  outcome: "completed",
  durationMs: 1,
  blocks: [{
    index: 0,
    status: "ok",
    exhibits: [
      {
        type: "check",
        result: judge(`Check ${attack}`, met ? 1 : 3, { atMost: 2 }, "dB", { id: attack }),
      },
      { type: "table", title: attack, columns: [attack], rows: [[attack, 1.5]] },
      { type: "choice", name: attack, value: attack, reason: attack },
      { type: "output", text: attack },
      { type: "warning", warning: { code: "x", message: attack } },
      { type: "coefficients", name: attack, values: [0.5, -0.25] },
    ],
  }],
});

Deno.test("report: markup and script attempts in every worksheet field render as inert text", () => {
  const html = reportHtml(input(completed(true)));
  assert.doesNotMatch(html, /<script/i);
  assert.doesNotMatch(html, /<img src=x/i);
  assert.doesNotMatch(html, /href="javascript:/i);
  assert.match(html, /&lt;script&gt;alert\(1\)&lt;\/script&gt;/);
  assert.match(html, /<a href="https:\/\/example.com">ok<\/a>/);
  // Content-Security-Policy forbids scripts outright.
  assert.match(html, /Content-Security-Policy" content="default-src 'none';/);
});

Deno.test("report: sections in the order reviewers read them", () => {
  const html = reportHtml(input(completed(true)));
  const order = [
    "requirements",
    "worksheet",
    "design-record",
    "coefficients",
    "exports",
    "provenance",
    "signoff",
    "cautions",
  ]
    .map((id) => html.indexOf(`<section id="${id}"`));
  assert.ok(order.every((i) => i > 0), String(order));
  assert.deepEqual([...order].sort((a, b) => a - b), order);
  assert.ok(html.indexOf('class="overall') < order[0]!);
  assert.match(html, /does not replace the reviewer's own judgment/);
});

Deno.test("report: verdicts", () => {
  assert.equal(overallVerdict(completed(true)), "met");
  assert.equal(overallVerdict(completed(false)), "not met");
  assert.equal(overallVerdict({ outcome: "timeout", blocks: [], durationMs: 1 }), "incomplete");
  assert.equal(
    overallVerdict({ outcome: "completed", blocks: [], durationMs: 1 }),
    "no requirements",
  );
  assert.match(reportHtml(input(completed(false))), /class="overall not-met">Requirements not met/);
});

Deno.test("report: worksheet headings sit below the report's own", () => {
  assert.match(proseToHtml("# A\n\n## B\n"), /<h2>A<\/h2>\n<h3>B<\/h3>/);
});

Deno.test("formatNumber keeps five significant digits", () => {
  const cases: [number, string][] = [[0, "0"], [1.23456789, "1.2346"], [-50.00001, "-50"], [
    1e-5,
    "1e-5",
  ], [123456789, "1.2346e+8"]];
  for (const [v, s] of cases) assert.equal(formatNumber(v), s);
});
