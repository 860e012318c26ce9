// Report data → one static HTML page (no scripts), in the order reviewers read it:
// identity and verdict; the requirement table; the worksheet's prose with each
// block's exhibits in place; design record; coefficients; exports; provenance;
// sign-off; cautions; and the worksheet's code as an appendix.
import type {
  BlockResult,
  CheckExhibit,
  ChoiceExhibit,
  CodePart,
  CoefficientsExhibit,
  ExecutionResult,
  Exhibit,
  FigureExhibit,
  ParamValue,
  Provenance,
  Verdict,
  Worksheet,
  WrittenFile,
} from "../record/types.ts";
import { defaultDesign } from "../record/types.ts";
import {
  designsChecked,
  overallVerdict,
  type RequirementRow,
  requirementRows,
} from "../record/verdict.ts";
import { escapeHtml as esc, pageHead, proseToHtml } from "./html.ts";
import { approvalsMarks } from "../record/manifest.ts";
import type { ApprovalStatus } from "../record/approvals.ts";
import { reportCss } from "./report_css.ts";

/** Everything the report shows. */
export interface ReportInput {
  worksheet: Worksheet;
  params: Record<string, ParamValue>;
  /** Names of settings changed from the worksheet's own values. */
  overridden: string[];
  execution: ExecutionResult;
  /** Figure file (relative path) for each figure exhibit. */
  figures: Map<Exhibit, WrittenFile>;
  /** The CSV file of each coefficient listing (its SHA-256 is the listing's). */
  listings: Map<Exhibit, WrittenFile>;
  exports: WrittenFile[];
  provenance: Provenance;
  /** The report's fingerprint (a placeholder while the fingerprint is computed). */
  fingerprint: string;
  /** SHA-256 of everything the result depends on. */
  inputs: string;
}

const verdictText: Record<Verdict, string> = {
  "met": "All requirements met",
  "not met": "Requirements not met",
  "incomplete": "Incomplete: the worksheet did not run to the end",
  "no requirements": "No requirements declared",
};

/** Format a number for a table: 5 significant digits, exponent outside [1e-3, 1e6). */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return "0";
  const a = Math.abs(value);
  if (a >= 1e6 || a < 1e-3) return value.toExponential(4).replace(/\.?0+e/, "e");
  return String(Number(value.toPrecision(5)));
}

/**
 * An achieved value that is zero up to rounding (below 1e-9 of the limit, or
 * of 1 when the limit is smaller) reads as "0 (rounding)": a linear-phase
 * filter's delay variation of 1.2e-13 samples is no variation at all.
 */
export function isRoundingZero(achieved: number, limit: number): boolean {
  return achieved !== 0 && Math.abs(achieved) < 1e-9 * Math.max(1, Math.abs(limit));
}

function withUnit(text: string, unit: string): string {
  return unit === "" ? text : `${text} ${esc(unit)}`;
}

function formatParam(value: ParamValue): string {
  return Array.isArray(value) ? `[${value.join(", ")}]` : String(value);
}

/** The number of each figure, in the order they appear, and its anchor. */
function numberFigures(figures: Map<Exhibit, WrittenFile>): Map<Exhibit, number> {
  return new Map([...figures.keys()].map((e, i) => [e, i + 1]));
}

/** For each requirement id, the first figure whose mask is labelled with it. */
function figureOfRequirement(numbers: Map<Exhibit, number>): Map<string, number> {
  const out = new Map<string, number>();
  for (const [exhibit, n] of numbers) {
    for (const m of (exhibit as FigureExhibit).mask ?? []) {
      if (m.label && !out.has(m.label)) out.set(m.label, n);
    }
  }
  return out;
}

