// A comparison of two design records → the figures to draw and one static
// HTML page (no scripts), in the order a reviewer asks: did anything get
// worse; what changed in identity and settings; in the requirements and their
// verdicts; in each design (coefficients, cost); in the responses (overlays and
// new − old); in the exports; and which two records were compared.
import type {
  Comparison,
  CostComparison,
  FigureComparison,
  ListingComparison,
  RowComparison,
  RowSide,
  Worsening,
} from "../record/compare.ts";
import { defaultDesign, type FigureExhibit, type ParamValue } from "../record/types.ts";
import { escapeHtml as esc, pageHead } from "./html.ts";
import { formatNumber } from "./report.ts";
import { reportCss } from "./report_css.ts";

/** The unit in an axis title's last parentheses: "Magnitude (dB)" → "dB". */
function unitOf(axisTitle: string): string {
  return /\(([^()]+)\)\s*$/.exec(axisTitle)?.[1] ?? "";
}

/** The two figures drawn for a compared figure: old and new overlaid, and new − old. */
export interface ComparisonFigures {
  overlay: FigureExhibit;
  difference: FigureExhibit;
}

/**
 * The figures for one compared figure. The overlay has each series of the new
 * record, then each of the old, with the new record's mask; the difference is
 * new − old for each series both records draw.
 */
export function comparisonFigures(f: FigureComparison): ComparisonFigures {
  const overlay: FigureExhibit = {
    type: "figure",
    kind: f.kind === "quantised" ? "magnitude" : f.kind,
    title: `${f.title}: new and old`,
    series: [
      ...f.series.flatMap((s) => (s.new ? [{ ...s.new, name: `${s.name} (new)` }] : [])),
      ...f.series.flatMap((
        s,
      ) => (s.old ? [{ ...s.old, name: `${s.oldName ?? s.name} (old)` }] : [])),
    ],
    xScale: f.xScale,
  };
  if (f.mask.length > 0) overlay.mask = f.mask;
  if (f.xLabel !== undefined) overlay.xLabel = f.xLabel;
  if (f.yLabel !== undefined) overlay.yLabel = f.yLabel;
  if (f.normaliseTo !== undefined) overlay.normaliseTo = f.normaliseTo;
  if (f.yDomain !== undefined) overlay.yDomain = f.yDomain;
  const both = f.series.filter((s) => s.difference !== undefined);
  const unit = unitOf(f.yTitle);
  const difference: FigureExhibit = {
    type: "figure",
    kind: "line",
    title: `${f.title}: new − old`,
    series: both.map((s) => ({ ...s.difference!, name: both.length > 1 ? s.name : "new − old" })),
    xLabel: f.xLabel ?? f.xTitle,
    yLabel: unit === "" ? "Difference, new − old" : `Difference, new − old (${unit})`,
    xScale: f.xScale,
  };
  if (f.normaliseTo !== undefined) difference.normaliseTo = f.normaliseTo;
  difference.yDomain = differenceDomain(difference.series.flatMap((s) => s.y));
  return { overlay, difference };
}

/**
 * The y range of a difference figure: always from below zero to above it
 * (6 % beyond the data), so an offset reads as an offset, and rounding noise
 * around a constant does not fill the plot.
 */
export function differenceDomain(values: readonly number[]): [number, number] {
  let lo = 0;
  let hi = 0;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === 0 && hi === 0) return [-1, 1];
  const pad = (hi - lo) * 0.06;
  return [lo - pad, hi + pad];
}

/** Where the drawn figures of each compared figure are, relative to the page. */
export interface DrawnFigures {
  overlay: string;
  difference: string;
}

const withUnit = (v: string, unit: string) => (unit === "" ? v : `${v} ${esc(unit)}`);
const signed = (v: number) => `${v >= 0 ? "+" : "−"}${formatNumber(Math.abs(v))}`;
const limitText = (l: { relation: string; limit: number; unit: string }) =>
  withUnit(`${l.relation === "atMost" ? "≤" : "≥"} ${formatNumber(l.limit)}`, l.unit);
const show = (v: ParamValue | undefined) =>
  v === undefined ? "—" : Array.isArray(v) ? `[${v.join(", ")}]` : String(v);
const rowName = (r: { id: string; design?: string; oldDesign?: string }) =>
  r.oldDesign !== undefined
    ? `${r.id} [${r.oldDesign} → ${r.design}]`
    : r.design === undefined || r.design === defaultDesign
    ? r.id
    : `${r.id} [${r.design}]`;
