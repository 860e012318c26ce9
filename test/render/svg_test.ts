import assert from "node:assert/strict";
import { vegaLiteToSvg } from "../../render/svg.ts";
import { figureToVegaLite } from "../../render/figures.ts";
import type { FigureExhibit } from "../../record/types.ts";

const figure = (title: string): FigureExhibit => ({
  type: "figure",
  kind: "magnitude",
  title,
  series: [{ name: "h", x: [0, 1000, 2000, 4000], y: [0, -1, -40, -80] }],
  mask: [{ from: 2000, to: 4000, level: -30, bound: "upper", label: "S-1" }],
});

Deno.test("svg: a figure's bytes from vega depend only on its specification, not on what was drawn before", async () => {
  const spec = figureToVegaLite(figure("Same"));
  const first = await vegaLiteToSvg(spec);
  await vegaLiteToSvg(figureToVegaLite(figure("Other")));
  const again = await vegaLiteToSvg(spec);
  assert.equal(again, first);
  assert.match(first, /id="clip1"/);
  assert.match(first, /url\(#clip1\)/);
});