function achievedHtml(check: CheckExhibit): string {
  const r = check.result;
  if (isRoundingZero(r.achieved, r.limit)) {
    return `<span title="${r.achieved}">${withUnit("0", r.unit)} (rounding)</span>`;
  }
  const beside = check.equivalent
    ? ` <span class="equivalent">(${
      withUnit(formatNumber(check.equivalent.value), check.equivalent.unit)
    })</span>`
    : "";
  return `${withUnit(formatNumber(r.achieved), r.unit)}${beside}`;
}

/** Where a requirement applies, from its declared fields: a band, or one frequency. */
function scopeOf(d: RequirementRow["requirement"]): string {
  const f = d.fields;
  const hz = (
    v: number | undefined,
  ) => (v === undefined || Number.isNaN(v) ? "fs/2" : `${formatNumber(v)} Hz`);
  if (f.from !== undefined || f.to !== undefined) {
    return `<span class="band">${f.from === undefined ? "0 Hz" : hz(f.from)} – ${hz(f.to)}</span>`;
  }
  if (f.frequency !== undefined) return `<span class="band">at ${hz(f.frequency)}</span>`;
  return "";
}

function requirementTable(rows: RequirementRow[], figureOf: Map<string, number>): string {
  if (rows.length === 0) {
    return `<p class="empty">The worksheet declares no requirements.</p>`;
  }
  const showDesign = rows.some((r) => r.check && r.check.design !== defaultDesign);
  // A requirement checked on several designs names itself once, over all its rows.
  const span = (i: number) => {
    const d = rows[i]!.requirement;
    if (i > 0 && rows[i - 1]!.requirement === d) return "";
    let n = 1;
    while (rows[i + n]?.requirement === d) n++;
    return `<td class="id"${n > 1 ? ` rowspan="${n}"` : ""}>${esc(d.id)}</td><td${
      n > 1 ? ` rowspan="${n}"` : ""
    }>${esc(d.text)}${scopeOf(d)}</td>`;
  };
  const body = rows.map(({ requirement: d, check }, i) => {
    const relation = d.relation === "atMost" ? "≤" : "≥";
    const source = typeof d.written === "string" && !/^[-+.\d]/.test(d.written)
      ? ` <span class="source">${esc(d.written)}</span>`
      : "";
    const figure = figureOf.get(d.id);
    const figureCell = figure === undefined
      ? ""
      : `<a href="#figure-${figure}">Fig.&nbsp;${figure}</a>`;
    const limit = `<td class="num">${relation} ${
      withUnit(formatNumber(d.limit), d.unit)
    }${source}</td>`;
    if (check === undefined) {
      return `<tr class="not-checked">${span(i)}${
        showDesign ? "<td>—</td>" : ""
      }${limit}<td class="num">—</td><td class="num">—</td><td class="num">—</td><td>${figureCell}</td><td class="verdict">Not checked</td></tr>`;
    }
    const r = check.result;
    const zero = isRoundingZero(r.achieved, r.limit);
    const margin = `${r.margin >= 0 ? "+" : "−"}${formatNumber(Math.abs(r.margin))}`;
    const worst = r.worst && !zero ? withUnit(formatNumber(r.worst.at), r.worst.unit) : "—";
    return `<tr class="${r.met ? "met" : "not-met"}">${span(i)}${
      showDesign ? `<td>${esc(check.design)}</td>` : ""
    }${limit}<td class="num">${achievedHtml(check)}</td><td class="num">${
      withUnit(margin, r.unit)
    }</td><td class="num">${worst}</td><td>${figureCell}</td><td class="verdict">${
      r.met ? "Met" : "Not met"
    }</td></tr>`;
  });
  return `<div class="table-scroll"><table class="requirements"><thead><tr><th>Id</th><th>Requirement</th>${
    showDesign ? "<th>Design</th>" : ""
  }<th>Limit</th><th>Achieved</th><th>Margin</th><th>Worst at</th><th>Figure</th><th>Verdict</th></tr></thead>
<tbody>${body.join("\n")}</tbody></table></div>`;
}