/** A name, with the old one under it when the two were paired by order. */
const named = (name: string, oldName?: string) =>
  oldName === undefined
    ? esc(name)
    : `${esc(name)}<span class="was">was ${esc(oldName)}; paired by order</span>`;

const worseText: Record<Worsening["why"], string> = {
  "met to not met": "was met and is not met now",
  "met to not checked": "was met and is no longer checked",
  "no longer checked": "was not met and is no longer checked",
  "shortfall grew": "was not met and falls further short of its limit now",
  "removed": "is no longer declared",
  "limit looser": "has a looser limit",
  "limit not comparable":
    "changed its relation or unit, so its limit cannot be shown to be as strict",
};

function table(head: string[], rows: string[][], cls = "data"): string {
  return `<div class="table-scroll"><table class="${cls}"><thead><tr>${
    head.map((h) => `<th>${h}</th>`).join("")
  }</tr></thead><tbody>${
    rows.map((r) => `<tr>${r.join("")}</tr>`).join("\n")
  }</tbody></table></div>`;
}

const td = (html: string, cls = "") => `<td${cls ? ` class="${cls}"` : ""}>${html}</td>`;

function identitySection(c: Comparison): string {
  const rows = [
    ...c.identity.map((i) => [td(esc(i.field)), td(esc(i.old || "—")), td(esc(i.new || "—"))]),
    ...c.settings.map((s) => [
      td(`setting <code>${esc(s.name)}</code>`),
      td(esc(show(s.old)), "num"),
      td(esc(show(s.new)), "num"),
    ]),
  ];
  if (rows.length === 0) {
    return `<p class="empty">Title, document, revision and settings are the same.</p>`;
  }
  return `${
    table(["What", "Old", "New"], rows)
  }<p class="note">A dash: not declared on that side.</p>`;
}

function requirementsSection(c: Comparison): string {
  if (c.requirements.length === 0) {
    return `<p class="empty">The same requirements are declared, with the same limits.</p>`;
  }
  const rows = c.requirements.map((r) => {
    const what = r.change === "added"
      ? "added"
      : r.change === "removed"
      ? "removed"
      : [r.limit ? `limit ${r.limit}` : "", r.textChanged ? "text changed" : ""].filter(Boolean)
        .join(", ");
    const side = (d: typeof r.old) => (d ? `${esc(d.text)}<br>${limitText(d)}` : "—");
    const worse = r.change === "removed" || r.limit === "looser" || r.limit === "not comparable";
    return [
      td(esc(r.id), "id"),
      td(side(r.old)),
      td(side(r.new)),
      td(esc(what), worse ? "verdict worse" : "verdict"),
    ];
  });
  return table(["Id", "Old", "New", "Change"], rows, "data requirements-change");
}

function rowSideCell(s: RowSide | undefined): string {
  if (s === undefined) return td("not declared", "side");
  const facts = [
    s.achieved === undefined ? "" : `achieved ${withUnit(formatNumber(s.achieved), s.unit)}`,
    s.margin === undefined ? "" : `margin ${withUnit(signed(s.margin), s.unit)}`,
    `limit ${limitText(s)}`,
  ].filter(Boolean);
  return td(
    `<span class="status ${s.status.replace(" ", "-")}">${
      esc(s.status)
    }</span><span class="facts">${facts.join("<br>")}</span>`,
    "side",
  );
}

function rowClass(r: RowComparison): string {
  if (r.worse !== undefined) return "worse";
  if (r.verdictChanged) return "changed";
  return "";
}

function verdictsSection(c: Comparison): string {
  if (c.rows.length === 0) return `<p class="empty">Neither record declares requirements.</p>`;
  const rows = c.rows.map((r) => {
    const change = r.worse !== undefined
      ? `got worse: ${esc(worseText[r.worse])}`
      : r.verdictChanged
      ? `${esc(r.old!.status)} → ${esc(r.new!.status)}`
      : r.marginChange !== undefined && r.marginChange !== 0
      ? `margin ${withUnit(signed(r.marginChange), r.new!.unit)}`
      : r.old === undefined
      ? "added"
      : r.new === undefined
      ? "removed"
      : "same";
    return `<tr class="${rowClass(r)}">${
      [
        td(esc(r.id), "id"),
        td(esc(r.text)),
        td(
          r.design === undefined || r.design === defaultDesign ? "" : named(r.design, r.oldDesign),
        ),
        rowSideCell(r.old),
        rowSideCell(r.new),
        td(change, "change"),
      ].join("")
    }</tr>`;
  });
  return `<div class="table-scroll"><table class="verdicts"><thead><tr><th>Id</th><th>Requirement</th><th>Design</th><th>Old</th><th>New</th><th>Change</th></tr></thead><tbody>${
    rows.join("\n")
  }</tbody></table></div>`;
}

