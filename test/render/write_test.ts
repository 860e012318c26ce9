import assert from "node:assert/strict";
import { join } from "node:path";
import { renderCount } from "../../render/svg.ts";
import { type ReportContent, writeReport } from "../../render/write.ts";
import type { FigureExhibit } from "../../record/types.ts";
import { runToEnd } from "../_process.ts";
import { reportContent } from "./_content.ts";

function content(figures: FigureExhibit[]): ReportContent {
  return reportContent([
    ...figures,
    { type: "export", fileName: "taps.csv", content: "index,value\n0,1\n", description: "CSV" },
  ]);
}

const line = (title: string, y: number[]): FigureExhibit => ({
  type: "figure",
  kind: "line",
  title,
  series: [{ name: "s", x: y.map((_, i) => i), y }],
});

Deno.test("write: only figures whose specification changed are rendered again", async () => {
  const out = await Deno.makeTempDir();
  try {
    const before = renderCount();
    await writeReport(out, "w", content([line("A", [1, 2, 3]), line("B", [3, 2, 1])]));
    assert.equal(renderCount() - before, 2);
    const svgA = await Deno.readTextFile(join(out, "w", "figures", "01-a.svg"));
    await writeReport(out, "w", content([line("A", [1, 2, 3]), line("B", [3, 2, 2])]));
    assert.equal(renderCount() - before, 3, "only B was rendered again");
    assert.equal(await Deno.readTextFile(join(out, "w", "figures", "01-a.svg")), svgA);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("write: exports land in exports/ and are listed with their SHA-256", async () => {
  const out = await Deno.makeTempDir();
  try {
    const report = await writeReport(out, "w", content([]));
    const csv = await Deno.readTextFile(join(out, "w", "exports", "taps.csv"));
    assert.equal(csv, "index,value\n0,1\n");
    // source: SHA-256 of the bytes "index,value\n0,1\n", computed with sha256sum (coreutils)
    const expected = (await runToEnd("sha256sum", [join(out, "w", "exports", "taps.csv")]))
      .stdout.split(" ")[0];
    const listed = report.files.find((f) => f.path === "exports/taps.csv");
    assert.equal(listed?.sha256, expected);
    const html = await Deno.readTextFile(join(out, "w", "index.html"));
    assert.ok(html.includes(`<a href="exports/taps.csv">exports/taps.csv</a>`));
    assert.ok(html.includes(expected!));
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});
