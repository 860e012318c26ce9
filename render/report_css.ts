// The report's stylesheet: screen and print (A4 or Letter), tapsheet's own look.
import { fontStack, palette } from "./theme.ts";

function cssString(text: string): string {
  // CSS escapes keep quotes, backslashes and angle brackets from ending the
  // string or the <style> element.
  const escaped = text.replace(/[\\"<>&]/g, (c) => `\\${c.charCodeAt(0).toString(16)} `);
  return `"${escaped.replace(/[\n\r]/g, " ")}"`;
}

/** Stylesheet text; `identity` (document id and revision) is printed on every page. */
export function reportCss(identity: string): string {
  const p = palette;
  return `
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0 auto; max-width: 62rem; padding: 2rem 1.5rem 4rem; font-family: ${fontStack};
  font-size: 15px; line-height: 1.5; color: ${p.ink}; background: ${p.paper}; }
h1 { font-size: 1.7rem; margin: 0.2rem 0 0.8rem; line-height: 1.25; }
h2 { font-size: 1.3rem; margin: 2.2rem 0 0.8rem; padding-bottom: 0.3rem; border-bottom: 2px solid ${
    p.series[0]
  }; }
h3 { font-size: 1.1rem; margin: 1.6rem 0 0.6rem; }
h4, h5, h6 { font-size: 1rem; margin: 1.2rem 0 0.4rem; }
.identity { border-left: 6px solid ${p.series[0]}; padding: 0.6rem 0 0.6rem 1.1rem; }
.identity .kind { margin: 0; text-transform: uppercase; letter-spacing: 0.08em; font-size: 0.78rem; color: ${p.muted}; }
.facts { display: flex; flex-wrap: wrap; gap: 0.4rem 2rem; margin: 0 0 0.8rem; }
.facts div { display: flex; gap: 0.4rem; }
.facts dt { color: ${p.muted}; }
.facts dd { margin: 0; font-weight: bold; }
.overall { display: inline-block; margin: 0.2rem 0 0; padding: 0.35rem 0.9rem; border-radius: 3px;
  font-weight: bold; color: #fff; }
.overall.met { background: ${p.pass}; }
.overall.not-met { background: ${p.fail}; }
.overall.incomplete, .overall.no-requirements { background: ${p.incomplete}; }
table { border-collapse: collapse; width: 100%; margin: 0.6rem 0 1rem; font-size: 0.9rem; }
caption { text-align: left; font-weight: bold; padding-bottom: 0.3rem; }
th, td { border-bottom: 1px solid ${p.rule}; padding: 0.3rem 0.5rem; text-align: left; vertical-align: top; }
thead th { background: ${p.wash}; border-bottom: 2px solid ${p.rule}; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.hash { font-family: 'DejaVu Sans Mono', monospace; font-size: 0.78rem; word-break: break-all; }
table.requirements tr.met td.verdict { color: ${p.pass}; font-weight: bold; }
table.requirements tr.not-met td.verdict { color: ${p.fail}; font-weight: bold; }
table.requirements tr.not-met { background: #fbeceb; }
table.requirements tr.not-checked td.verdict { color: ${p.incomplete}; font-weight: bold; }
table.requirements tr.not-checked { background: #fdf5e6; }
table.requirements .band { display: block; font-size: 0.78rem; color: ${p.muted}; }
table.requirements .source, .equivalent { display: block; font-size: 0.75rem; color: ${p.muted}; }
.table-scroll { max-width: 100%; overflow-x: auto; }
/* In a narrow window the requirement table scrolls inside its box; its verdicts stay in view. */
@media screen and (max-width: 900px) {
  table.requirements { font-size: 0.78rem; }
  table.requirements td.verdict, table.requirements th:last-child {
    position: sticky; right: 0; background: ${p.paper}; box-shadow: -4px 0 4px -4px ${p.rule};
  }
  table.requirements tr.not-met td.verdict { background: #fbeceb; }
}
.check .equivalent { display: inline; font-size: inherit; }
.coverage { margin: 0.5rem 0 0; font-size: 0.9rem; color: ${p.muted}; }
.hash, dd.hash { font-family: 'DejaVu Sans Mono', monospace; font-size: 0.78rem; word-break: break-all; }
.note { font-size: 0.85rem; color: ${p.muted}; }
.figure figcaption .shows { color: ${p.muted}; }
.listing { margin: 1rem 0 1.4rem; }
.listing h3 { margin: 0 0 0.2rem; }
.listing-facts { margin: 0 0 0.4rem; font-size: 0.85rem; color: ${p.muted}; }
.listing.many table.coefficients { columns: 3 14rem; display: block; }
.listing.many table.coefficients thead { display: none; }
.listing.many table.coefficients tbody { display: block; }
.listing.many table.coefficients tr { display: flex; justify-content: space-between; break-inside: avoid; border-bottom: 1px solid ${p.rule}; }
.listing.many table.coefficients td { border: 0; padding: 0.1rem 0.4rem; }
table.sections .code, table.coefficients .code { color: ${p.muted}; font-size: 0.78rem; }
.code-reference { display: none; }
pre.listing-code { background: ${p.wash}; border: 1px solid ${p.rule}; border-radius: 3px; margin: 0.4rem 0 1rem; }
pre.listing-code .line-number { color: ${p.muted}; user-select: none; }
table.requirements td.verdict { white-space: nowrap; }
table.requirements { font-size: 0.84rem; }
table.requirements td:nth-child(2) { min-width: 10rem; }
table.requirements td.num { white-space: normal; }
table.requirements td, table.requirements th { padding: 0.3rem 0.35rem; }
table.requirements td[rowspan] { background: ${p.paper}; }
table.requirements td.id { white-space: nowrap; font-family: 'DejaVu Sans Mono', monospace; font-size: 0.82rem; }
.figure { margin: 1rem 0; text-align: center; break-inside: avoid; }
.figure img { max-width: 100%; height: auto; }
.figure figcaption { font-size: 0.85rem; color: ${p.muted}; }
details.code { margin: 0.8rem 0; border: 1px solid ${p.rule}; border-radius: 3px; background: ${p.wash}; }
details.code summary { cursor: pointer; padding: 0.3rem 0.6rem; font-size: 0.85rem; color: ${p.muted}; }
pre { margin: 0; padding: 0.6rem 0.8rem; overflow-x: auto; font-family: 'DejaVu Sans Mono', monospace;
  font-size: 0.8rem; line-height: 1.4; white-space: pre-wrap; }
pre.output { border-left: 3px solid ${p.muted}; background: ${p.wash}; margin: 0.6rem 0; }
.problem { border: 2px solid ${p.fail}; background: #fbeceb; padding: 0.4rem 0.8rem; margin: 0.8rem 0; border-radius: 3px; }
.problem p { margin: 0.2rem 0; color: ${p.fail}; }
.problem pre.excerpt { background: #fff; }
.not-run { color: ${p.incomplete}; font-style: italic; }
.check { margin: 0.4rem 0; padding: 0.3rem 0.6rem; border-left: 4px solid ${p.pass}; background: #eef6f0; }
.check.not-met { border-left-color: ${p.fail}; background: #fbeceb; }
.check .mark { font-weight: bold; margin-right: 0.4rem; }
.check .id { font-family: 'DejaVu Sans Mono', monospace; font-size: 0.82rem; }
.choice, .warning, .coefficient-note { margin: 0.4rem 0; padding: 0.3rem 0.6rem; background: ${p.wash}; }
.warning { border-left: 4px solid ${p.incomplete}; }
.label { font-size: 0.75rem; text-transform: uppercase; letter-spacing: 0.06em; color: ${p.muted}; margin-right: 0.4rem; }
.empty { color: ${p.muted}; font-style: italic; }
details.coefficients summary { cursor: pointer; }
table.coefficients { width: auto; }
table.approvals tr.holds td.verdict { color: ${p.pass}; font-weight: bold; }
table.approvals tr.void td.verdict, table.approvals tr.bad-signature td.verdict { color: ${p.fail}; font-weight: bold; }
table.signoff td.blank { height: 2.6rem; min-width: 9rem; }
#cautions { font-size: 0.9rem; }
a { color: ${p.series[2]}; }
@page { size: auto; margin: 18mm 16mm 20mm;
  @bottom-left { content: ${
    cssString(identity)
  }; font-family: ${fontStack}; font-size: 8pt; color: ${p.muted}; }
  @bottom-right { content: "Page " counter(page) " of " counter(pages); font-family: ${fontStack}; font-size: 8pt; color: ${p.muted}; } }
@media print {
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  h2, h3 { break-after: avoid; }
  /* The identity and the whole requirement table fit the first page. */
  h1 { font-size: 15pt; margin: 0 0 4pt; }
  .identity { padding: 2pt 0 2pt 8pt; }
  .facts { gap: 0 14pt; margin: 0 0 4pt; font-size: 8.5pt; }
  .overall { padding: 2pt 8pt; font-size: 9pt; }
  .coverage { font-size: 8pt; margin-top: 3pt; }
  #requirements h2 { margin-top: 8pt; }
  table.requirements { font-size: 7.5pt; line-height: 1.25; margin: 4pt 0; }
  table.requirements td, table.requirements th { padding: 1.5pt 3pt; }
  table.requirements td:nth-child(2) { min-width: 0; }
  table.requirements td.id { font-size: 6.5pt; }
  table.requirements .band, table.requirements .source, table.requirements .equivalent { display: inline; font-size: 6.5pt; }
  table.requirements .band::before, table.requirements .source::before { content: " · "; }
  /* Long tables may break across pages; their rows and the figures do not. */
  tr, .figure, .check, .problem, .listing h3 { break-inside: avoid; }
  table.signoff, table.provenance { break-inside: avoid; }
  thead { display: table-header-group; }
  .table-scroll { overflow: visible; }
  /* The code is printed once, in the appendix, with line numbers; in place a pointer to it. */
  details.code { display: none; }
  .code-reference { display: block; font-size: 8.5pt; color: ${p.muted}; margin: 0.2rem 0; }
  #appendix { break-before: page; }
  pre.listing-code { white-space: pre-wrap; font-size: 7.5pt; }
  #signoff { break-before: page; }
  .overall { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  a { color: inherit; text-decoration: none; }
}
`;
}