function listingRow(l: ListingComparison): string[] {
  const shape = (s: typeof l.old) =>
    s
      ? `${s.count} ${s.layout === "sections" ? "values in sections" : "values"}${
        s.hasCodes ? `, codes${s.format ? ` ${esc(s.format)}` : ""}` : ""
      }`
      : "—";
  const at = (i: number) =>
    l.new?.layout === "sections"
      ? `section ${Math.floor(i / 5) + 1} ${["b0", "b1", "b2", "a1", "a2"][i % 5]}`
      : `index ${i}`;
  const values = l.values === undefined
    ? l.old && l.new ? "not compared: layout or length differs" : "—"
    : l.values.changed === 0
    ? "none"
    : `${formatNumber(l.values.largest)} at ${at(l.values.at)} (${l.values.changed} changed)`;
  const codes = l.codes !== undefined
    ? l.codes.changed === 0
      ? "none"
      : `${l.codes.largestLsb} LSB at ${at(l.codes.at)} (${l.codes.changed} changed)`
    : l.codesNotCompared
    ? `not compared: ${esc(l.codesNotCompared)}`
    : "—";
  return [
    td(named(l.name, l.oldName)),
    td(shape(l.old)),
    td(shape(l.new)),
    td(values, "num"),
    td(codes, "num"),
  ];
}

const costLabels: [keyof NonNullable<CostComparison["old"]>, string][] = [
  ["structure", "Structure"],
  ["multipliesPerOutput", "Multiplies per output sample"],
  ["addsPerOutput", "Adds per output sample"],
  ["multipliesPerSecond", "Multiplies per second"],
  ["stateWords", "State memory (words)"],
  ["coefficientWords", "Coefficient memory (words)"],
  ["memoryWords", "Memory (words)"],
  ["latencySamples", "Latency (samples)"],
  ["latencySeconds", "Latency (s)"],
  ["inputRate", "Input rate (Hz)"],
  ["outputRate", "Output rate (Hz)"],
  ["decimation", "Decimation"],
];

function costHtml(k: CostComparison): string {
  const cell = (v: unknown) =>
    v === undefined ? "—" : typeof v === "number" ? formatNumber(v) : esc(String(v));
  const rows = costLabels.map(([field, label]) => {
    const [a, b] = [k.old?.[field], k.new?.[field]];
    const change = typeof a === "number" && typeof b === "number" && a !== b
      ? signed(b - a)
      : a !== b && a !== undefined && b !== undefined
      ? "changed"
      : "";
    return `<tr class="${change ? "changed" : ""}"><th>${label}</th>${td(cell(a), "num")}${
      td(cell(b), "num")
    }${td(change, "num")}</tr>`;
  });
  const state = !k.old ? " (new)" : !k.new ? " (removed)" : k.changed.length === 0 ? " (same)" : "";
  return `<div class="table-scroll"><table class="data cost"><caption>Implementation cost: ${
    named(k.name, k.oldName)
  }${state}</caption><thead><tr><th></th><th>Old</th><th>New</th><th>Change</th></tr></thead><tbody>${
    rows.join("")
  }</tbody></table></div>`;
}

function designsSection(c: Comparison): string {
  const listings = c.listings.length === 0
    ? `<p class="empty">Neither record lists coefficients.</p>`
    : `${
      table(
        ["Listing", "Old", "New", "Largest change of a value", "Largest change of a code"],
        c.listings.map(listingRow),
      )
    }<p class="note">Listings are matched by name and compared value by value when layout and length agree; codes are compared in LSBs (steps of the integer code) when both sides hold codes in the same format.</p>`;
  const costs = c.costs.length === 0
    ? `<p class="empty">Neither record costs a design.</p>`
    : c.costs.map(costHtml).join("\n");
  return `<h3>Coefficients</h3>\n${listings}\n<h3>Implementation cost</h3>\n${costs}`;
}

