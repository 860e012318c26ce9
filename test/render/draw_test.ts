// tapsheet's own SVG writer (render/draw.ts) against outside references: its
// tick values against d3-array and d3-scale (the libraries vega itself uses),
// and its drawing of every figure kind of the probe worksheet against vega's
// rendering of the same vega-lite specification.
import assert from "node:assert/strict";
// The reference libraries are the test's own, outside the import map the runner hands worksheets
// and records in provenance.
// deno-lint-ignore no-import-prefix
import { ticks as d3Ticks } from "npm:d3-array@3.2.4";
// deno-lint-ignore no-import-prefix
import { scaleLog } from "npm:d3-scale@4.0.3";
import { drawFigure, logLabel, logTicks, niceTicks, tickLabel } from "../../render/draw.ts";
import { figureSvg, vegaLiteToSvg } from "../../render/svg.ts";
import { figureToVegaLite } from "../../render/figures.ts";
import { differencePanel } from "../../render/theme.ts";
import { executeWorksheet } from "../../runner/execute.ts";
import { parseWorksheet } from "../../runner/parse.ts";
import type { FigureExhibit } from "../../record/types.ts";
import { balanced, plotArea, svgSize, svgTexts, themeSize } from "./_svg.ts";

/** A repeatable stream of numbers in [0, 1) (a linear congruential generator). */
function random(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

Deno.test("draw: linear ticks are d3-array's for 2,000 domains and counts", () => {
  // source: d3-array 3.2.4, ticks(start, stop, count) (npm), the tick rule vega uses
  const next = random(7);
  for (let i = 0; i < 2000; i++) {
    const scale = 10 ** Math.floor(next() * 12 - 6);
    const a = (next() - 0.5) * 200 * scale;
    const b = a + next() * 100 * scale;
    const count = 1 + Math.floor(next() * 20);
    assert.deepEqual(niceTicks(a, b, count), d3Ticks(a, b, count), `${a}..${b}, ${count}`);
  }
  // Domains a figure of ours has: 0–24 kHz, −100…+5 dB, a passband of ±0.3 dB.
  for (const [a, b, c] of [[0, 24000, 15], [-105.3, 5.2, 6], [-0.3, 0.3, 6], [-0.5, 48.5, 15]]) {
    assert.deepEqual(niceTicks(a!, b!, c!), d3Ticks(a!, b!, c!));
  }
});

Deno.test("draw: log ticks are d3-scale's log scale ticks", () => {
  // source: d3-scale 4.0.3, scaleLog().domain([a, b]).ticks(count) (npm)
  const next = random(11);
  for (let i = 0; i < 500; i++) {
    const a = 10 ** (next() * 6 - 2);
    const b = a * 10 ** (0.3 + next() * 6);
    const count = 3 + Math.floor(next() * 15);
    const theirs = scaleLog().domain([a, b]).ticks(count);
    const ours = logTicks(a, b, count);
    assert.equal(ours.length, theirs.length, `${a}..${b}, ${count}`);
    ours.forEach((t, k) => assert.ok(Math.abs(t - theirs[k]!) <= 1e-12 * theirs[k]!, `${t}`));
  }
});

Deno.test("draw: tick labels carry the decimals of the step, grouped thousands and a true minus", () => {
  // common practice (typesetting): U+2212 for minus, thousands grouped with commas
  assert.equal(tickLabel(-40, 20), "\u221240");
  assert.equal(tickLabel(12000, 2000), "12,000");
  assert.equal(tickLabel(0.1, 0.05), "0.10");
  assert.equal(tickLabel(-0.0000001, 0.1), "0.0");
  assert.equal(logLabel(20), "20");
  assert.equal(logLabel(2000), "2k");
  assert.equal(logLabel(0.5), "0.5");
});

const probe = new URL("../runner/fixtures/every_figure.md", import.meta.url);

async function probeSpecs(): Promise<{ figure: FigureExhibit; spec: Record<string, unknown> }[]> {
  const worksheet = parseWorksheet(
    "test/runner/fixtures/every_figure.md",
    await Deno.readTextFile(probe),
  );
  const result = await executeWorksheet(worksheet, worksheet.params);
  assert.equal(result.outcome, "completed", JSON.stringify(result.problem));
  const figures = result.blocks.flatMap((b) => b.exhibits).filter((e): e is FigureExhibit =>
    e.type === "figure"
  );
  return figures.map((figure, i) => {
    const xs = figure.series[0]!.x.filter((v) => figure.xScale !== "log" || v > 0);
    const worst = { id: `W-${i}`, at: xs[Math.floor(xs.length / 2)]!, met: i % 2 === 0 };
    return { figure, spec: figureToVegaLite(figure, { worst: [worst] }) };
  });
}

/**
 * The vertices of every line path in groups matching `groupClass` (drawn
 * from the plot's top-left corner, in both renderers), as fractions of the
 * plot's size. With a difference panel (fixed in px at the
 * bottom of the plot, whatever its height) the main plot's vertices are
 * fractions of the height above the panel, and the panel's are 2 + their
 * height above the bottom in panel heights.
 */
function lineVertices(
  svg: string,
  groupClass: RegExp,
  area: { width: number; height: number },
  panel: boolean,
): [number, number][] {
  const above = area.height - differencePanel.height - differencePanel.gap;
  const v = (y: number) =>
    !panel
      ? y / area.height
      : y <= above + differencePanel.gap / 2
      ? y / above
      : 2 + (area.height - y) / differencePanel.height;
  const out: [number, number][] = [];
  for (const g of svg.matchAll(groupClass)) {
    for (const p of g[0].matchAll(/<path\b[^>]*\bd="([^"]+)"/g)) {
      for (const m of p[1]!.matchAll(/[ML]\s*(-?[\d.]+(?:e-?\d+)?)[ ,](-?[\d.]+(?:e-?\d+)?)/g)) {
        out.push([
          Number(m[1]) / area.width,
          v(Number(m[2])),
        ]);
      }
    }
  }
  return out.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

/** The size of our plot area, from its frame. */
function ourPlotSize(svg: string): { width: number; height: number } {
  const frame = /<rect class="frame" width="([\d.]+)" height="([\d.]+)"/.exec(svg);
  assert.ok(frame, "a plot group with its frame");
  return { width: Number(frame[1]), height: Number(frame[2]) };
}

/** Text inside the plot (notes), without the halos drawn under them. */
function notes(svg: string): string[] {
  return [...svg.matchAll(/<g class="note">((?:<text\b[^>]*>[^<]*<\/text>)*)<\/g>/g)].flatMap((g) =>
    [...g[1]!.matchAll(/<text\b[^>]*>([^<]*)<\/text>/g)].map((t) => t[1]!)
  );
}

Deno.test("draw: every figure kind of the probe is drawn as vega draws the same specification", async () => {
  for (const { figure, spec } of await probeSpecs()) {
    const what = `${figure.kind} "${figure.title}"`;
    const ours = drawFigure(spec);
    assert.ok(ours !== undefined, `${what}: drawn by draw.ts`);
    const theirs = await vegaLiteToSvg(spec);
    assert.deepEqual(svgSize(ours), svgSize(theirs), `${what}: size`);
    assert.deepEqual(svgSize(ours), themeSize(figure.kind), `${what}: theme size`);
    assert.match(ours, /^<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/, what);
    assert.ok(ours.trimEnd().endsWith("</svg>") && balanced(ours), `${what}: well-formed markup`);

    // The same curves: every vertex of every line, as a fraction of the plot area.
    // source: vega 6.4.0 and vega-lite 6.5.0 (npm) rendering the same specification
    const panel = figure.kind === "quantised";
    const mine = lineVertices(
      ours,
      /<g class="mark-line"[^>]*>[\s\S]*?<\/g>/g,
      ourPlotSize(ours),
      panel,
    );
    const area = plotArea(theirs);
    const vega = lineVertices(
      theirs,
      /<g class="mark-line role-mark[^"]*"[^>]*>[\s\S]*?<\/g>/g,
      area,
      panel,
    );
    assert.equal(mine.length, vega.length, `${what}: as many line vertices`);
    // Under half a pixel of the plot's size, both ways.
    const tolerance = 0.5 / Math.min(area.width, area.height) + 0.002;
    mine.forEach(([u, v], i) => {
      const [a, b] = vega[i]!;
      assert.ok(
        Math.abs(u - a) <= tolerance && Math.abs(v - b) <= tolerance,
        `${what}: vertex ${i} (${u.toFixed(4)}, ${v.toFixed(4)}) vs vega (${a.toFixed(4)}, ${
          b.toFixed(4)
        })`,
      );
    });

    // Every text vega shows that is not a tick label, ours shows too.
    const texts = new Set(svgTexts(ours));
    for (const t of svgTexts(theirs)) {
      if (/^[−\-\d.,]+k?$/.test(t.replace("\u2212", "-"))) continue; // a tick label
      assert.ok(texts.has(t), `${what}: "${t}"`);
    }
    // Mask labels and worst cases inside the plot.
    const inside = notes(ours);
    const all = figure.series.flatMap((s) => s.x);
    const [lo, hi] = [Math.min(...all), Math.max(...all)];
    for (const m of figure.mask ?? []) {
      if (m.label && m.from < hi && m.to > lo) assert.ok(inside.includes(m.label), `${what}`);
    }
  }
});

Deno.test("draw: the same specification gives the same bytes; others are left to vega", async () => {
  const spec = (await probeSpecs())[0]!.spec;
  assert.equal(drawFigure(spec), drawFigure(structuredClone(spec)));
  assert.match(await figureSvg(spec), /<g class="plot"/);
  // A specification not made by figureToVegaLite (no usermeta.figure) goes to vega.
  const bars = {
    data: { values: [{ a: "x", b: 1 }, { a: "y", b: 2 }] },
    mark: "bar",
    encoding: { x: { field: "a", type: "nominal" }, y: { field: "b", type: "quantitative" } },
  };
  assert.equal(drawFigure(bars), undefined);
  assert.match(await figureSvg(bars), /class="mark-rect role-mark/);
  // One of ours with a construct draw.ts does not read goes to vega too.
  const restyled = { ...spec, layer: [{ mark: "bar", encoding: {} }] };
  assert.equal(drawFigure(restyled), undefined);
});
