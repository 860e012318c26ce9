import assert from "node:assert/strict";
import { figureToVegaLite, thin } from "../../render/figures.ts";
import { vegaLiteToSvg } from "../../render/svg.ts";
import type { FigureExhibit, FigureKind } from "../../record/types.ts";

const f = Array.from({ length: 65 }, (_, i) => i * 100);
const db = f.map((x) => (x < 2000 ? 0 : -60 - (x % 300) / 10));
const kinds: FigureKind[] = [
  "magnitude",
  "passband",
  "phase",
  "groupDelay",
  "impulse",
  "step",
  "poleZero",
  "spectrum",
  "quantised",
  "line",
];

for (const kind of kinds) {
  Deno.test(`figures: ${kind} renders to SVG with its title and axis titles`, async () => {
    const figure: FigureExhibit = kind === "poleZero"
      ? {
        type: "figure",
        kind,
        title: "Poles & zeros <of> H",
        series: [{ name: "zeros", x: [-1, 0.5], y: [0, 0.8] }, {
          name: "poles",
          x: [0.9, 0.9],
          y: [0.1, -0.1],
        }],
      }
      : {
        type: "figure",
        kind,
        title: `A ${kind} figure`,
        series: [{ name: "ideal", x: f, y: db }, { name: "Q15", x: f, y: db.map((v) => v + 0.5) }],
        mask: [{ from: 2500, to: 3200, level: -50, bound: "upper" }],
      };
    const spec = figureToVegaLite(figure);
    const svg = await vegaLiteToSvg(spec);
    assert.match(svg, /^<svg[^>]+width="\d+" height="\d+"/);
    const text = svg.replaceAll("&amp;", "&").replaceAll("&lt;", "<").replaceAll("&gt;", ">");
    assert.ok(text.includes(figure.title), "title in the SVG");
    const json = JSON.stringify(spec);
    for (const axis of (json.match(/"title":"([^"]+)"/g) ?? []).slice(0, 3)) {
      const title = axis.slice(9, -1);
      if (title !== figure.title) assert.ok(text.includes(title), `axis title ${title}`);
    }
  });
}

Deno.test("figures: the mask becomes a shaded region above an upper bound", () => {
  const spec = figureToVegaLite({
    type: "figure",
    kind: "magnitude",
    title: "m",
    series: [{ name: "h", x: [0, 1000, 4000], y: [0, -3, -80] }],
    mask: [{ from: 2000, to: 4000, level: -60, bound: "upper" }],
    yDomain: [-100, 5],
  });
  const json = JSON.stringify(spec);
  assert.match(json, /"x":2000,"y":-60,"edge":5/);
  assert.match(json, /"x":4000,"y":-60,"edge":5/);
  assert.match(json, /"type":"area"/);
  // A lower bound shades a strip below its line, 12 % of the axis range deep.
  const floor = JSON.stringify(figureToVegaLite({
    type: "figure",
    kind: "magnitude",
    title: "m",
    series: [{ name: "h", x: [0, 1000], y: [0, -3] }],
    mask: [{ from: 0, to: 1000, level: -1, bound: "lower" }],
    yDomain: [-100, 0],
  }));
  assert.match(floor, /"x":0,"y":-1,"edge":-13/);
});

Deno.test("figures: a logarithmic axis leaves out f = 0 instead of failing; normalised axes divide by fs", () => {
  const log = JSON.stringify(figureToVegaLite({
    type: "figure",
    kind: "magnitude",
    title: "log",
    xScale: "log",
    series: [{ name: "h", x: [0, 10, 100], y: [0, -1, -2] }],
  }));
  assert.doesNotMatch(log, /"x":0,/);
  assert.match(log, /"type":"log"/);
  const normalised = JSON.stringify(figureToVegaLite({
    type: "figure",
    kind: "magnitude",
    title: "n",
    normaliseTo: 8000,
    series: [{ name: "h", x: [0, 2000, 4000], y: [0, -1, -2] }],
    mask: [{ from: 2000, to: 4000, level: -1, bound: "upper" }],
  }));
  assert.match(normalised, /"x":0.25,"y":-1,"series":"h"/);
  assert.match(normalised, /"x":0.5,"y":-1,"edge"/);
  assert.match(normalised, /Frequency \(f \/ fs\)/);
});

Deno.test("thin keeps every bucket's extremes, so peaks survive", () => {
  const n = 10_000;
  const x = Array.from({ length: n }, (_, i) => i);
  const y = x.map((i) => (i === 7777 ? 50 : i === 1234 ? -90 : Math.sin(i / 100)));
  const t = thin(x, y);
  assert.ok(t.x.length <= 1200);
  assert.ok(t.y.includes(50) && t.y.includes(-90));
  assert.deepEqual([...t.x].sort((a, b) => a - b), t.x, "order kept");
});
