// Figure specification → SVG text, with no browser.
//
// tapsheet's own figures are drawn by render/draw.ts in a few milliseconds.
// Any other vega-lite specification (one a user restyled, or a construct
// draw.ts does not read) is drawn by vega, loaded on first use: vega and
// vega-lite take a few hundred milliseconds to load and warm up.
import { drawFigure } from "./draw.ts";

type Vega = typeof import("vega");
type VegaLite = typeof import("vega-lite");

let loading: Promise<[Vega, VegaLite]> | undefined;

function loadVega(): Promise<[Vega, VegaLite]> {
  loading ??= Promise.all([import("vega"), import("vega-lite")]);
  return loading;
}

let rendered = 0;

/** How many figures this process has rendered (unchanged figures are reused, not rendered). */
export function renderCount(): number {
  return rendered;
}

/**
 * vega numbers clip paths (and gradients) with counters that run on for the
 * whole process, so the same figure drawn second comes out with other ids.
 * Number them afresh from 1 in each SVG, so a figure's bytes depend only on
 * its specification (a report made in a batch or in watch mode is then the
 * same as one made alone).
 */
export function renumberIds(svg: string): string {
  const map = new Map<string, string>();
  const counts = new Map<string, number>();
  for (const m of svg.matchAll(/\bid="([A-Za-z_-]+)(\d+)"/g)) {
    const [id, prefix] = [`${m[1]}${m[2]}`, m[1]!];
    if (map.has(id)) continue;
    const n = (counts.get(prefix) ?? 0) + 1;
    counts.set(prefix, n);
    map.set(id, `${prefix}${n}`);
  }
  if (map.size === 0) return svg;
  return svg.replace(
    /\b(id="|url\(#|href="#)([A-Za-z_-]+\d+)\b/g,
    (whole, lead: string, id: string) => (map.has(id) ? `${lead}${map.get(id)}` : whole),
  );
}

/** Render a vega-lite specification to SVG markup with vega. */
export async function vegaLiteToSvg(spec: Record<string, unknown>): Promise<string> {
  const [vega, vegaLite] = await loadVega();
  const compiled = vegaLite.compile(spec as never).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: "none" });
  const svg = await view.toSVG();
  view.finalize();
  return renumberIds(svg);
}

/**
 * Render a figure's specification to SVG markup: with draw.ts when it is one
 * of tapsheet's own figure specifications, else with vega.
 */
export async function figureSvg(spec: Record<string, unknown>): Promise<string> {
  rendered++;
  return drawFigure(spec) ?? await vegaLiteToSvg(spec);
}