/** What the overall verdict covers, in one sentence. */
function coverage(execution: ExecutionResult, rows: RequirementRow[]): string {
  const declared = execution.requirements.length;
  if (declared === 0) return "";
  const designs = designsChecked(execution);
  const unchecked = rows.filter((r) => r.check === undefined).length;
  const on = designs.length === 0
    ? "no design was checked"
    : designs.length === 1 && designs[0] === defaultDesign
    ? "checked on the one design"
    : `checked on ${designs.length === 1 ? "the design" : "each of the designs"} ${
      designs.map((d) => `“${esc(d)}”`).join(", ")
    }`;
  return `<p class="coverage">The verdict covers the ${declared} requirement${
    declared === 1 ? "" : "s"
  } declared in the worksheet, ${on}${
    unchecked > 0 ? `; ${unchecked} ${unchecked === 1 ? "was" : "were"} never checked` : ""
  }.</p>`;
}

/** One coefficient listing as CSV: the file whose SHA-256 the report shows. */
export function listingCsv(c: CoefficientsExhibit): string {
  const codes = c.codes !== undefined;
  if (c.layout === "sections") {
    const names = ["b0", "b1", "b2", "a1", "a2"];
    const lines = c.values.map((v, i) =>
      `${Math.floor(i / 5) + 1},${names[i % 5]},${v}${codes ? `,${c.codes![i]}` : ""}`
    );
    return `section,coefficient,value${codes ? ",code" : ""}\n${lines.join("\n")}\n`;
  }
  const lines = c.values.map((v, i) => `${i},${v}${codes ? `,${c.codes![i]}` : ""}`);
  return `index,value${codes ? ",code" : ""}\n${lines.join("\n")}\n`;
}

function listingHtml(c: CoefficientsExhibit, file: WrittenFile | undefined): string {
  const codes = c.codes;
  const code = (i: number) => (codes ? `<td class="num">${codes[i]}</td>` : "");
  const codeHead = codes ? `<th>Code${c.format ? ` (${esc(c.format)})` : ""}</th>` : "";
  let table: string;
  if (c.layout === "sections") {
    const names = ["b0", "b1", "b2", "a1", "a2"];
    const rows: string[] = [];
    for (let s = 0; s < c.values.length / 5; s++) {
      const cells = names.map((_, k) => {
        const i = 5 * s + k;
        return `<td class="num">${c.values[i]}${
          codes ? `<br><span class="code">${codes[i]}</span>` : ""
        }</td>`;
      });
      rows.push(`<tr><td class="num">${s + 1}</td>${cells.join("")}</tr>`);
    }
    table = `<div class="table-scroll"><table class="data sections"><thead><tr><th>Section</th>${
      names.map((n) => `<th>${n}</th>`).join("")
    }</tr></thead><tbody>${rows.join("")}</tbody></table></div>${
      codes
        ? `<p class="note">Below each value: the integer code the target holds${
          c.format ? ` (${esc(c.format)})` : ""
        }. a0 = 1.</p>`
        : `<p class="note">a0 = 1.</p>`
    }`;
  } else {
    table =
      `<table class="data coefficients"><thead><tr><th>Index</th><th>Value</th>${codeHead}</tr></thead><tbody>${
        c.values.map((v, i) =>
          `<tr><td class="num">${i}</td><td class="num">${v}</td>${code(i)}</tr>`
        )
          .join("")
      }</tbody></table>`;
  }
  const many = c.layout !== "sections" && c.values.length > 24 ? " many" : "";
  return `<section class="listing${many}"><h3>${
    esc(c.name)
  }</h3><p class="listing-facts">${c.values.length} values${
    c.description ? `: ${esc(c.description)}` : ""
  }${
    file
      ? `<br>SHA-256 of <a href="${esc(file.path)}">${
        esc(file.path)
      }</a>: <span class="hash">${file.sha256}</span>`
      : ""
  }</p>${table}</section>`;
}

