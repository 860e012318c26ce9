import assert from "node:assert/strict";
import { join } from "node:path";
import { renderCount } from "../../render/svg.ts";
import { draftFigure, type ReportContent, writeReport } from "../../render/write.ts";
import type { CheckExhibit, DeclaredRequirement, FigureExhibit } from "../../record/types.ts";
import { judge } from "../../lib/verify/requirement.ts";
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

Deno.test("write: a figure drawn while the run was under way is used only when its context is unchanged", async () => {
  // source: common practice (memoising a pure function): figureToVegaLite and the drawing
  // depend on the figure and the worst points it marks only, so a draft made in the same
  // context must give the very bytes of a report made without drafts
  const requirement: DeclaredRequirement = {
    id: "R-1",
    text: "Stopband",
    relation: "atLeast",
    limit: 40,
    unit: "dB",
    written: "40",
    fields: {},
    line: 1,
  };
  const check: CheckExhibit = {
    type: "check",
    result: {
      ...judge("Stopband", 43.5, { atLeast: 40 }, "dB", { worst: { at: 1250, unit: "Hz" } }),
      id: "R-1",
    },
    design: "floating point",
  };
  const xs = Array.from({ length: 200 }, (_, i) => i * 10);
  const figure: FigureExhibit = {
    type: "figure",
    kind: "magnitude",
    title: "Magnitude",
    series: [{ name: "s", x: xs, y: xs.map((f) => -f / 40) }],
    mask: [{ from: 1000, to: 1990, level: -40, bound: "upper", label: "R-1" }],
  };
  const base = reportContent([check, figure]);
  base.execution.requirements = [requirement];
  const out = await Deno.makeTempDir();
  try {
    const plain = await writeReport(out, "plain", base);
    const sameContext = await draftFigure(figure, base.execution);
    const before = renderCount();
    const drafted = await writeReport(out, "drafted", {
      ...base,
      drafts: new Map([[figure, sameContext]]),
    });
    assert.equal(renderCount() - before, 0, "the draft's drawing was used");
    assert.deepEqual(drafted.files, plain.files);
    assert.equal(drafted.fingerprint, plain.fingerprint);

    // Drafted before the check came in: no worst point then, so the draft is not used.
    const early = await draftFigure(figure, { requirements: [requirement], blocks: [] });
    assert.notEqual(early.context, sameContext.context);
    const beforeRedraw = renderCount();
    const redrawn = await writeReport(out, "redrawn", {
      ...base,
      drafts: new Map([[figure, early]]),
    });
    assert.equal(renderCount() - beforeRedraw, 1, "drawn anew");
    assert.deepEqual(redrawn.files, plain.files);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});