function figureHtml(f: FigureComparison, drawn: DrawnFigures | undefined, n: number): string {
  if (drawn === undefined) return "";
  const largest = f.series.filter((s) => s.largest !== undefined).map((s) =>
    `${esc(s.name)}${s.oldName ? ` (was ${esc(s.oldName)})` : ""}: ${
      withUnit(formatNumber(s.largest!.delta), unitOf(f.yTitle))
    } at ${withUnit(formatNumber(s.largest!.at), f.normaliseTo ? "Hz" : unitOf(f.xTitle))}`
  );
  const only = f.series.filter((s) => !s.old || !s.new).map((s) =>
    `${esc(s.name)} only in the ${s.new ? "new" : "old"} record`
  );
  const facts = [
    `Old figure ${f.old.number}${
      f.oldTitle !== f.title ? ` (“${esc(f.oldTitle)}”)` : ""
    }, new figure ${f.new.number}; matched by ${f.matchedBy}.`,
    f.mask.length > 0
      ? `The mask is the new record's${f.maskChanged ? "; it differs from the old record's" : ""}.`
      : f.maskChanged
      ? "The old record's figure had a mask; the new one has none."
      : "",
    largest.length > 0 ? `Largest change: ${largest.join("; ")}.` : "",
    only.length > 0 ? `${only.join("; ")}.` : "",
  ].filter(Boolean);
  return `<figure class="figure" id="figure-${n}"><img src="${
    esc(drawn.overlay)
  }" alt="Figure ${n}: ${esc(f.title)}, new and old"><img src="${
    esc(drawn.difference)
  }" alt="Figure ${n}, below: new minus old">
<figcaption><strong>Figure ${n}.</strong> ${esc(f.title)}. ${
    facts.join(" ")
  }</figcaption></figure>`;
}

function figuresSection(c: Comparison, drawn: readonly (DrawnFigures | undefined)[]): string {
  const parts = c.figures.map((f, i) => figureHtml(f, drawn[i], i + 1));
  const unmatched = c.unmatchedFigures.map((f) =>
    `<li>${esc(f.title)} (${esc(f.kind)}, figure ${f.number}) only in the ${f.side} record</li>`
  );
  return `${
    parts.length === 0
      ? `<p class="empty">No magnitude, passband, phase or group-delay figure is in both records.</p>`
      : `<p class="note">Each figure overlays the old record's series on the new one's, drawn from the points the reports plotted (dense curves keep the extremes of each of about 600 stretches); below it, new − old on the new series' points, the old series interpolated linearly.</p>\n${
        parts.join("\n")
      }`
  }${unmatched.length > 0 ? `<ul class="unmatched">${unmatched.join("")}</ul>` : ""}`;
}

function exportsSection(c: Comparison): string {
  const same = c.exportsUnchanged;
  const note = `<p class="note">${same} export${
    same === 1 ? "" : "s"
  } with the same SHA-256 on both sides.</p>`;
  if (c.exports.length === 0) {
    return `<p class="empty">No export changed.</p>${same > 0 ? note : ""}`;
  }
  return `${
    table(
      ["File", "Change", "Old SHA-256", "New SHA-256"],
      c.exports.map((e) => [
        td(esc(e.path)),
        td(esc(e.change)),
        td(e.old ?? "—", "hash"),
        td(e.new ?? "—", "hash"),
      ]),
    )
  }${note}`;
}

function recordsSection(c: Comparison): string {
  const row = (label: string, a: string, b: string, cls = "") =>
    `<tr><th>${label}</th>${td(a, cls)}${td(b, cls)}</tr>`;
  const { old: a, new: b } = c;
  return `<div class="table-scroll"><table class="data provenance"><thead><tr><th></th><th>Old</th><th>New</th></tr></thead><tbody>
${row("Compared as", esc(a.label), esc(b.label))}
${row("Worksheet", esc(a.worksheet), esc(b.worksheet))}
${
    row(
      "Document, revision",
      esc(`${a.document || "—"}, ${a.revision || "—"}`),
      esc(`${b.document || "—"}, ${b.revision || "—"}`),
    )
  }
${row("Run date", esc(a.date), esc(b.date))}
${row("Verdict", esc(a.verdict), esc(b.verdict))}
${row("Report fingerprint", esc(a.fingerprint), esc(b.fingerprint), "hash")}
${row("tapsheet code SHA-256", esc(a.toolSha256), esc(b.toolSha256), "hash")}
${row("To reproduce", `<code>${esc(a.command)}</code>`, `<code>${esc(b.command)}</code>`)}
</tbody></table></div>${
    c.unreadable.length > 0
      ? `<p class="note">Not read: ${
        c.unreadable.map((u) => `${u.side} ${esc(u.path)} (${esc(u.reason)})`).join("; ")
      }.</p>`
      : ""
  }`;
}

