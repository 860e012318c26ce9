import assert from "node:assert/strict";
import { judge } from "../../lib/verify/requirement.ts";
import { formatNumber, isRoundingZero, listingCsv, reportHtml } from "../../render/report.ts";
import type { ReportInput } from "../../render/report.ts";
import { overallVerdict, requirementRows } from "../../record/verdict.ts";
import { proseToHtml } from "../../render/html.ts";
import type {
  CheckExhibit,
  DeclaredRequirement,
  ExecutionResult,
  Exhibit,
  Worksheet,
} from "../../record/types.ts";

const attack = `<script>alert(1)</script><img src=x onerror=alert(2)>`;

const declared = (id: string, limit = 2, unit = "dB"): DeclaredRequirement => ({
  id,
  text: `Requirement ${id} ${attack}`,
  relation: "atMost",
  limit,
  unit,
  written: String(limit),
  fields: {},
  line: 5,
});

function input(execution: ExecutionResult, worksheet?: Partial<Worksheet>): ReportInput {
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
      paramRules: { label: { unit: "Hz", min: 1, max: 9, description: `About ${attack}` } },
      requirements: [],
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
    listings: new Map(),
    exports: [{ path: "exports/a.h", sha256: "ab".repeat(32), description: attack }],
    provenance: {
      worksheetSha256: "cd".repeat(32),
      worksheetPath: "w.md",
      tapsheetVersion: "0.1.0",
      toolSha256: "ef".repeat(32),
      platform: "linux x86_64",
      command: "deno task tapsheet run w.md --date 2026-01-01",
      denoVersion: "2.9.6",
      packages: [{ name: "vega", version: "6.4.0" }],
      date: "2026-01-01",
    },
    fingerprint: "12".repeat(32),
    inputs: "34".repeat(32),
  };
}

const check = (id: string, achieved: number, design = "design", limit = 2): CheckExhibit => ({
  type: "check",
  result: { ...judge(`Requirement ${id} ${attack}`, achieved, { atMost: limit }, "dB"), id },
  design,
});

