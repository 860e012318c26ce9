// vega-lite specification → SVG text, with no browser.
import * as vega from "vega";
import { compile } from "vega-lite";

/** Render a vega-lite specification to SVG markup. */
export async function vegaLiteToSvg(spec: Record<string, unknown>): Promise<string> {
  const compiled = compile(spec as never).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: "none" });
  const svg = await view.toSVG();
  view.finalize();
  return svg;
}
