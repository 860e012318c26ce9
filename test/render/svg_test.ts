import assert from "node:assert/strict";
import {
  renderInThisThread,
  startRenderWorkers,
  stopRenderWorkers,
  vegaLiteToSvg,
} from "../../render/svg.ts";
import { figureToVegaLite } from "../../render/figures.ts";
import { warmUpSpecification } from "../../render/write.ts";
import type { FigureExhibit } from "../../record/types.ts";

const figure = (title: string): FigureExhibit => ({
  type: "figure",
  kind: "magnitude",
  title,
  series: [{ name: "h", x: [0, 1000, 2000, 4000], y: [0, -1, -40, -80] }],
  mask: [{ from: 2000, to: 4000, level: -30, bound: "upper", label: "S-1" }],
});

Deno.test("svg: the render workers draw the same SVG as this thread, several figures at once", async () => {
  const specs = ["One", "Two", "Three"].map((t) => figureToVegaLite(figure(t)));
  const here = await Promise.all(specs.map((s) => renderInThisThread(s)));
  startRenderWorkers(warmUpSpecification());
  try {
    const there = await Promise.all(specs.map((s) => vegaLiteToSvg(s)));
    assert.deepEqual(there, here);
    assert.match(there[2]!, /Three/);
  } finally {
    stopRenderWorkers();
  }
});

Deno.test("svg: a figure's bytes depend only on its specification, not on what was drawn before", async () => {
  const spec = figureToVegaLite(figure("Same"));
  const first = await renderInThisThread(spec);
  await renderInThisThread(figureToVegaLite(figure("Other")));
  const again = await renderInThisThread(spec);
  assert.equal(again, first);
  assert.match(first, /id="clip1"/);
  assert.match(first, /url\(#clip1\)/);
});
