// Figure exhibits → vega-lite specifications in tapsheet's theme.
import { interpolate } from "../record/series.ts";
import type { MaskSegment } from "../lib/types.ts";
import type { FigureExhibit, FigureKind } from "../record/types.ts";
import { differencePanel, figureSize, figureType, fontStack, palette } from "./theme.ts";

type Spec = Record<string, unknown>;

/**
 * What the renderer draws on a figure besides the figure itself; the caller
 * works it out from the requirement checks.
 */
export interface FigureContext {
  /**
   * Worst cases of requirements: each one whose `at` (Hz, or the figure's x
   * unit) lies on the figure's x axis is ringed on the first series, in the
   * pass or fail colour, with its id beside it.
   */
  worst?: { id: string; at: number; met: boolean }[];
}

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

/**
 * Reduce a series to at most ~`limit` points, keeping each bucket's extremes in order.
 * @param limit Most points kept. @default 1200
 */
export function thin(
  x: number[],
  y: number[],
  limit: number = maxPoints,
): { x: number[]; y: number[] } {
  if (x.length <= limit) return { x, y };
  const buckets = Math.max(1, Math.floor(limit / 2));
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

/** Smallest and largest finite value ([Infinity, −Infinity] when there is none). */
function extent(values: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return [lo, hi];
}

function niceDomain(values: number[], kind: FigureKind): [number, number] {
  let [lo, hi] = extent(values);
  if (!Number.isFinite(lo)) return [0, 1];
  if (kind === "magnitude" || kind === "quantised") lo = Math.max(lo, hi - 160);
  if (lo === hi) {
    lo -= 1;
    hi += 1;
  }
  const pad = (hi - lo) * 0.06;
  return [lo - pad, hi + pad];
}

// ---------------------------------------------------------------------------
// Text layout. vega lays out text it cannot measure (there is no canvas here)
// at 0.8 em a character (source: vega-scenegraph, textMetrics.estimateWidth),
// and with autosize "fit" any text wider than the figure shrinks the plot to
// make room. Titles are wrapped against that same estimate, so no line of them
// is ever wider than the room it has. The glyphs themselves are narrower:
// DejaVu Sans averages about 0.6 em a character (from memory), which is what
// decides whether a label inside the plot is visible.

const layoutEm = 0.8;
const inkEm = 0.62;
/** vega's default padding around the figure, px. */
const padding = 5;

/** How many characters of `fontSize` fit in `room` px by vega's estimate. */
function charsIn(room: number, fontSize: number): number {
  return Math.max(8, Math.floor(room / (layoutEm * fontSize)));
}

/**
 * Break text into lines of at most `maxChars` at spaces (a longer word is cut),
 * keeping at most `maxLines`; the last kept line ends in "…" when text is left over.
 */
function wrap(text: string, maxChars: number, maxLines: number): string[] {
  const lines: string[] = [];
  let line = "";
  for (let word of text.trim().split(/\s+/).filter((w) => w !== "")) {
    while (word.length > maxChars) {
      if (line !== "") lines.push(line);
      line = "";
      lines.push(word.slice(0, maxChars));
      word = word.slice(maxChars);
    }
    if (line === "") line = word;
    else if (line.length + 1 + word.length <= maxChars) line += " " + word;
    else {
      lines.push(line);
      line = word;
    }
  }
  if (line !== "") lines.push(line);
  if (lines.length <= maxLines) return lines.length > 0 ? lines : [""];
  const kept = lines.slice(0, maxLines);
  const rest = lines.slice(maxLines - 1).join(" ");
  kept[maxLines - 1] = rest.slice(0, maxChars - 1).trimEnd() + "…";
  return kept;
}

/**
 * Wrap an axis title; one too long even for `maxLines` loses words from its
 * middle, not its unit: "Minimum stopband attenuation relative … (dB)".
 */
function wrapAxisTitle(text: string, maxChars: number, maxLines: number): string[] {
  const lines = wrap(text, maxChars, maxLines);
  const unit = /\s(\([^()]*\))$/.exec(text.trim())?.[1];
  if (!lines[lines.length - 1]!.endsWith("…") || unit === undefined) return lines;
  const words = text.trim().slice(0, -unit.length).trim().split(/\s+/);
  for (let keep = words.length - 1; keep > 0; keep--) {
    const shorter = wrap(`${words.slice(0, keep).join(" ")} … ${unit}`, maxChars, maxLines);
    if (!shorter[shorter.length - 1]!.endsWith("…")) return shorter;
  }
  return lines;
}

/** A title as vega-lite takes it: a string for one line, an array of lines otherwise. */
function titleText(lines: string[]): string | string[] {
  return lines.length === 1 ? lines[0]! : lines;
}

/** Legend columns that fit the figure's width, and how many rows that makes. */
function legendLayout(names: string[], width: number): { legend: Spec | null; rows: number } {
  if (names.length < 2) return { legend: null, rows: 0 };
  const room = width - 2 * padding;
  const longest = Math.max(...names.map((n) => n.length));
  const entry = longest * layoutEm * figureType.label + 34; // symbol, gaps, column padding
  const columns = Math.max(1, Math.min(names.length, 3, Math.floor(room / entry)));
  return {
    legend: { columns, labelLimit: room - 40 },
    rows: Math.ceil(names.length / columns),
  };
}

// ---------------------------------------------------------------------------
// Geometry of the plot area, estimated, for placing labels inside it.

interface Box {
  left: number;
  top: number;
  right: number;
  bottom: number;
}

interface Plot {
  width: number;
  height: number;
  /** Data → px from the plot's left edge. */
  px(x: number): number;
  /** Data → px from the plot's top edge. */
  py(y: number): number;
}

function plotOf(
  xDomain: [number, number],
  yDomain: [number, number],
  logX: boolean,
  width: number,
  height: number,
): Plot {
  const t = (v: number) => (logX ? Math.log10(v) : v);
  const [x0, x1] = [t(xDomain[0]), t(xDomain[1])];
  return {
    width,
    height,
    px: (x) => ((t(x) - x0) / (x1 - x0 || 1)) * width,
    py: (y) => ((yDomain[1] - y) / (yDomain[1] - yDomain[0] || 1)) * height,
  };
}

const overlaps = (a: Box, b: Box) =>
  a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;

const inside = (b: Box, plot: Plot) =>
  b.left >= 1 && b.right <= plot.width - 1 && b.top >= 1 && b.bottom <= plot.height - 1;

/** A text label anchored at a data point, beside it on one side. */
interface Placement {
  x: number;
  y: number;
  align: "left" | "right";
  baseline: "bottom" | "top";
  dx: number;
  dy: number;
  box: Box;
}

function placement(
  plot: Plot,
  x: number,
  y: number,
  text: string,
  align: "left" | "right",
  above: boolean,
  dx: number,
  gap: number,
): Placement {
  const ax = plot.px(x) + (align === "left" ? dx : -dx);
  const ay = plot.py(y) + (above ? -gap : gap);
  const w = inkEm * figureType.note * text.length;
  const h = figureType.note + 2;
  return {
    x,
    y,
    align,
    baseline: above ? "bottom" : "top",
    dx: align === "left" ? dx : -dx,
    dy: above ? -gap : gap,
    box: {
      left: align === "left" ? ax : ax - w,
      right: align === "left" ? ax + w : ax,
      top: above ? ay - h : ay,
      bottom: above ? ay : ay + h,
    },
  };
}

/** A stretch of a drawn curve, in px of the plot. */
type Stroke = [number, number, number, number];

/** Whether a stroke passes through a box (Liang–Barsky clipping). */
function crosses([ax, ay, bx, by]: Stroke, box: Box): boolean {
  let t0 = 0;
  let t1 = 1;
  const dx = bx - ax;
  const dy = by - ay;
  const sides: [number, number][] = [
    [-dx, ax - box.left],
    [dx, box.right - ax],
    [-dy, ay - box.top],
    [dy, box.bottom - ay],
  ];
  for (const [p, q] of sides) {
    if (p === 0) {
      if (q < 0) return false;
      continue;
    }
    const t = q / p;
    if (p < 0) t0 = Math.max(t0, t);
    else t1 = Math.min(t1, t);
    if (t0 > t1) return false;
  }
  return true;
}

/**
 * The first candidate inside the plot that overlaps no placed label, crossing
 * the fewest strokes of the curves; failing that the first inside, failing that the first.
 */
function choose(
  candidates: Placement[],
  plot: Plot,
  placed: Box[],
  strokes: Stroke[],
): Placement {
  let best: Placement | undefined;
  let bestHits = Infinity;
  for (const c of candidates) {
    if (!inside(c.box, plot) || placed.some((b) => overlaps(b, c.box))) continue;
    let hits = 0;
    for (const stroke of strokes) if (crosses(stroke, c.box)) hits++;
    if (hits < bestHits) {
      best = c;
      bestHits = hits;
      if (hits === 0) break;
    }
  }
  return best ?? candidates.find((c) => inside(c.box, plot)) ?? candidates[0]!;
}

/** A label with a halo of paper colour under it, so it stays legible across a curve. */
function textLayer(p: Placement, text: string, colour: string, x: Spec, y: Spec): Spec {
  const mark = {
    type: "text",
    align: p.align,
    baseline: p.baseline,
    dx: p.dx,
    dy: p.dy,
    fontSize: figureType.note,
    clip: true,
  };
  return {
    data: { values: [{ x: p.x, y: p.y, text }] },
    encoding: { x, y, text: { field: "text", type: "nominal" } },
    layer: [
      {
        mark: {
          ...mark,
          color: palette.paper,
          stroke: palette.paper,
          strokeWidth: 3,
          strokeJoin: "round",
          aria: false,
        },
      },
      { mark: { ...mark, color: colour } },
    ],
  };
}

// ---------------------------------------------------------------------------
// Series helpers.

/** The points of a series in increasing x. */
function sortedByX(x: number[], y: number[]): { x: number[]; y: number[] } {
  let sorted = true;
  for (let i = 1; i < x.length && sorted; i++) sorted = x[i - 1]! <= x[i]!;
  if (sorted) return { x, y };
  const order = x.map((_, i) => i).sort((a, b) => x[a]! - x[b]!);
  return { x: order.map((i) => x[i]!), y: order.map((i) => y[i]!) };
}

/**
 * Cut a polyline at the edges of [lo, hi]: parts outside are left out, the
 * crossing points are added, and each gap is a null that breaks the line.
 */
function clipToBand(
  x: number[],
  y: number[],
  lo: number,
  hi: number,
): { x: number[]; y: (number | null)[] } {
  const ox: number[] = [];
  const oy: (number | null)[] = [];
  const gap = (at: number) => {
    if (oy.length > 0 && oy[oy.length - 1] !== null) {
      ox.push(at);
      oy.push(null);
    }
  };
  const side = (v: number) => (!Number.isFinite(v) ? NaN : v < lo ? -1 : v > hi ? 1 : 0);
  for (let i = 0; i < x.length; i++) {
    const now = side(y[i]!);
    const before = i > 0 ? side(y[i - 1]!) : NaN;
    if (!Number.isNaN(now) && !Number.isNaN(before) && now !== before) {
      // The step from i − 1 to i enters the band, leaves it, or crosses it.
      const crossing = (level: number) => {
        const t = (level - y[i - 1]!) / (y[i]! - y[i - 1]!);
        ox.push(x[i - 1]! + t * (x[i]! - x[i - 1]!));
        oy.push(level);
      };
      if (before !== 0) crossing(before < 0 ? lo : hi);
      if (now !== 0) crossing(now < 0 ? lo : hi);
    }
    if (now === 0) {
      ox.push(x[i]!);
      oy.push(y[i]!);
    } else gap(x[i]!);
  }
  return { x: ox, y: oy };
}

/** Thin each unbroken run of a series on its own (about `limit` points in all), keeping the breaks. */
function thinRuns(
  x: number[],
  y: number[],
  limit: number,
): { x: number[]; y: (number | null)[] } {
  const ox: number[] = [];
  const oy: (number | null)[] = [];
  const finite = y.filter(Number.isFinite).length || 1;
  let start = -1;
  const flush = (end: number) => {
    if (start < 0) return;
    const share = Math.max(2, Math.round((limit * (end - start)) / finite));
    const t = thin(x.slice(start, end), y.slice(start, end), share);
    if (ox.length > 0) {
      ox.push((ox[ox.length - 1]! + t.x[0]!) / 2);
      oy.push(null);
    }
    ox.push(...t.x);
    oy.push(...t.y);
    start = -1;
  };
  for (let i = 0; i < x.length; i++) {
    if (Number.isFinite(y[i]!)) {
      if (start < 0) start = i;
    } else flush(i);
  }
  flush(x.length);
  return { x: ox, y: oy };
}

const config = {
  background: palette.paper,
  font: fontStack,
  view: { stroke: palette.rule },
  axis: {
    labelFont: fontStack,
    titleFont: fontStack,
    labelFontSize: figureType.label,
    titleFontSize: figureType.axisTitle,
    titleLineHeight: figureType.axisTitleLine,
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
    labelFontSize: figureType.label,
    orient: "bottom",
    direction: "horizontal",
    labelLimit: 600,
    title: null,
  },
  title: {
    font: fontStack,
    fontSize: figureType.title,
    lineHeight: figureType.titleLine,
    fontWeight: "bold",
    color: palette.ink,
    anchor: "start",
    offset: 8,
  },
};

/**
 * Build the vega-lite specification of a figure. The result is plain JSON: it
 * is saved beside the SVG so a user can restyle the figure.
 *
 * Every figure has the outer size of the theme (`figureSize`); titles and axis
 * titles are wrapped so that no text squeezes the plot or pushes the title off
 * the canvas. Masks shade the whole forbidden region, to the edge of the plot,
 * and carry their requirement ids. A "quantised" figure with two or more series
 * gets a panel under the plot with each other series minus the first, where
 * both are inside the plot's y range. Impulse and step figures leave room for
 * their end stems.
 *
 * @param figure The figure exhibit.
 * @param context Worst cases of requirements to mark on the first series.
 * @returns A vega-lite (v6) specification.
 */
export function figureToVegaLite(figure: FigureExhibit, context: FigureContext = {}): Spec {
  const kind = figure.kind in defaults ? figure.kind : "line";
  const square = kind === "poleZero";
  const stems = kind === "impulse" || kind === "step";
  const withDifference = kind === "quantised" && figure.series.length > 1;
  const width = square ? figureSize.square : figureSize.width;
  const height = square
    ? figureSize.square
    : withDifference
    ? figureSize.withDifference
    : figureSize.height;
  const labels = defaults[kind];
  const scale = figure.normaliseTo ?? 1;
  const logX = figure.xScale === "log" && !square;
  const xTitleText = figure.xLabel ??
    (figure.normaliseTo !== undefined && labels.x.startsWith("Frequency")
      ? "Frequency (f / fs)"
      : labels.x);
  const yTitleText = figure.yLabel ?? labels.y;
  const names = figure.series.map((s) => s.name);

  // Room for the plot, estimated the way vega will lay it out.
  const title = wrap(figure.title, charsIn(width - 2 * padding, figureType.title), 4);
  const { legend, rows: legendRows } = legendLayout(square ? [] : names, width);
  const plotWidth = width - 2 * padding - 62;
  const xTitle = wrapAxisTitle(xTitleText, charsIn(plotWidth + 40, figureType.axisTitle), 2);
  const panel = withDifference ? differencePanel.height + differencePanel.gap : 0;
  const plotHeight = height - 2 * padding - (title.length * figureType.titleLine + 10) -
    (24 + xTitle.length * figureType.axisTitleLine) - (legendRows > 0 ? 12 + 17 * legendRows : 0) -
    panel;
  const yTitle = wrapAxisTitle(yTitleText, charsIn(plotHeight + 24, figureType.axisTitle), 3);

  const spec: Spec = {
    $schema: "https://vega.github.io/schema/vega-lite/v6.json",
    title: { text: titleText(title) },
    width,
    height,
    autosize: { type: "fit", contains: "padding" },
    config,
    usermeta: { figure: figureFacts(figure) },
  };
  if (square) {
    spec.layer = poleZeroLayers(figure, titleText(xTitle), titleText(yTitle));
    return spec;
  }

  const rows: { x: number; y: number | null; series: string }[] = [];
  const allY: number[] = [];
  const shown = figure.series.map((s) => {
    let { x, y } = s;
    if (scale !== 1) x = x.map((v) => v / scale);
    if (logX) {
      // a log axis cannot show f = 0
      const keep = x.map((v) => v > 0);
      x = x.filter((_, i) => keep[i]);
      y = y.filter((_, i) => keep[i]);
    }
    if (!stems) ({ x, y } = thin(x, y));
    allY.push(...y);
    return { name: s.name, x, y };
  });
  const xValues = shown.flatMap((s) => s.x).filter(Number.isFinite);
  let xDomain: [number, number] = xValues.length > 0
    ? extent(xValues)
    : [logX ? 1 : 0, logX ? 10 : 1];
  if (xDomain[0] === xDomain[1]) {
    xDomain = logX ? [xDomain[0] / 2, xDomain[1] * 2] : [xDomain[0] - 0.5, xDomain[1] + 0.5];
  } else if (stems) xDomain = padForStems(xValues, xDomain);

  const mask = clipMask(
    (figure.mask ?? []).map((m) =>
      scale === 1 ? m : { ...m, from: m.from / scale, to: m.to / scale }
    ),
    xDomain,
  );
  const yDomain = figure.yDomain ??
    niceDomain([
      ...allY,
      ...mask.flatMap((m) => [m.level, m.toLevel ?? m.level]),
      ...(stems ? [0] : []),
    ], kind);

  for (const s of shown) {
    const part = withDifference ? clipToBand(s.x, s.y, yDomain[0], yDomain[1]) : { x: s.x, y: s.y };
    for (let i = 0; i < part.x.length; i++) {
      rows.push({ x: part.x[i]!, y: part.y[i]!, series: s.name });
    }
  }

  const integerX = stems && xValues.every(Number.isInteger);
  const x: Spec = {
    field: "x",
    type: "quantitative",
    title: titleText(xTitle),
    scale: logX
      ? { type: "log", domain: xDomain, nice: false }
      : { domain: xDomain, nice: false, zero: false },
    ...(integerX ? { axis: { tickMinStep: 1 } } : {}),
  };
  const mainBottom = withDifference ? { expr: `height - ${panel}` } : undefined;
  const y: Spec = {
    field: "y",
    type: "quantitative",
    title: titleText(yTitle),
    scale: {
      domain: yDomain,
      nice: false,
      zero: false,
      ...(mainBottom ? { range: [mainBottom, 0] } : {}),
    },
  };
  const colour = {
    field: "series",
    type: "nominal",
    scale: { domain: names, range: palette.series.slice(0, Math.max(1, names.length)) },
    // Long series names get a row each so they stay inside the figure's width.
    legend,
  };

  const layers: Spec[] = [];
  if (mask.length > 0) layers.push(maskLayer(mask, yDomain, x, y));
  if (stems) {
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
    // The first series solid, the others (for "quantised": its variants) dashed.
    const dashed = kind === "quantised" ? new Set(names.slice(1)) : new Set<string>();
    for (const part of [false, true]) {
      const values = rows.filter((r) => dashed.has(r.series) === part);
      if (values.length === 0) continue;
      layers.push({
        data: { values },
        mark: {
          type: "line",
          strokeWidth: 1.6,
          clip: true,
          interpolate: "linear",
          ...(part ? { strokeDash: [5, 3] } : {}),
        },
        encoding: { x, y, color: colour },
      });
    }
  }

  // Notes inside the plot: worst-case rings, their ids and the mask labels.
  const plot = plotOf(xDomain, yDomain, logX, plotWidth, plotHeight);
  const strokes: Stroke[] = [];
  for (let i = 0; i < rows.length; i++) {
    const [a, b] = [rows[i - 1], rows[i]!];
    if (b.y === null) continue;
    if (stems) strokes.push([plot.px(b.x), plot.py(0), plot.px(b.x), plot.py(b.y)]);
    else if (a && a.y !== null && a.series === b.series) {
      strokes.push([plot.px(a.x), plot.py(a.y), plot.px(b.x), plot.py(b.y)]);
    }
  }
  const first = figure.series[0]
    ? sortedByX(figure.series[0].x.map((v) => v / scale), figure.series[0].y)
    : { x: [], y: [] };
  const worst = (context.worst ?? []).flatMap((w) => {
    const at = w.at / scale;
    const value = interpolate(first.x, first.y, at);
    const onAxis = at >= xDomain[0] && at <= xDomain[1] && (!logX || at > 0);
    return onAxis && Number.isFinite(value) ? [{ ...w, at, value }] : [];
  });
  const placed: Box[] = worst.map((w) => {
    const [cx, cy] = [plot.px(w.at), plot.py(w.value)];
    return { left: cx - 6, right: cx + 6, top: cy - 6, bottom: cy + 6 };
  });
  for (const met of [true, false]) {
    const values = worst.filter((w) => w.met === met).map((w) => ({ x: w.at, y: w.value }));
    if (values.length === 0) continue;
    layers.push({
      data: { values },
      mark: {
        type: "point",
        shape: "circle",
        filled: false,
        size: 120,
        strokeWidth: 2,
        color: met ? palette.pass : palette.fail,
        clip: true,
      },
      encoding: { x, y },
    });
  }
  // Worst-case ids first (they belong to one point), then mask labels (they may go anywhere
  // along their segments).
  for (const w of worst) {
    const text = w.met ? w.id : `${w.id} not met`;
    const candidates = [4, 16, 28].flatMap((gap) =>
      [true, false].flatMap((above) =>
        ["left", "right"].map((align) =>
          placement(plot, w.at, w.value, text, align as "left" | "right", above, 7, gap)
        )
      )
    );
    const p = choose(candidates, plot, placed, strokes);
    placed.push(p.box);
    layers.push(textLayer(p, text, w.met ? palette.pass : palette.fail, x, y));
  }
  for (const run of labelRuns(mask)) {
    const label = run[0]!.label!;
    const p = choose(maskCandidates(run, label, plot, yDomain), plot, placed, strokes);
    placed.push(p.box);
    layers.push(textLayer(p, label, palette.mask, x, y));
  }

  if (withDifference) {
    spec.layer = [
      { layer: layers },
      {
        layer: differenceLayers(figure, { scale, logX, yDomain, x, yTitleText, names, plotHeight }),
      },
    ];
    spec.resolve = { scale: { y: "independent", color: "independent" } };
  } else {
    spec.layer = layers;
    spec.resolve = { scale: { color: "independent" } };
  }
  return spec;
}

/**
 * What the figure exhibit says besides its series, kept in the spec's
 * `usermeta` (vega ignores it), so that a reader of the record (`compare`)
 * knows the figure's kind, its whole title and its mask in the exhibit's own
 * units without working them back out of the drawing.
 */
export interface FigureFacts {
  kind: FigureKind;
  title: string;
  xLabel?: string;
  yLabel?: string;
  xScale?: "linear" | "log";
  /** The sample rate the figure's frequencies are divided by (x values in the spec are f / fs). */
  normaliseTo?: number;
  yDomain?: [number, number];
  /** The mask as the worksheet gave it: x in Hz (or s), not divided by normaliseTo. */
  mask?: MaskSegment[];
}

function figureFacts(figure: FigureExhibit): FigureFacts {
  const facts: FigureFacts = { kind: figure.kind, title: figure.title };
  if (figure.xLabel !== undefined) facts.xLabel = figure.xLabel;
  if (figure.yLabel !== undefined) facts.yLabel = figure.yLabel;
  if (figure.xScale !== undefined) facts.xScale = figure.xScale;
  if (figure.normaliseTo !== undefined) facts.normaliseTo = figure.normaliseTo;
  if (figure.yDomain !== undefined) facts.yDomain = figure.yDomain;
  if (figure.mask !== undefined && figure.mask.length > 0) facts.mask = figure.mask;
  return facts;
}

/** Impulse and step x axes reach half a sample (at least 1 % of the span) past the ends. */
function padForStems(xValues: number[], xDomain: [number, number]): [number, number] {
  const sorted = [...new Set(xValues)].sort((a, b) => a - b);
  let step = Infinity;
  for (let i = 1; i < sorted.length; i++) step = Math.min(step, sorted[i]! - sorted[i - 1]!);
  const span = xDomain[1] - xDomain[0];
  const pad = Math.max(0.5 * step, 0.01 * span);
  return [xDomain[0] - pad, xDomain[1] + pad];
}

/** Mask segments cut to the x axis, the limit interpolated where a segment is cut. */
function clipMask(mask: MaskSegment[], xDomain: [number, number]): MaskSegment[] {
  const out: MaskSegment[] = [];
  for (const m of mask) {
    const end = m.toLevel ?? m.level;
    const at = (v: number) =>
      m.to === m.from ? m.level : m.level + ((end - m.level) * (v - m.from)) / (m.to - m.from);
    const from = Math.max(Math.min(m.from, m.to), xDomain[0]);
    const to = Math.min(Math.max(m.from, m.to), xDomain[1]);
    if (!(from < to)) continue;
    const { toLevel: _, ...rest } = m;
    const level = at(from);
    const levelTo = at(to);
    out.push(
      levelTo === level
        ? { ...rest, from, to, level }
        : { ...rest, from, to, level, toLevel: levelTo },
    );
  }
  return out;
}

/** Segments that share a label, grouped into runs that touch or overlap along x. */
function labelRuns(mask: MaskSegment[]): MaskSegment[][] {
  const byLabel = new Map<string, MaskSegment[]>();
  for (const m of mask) {
    if (m.label === undefined || m.label === "") continue;
    byLabel.set(m.label, [...(byLabel.get(m.label) ?? []), m]);
  }
  const runs: MaskSegment[][] = [];
  for (const segments of byLabel.values()) {
    segments.sort((a, b) => a.from - b.from);
    let run: MaskSegment[] = [];
    let end = -Infinity;
    for (const s of segments) {
      const touches = s.from <= end + 1e-9 * Math.max(1, Math.abs(end));
      if (!touches && run.length > 0) {
        runs.push(run);
        run = [];
        end = -Infinity;
      }
      run.push(s);
      end = Math.max(end, s.to);
    }
    if (run.length > 0) runs.push(run);
  }
  return runs;
}

/**
 * Where a run's label may go: inside a forbidden region first (above an upper
 * line, below a lower one; the roomiest first), at the start or the end of a
 * segment, then on the allowed side of the line.
 */
function maskCandidates(
  run: MaskSegment[],
  label: string,
  plot: Plot,
  yDomain: [number, number],
): Placement[] {
  const room = (m: MaskSegment) => {
    const level = Math.max(m.level, m.toLevel ?? m.level);
    const low = Math.min(m.level, m.toLevel ?? m.level);
    return m.bound === "upper" ? plot.py(level) : plot.height - plot.py(low);
  };
  const ordered = [...run].sort((a, b) => room(b) - room(a));
  const out: Placement[] = [];
  for (const forbidden of [true, false]) {
    for (const m of ordered) {
      const above = (m.bound === "upper") === forbidden;
      const clampY = (v: number) => Math.min(yDomain[1], Math.max(yDomain[0], v));
      const levelAt = (v: number) =>
        clampY(m.level + ((m.toLevel ?? m.level) - m.level) * (v - m.from) / (m.to - m.from));
      for (const t of [0, 0.25, 0.5]) {
        const at = m.from + t * (m.to - m.from);
        out.push(placement(plot, at, levelAt(at), label, "left", above, 4, 3));
      }
      out.push(placement(plot, m.to, levelAt(m.to), label, "right", above, 4, 3));
    }
  }
  return out;
}

/**
 * Shaded forbidden regions, each to the edge of the plot: above an upper bound
 * up to the top of the y axis, below a lower bound down to its bottom. The
 * drawing is clipped to the plot, so a limit outside the y range shades nothing.
 */
function maskLayer(mask: MaskSegment[], yDomain: [number, number], x: Spec, y: Spec): Spec {
  const values = mask.flatMap((m, i) => {
    const edge = m.bound === "upper" ? yDomain[1] : yDomain[0];
    const end = m.toLevel ?? m.level;
    return [
      { x: m.from, y: m.level, edge, piece: i },
      { x: m.to, y: end, edge, piece: i },
    ];
  });
  return {
    data: { values },
    layer: [
      {
        mark: { type: "area", color: palette.mask, opacity: 0.13, clip: true },
        encoding: {
          x,
          y,
          y2: { field: "edge" },
          detail: { field: "piece", type: "nominal" },
        },
      },
      {
        mark: { type: "line", color: palette.mask, strokeWidth: 1, strokeDash: [4, 2], clip: true },
        encoding: { x, y, detail: { field: "piece", type: "nominal" } },
      },
    ],
  };
}

/**
 * The difference panel of a "quantised" figure: each other series minus the
 * first, on the first one's x grid (other grids are interpolated onto it),
 * where both are inside the main plot's y range.
 */
function differenceLayers(
  figure: FigureExhibit,
  o: {
    scale: number;
    logX: boolean;
    yDomain: [number, number];
    x: Spec;
    yTitleText: string;
    names: string[];
    plotHeight: number;
  },
): Spec[] {
  const [lo, hi] = o.yDomain;
  const seen = (v: number) => Number.isFinite(v) && v >= lo && v <= hi;
  const reference = figure.series[0]!;
  const refX = reference.x.map((v) => v / o.scale);
  const rows: { x: number; d: number | null; series: string }[] = [];
  let largest = 0;
  for (const s of figure.series.slice(1)) {
    const sameGrid = s.x.length === reference.x.length && s.x.every((v, i) => v === reference.x[i]);
    const sorted = sameGrid ? undefined : sortedByX(s.x.map((v) => v / o.scale), s.y);
    const gx: number[] = [];
    const gd: number[] = [];
    refX.forEach((at, i) => {
      if (o.logX && !(at > 0)) return;
      const other = sorted ? interpolate(sorted.x, sorted.y, at) : s.y[i]!;
      const ref = reference.y[i]!;
      gx.push(at);
      gd.push(seen(ref) && seen(other) ? other - ref : NaN);
    });
    for (const d of gd) if (Number.isFinite(d)) largest = Math.max(largest, Math.abs(d));
    // The panel is short: half the points of a full plot draw it as finely.
    const t = thinRuns(gx, gd, maxPoints / 2);
    for (let i = 0; i < t.x.length; i++) rows.push({ x: t.x[i]!, d: t.y[i]!, series: s.name });
  }
  const half = (largest > 0 ? largest : 0.01 * (hi - lo)) * 1.15;
  const unit = /\(([^()]+)\)\s*$/.exec(o.yTitleText)?.[1];
  const title = unit ? `Difference (${unit})` : "Difference";
  const d = {
    field: "d",
    type: "quantitative",
    title: titleText(
      wrap(title, charsIn(differencePanel.height + 30, figureType.axisTitle), 3),
    ),
    scale: {
      domain: [-half, half],
      nice: false,
      zero: false,
      range: [{ expr: "height" }, { expr: `height - ${differencePanel.height}` }],
    },
    axis: { tickCount: 3, orient: "left" },
  };
  const others = o.names.slice(1);
  const top = `height - ${differencePanel.height + differencePanel.gap}`;
  const bottom = `height - ${differencePanel.height}`;
  const edge = (at: string) => ({
    mark: { type: "rule", color: palette.rule, strokeWidth: 1 },
    encoding: {
      x: { value: 0 },
      x2: { value: { expr: "width" } },
      y: { value: { expr: at } },
    },
  });
  return [
    // Blank out the gap between the plots (grid lines and frame), then close both frames.
    {
      mark: { type: "rect", color: palette.paper, strokeWidth: 0 },
      encoding: {
        x: { value: -1 },
        x2: { value: { expr: "width + 1" } },
        y: { value: { expr: top } },
        y2: { value: { expr: bottom } },
      },
    },
    edge(top),
    edge(bottom),
    {
      data: { values: [{ d: 0 }] },
      mark: { type: "rule", color: palette.muted, strokeWidth: 1 },
      encoding: { y: d },
    },
    {
      data: { values: rows },
      mark: { type: "line", strokeWidth: 1.4, clip: true, interpolate: "linear" },
      encoding: {
        x: o.x,
        y: { ...d, field: "d" },
        color: {
          field: "series",
          type: "nominal",
          scale: {
            domain: others,
            range: palette.series.slice(1, 1 + Math.max(1, others.length)),
          },
          legend: null,
        },
      },
    },
  ];
}

function poleZeroLayers(
  figure: FigureExhibit,
  xTitle: string | string[],
  yTitle: string | string[],
): Spec[] {
  const circle = Array.from({ length: 181 }, (_, i) => {
    const t = (2 * Math.PI * i) / 180;
    return { x: Math.cos(t), y: Math.sin(t), order: i };
  });
  const points = figure.series.flatMap((s) =>
    s.x.map((x, i) => ({ x, y: s.y[i]!, series: s.name }))
  );
  const extent = Math.max(1.2, ...points.map((p) => Math.max(Math.abs(p.x), Math.abs(p.y)) * 1.1));
  const axis = (title: string | string[], field: string) => ({
    field,
    type: "quantitative",
    title,
    scale: { domain: [-extent, extent], nice: false },
  });
  const x = axis(xTitle, "x");
  const y = axis(yTitle, "y");
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