function exhibitHtml(
  exhibit: Exhibit,
  input: ReportInput,
  numbers: Map<Exhibit, number>,
): string {
  switch (exhibit.type) {
    case "figure": {
      const file = input.figures.get(exhibit);
      const n = numbers.get(exhibit);
      if (!file || n === undefined) return "";
      const spec = file.path.replace(/\.svg$/, ".vl.json");
      const ids = [...new Set((exhibit.mask ?? []).flatMap((m) => (m.label ? [m.label] : [])))];
      return `<figure class="figure" id="figure-${n}"><img src="${
        esc(file.path)
      }" alt="Figure ${n}: ${esc(exhibit.title)}">
<figcaption><strong>Figure ${n}.</strong> ${esc(exhibit.title)}${
        ids.length > 0 ? ` <span class="shows">Requirements: ${ids.map(esc).join(", ")}</span>` : ""
      } · <a href="${esc(spec)}">plot specification</a></figcaption></figure>`;
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
      return `<div class="table-scroll"><table class="data"><caption>${
        esc(exhibit.title)
      }</caption><thead><tr>${head}</tr></thead><tbody>${body}</tbody></table></div>`;
    }
    case "check": {
      const r = exhibit.result;
      const relation = r.relation === "atMost" ? "at most" : "at least";
      const design = exhibit.design === defaultDesign ? "" : ` [${esc(exhibit.design)}]`;
      return `<p class="check ${r.met ? "met" : "not-met"}"><span class="mark">${
        r.met ? "Met" : "Not met"
      }</span> ${r.id ? `<span class="id">${esc(r.id)}</span> ` : ""}${esc(r.name)}${design}: ${
        achievedHtml(exhibit)
      } (limit ${relation} ${withUnit(formatNumber(r.limit), r.unit)})</p>`;
    }
    case "choice":
      return `<p class="choice"><span class="label">Design choice</span> ${
        esc(exhibit.name)
      } = <strong>${esc(String(exhibit.value))}</strong>: ${esc(exhibit.reason)}</p>`;
    case "coefficients":
      return `<p class="coefficient-note">Coefficients <strong>${
        esc(exhibit.name)
      }</strong> (${exhibit.values.length} values) are listed under Coefficients.</p>`;
    case "cost":
      return costTable(exhibit);
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

/**
 * The approvals recorded for the report (deno task tapsheet approve), each
 * with whether it still holds for this record. Not covered by the
 * fingerprint: approving a report does not change the record approved.
 */
export function approvalsHtml(statuses: readonly ApprovalStatus[]): string {
  if (statuses.length === 0) {
    return `<p class="note">No approvals are recorded for this report (deno task tapsheet approve).</p>`;
  }
  const label: Record<ApprovalStatus["state"], string> = {
    "holds": "Holds",
    "void": "Void",
    "superseded": "Superseded",
    "bad signature": "Signature does not verify",
  };
  const rows = statuses.map(({ approval: a, state, why }) =>
    `<tr class="approval ${state.replace(" ", "-")}"><td>${esc(a.role)}</td><td>${
      esc(a.name)
    }</td><td>${esc(a.date)}</td><td>${esc(a.revision)}</td><td class="hash">${
      esc(a.fingerprint.slice(0, 16))
    }…</td><td>${a.signature ? "Ed25519" : "unsigned"}</td><td class="verdict">${label[state]}${
      why ? `<br><span class="note">${esc(why)}</span>` : ""
    }</td></tr>`
  );
  return `<h3>Approvals recorded</h3><div class="table-scroll"><table class="data approvals"><thead><tr><th>Role</th><th>Name</th><th>Date</th><th>Revision</th><th>Fingerprint</th><th>Signature</th><th>State</th></tr></thead><tbody>${
    rows.join("\n")
  }</tbody></table></div>`;
}

/** Implementation cost of one design, as a small table. */
function costTable(e: Extract<Exhibit, { type: "cost" }>): string {
  const c = e.cost;
  const rate = c.decimation > 1
    ? ` (input ${formatNumber(c.inputRate)} Hz, output ${formatNumber(c.outputRate)} Hz)`
    : ` at ${formatNumber(c.outputRate)} Hz`;
  const latency = `${formatNumber(c.latencySamples)} samples, ${
    formatNumber(c.latencySeconds * 1000)
  } ms${
    c.latencyFrequency === undefined
      ? ""
      : ` (group delay at ${formatNumber(c.latencyFrequency)} Hz)`
  }`;
  const rows: [string, string][] = [
    ["Structure", esc(c.structure)],
    ["Multiplies per output sample", formatNumber(c.multipliesPerOutput)],
    ["Adds per output sample", formatNumber(c.addsPerOutput)],
    ["Multiplies per second", `${formatNumber(c.multipliesPerSecond)}${rate}`],
    ["State memory", `${formatNumber(c.stateWords)} words`],
    ["Coefficient memory", `${formatNumber(c.coefficientWords)} words`],
    ["Latency", latency],
  ];
  return `<table class="data cost"><caption>Implementation cost: ${esc(e.name)}</caption><tbody>${
    rows.map(([k, v]) => `<tr><th>${k}</th><td>${v}</td></tr>`).join("")
  }</tbody></table>`;
}

function problemHtml(problem: NonNullable<ExecutionResult["problem"]>, heading: string): string {
  const where = `${problem.path}:${problem.line}${problem.column ? `:${problem.column}` : ""}`;
  return `<div class="problem"><p><strong>${heading}${esc(where)}</strong></p>
<pre>${esc(problem.message)}</pre>${
    problem.excerpt ? `<pre class="excerpt">${problem.line} | ${esc(problem.excerpt)}</pre>` : ""
  }</div>`;
}

function blockHtml(
  input: ReportInput,
  block: BlockResult | undefined,
  part: CodePart,
  numbers: Map<Exhibit, number>,
): string {
  const status = block?.status ?? "not run";
  const problem = input.execution.problem;
  const output = (block?.exhibits ?? []).flatMap((e) => (e.type === "output" ? [e.text] : []));
  const lines = `${part.startLine}–${part.endLine}`;
  const parts = [
    `<details class="code ${status.replace(" ", "-")}"><summary>Worksheet lines ${lines}${
      status === "not run" ? " (not run)" : ""
    }</summary><pre><code>${esc(part.code)}</code></pre></details>`,
    `<p class="code-reference">Worksheet lines ${lines}: see the appendix${
      status === "not run" ? " (not run)" : ""
    }.</p>`,
  ];
  if (output.length > 0) parts.push(`<pre class="output">${esc(output.join("\n"))}</pre>`);
  if (status === "failed" && problem !== undefined) parts.push(problemHtml(problem, "Failed at "));
  if (status === "not run") {
    parts.push(`<p class="not-run">Not run: an earlier block failed.</p>`);
  }
  for (const exhibit of block?.exhibits ?? []) parts.push(exhibitHtml(exhibit, input, numbers));
  return `<div class="block">${parts.join("\n")}</div>`;
}

function parameterTable(input: ReportInput): string {
  const rules = input.worksheet.paramRules;
  const entries = Object.entries(input.params);
  if (entries.length === 0) return `<p class="empty">The worksheet declares no settings.</p>`;
  const rows = entries.map(([name, value]) => {
    const rule = rules[name] ?? {};
    const range = rule.min !== undefined && rule.max !== undefined
      ? `${rule.min} … ${rule.max}`
      : rule.min !== undefined
      ? `≥ ${rule.min}`
      : rule.max !== undefined
      ? `≤ ${rule.max}`
      : "";
    return `<tr><td>${esc(name)}</td><td class="num">${esc(formatParam(value))}</td><td>${
      esc(rule.unit ?? "")
    }</td><td class="num">${esc(range)}</td><td>${esc(rule.description ?? "")}</td><td>${
      input.overridden.includes(name) ? "set for this run" : "worksheet value"
    }</td></tr>`;
  });
  return `<div class="table-scroll"><table class="data settings"><thead><tr><th>Name</th><th>Value</th><th>Unit</th><th>Range</th><th>Description</th><th>Source</th></tr></thead><tbody>${
    rows.join("\n")
  }</tbody></table></div>`;
}

/** Build the report page. Pure: the same input gives the same bytes. */
export function reportHtml(input: ReportInput): string {
  const { worksheet, execution, provenance } = input;
  const meta = worksheet.meta;
  const verdict = overallVerdict(execution);
  const rows = requirementRows(execution);
  const numbers = numberFigures(input.figures);
  const blockByIndex = new Map(execution.blocks.map((b) => [b.index, b]));
  const exhibits = execution.blocks.flatMap((b) => b.exhibits);
  const choices = exhibits.filter((e): e is ChoiceExhibit => e.type === "choice");
  const coefficients = exhibits.filter((e): e is CoefficientsExhibit => e.type === "coefficients");
  const codeParts = worksheet.parts.filter((p): p is CodePart => p.kind === "code");
  const identity = [meta.document, meta.revision ? `revision ${meta.revision}` : ""].filter(Boolean)
    .join(", ");
  const problem = execution.problem;
  const rejected = execution.outcome === "rejected" && problem !== undefined;
  const met = rows.filter((r) => r.check?.result.met === true).length;

  const body: string[] = [];
  for (const part of worksheet.parts) {
    if (part.kind === "prose") body.push(`<div class="prose">${proseToHtml(part.markdown)}</div>`);
    else body.push(blockHtml(input, blockByIndex.get(part.index), part, numbers));
  }

  const choiceTable = choices.length === 0
    ? `<p class="empty">The worksheet recorded no design choices.</p>`
    : `<div class="table-scroll"><table class="data"><thead><tr><th>Choice</th><th>Value</th><th>Reason</th></tr></thead><tbody>${
      choices.map((c) =>
        `<tr><td>${esc(c.name)}</td><td>${esc(String(c.value))}</td><td>${esc(c.reason)}</td></tr>`
      ).join("\n")
    }</tbody></table></div>`;

  const coefficientBlocks = coefficients.length === 0
    ? `<p class="empty">The worksheet listed no coefficients.</p>`
    : coefficients.map((c) => listingHtml(c, input.listings.get(c))).join("\n");

  const exportList = input.exports.length === 0
    ? `<p class="empty">The worksheet exported no files.</p>`
    : `<div class="table-scroll"><table class="data"><thead><tr><th>File</th><th>Description</th><th>SHA-256</th></tr></thead><tbody>${
      input.exports.map((f) =>
        `<tr><td><a href="${esc(f.path)}">${esc(f.path)}</a></td><td>${
          esc(f.description ?? "")
        }</td><td class="hash">${f.sha256}</td></tr>`
      ).join("\n")
    }</tbody></table></div>`;

  const signoff =
    (meta.signoff.length > 0 ? meta.signoff : [{ role: "Designer" }, { role: "Reviewer" }])
      .map((s) =>
        `<tr><td>${esc(s.role)}</td><td>${
          esc(s.name ?? "")
        }</td><td class="blank"></td><td class="blank"></td></tr>`
      ).join("\n");

  const appendix = codeParts.length === 0
    ? `<p class="empty">The worksheet has no code.</p>`
    : codeParts.map((p) => {
      const status = blockByIndex.get(p.index)?.status ?? "not run";
      return `<h3>Lines ${p.startLine}–${p.endLine}${
        status === "ok" ? "" : ` (${esc(status)})`
      }</h3><pre class="listing-code"><code>${
        esc(p.code).split("\n").map((l, i) =>
          `<span class="line-number">${String(p.startLine + i).padStart(4)}</span> ${l}`
        ).join("\n")
      }</code></pre>`;
    }).join("\n");

  return `${
    pageHead(`${meta.title}${meta.document ? ` (${meta.document})` : ""}`, reportCss(identity))
  }<header class="identity">
<p class="kind">Filter design report</p>
<h1>${esc(meta.title)}</h1>
<dl class="facts">
<div><dt>Document</dt><dd>${esc(meta.document || "—")}</dd></div>
<div><dt>Revision</dt><dd>${esc(meta.revision || "—")}</dd></div>
<div><dt>Date</dt><dd>${esc(provenance.date)}</dd></div>
<div><dt>Requirements</dt><dd>${met} of ${rows.length} met</dd></div>
<div><dt>Fingerprint</dt><dd class="hash">${input.fingerprint}</dd></div>
</dl>
<p class="overall ${verdict.replace(" ", "-")}">${verdictText[verdict]}</p>
${coverage(execution, rows)}
${problem && (rejected || execution.outcome !== "error") ? problemHtml(problem, "") : ""}
</header>
<main>
<section id="requirements"><h2>Requirements</h2>
${requirementTable(rows, figureOfRequirement(numbers))}
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
<div class="table-scroll"><table class="data provenance"><tbody>
<tr><th>Worksheet</th><td>${esc(provenance.worksheetPath)}</td></tr>
<tr><th>Worksheet SHA-256</th><td class="hash">${provenance.worksheetSha256}</td></tr>
<tr><th>Inputs SHA-256</th><td class="hash">${input.inputs}</td></tr>
<tr><th>Report fingerprint</th><td class="hash">${input.fingerprint}</td></tr>
<tr><th>tapsheet</th><td>${esc(provenance.tapsheetVersion)}, code SHA-256 <span class="hash">${
    esc(provenance.toolSha256)
  }</span></td></tr>
<tr><th>Deno</th><td>${esc(provenance.denoVersion)}</td></tr>
<tr><th>Packages</th><td>${
    provenance.packages.map((p) => `${esc(p.name)} ${esc(p.version)}`).join(", ")
  }</td></tr>
<tr><th>Platform</th><td>${esc(provenance.platform)}</td></tr>
<tr><th>Run date</th><td>${esc(provenance.date)}</td></tr>
<tr><th>To reproduce</th><td><code>${esc(provenance.command)}</code></td></tr>
</tbody></table></div>
<p class="note">The fingerprint is the SHA-256 over every file of the report (this page taken with its fingerprint left out); <code>deno task tapsheet verify</code> checks it and re-runs the worksheet.</p>
<h3>Settings</h3>
${parameterTable(input)}
</section>
<section id="signoff"><h2>Sign-off</h2>
<p class="note">Signing approves the report with fingerprint <span class="hash">${input.fingerprint}</span>.</p>
<table class="signoff"><thead><tr><th>Role</th><th>Name</th><th>Signature</th><th>Date</th></tr></thead><tbody>
${signoff}
</tbody></table>
${approvalsMarks[0]}${approvalsMarks[1]}
</section>
<section id="cautions"><h2>Cautions</h2>
<ul>
<li>This report shows that the design meets the requirements written in its worksheet, evaluated as described there. It does not show that those requirements are right or complete for the product.</li>
<li>Verification by tapsheet does not replace the reviewer's own judgment, the product's own testing on the real target with real signals, or the standards and regulations that apply where the product ships.</li>
<li>Filters in hearing, medical, measurement and control products can cause harm when wrong. Check the exported coefficients in the implementation itself, including its arithmetic, scaling and overflow behaviour.</li>
</ul>
</section>
<section id="appendix"><h2>Appendix: the worksheet's code</h2>
<p class="note">Every code block of the worksheet, with its line numbers in ${
    esc(provenance.worksheetPath)
  }.</p>
${appendix}
</section>
</main>
</body>
</html>
`;
}
