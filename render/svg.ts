// vega-lite specification → SVG text, with no browser.
//
// vega and vega-lite take a few hundred milliseconds to load, so they are
// loaded on first use, and `preloadRenderer` lets the command line start that
// load while the worksheet's child process runs on the other core.

type Vega = typeof import("vega");
type VegaLite = typeof import("vega-lite");

let loading: Promise<[Vega, VegaLite]> | undefined;

/** Start loading vega and vega-lite in the background (idempotent). */
export function preloadRenderer(): Promise<[Vega, VegaLite]> {
  loading ??= Promise.all([import("vega"), import("vega-lite")]);
  return loading;
}

let rendered = 0;

/** How many figures this process has rendered (unchanged figures are reused, not rendered). */
export function renderCount(): number {
  return rendered;
}

/** Render a vega-lite specification to SVG markup. */
export async function vegaLiteToSvg(spec: Record<string, unknown>): Promise<string> {
  const [vega, vegaLite] = await preloadRenderer();
  rendered++;
  const compiled = vegaLite.compile(spec as never).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: "none" });
  const svg = await view.toSVG();
  view.finalize();
  return svg;
}