const completed = (met: boolean, extra: Exhibit[] = []): ExecutionResult => ({
  outcome: "completed",
  durationMs: 1,
  requirements: [declared("R-1")],
  blocks: [{
    index: 0,
    status: "ok",
    exhibits: [
      check("R-1", met ? 1 : 3),
      { type: "table", title: attack, columns: [attack, "n"], rows: [[attack, 1.5]] },
      { type: "choice", name: attack, value: attack, reason: attack },
      { type: "output", text: attack },
      { type: "warning", warning: { code: "x", message: attack } },
      { type: "coefficients", name: attack, values: [0.5, -0.25] },
      ...extra,
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
    "appendix",
  ]
    .map((id) => html.indexOf(`<section id="${id}"`));
  assert.ok(order.every((i) => i > 0), String(order));
  assert.deepEqual([...order].sort((a, b) => a - b), order);
  assert.ok(html.indexOf('class="overall') < order[0]!);
  assert.match(html, /does not replace the reviewer's own judgment/);
});

Deno.test("report: the verdict follows the declared requirements", () => {
  assert.equal(overallVerdict(completed(true)), "met");
  assert.equal(overallVerdict(completed(false)), "not met");
  const base = { blocks: [], durationMs: 1, requirements: [] };
  assert.equal(overallVerdict({ ...base, outcome: "timeout" }), "incomplete");
  assert.equal(overallVerdict({ ...base, outcome: "completed" }), "no requirements");
  assert.match(reportHtml(input(completed(false))), /class="overall not-met">Requirements not met/);
  // A declared requirement that no check reached keeps the verdict from "met".
  const unchecked = completed(true);
  unchecked.requirements.push(declared("R-2"));
  assert.equal(overallVerdict(unchecked), "not met");
  const html = reportHtml(input(unchecked));
  assert.match(html, /<tr class="not-checked"><td class="id">R-2<\/td>.*Not checked/);
  assert.match(html, /covers the 2 requirements declared .*1 was never checked/);
});

Deno.test("report: one row per declared requirement per design, and the designs the verdict covers", () => {
  const execution = completed(true);
  execution.requirements = [declared("R-1"), declared("R-2", 0.5, "ms")];
  execution.blocks[0]!.exhibits = [
    check("R-1", 1, "floating point"),
    check("R-1", 1.5, "Q15 coefficients"),
    {
      type: "check",
      result: { ...judge("x", 0.25, { atMost: 0.5 }, "ms"), id: "R-2" },
      design: "Q15 coefficients",
      equivalent: { value: 12, unit: "samples" },
    },
  ];
  const rows = requirementRows(execution);
  assert.deepEqual(rows.map((r) => [r.requirement.id, r.check?.design]), [
    ["R-1", "floating point"],
    ["R-1", "Q15 coefficients"],
    ["R-2", "Q15 coefficients"],
  ]);
  const html = reportHtml(input(execution));
  assert.match(html, /<th>Design<\/th>/);
  assert.match(html, /checked on each of the designs “floating point”, “Q15 coefficients”/);
  // The requirement keeps its own unit, with the samples beside it.
  assert.match(html, /0\.25 ms <span class="equivalent">\(12 samples\)<\/span>/);
});

Deno.test("report: near-zero results read as zero up to rounding, without a worst frequency", () => {
  // source: common practice: a symmetric FIR's delay variation is exactly 0; 1e-13 is rounding
  assert.ok(isRoundingZero(1.2e-13, 0.01));
  assert.ok(!isRoundingZero(1e-6, 0.01));
  assert.ok(!isRoundingZero(0, 1));
  const execution = completed(true);
  execution.blocks[0]!.exhibits = [{
    type: "check",
    result: {
      ...judge("x", 1.2e-13, { atMost: 2 }, "dB", { worst: { at: 433.3, unit: "Hz" } }),
      id: "R-1",
    },
    design: "design",
  }];
  const html = reportHtml(input(execution));
  assert.match(html, /0 dB \(rounding\)/);
  assert.doesNotMatch(html, /1\.2e-13 dB/);
  assert.doesNotMatch(html, /433\.3 Hz/);
});

Deno.test("report: figures are numbered and each requirement row links to its figure", () => {
  const figure: Exhibit = {
    type: "figure",
    kind: "magnitude",
    title: "Magnitude",
    series: [{ name: "h", x: [0, 1], y: [0, -1] }],
    mask: [{ from: 0, to: 1, level: -2, bound: "lower", label: "R-1" }],
  };
  const execution = completed(true, [figure]);
  const i = input(execution);
  i.figures.set(figure, { path: "figures/01-magnitude.svg", sha256: "00".repeat(32) });
  const html = reportHtml(i);
  assert.match(html, /<figure class="figure" id="figure-1">/);
  assert.match(html, /<strong>Figure 1\.<\/strong> Magnitude/);
  assert.match(html, /<a href="#figure-1">Fig\.&nbsp;1<\/a>/);
});

Deno.test("report: listings carry their SHA-256, the integer codes, and sections as b0 b1 b2 a1 a2", () => {
  const list: Exhibit = {
    type: "coefficients",
    name: "Taps",
    values: [0.25, 0.5],
    codes: [8192, 16384],
    format: "Q1.15",
  };
  const sections: Exhibit = {
    type: "coefficients",
    name: "Sections",
    values: [1, 2, 1, -0.5, 0.25, 1, 0, -1, 0.1, 0.2],
    layout: "sections",
  };
  // source: Q1.15 codes are round(value · 2^15): 0.25 → 8192, 0.5 → 16384
  assert.equal(listingCsv(list), "index,value,code\n0,0.25,8192\n1,0.5,16384\n");
  assert.match(listingCsv(sections), /^section,coefficient,value\n1,b0,1\n1,b1,2\n/);
  const execution = completed(true, [list, sections]);
  const i = input(execution);
  i.listings.set(list, { path: "listings/01-taps.csv", sha256: "aa".repeat(32) });
  const html = reportHtml(i);
  assert.match(html, new RegExp(`SHA-256 of <a href="listings/01-taps.csv">.*${"aa".repeat(32)}`));
  assert.match(html, /<th>Code \(Q1\.15\)<\/th>/);
  assert.match(html, /<td class="num">16384<\/td>/);
  assert.match(
    html,
    /<th>Section<\/th><th>b0<\/th><th>b1<\/th><th>b2<\/th><th>a1<\/th><th>a2<\/th>/,
  );
  assert.match(html, /<tr><td class="num">2<\/td><td class="num">1<\/td><td class="num">0<\/td>/);
});

Deno.test("report: provenance names units, ranges, fingerprint, inputs, code hash, platform and command", () => {
  const html = reportHtml(input(completed(true)));
  assert.match(html, /<td>Hz<\/td><td class="num">1 … 9<\/td><td>About &lt;script/);
  assert.match(html, /Report fingerprint<\/th><td class="hash">(12){32}/);
  assert.match(html, /Inputs SHA-256<\/th><td class="hash">(34){32}/);
  assert.match(html, /code SHA-256 <span class="hash">(ef){32}/);
  assert.match(html, /<td>linux x86_64<\/td>/);
  assert.match(html, /<code>deno task tapsheet run w\.md --date 2026-01-01<\/code>/);
  // The code is in the appendix with its line numbers, folded in place on screen.
  assert.match(html, /<summary>Worksheet lines 10–10<\/summary>/);
  assert.match(html, /<span class="line-number"> {2}10<\/span> const s = /);
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
