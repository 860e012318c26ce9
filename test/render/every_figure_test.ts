// Runs the probe worksheet test/runner/fixtures/every_figure.md (one figure of
// every kind, masks with requirement ids) and renders each of its figures.
import assert from "node:assert/strict";
import { executeWorksheet } from "../../runner/execute.ts";
import { parseWorksheet } from "../../runner/parse.ts";
import { figureToVegaLite } from "../../render/figures.ts";
import { vegaLiteToSvg } from "../../render/svg.ts";
import { type FigureExhibit, figureKinds } from "../../record/types.ts";
import { balanced, plotTexts, svgSize, svgTexts, themeSize } from "./_svg.ts";

const path = new URL("../runner/fixtures/every_figure.md", import.meta.url);

async function probeFigures(): Promise<FigureExhibit[]> {
  const worksheet = parseWorksheet(
    "test/runner/fixtures/every_figure.md",
    await Deno.readTextFile(path),
  );
  const result = await executeWorksheet(worksheet, worksheet.params);
  assert.equal(result.outcome, "completed", JSON.stringify(result.problem));
  return result.blocks.flatMap((b) => b.exhibits).filter((e): e is FigureExhibit =>
    e.type === "figure"
  );
}

/** Every data row of a spec, from every layer. */
function rowsOf(spec: Record<string, unknown>): Record<string, unknown>[] {
  const own = ((spec.data as { values?: Record<string, unknown>[] } | undefined)?.values) ?? [];
  const inner = (spec.layer as Record<string, unknown>[] | undefined) ?? [];
  return [...own, ...inner.flatMap(rowsOf)];
}

Deno.test("every figure kind of the probe worksheet renders, with its title, mask ids and worst case", async () => {
  const figures = await probeFigures();
  assert.deepEqual(
    [...new Set(figures.map((f) => f.kind))].sort(),
    [...figureKinds].sort(),
    "the probe draws every kind",
  );
  for (const [i, figure] of figures.entries()) {
    const first = figure.series[0]!;
    const xs = first.x.filter((v) => figure.xScale !== "log" || v > 0);
    const at = xs[Math.floor(xs.length / 2)]!;
    const worst = { id: `W-${i}`, at, met: i % 2 === 0 };
    const spec = figureToVegaLite(figure, { worst: [worst] });
    const svg = await vegaLiteToSvg(spec);
    const what = `${figure.kind} "${figure.title}"`;

    assert.match(svg, /^<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/, what);
    assert.ok(svg.endsWith("</svg>") && balanced(svg), `${what}: well-formed markup`);
    assert.deepEqual(svgSize(svg), themeSize(figure.kind), `${what}: theme size`);

    const texts = svgTexts(svg);
    const title = (spec.title as { text: string | string[] }).text;
    for (const line of [title].flat()) assert.ok(texts.includes(line), `${what}: "${line}"`);
    assert.equal([title].flat().join(" "), figure.title.trim(), `${what}: whole title`);

    const notes = plotTexts(svg).filter((t) => !t.halo).map((t) => t.text);
    // Every id of a mask segment that reaches the figure's x range is written on it.
    const all = figure.series.flatMap((s) => s.x);
    const [lo, hi] = [Math.min(...all), Math.max(...all)];
    const onAxis = (figure.mask ?? []).filter((m) => m.label && m.from < hi && m.to > lo);
    for (const label of new Set(onAxis.map((m) => m.label))) {
      assert.ok(notes.includes(label!), `${what}: mask label ${label}`);
    }
    const worstText = worst.met ? worst.id : `${worst.id} not met`;
    if (figure.kind === "poleZero") {
      assert.ok(!notes.includes(worstText), "a pole-zero plot has no frequency axis to mark");
    } else assert.ok(notes.includes(worstText), `${what}: worst case ${worst.id}`);

    if (figure.kind === "quantised") {
      assert.match(svg, /aria-label="Y-axis titled 'Difference \(dB\)'/, `${what}: panel`);
    }
    if (figure.xScale === "log") {
      assert.ok(first.x.includes(0), "the probe's spectrum starts at 0 Hz");
      assert.match(JSON.stringify(spec), /"scale":\{"type":"log"/);
      const xs = rowsOf(spec).map((r) => r.x).filter((x) => typeof x === "number");
      assert.ok(xs.length > 0 && xs.every((x) => (x as number) > 0), `${what}: f = 0 dropped`);
    }
  }
});
