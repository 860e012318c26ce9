// Report data → one static HTML page (no scripts), in the order reviewers read it.
import type { RequirementResult } from "../lib/verify/requirement.ts";
import type {
  BlockResult,
  ChoiceExhibit,
  CoefficientsExhibit,
  ExecutionResult,
  Exhibit,
  ParamValue,
  Provenance,
  Verdict,
  Worksheet,
  WrittenFile,
} from "../record/types.ts";
import { overallVerdict, requirementResults } from "../record/verdict.ts";
import { escapeHtml as esc, proseToHtml } from "./html.ts";
import { reportCss } from "./report_css.ts";

/** Everything the report shows. */
export interface ReportInput {
  worksheet: Worksheet;
  params: Record<string, ParamValue>;
  /** Names of parameters changed from the worksheet's own values. */
  overridden: string[];
  execution: ExecutionResult;
  /** Figure file (relative path) for each figure exhibit, by block index and position. */
  figures: Map<Exhibit, WrittenFile>;
  exports: WrittenFile[];
  provenance: Provenance;
}

const verdictText: Record<Verdict, string> = {
  "met": "All requirements met",
  "not met": "Requirements not met",
  "incomplete": "Incomplete: the worksheet did not run to the end",
  "no requirements": "No requirements checked",
};

/** Format a number for a table: 5 significant digits, exponent outside [1e-3, 1e6). */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return "0";
  const a = Math.abs(value);
  if (a >= 1e6 || a < 1e-3) return value.toExponential(4).replace(/\.?0+e/, "e");
  return String(Number(value.toPrecision(5)));
}

function formatParam(value: ParamValue): string {
  return Array.isArray(value) ? `[${value.join(", ")}]` : String(value);
}

function requirementRows(results: RequirementResult[]): string {
  if (results.length === 0) {
    return `<p class="empty">The worksheet checked no requirements.</p>`;
  }
  const rows = results.map((r) => {
    const relation = r.relation === "atMost" ? "≤" : "≥";
    const margin = `${r.margin >= 0 ? "+" : "−"}${formatNumber(Math.abs(r.margin))}`;
    const worst = r.worst ? `${formatNumber(r.worst.at)} ${esc(r.worst.unit)}` : "";
    return `<tr class="${r.met ? "met" : "not-met"}">
<td class="id">${esc(r.id ?? "")}</td><td>${esc(r.name)}</td>
<td class="num">${relation} ${formatNumber(r.limit)} ${esc(r.unit)}</td>
<td class="num">${formatNumber(r.achieved)} ${esc(r.unit)}</td>
<td class="num">${margin} ${esc(r.unit)}</td><td class="num">${worst}</td>
<td class="verdict">${r.met ? "Met" : "Not met"}</td></tr>`;
  });
  return `<table class="requirements"><thead><tr><th>Id</th><th>Requirement</th><th>Limit</th>
<th>Achieved</th><th>Margin</th><th>Worst at</th><th>Verdict</th></tr></thead>
<tbody>${rows.join("\n")}</tbody></table>`;
}

function exhibitHtml(exhibit: Exhibit, figures: Map<Exhibit, WrittenFile>): string {
  switch (exhibit.type) {
    case "figure": {
      const file = figures.get(exhibit);
      if (!file) return "";
      const spec = file.path.replace(/\.svg$/, ".vl.json");
      return `<figure class="figure"><img src="${esc(file.path)}" alt="${esc(exhibit.title)}">
<figcaption>${esc(exhibit.title)} · <a href="${
        esc(spec)
      }">plot specification</a></figcaption></figure>`;
    }
    case "table": {
      const head = exhibit.columns.map((c) => `<th>${esc(c)}</th>`).join("");
      const body = exhibit.rows.map((r) =>
        `<tr>${
          r.map((c) =>
            typeof c === "number" ? `<td class="num">${formatNumber(c)}</td>` : `<td>${esc(c)}</td>`
          ).join("")
        }</tr>`
      ).join("\n");
      return `<table class="data"><caption>${
        esc(exhibit.title)
      }</caption><thead><tr>${head}</tr></thead><tbody>${body}</tbody></table>`;
    }
    case "check": {
      const r = exhibit.result;
      const relation = r.relation === "atMost" ? "at most" : "at least";
      return `<p class="check ${r.met ? "met" : "not-met"}"><span class="mark">${
        r.met ? "Met" : "Not met"
      }</span> ${r.id ? `<span class="id">${esc(r.id)}</span> ` : ""}${esc(r.name)}: ${
        formatNumber(r.achieved)
      } ${esc(r.unit)} (limit ${relation} ${formatNumber(r.limit)} ${esc(r.unit)})</p>`;
    }
    case "choice":
      return `<p class="choice"><span class="label">Design choice</span> ${
        esc(exhibit.name)
      } = <strong>${esc(String(exhibit.value))}</strong>: ${esc(exhibit.reason)}</p>`;
    case "coefficients":
      return `<p class="coefficient-note">Coefficients <strong>${
        esc(exhibit.name)
      }</strong> (${exhibit.values.length} values) are listed under Coefficients.</p>`;
    case "export":
      return `<p class="coefficient-note">Exported <code>${
        esc(exhibit.fileName)
      }</code>, listed under Exports.</p>`;
    case "warning":
      return `<p class="warning"><span class="label">Warning</span> ${
        esc(exhibit.warning.message)
      }</p>`;
    case "output":
      return "";
  }
}

