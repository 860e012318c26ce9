// Figure exhibits → vega-lite specifications in tapsheet's theme.
import type { MaskSegment } from "../lib/types.ts";
import type { FigureExhibit, FigureKind } from "../record/types.ts";
import { figureSize, fontStack, palette } from "./theme.ts";

type Spec = Record<string, unknown>;

const defaults: Record<FigureKind, { x: string; y: string }> = {
  magnitude: { x: "Frequency (Hz)", y: "Magnitude (dB)" },
  passband: { x: "Frequency (Hz)", y: "Magnitude (dB)" },
  phase: { x: "Frequency (Hz)", y: "Phase (degrees)" },
  groupDelay: { x: "Frequency (Hz)", y: "Group delay (samples)" },
  impulse: { x: "Sample", y: "Amplitude" },
  step: { x: "Sample", y: "Amplitude" },
  poleZero: { x: "Real part", y: "Imaginary part" },
  spectrum: { x: "Frequency (Hz)", y: "Power spectral density (dB/Hz)" },
  quantised: { x: "Frequency (Hz)", y: "Magnitude (dB)" },
  line: { x: "x", y: "y" },
};

/** Most points kept per series; denser series keep each bucket's min and max. */
const maxPoints = 1200;

/** Reduce a series to at most ~maxPoints, keeping each bucket's extremes in order. */
export function thin(x: number[], y: number[]): { x: number[]; y: number[] } {
  if (x.length <= maxPoints) return { x, y };
  const buckets = maxPoints / 2;
  const size = x.length / buckets;
  const ox: number[] = [];
  const oy: number[] = [];
  for (let b = 0; b < buckets; b++) {
    const start = Math.floor(b * size);
    const end = Math.min(x.length, Math.floor((b + 1) * size));
    let lo = start;
    let hi = start;
    for (let i = start; i < end; i++) {
      if (y[i]! < y[lo]!) lo = i;
      if (y[i]! > y[hi]!) hi = i;
    }
    for (const i of lo < hi ? [lo, hi] : lo === hi ? [lo] : [hi, lo]) {
      ox.push(x[i]!);
      oy.push(y[i]!);
    }
  }
  return { x: ox, y: oy };
}

function niceDomain(values: number[], kind: FigureKind): [number, number] {
  const finite = values.filter(Number.isFinite);
  let lo = Math.min(...finite);
  let hi = Math.max(...finite);
  if (!Number.isFinite(lo)) return [0, 1];
  if (kind === "magnitude" || kind === "quantised") lo = Math.max(lo, hi - 160);
  if (lo === hi) {
    lo -= 1;
    hi += 1;
  }
  const pad = (hi - lo) * 0.06;
  return [lo - pad, hi + pad];
}

const config = {
  background: palette.paper,
  font: fontStack,
  view: { stroke: palette.rule },
  axis: {
    labelFont: fontStack,
    titleFont: fontStack,
    labelFontSize: 11,
    titleFontSize: 12,
    titleFontWeight: "normal",
    titleColor: palette.ink,
    labelColor: palette.muted,
    gridColor: "#e6eaee",
    domainColor: palette.muted,
    tickColor: palette.muted,
  },
  legend: {
    labelFont: fontStack,
    titleFont: fontStack,
    labelFontSize: 11,
    orient: "bottom",
    direction: "horizontal",
    labelLimit: 600,
    title: null,
  },
  title: {
    font: fontStack,
    fontSize: 13,
    fontWeight: "bold",
    color: palette.ink,
    anchor: "start",
    offset: 8,
  },
};

/**
 * Build the vega-lite specification of a figure. The result is plain JSON: it
 * is saved beside the SVG so a user can restyle the figure.
 */
