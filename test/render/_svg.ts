// Reading back what vega put in an SVG: its size, the plot area, and its text.
// The patterns follow the markup vega's SVG renderer writes (vega 6); size,
// texts and well-formedness read tapsheet's own drawing (render/draw.ts) too.
import { figureSize } from "../../render/theme.ts";
import type { FigureKind } from "../../record/types.ts";

/** The outer size of a figure of this kind in the theme. */
export function themeSize(kind: FigureKind): { width: number; height: number } {
  return kind === "poleZero"
    ? { width: figureSize.square, height: figureSize.square }
    : kind === "quantised"
    ? { width: figureSize.width, height: figureSize.withDifference }
    : { width: figureSize.width, height: figureSize.height };
}

/** Whether every element opened in the markup is closed, in order. */
export function balanced(svg: string): boolean {
  const open: string[] = [];
  for (const m of svg.matchAll(/<(\/?)([a-zA-Z][\w:-]*)[^>]*?(\/?)>/g)) {
    const [, closing, name, selfClosing] = m;
    if (selfClosing) continue;
    if (!closing) open.push(name!);
    else if (open.pop() !== name) return false;
  }
  return open.length === 0;
}

/** The outer size the SVG declares. */
export function svgSize(svg: string): { width: number; height: number } {
  const m = /^<svg[^>]* width="(\d+(?:\.\d+)?)" height="(\d+(?:\.\d+)?)"/.exec(svg);
  if (!m) throw new Error("not an SVG with a width and height");
  return { width: Number(m[1]), height: Number(m[2]) };
}

/** Undo the entities vega writes in text. */
export function unescapeXml(text: string): string {
  return text.replaceAll("&lt;", "<").replaceAll("&gt;", ">").replaceAll("&quot;", '"')
    .replaceAll("&#39;", "'").replaceAll("&amp;", "&");
}

/** Every piece of text in the SVG: each text element and each line (tspan) of one. */
export function svgTexts(svg: string): string[] {
  const out: string[] = [];
  for (const m of svg.matchAll(/<(text|tspan)\b[^>]*>([^<]*)(?=<)/g)) {
    if (m[2]!.trim() !== "") out.push(unescapeXml(m[2]!));
  }
  return out;
}

/** Where the plot area (the root group's frame) lies in the SVG, in px. */
export function plotArea(
  svg: string,
): { left: number; top: number; width: number; height: number } {
  const origin =
    /<g fill="none" stroke-miterlimit="4" transform="translate\(([-\d.]+),([-\d.]+)\)">/
      .exec(svg);
  const frame =
    /class="mark-group role-frame root"[\s\S]*?<path class="background"[^>]* d="M[-\d.]+,[-\d.]+h([\d.]+)v([\d.]+)h/
      .exec(svg);
  if (!origin || !frame) throw new Error("no root group in the SVG");
  return {
    left: Number(origin[1]),
    top: Number(origin[2]),
    width: Number(frame[1]),
    height: Number(frame[2]),
  };
}

/** Where the figure title's group starts, in px from the SVG's top-left corner. */
export function titleOrigin(svg: string): { x: number; y: number } {
  const plot = plotArea(svg);
  const m = /<g class="mark-group role-title"><g transform="translate\(([-\d.]+),([-\d.]+)\)">/
    .exec(svg);
  if (!m) throw new Error("no title in the SVG");
  return { x: plot.left + Number(m[1]), y: plot.top + Number(m[2]) };
}

/** A text mark drawn inside the plot (not an axis or title), with its anchor point. */
export interface PlotText {
  text: string;
  x: number;
  y: number;
  anchor: "start" | "middle" | "end";
  /** Text drawn only as a halo under another (aria-hidden layers). */
  halo: boolean;
}

/** The text marks of the plot itself, positions relative to the plot area. */
export function plotTexts(svg: string): PlotText[] {
  const out: PlotText[] = [];
  const groups = svg.matchAll(
    /<g class="mark-text role-mark[^"]*"([^>]*)>((?:<text\b[^>]*>[^<]*<\/text>)*)<\/g>/g,
  );
  for (const g of groups) {
    const halo = g[1]!.includes('aria-hidden="true"');
    for (const t of g[2]!.matchAll(/<text\b([^>]*)>([^<]*)<\/text>/g)) {
      const at = /transform="translate\(([-\d.]+),([-\d.]+)\)"/.exec(t[1]!);
      const anchor = /text-anchor="(\w+)"/.exec(t[1]!)?.[1] ?? "start";
      if (!at) continue;
      out.push({
        text: unescapeXml(t[2]!),
        x: Number(at[1]),
        y: Number(at[2]),
        anchor: anchor as PlotText["anchor"],
        halo,
      });
    }
  }
  return out;
}