function blockHtml(
  input: ReportInput,
  block: BlockResult | undefined,
  code: string,
  lines: [number, number],
): string {
  const status = block?.status ?? "not run";
  const problem = input.execution.problem;
  const output = (block?.exhibits ?? []).filter((e) => e.type === "output").map((e) =>
    e.type === "output" ? e.text : ""
  );
  const failed = status === "failed" && problem !== undefined;
  const parts = [
    `<details class="code ${status.replace(" ", "-")}"><summary>Code, worksheet lines ${lines[0]}–${
      lines[1]
    }${status === "not run" ? " (not run)" : ""}</summary><pre><code>${
      esc(code)
    }</code></pre></details>`,
  ];
  if (output.length > 0) parts.push(`<pre class="output">${esc(output.join("\n"))}</pre>`);
  if (failed) {
    const where = `${problem.path}:${problem.line}${problem.column ? `:${problem.column}` : ""}`;
    parts.push(`<div class="problem"><p><strong>Failed at ${esc(where)}</strong></p>
<pre>${esc(problem.message)}</pre>${
      problem.excerpt ? `<pre class="excerpt">${problem.line} | ${esc(problem.excerpt)}</pre>` : ""
    }</div>`);
  }
  if (status === "not run") {
    parts.push(`<p class="not-run">Not run: an earlier block failed.</p>`);
  }
  for (const exhibit of block?.exhibits ?? []) parts.push(exhibitHtml(exhibit, input.figures));
  return `<div class="block">${parts.join("\n")}</div>`;
}