export function figureToVegaLite(figure: FigureExhibit): Spec {
  const kind = figure.kind in defaults ? figure.kind : "line";
  const labels = defaults[kind];
  const scale = figure.normaliseTo ?? 1;
  const xTitle = figure.xLabel ??
    (figure.normaliseTo !== undefined && labels.x.startsWith("Frequency")
      ? "Frequency (f / fs)"
      : labels.x);
  const yTitle = figure.yLabel ?? labels.y;
  const names = figure.series.map((s) => s.name);
  const rows: { x: number; y: number; series: string }[] = [];
  const allY: number[] = [];
  for (const s of figure.series) {
    let { x, y } = s;
    if (scale !== 1) x = x.map((v) => v / scale);
    if (kind !== "impulse" && kind !== "step" && kind !== "poleZero") ({ x, y } = thin(x, y));
    for (let i = 0; i < x.length; i++) {
      if (figure.xScale === "log" && !(x[i]! > 0)) continue; // a log axis cannot show f = 0
      rows.push({ x: x[i]!, y: y[i]!, series: s.name });
      allY.push(y[i]!);
    }
  }
  const colour = {
    field: "series",
    type: "nominal",
    scale: { domain: names, range: palette.series.slice(0, Math.max(1, names.length)) },
    // Long series names get a row each so they stay inside the figure's width.
    legend: names.length > 1
      ? { columns: names.some((n) => n.length > 24) ? 1 : Math.min(names.length, 3) }
      : null,
  };
  const mask = (figure.mask ?? []).map((m) =>
    scale === 1 ? m : { ...m, from: m.from / scale, to: m.to / scale }
  );
  const yDomain = figure.yDomain ??
    niceDomain([...allY, ...mask.flatMap((m) => [m.level, m.toLevel ?? m.level])], kind);
  const xValues = rows.map((r) => r.x);
  const xDomain: [number, number] = [Math.min(...xValues), Math.max(...xValues)];
  const x = {
    field: "x",
    type: "quantitative",
    title: xTitle,
    scale: figure.xScale === "log"
      ? { type: "log", domain: xDomain, nice: false }
      : { domain: xDomain, nice: false, zero: false },
  };
  const y = {
    field: "y",
    type: "quantitative",
    title: yTitle,
    scale: { domain: yDomain, nice: false, zero: false },
  };

  const layers: Spec[] = [];
  if (mask.length > 0) layers.push(maskLayer(mask, yDomain, x));
  if (kind === "poleZero") {
    layers.push(...poleZeroLayers(figure));
  } else if (kind === "impulse" || kind === "step") {
    layers.push(
      {
        data: { values: rows },
        mark: { type: "rule", strokeWidth: 1.2, clip: true },
        encoding: { x, y, y2: { datum: 0 }, color: colour },
      },
      {
        data: { values: rows },
        mark: { type: "point", filled: true, size: 22, clip: true },
        encoding: { x, y, color: colour },
      },
    );
  } else {
    layers.push({
      data: { values: rows },
      mark: { type: "line", strokeWidth: 1.6, clip: true, interpolate: "linear" },
      encoding: {
        x,
        y,
        color: colour,
        strokeDash: kind === "quantised" ? dashBySeries(names) : undefined,
      },
    });
  }
  const square = kind === "poleZero";
  return {
    $schema: "https://vega.github.io/schema/vega-lite/v6.json",
    title: figure.title,
    width: square ? figureSize.square : figureSize.width,
    height: square ? figureSize.square : figureSize.height,
    autosize: { type: "fit", contains: "padding" },
    config,
    layer: layers,
    ...(square ? {} : { resolve: { scale: { color: "independent" } } }),
  };
}

function dashBySeries(names: string[]): Spec {
  return {
    field: "series",
    type: "nominal",
    scale: { domain: names, range: names.map((_, i) => (i === 0 ? [1, 0] : [5, 3])) },
    legend: null,
  };
}

/** Shaded forbidden regions: above an upper bound, below a lower bound. */
function maskLayer(mask: MaskSegment[], yDomain: [number, number], x: Spec): Spec {
  // Above an upper bound the whole forbidden region is shaded (a stopband ceiling
  // reads at a glance). Below a lower bound only a strip is: shading a passband
  // floor down to the axis bottom would cover the transition band's picture.
  const strip = 0.12 * (yDomain[1] - yDomain[0]);
  const values = mask.flatMap((m, i) => {
    const edgeAt = (level: number) =>
      m.bound === "upper" ? yDomain[1] : Math.max(yDomain[0], level - strip);
    const end = m.toLevel ?? m.level;
    return [
      { x: m.from, y: m.level, edge: edgeAt(m.level), piece: i, label: m.label ?? "" },
      { x: m.to, y: end, edge: edgeAt(end), piece: i, label: m.label ?? "" },
    ];
  });
  return {
    data: { values },
    layer: [
      {
        mark: { type: "area", color: palette.mask, opacity: 0.13, clip: true },
        encoding: {
          x,
          y: { field: "y", type: "quantitative" },
          y2: { field: "edge" },
          detail: { field: "piece", type: "nominal" },
        },
      },
      {
        mark: { type: "line", color: palette.mask, strokeWidth: 1, strokeDash: [4, 2], clip: true },
        encoding: {
          x,
          y: { field: "y", type: "quantitative" },
          detail: { field: "piece", type: "nominal" },
        },
      },
    ],
  };
}

function poleZeroLayers(figure: FigureExhibit): Spec[] {
  const circle = Array.from({ length: 181 }, (_, i) => {
    const t = (2 * Math.PI * i) / 180;
    return { x: Math.cos(t), y: Math.sin(t), order: i };
  });
  const points = figure.series.flatMap((s) =>
    s.x.map((x, i) => ({ x, y: s.y[i]!, series: s.name }))
  );
  const extent = Math.max(1.2, ...points.map((p) => Math.max(Math.abs(p.x), Math.abs(p.y)) * 1.1));
  const axis = (title: string, field: string) => ({
    field,
    type: "quantitative",
    title,
    scale: { domain: [-extent, extent], nice: false },
  });
  const x = axis(figure.xLabel ?? "Real part", "x");
  const y = axis(figure.yLabel ?? "Imaginary part", "y");
  const shapeOf = (name: string) => (/pole/i.test(name) ? "cross" : "circle");
  return [
    {
      data: { values: circle },
      mark: { type: "line", color: palette.muted, strokeWidth: 1, strokeDash: [3, 3] },
      encoding: { x, y, order: { field: "order", type: "quantitative" } },
    },
    {
      data: { values: points },
      mark: { type: "point", size: 70, strokeWidth: 1.6, clip: true },
      encoding: {
        x,
        y,
        color: {
          field: "series",
          type: "nominal",
          scale: {
            domain: figure.series.map((s) => s.name),
            range: palette.series.slice(0, Math.max(1, figure.series.length)),
          },
          legend: {},
        },
        shape: {
          field: "series",
          type: "nominal",
          scale: {
            domain: figure.series.map((s) => s.name),
            range: figure.series.map((s) =>
              shapeOf(s.name) === "cross" ? "M-1,-1L1,1M-1,1L1,-1" : "circle"
            ),
          },
          legend: {},
        },
      },
    },
  ];
}
