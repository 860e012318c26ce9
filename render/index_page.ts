// reports/index.html: every report in the output folder with its verdict.
import { join } from "node:path";
import { escapeHtml as esc, pageHead } from "./html.ts";
import { reportCss } from "./report_css.ts";
import { type Manifest, readManifest } from "../record/manifest.ts";

const verdictText: Record<string, string> = {
  "met": "Met",
  "not met": "Not met",
  "incomplete": "Incomplete",
  "no requirements": "No requirements",
};

/** Build the index page from the manifests of the reports (pure). */
export function reportsIndexHtml(manifests: Manifest[]): string {
  const rows = manifests.map((m) => {
    const met = m.requirements.filter((r) => r.met).length;
    return `<tr class="${m.verdict.replace(" ", "-")}"><td><a href="${
      esc(encodeURIComponent(m.name))
    }/index.html">${esc(m.title)}</a></td><td>${esc(m.document)}</td><td>${
      esc(m.revision)
    }</td><td class="date">${
      esc(m.provenance.date)
    }</td><td class="num">${met}/${m.requirements.length}</td><td class="verdict">${
      verdictText[m.verdict] ?? esc(m.verdict)
    }</td></tr>`;
  });
  return `${
    pageHead(
      "Filter design reports",
      `${reportCss("Filter design reports")}
tr.met td.verdict { color: #1e7a46; font-weight: bold; }
td.date, td.verdict { white-space: nowrap; }
tr.not-met td.verdict, tr.incomplete td.verdict { color: #b3261e; font-weight: bold; }
`,
      false,
    )
  }<header class="identity"><p class="kind">tapsheet</p><h1>Filter design reports</h1></header>
<main>
${
    manifests.length === 0 ? `<p class="empty">No reports yet.</p>` : `<table class="data">
<thead><tr><th>Worksheet</th><th>Document</th><th>Revision</th><th>Date</th><th>Met</th><th>Verdict</th></tr></thead>
<tbody>
${rows.join("\n")}
</tbody></table>`
  }
</main>
</body>
</html>
`;
}

/**
 * The index's order of report names: letters without regard to case, then
 * code units. The same on every machine, and no locale collator to load (its
 * first use costs a run ~5 ms).
 */
export function reportOrder(a: string, b: string): number {
  const order = (x: string, y: string) => (x < y ? -1 : x > y ? 1 : 0);
  return order(a.toLowerCase(), b.toLowerCase()) || order(a, b);
}

/** Write `<outDir>/index.html` from every `<outDir>/<name>/manifest.json`. */
export async function writeReportsIndex(outDir: string): Promise<void> {
  const manifests: Manifest[] = [];
  for await (const e of Deno.readDir(outDir)) {
    if (!e.isDirectory || e.name.startsWith(".")) continue;
    const manifest = await readManifest(join(outDir, e.name));
    if (manifest) manifests.push(manifest); // else not a report folder
  }
  manifests.sort((a, b) => reportOrder(a.name, b.name));
  const temp = join(outDir, `.index.html.${crypto.randomUUID().slice(0, 8)}`);
  await Deno.writeTextFile(temp, reportsIndexHtml(manifests));
  await Deno.rename(temp, join(outDir, "index.html"));
}