/** Build the report page. Pure: the same input gives the same bytes. */
export function reportHtml(input: ReportInput): string {
  const { worksheet, execution, provenance } = input;
  const meta = worksheet.meta;
  const verdict = overallVerdict(execution);
  const results = requirementResults(execution);
  const blockByIndex = new Map(execution.blocks.map((b) => [b.index, b]));
  const exhibits = execution.blocks.flatMap((b) => b.exhibits);
  const choices = exhibits.filter((e): e is ChoiceExhibit => e.type === "choice");
  const coefficients = exhibits.filter((e): e is CoefficientsExhibit => e.type === "coefficients");
  const identity = [meta.document, meta.revision ? `revision ${meta.revision}` : ""].filter(Boolean)
    .join(", ");
  const problem = execution.problem;
  const rejected = execution.outcome === "rejected" && problem !== undefined;

  const body: string[] = [];
  for (const part of worksheet.parts) {
    if (part.kind === "prose") body.push(`<div class="prose">${proseToHtml(part.markdown)}</div>`);
    else {
      body.push(
        blockHtml(input, blockByIndex.get(part.index), part.code, [part.startLine, part.endLine]),
      );
    }
  }

  const choiceTable = choices.length === 0
    ? `<p class="empty">The worksheet recorded no design choices.</p>`
    : `<table class="data"><thead><tr><th>Choice</th><th>Value</th><th>Reason</th></tr></thead><tbody>${
      choices.map((c) =>
        `<tr><td>${esc(c.name)}</td><td>${esc(String(c.value))}</td><td>${esc(c.reason)}</td></tr>`
      ).join("\n")
    }</tbody></table>`;

  const coefficientBlocks = coefficients.length === 0
    ? `<p class="empty">The worksheet listed no coefficients.</p>`
    : coefficients.map((c) =>
      `<details class="coefficients"><summary>${esc(c.name)}: ${c.values.length} values${
        c.description ? ` (${esc(c.description)})` : ""
      }</summary><table class="data coefficients"><thead><tr><th>Index</th><th>Value</th></tr></thead><tbody>${
        c.values.map((v, i) =>
          `<tr><td class="num">${i}</td><td class="num">${v.toPrecision(17)}</td></tr>`
        )
          .join("")
      }</tbody></table></details>`
    ).join("\n");

  const exportList = input.exports.length === 0
    ? `<p class="empty">The worksheet exported no files.</p>`
    : `<table class="data"><thead><tr><th>File</th><th>Description</th><th>SHA-256</th></tr></thead><tbody>${
      input.exports.map((f) =>
        `<tr><td><a href="${esc(f.path)}">${esc(f.path)}</a></td><td>${
          esc(f.description ?? "")
        }</td><td class="hash">${f.sha256}</td></tr>`
      ).join("\n")
    }</tbody></table>`;

  const paramRows = Object.entries(input.params).map(([name, value]) =>
    `<tr><td>${esc(name)}</td><td class="num">${esc(formatParam(value))}</td><td>${
      input.overridden.includes(name) ? "set for this run" : "worksheet value"
    }</td></tr>`
  ).join("\n");

  const signoff =
    (meta.signoff.length > 0 ? meta.signoff : [{ role: "Designer" }, { role: "Reviewer" }])
      .map((s) =>
        `<tr><td>${esc(s.role)}</td><td>${
          esc(s.name ?? "")
        }</td><td class="blank"></td><td class="blank"></td></tr>`
      ).join("\n");

  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src 'self' file: data:; style-src 'unsafe-inline'; base-uri 'none'; form-action 'none'">
<title>${esc(meta.title)}${meta.document ? ` (${esc(meta.document)})` : ""}</title>
<style>${reportCss(identity)}</style>
</head>
<body>
<header class="identity">
<p class="kind">Filter design report</p>
<h1>${esc(meta.title)}</h1>
<dl class="facts">
<div><dt>Document</dt><dd>${esc(meta.document || "—")}</dd></div>
<div><dt>Revision</dt><dd>${esc(meta.revision || "—")}</dd></div>
<div><dt>Date</dt><dd>${esc(provenance.date)}</dd></div>
<div><dt>Requirements</dt><dd>${
    results.filter((r) => r.met).length
  } of ${results.length} met</dd></div>
</dl>
<p class="overall ${verdict.replace(" ", "-")}">${verdictText[verdict]}</p>
${
    problem && (rejected || execution.outcome !== "error")
      ? `<div class="problem"><p><strong>${esc(problem.path)}:${problem.line}${
        problem.column ? `:${problem.column}` : ""
      }</strong></p><pre>${esc(problem.message)}</pre>${
        problem.excerpt
          ? `<pre class="excerpt">${problem.line} | ${esc(problem.excerpt)}</pre>`
          : ""
      }</div>`
      : ""
  }
</header>
<main>
<section id="requirements"><h2>Requirements</h2>
${requirementRows(results)}
</section>
<section id="worksheet">
${body.join("\n")}
</section>
<section id="design-record"><h2>Design record</h2>
${choiceTable}
</section>
<section id="coefficients"><h2>Coefficients</h2>
${coefficientBlocks}
</section>
<section id="exports"><h2>Exports</h2>
${exportList}
</section>
<section id="provenance"><h2>Provenance</h2>
<table class="data"><tbody>
<tr><th>Worksheet</th><td>${esc(provenance.worksheetPath)}</td></tr>
<tr><th>Worksheet SHA-256</th><td class="hash">${provenance.worksheetSha256}</td></tr>
<tr><th>tapsheet</th><td>${esc(provenance.tapsheetVersion)}</td></tr>
<tr><th>Deno</th><td>${esc(provenance.denoVersion)}</td></tr>
<tr><th>Packages</th><td>${
    provenance.packages.map((p) => `${esc(p.name)} ${esc(p.version)}`).join(", ")
  }</td></tr>
<tr><th>Run date</th><td>${esc(provenance.date)}</td></tr>
</tbody></table>
<h3>Parameters</h3>
${
    paramRows === ""
      ? `<p class="empty">The worksheet declares no parameters.</p>`
      : `<table class="data"><thead><tr><th>Name</th><th>Value</th><th>Source</th></tr></thead><tbody>${paramRows}</tbody></table>`
  }
</section>
<section id="signoff"><h2>Sign-off</h2>
<table class="signoff"><thead><tr><th>Role</th><th>Name</th><th>Signature</th><th>Date</th></tr></thead><tbody>
${signoff}
</tbody></table>
</section>
<section id="cautions"><h2>Cautions</h2>
<ul>
<li>This report shows that the design meets the requirements written in its worksheet, evaluated as described there. It does not show that those requirements are right or complete for the product.</li>
<li>Verification by tapsheet does not replace the reviewer's own judgment, the product's own testing on the real target with real signals, or the standards and regulations that apply where the product ships.</li>
<li>Filters in hearing, medical, measurement and control products can cause harm when wrong. Check the exported coefficients in the implementation itself, including its arithmetic, scaling and overflow behaviour.</li>
</ul>
</section>
</main>
</body>
</html>
`;
}