const extraCss = `
.overall.worse { background: #b3261e; }
.overall.held { background: #1e7a46; }
ul.worse li { color: #b3261e; }
table.verdicts { font-size: 0.82rem; }
table.verdicts td, table.verdicts th { padding: 0.25rem 0.35rem; }
table.verdicts tr.worse { background: #fbeceb; }
table.verdicts tr.worse td.change { color: #b3261e; font-weight: bold; }
table.verdicts tr.changed { background: #eef6f0; }
table.verdicts .status { display: block; font-weight: bold; white-space: nowrap; }
table.verdicts .status.not-met { color: #b3261e; }
table.verdicts .status.met { color: #1e7a46; }
table.verdicts .status.not-checked { color: #8a5a00; }
table.verdicts .facts { display: block; font-size: 0.78rem; color: #5b6878; white-space: nowrap; }
table.verdicts td.id, table.requirements-change td.id { font-family: 'DejaVu Sans Mono', monospace; font-size: 0.8rem; white-space: nowrap; }
table.requirements-change td.verdict.worse { color: #b3261e; font-weight: bold; }
table.cost tr.changed { background: #fdf5e6; }
.was { display: block; font-size: 0.75rem; color: #5b6878; }
.figure img + img { display: block; margin: 0.3rem auto 0; }
`;

/**
 * Build the comparison page. Pure: the same comparison and figure paths give the same bytes.
 * @param drawn For each compared figure, in order, the paths of its two drawn figures.
 */
export function comparisonHtml(
  c: Comparison,
  drawn: readonly (DrawnFigures | undefined)[],
): string {
  const worse = c.worse.length;
  const identity = `Comparison: ${c.old.label} → ${c.new.label}`;
  const worseList = worse === 0
    ? `<p class="empty">Nothing a requirement covers got worse.</p>`
    : `<ul class="worse">${
      c.worse.map((w) =>
        `<li><span class="id">${esc(rowName(w))}</span> ${esc(worseText[w.why])}</li>`
      )
        .join("")
    }</ul>`;
  return `${
    pageHead(`Comparison: ${c.new.title}`, `${reportCss(identity)}${extraCss}`)
  }<header class="identity">
<p class="kind">Revision comparison</p>
<h1>${esc(c.new.title)}</h1>
<dl class="facts">
<div><dt>Old</dt><dd>${esc(c.old.label)}</dd></div>
<div><dt>New</dt><dd>${esc(c.new.label)}</dd></div>
<div><dt>Document</dt><dd>${esc(c.new.document || "—")}</dd></div>
<div><dt>Verdicts</dt><dd>${esc(c.old.verdict)} → ${esc(c.new.verdict)}</dd></div>
</dl>
<p class="overall ${worse > 0 ? "worse" : "held"}">${
    worse > 0
      ? `${worse} thing${worse === 1 ? "" : "s"} a requirement covers got worse`
      : "Nothing a requirement covers got worse"
  }</p>
</header>
<main>
<section id="worse"><h2>Got worse</h2>
${worseList}
<p class="note">Got worse means: a requirement no longer declared; a limit made looser, or changed in relation or unit; a requirement met before and now not met or no longer checked on a design; one checked and not met before and no longer checked; or one not met on both sides that now falls further short of its limit. A stricter limit, a smaller margin that is still met and a new requirement are changes, not regressions.</p>
</section>
<section id="identity"><h2>Identity and settings</h2>
${identitySection(c)}
</section>
<section id="requirements"><h2>Requirements</h2>
${requirementsSection(c)}
<h3>Verdicts</h3>
${verdictsSection(c)}
</section>
<section id="designs"><h2>Designs</h2>
${designsSection(c)}
</section>
<section id="figures"><h2>Responses</h2>
${figuresSection(c, drawn)}
</section>
<section id="exports"><h2>Exports</h2>
${exportsSection(c)}
</section>
<section id="records"><h2>The two records</h2>
${recordsSection(c)}
<p class="note">This page compares two records as they are; it does not re-check either of them. Each record's own report, with its fingerprint, is what a reviewer signs.</p>
</section>
</main>
</body>
</html>
`;
}
