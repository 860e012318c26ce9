// tapsheet's own SVG writer for the figure specifications that figures.ts
// builds. Those specifications are vega-lite and stay the figure's saved,
// restylable description; drawing them here takes a few milliseconds, where
// loading vega and compiling its dataflow costs a few hundred per process.
//
// It reads the subset of vega-lite that `figureToVegaLite` writes: layers
// (nested, inheriting data and encoding), inline values, line, area, rule,
// point, rect and text marks, linear and log scales with explicit domains,
// one x axis, one or more y axes, one legend and the title. Anything else
// throws `Unsupported`, and `drawFigure` then answers `undefined` so the
// caller draws the specification with vega instead (render/svg.ts). The
// drawing is tested against vega's own rendering of the same specifications.
import { figureType, fontStack, palette } from "./theme.ts";

type Spec = Record<string, unknown>;
type Row = Record<string, unknown>;

/** A construct outside the subset this writer draws. */
export class Unsupported extends Error {}

const padding = 5;
/** The room figures.ts leaves left of the plot for the y axis (its layout estimate). */
const yAxisRoom = 62;
const tickSize = 5;
const labelPadding = 2;
/** Average glyph width of DejaVu Sans, in em (from memory); for fitting labels. */
const inkEm = 0.62;

/** Where text sits relative to its anchor, as a share of the font size (common practice). */
const baselineShift = { top: 0.79, middle: 0.3, bottom: -0.21, alphabetic: 0 } as const;

// ---------------------------------------------------------------------------
// Numbers and text in the markup.

/** A coordinate with at most two decimals, no "-0". */
function n(v: number): string {
  const r = Math.round(v * 100) / 100;
  return r === 0 ? "0" : String(r); // also -0
}

function esc(text: string): string {
  return text.replaceAll("&", "&amp;").replaceAll("<", "&lt;").replaceAll(">", "&gt;")
    .replaceAll('"', "&quot;");
}

const textWidth = (text: string, size: number) => text.length * inkEm * size;

// ---------------------------------------------------------------------------
// Ticks: the published "nice numbers" steps of 1, 2 and 5 × 10^k, computed as
// d3-array's `ticks` computes them (tested against d3-array).

const e10 = Math.sqrt(50);
const e5 = Math.sqrt(10);
const e2 = Math.sqrt(2);

function tickSpec(start: number, stop: number, count: number): [number, number, number] {
  const step = (stop - start) / Math.max(0, count);
  const power = Math.floor(Math.log10(step));
  const error = step / Math.pow(10, power);
  const factor = error >= e10 ? 10 : error >= e5 ? 5 : error >= e2 ? 2 : 1;
  let i1: number;
  let i2: number;
  let inc: number;
  if (power < 0) {
    inc = Math.pow(10, -power) / factor;
    i1 = Math.round(start * inc);
    i2 = Math.round(stop * inc);
    if (i1 / inc < start) ++i1;
    if (i2 / inc > stop) --i2;
    inc = -inc;
  } else {
    inc = Math.pow(10, power) * factor;
    i1 = Math.round(start / inc);
    i2 = Math.round(stop / inc);
    if (i1 * inc < start) ++i1;
    if (i2 * inc > stop) --i2;
  }
  if (i2 < i1 && 0.5 <= count && count < 2) return tickSpec(start, stop, count * 2);
  return [i1, i2, inc];
}

/** About `count` round values from `start` to `stop` (start ≤ stop), steps 1, 2 or 5 × 10^k. */
export function niceTicks(start: number, stop: number, count: number): number[] {
  if (!(count > 0)) return [];
  if (start === stop) return [start];
  const [i1, i2, inc] = tickSpec(start, stop, count);
  if (!(i2 >= i1)) return [];
  const out: number[] = [];
  for (let k = 0; k <= i2 - i1; k++) out.push(inc < 0 ? (i1 + k) / -inc : (i1 + k) * inc);
  return out;
}

/** The step between the ticks `niceTicks` gives. */
export function niceStep(start: number, stop: number, count: number): number {
  const inc = tickSpec(start, stop, count)[2];
  return inc < 0 ? 1 / -inc : inc;
}

/**
 * Ticks of a base-10 log axis, as d3-scale's log scale chooses them: every
 * 1…9 × 10^k when the domain spans fewer decades than `count`, else powers
 * of ten (tested against d3-scale).
 */
export function logTicks(start: number, stop: number, count: number): number[] {
  const i0 = Math.log10(start);
  const j0 = Math.log10(stop);
  let z: number[] = [];
  if (j0 - i0 < count) {
    const i = Math.floor(i0);
    const j = Math.ceil(j0);
    for (let p = i; p <= j; ++p) {
      for (let k = 1; k < 10; ++k) {
        const t = p < 0 ? k / Math.pow(10, -p) : k * Math.pow(10, p);
        if (t < start) continue;
        if (t > stop) break;
        z.push(t);
      }
    }
    if (z.length * 2 < count) z = niceTicks(start, stop, count);
  } else {
    z = niceTicks(i0, j0, Math.min(j0 - i0, count)).map((p) => Math.pow(10, p));
  }
  return z;
}

/** Which log ticks carry a label: as d3-scale's log tickFormat, at most `count` of them. */
function logLabelled(ticks: number[], count: number): (t: number) => boolean {
  const k = Math.max(1, (10 * count) / ticks.length);
  return (d) => {
    let i = d / Math.pow(10, Math.round(Math.log10(d)));
    if (i * 10 < 10 - 0.5) i *= 10;
    return i <= k + 1e-9;
  };
}

const minus = "\u2212";

/** A tick label: as many decimals as the step needs, thousands grouped, a true minus sign. */
export function tickLabel(value: number, step: number): string {
  const decimals = Math.max(0, -Math.floor(Math.log10(Math.abs(step)) + 1e-9));
  const fixed = Math.abs(value).toFixed(Math.min(decimals, 20));
  const [whole, fraction] = fixed.split(".");
  const grouped = whole!.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const text = fraction === undefined ? grouped : `${grouped}.${fraction}`;
  return value < 0 && Number(fixed) !== 0 ? minus + text : text;
}

/** A log-axis label: 20, 500, 2k, 10k, 1M; below 1 as decimals. */
export function logLabel(value: number): string {
  const units: [number, string][] = [[1e9, "G"], [1e6, "M"], [1e3, "k"]];
  for (const [size, suffix] of units) {
    if (value >= size) return `${Number((value / size).toPrecision(3))}${suffix}`;
  }
  return String(Number(value.toPrecision(3)));
}

// ---------------------------------------------------------------------------
// Scales.

interface Scale {
  log: boolean;
  domain: [number, number];
  /** Pixel range [at domain[0], at domain[1]]. */
  range: [number, number];
  at(v: number): number;
}

interface Frame {
  width: number;
  height: number;
}

function expr(value: unknown, frame: Frame): number {
  if (typeof value === "number") return value;
  const text = (value as { expr?: unknown } | null)?.expr;
  if (typeof text !== "string") throw new Unsupported(`value ${JSON.stringify(value)}`);
  const m = /^\s*(width|height)\s*(?:([+-])\s*(\d+(?:\.\d+)?))?\s*$/.exec(text);
  if (!m) throw new Unsupported(`expression ${text}`);
  const base = m[1] === "width" ? frame.width : frame.height;
  return m[2] === undefined ? base : base + (m[2] === "+" ? 1 : -1) * Number(m[3]);
}

function scaleOf(channel: "x" | "y", encoding: Spec, frame: Frame): Scale {
  const s = (encoding.scale ?? {}) as Spec;
  for (const key of Object.keys(s)) {
    if (!["type", "domain", "nice", "zero", "range"].includes(key)) {
      throw new Unsupported(`scale.${key}`);
    }
  }
  const domain = s.domain as [number, number] | undefined;
  if (!Array.isArray(domain) || domain.length !== 2 || !domain.every(Number.isFinite)) {
    throw new Unsupported("a scale without an explicit numeric domain");
  }
  if (s.nice === true) throw new Unsupported("nice scales");
  const log = s.type === "log";
  if (s.type !== undefined && !log && s.type !== "linear") throw new Unsupported(`${s.type} scale`);
  const range: [number, number] = Array.isArray(s.range)
    ? [expr(s.range[0], frame), expr(s.range[1], frame)]
    : channel === "x"
    ? [0, frame.width]
    : [frame.height, 0];
  const t = (v: number) => (log ? Math.log10(v) : v);
  const [d0, d1] = [t(domain[0]), t(domain[1])];
  const span = d1 - d0 || 1;
  return {
    log,
    domain,
    range,
    at: (v) => range[0] + ((t(v) - d0) / span) * (range[1] - range[0]),
  };
}

// ---------------------------------------------------------------------------
// The layers, flattened: each unit layer with the data and encoding it inherits.

interface Unit {
  rows: Row[];
  mark: Spec;
  encoding: Record<string, Spec>;
}

const unitKeys = new Set(["data", "mark", "encoding", "layer"]);

function units(spec: Spec, rows: Row[], encoding: Record<string, Spec>, out: Unit[]): Unit[] {
  for (const key of Object.keys(spec)) {
    if (!unitKeys.has(key)) throw new Unsupported(`layer key ${key}`);
  }
  const data = spec.data as { values?: Row[] } | undefined;
  if (data !== undefined && !Array.isArray(data.values)) {
    throw new Unsupported("data by name or url");
  }
  const ownRows = data?.values ?? rows;
  const ownEncoding = { ...encoding, ...((spec.encoding ?? {}) as Record<string, Spec>) };
  if (Array.isArray(spec.layer)) {
    for (const child of spec.layer as Spec[]) units(child, ownRows, ownEncoding, out);
  } else {
    const mark = typeof spec.mark === "string" ? { type: spec.mark } : spec.mark as Spec;
    if (mark === undefined) throw new Unsupported("a layer without a mark");
    out.push({ rows: ownRows, mark, encoding: ownEncoding });
  }
  return out;
}

// ---------------------------------------------------------------------------
// Layout.

interface Axis {
  channel: "x" | "y";
  scale: Scale;
  title: string[];
  ticks: number[];
  labels: string[];
}

function titleLines(title: unknown): string[] {
  if (title === undefined || title === null) return [];
  return Array.isArray(title) ? title.map(String) : [String(title)];
}

function axisFor(channel: "x" | "y", encoding: Spec, scale: Scale): Axis {
  const options = (encoding.axis ?? {}) as Spec;
  const size = Math.abs(scale.range[1] - scale.range[0]);
  const count = typeof options.tickCount === "number" ? options.tickCount : Math.ceil(size / 40);
  const [lo, hi] = [Math.min(...scale.domain), Math.max(...scale.domain)];
  let ticks: number[];
  // Label sets to try, richest first; the first whose labels do not overlap is drawn
  // (x axes only: y labels stand 40 px apart or more).
  let candidates: string[][];
  if (scale.log) {
    ticks = logTicks(lo, hi, count);
    const shown = logLabelled(ticks, count);
    const mantissa = (t: number) => Math.round(t / Math.pow(10, Math.floor(Math.log10(t) + 1e-9)));
    candidates = [
      ticks.map((t) => (shown(t) ? logLabel(t) : "")),
      ...[[1, 2, 5], [1, 2], [1]].map((keep) =>
        ticks.map((t) => (keep.includes(mantissa(t)) ? logLabel(t) : ""))
      ),
    ];
  } else {
    let step = niceStep(lo, hi, count);
    ticks = niceTicks(lo, hi, count);
    if (typeof options.tickMinStep === "number" && step < options.tickMinStep) {
      step = options.tickMinStep;
      ticks = [];
      for (let t = Math.ceil(lo / step) * step; t <= hi + 1e-9 * step; t += step) ticks.push(t);
    }
    // Every tick, then every other one, every fourth …; a thinned set is written with the
    // decimals of its own step when that shows every kept value exactly (6, 7, 8, not 6.0).
    candidates = [1, 2, 4, 8, 16, 32].map((keep) =>
      ticks.map((t, i) => {
        if (i % keep !== 0) return "";
        const short = tickLabel(t, step * keep);
        const exact = Math.abs(Number(short.replace("\u2212", "-").replaceAll(",", "")) - t) <=
          1e-9 * Math.max(1, Math.abs(t));
        return exact ? short : tickLabel(t, step);
      })
    );
  }
  const fits = (labels: string[]) => {
    const boxes = ticks.flatMap((t, i) =>
      labels[i] === "" ? [] : [{ at: scale.at(t), w: textWidth(labels[i]!, figureType.label) }]
    );
    return boxes.every((b, i) =>
      i === 0 || boxes[i - 1]!.at + boxes[i - 1]!.w / 2 + 4 <= b.at - b.w / 2
    );
  };
  const labels = channel === "y"
    ? candidates[0]!
    : candidates.find(fits) ?? candidates[candidates.length - 1]!;
  return { channel, scale, title: titleLines(encoding.title), ticks, labels };
}

// ---------------------------------------------------------------------------
// Marks.

interface Paint {
  colourOf(row: Row): string;
}

function paintOf(unit: Unit, fallback: string): Paint {
  const mark = unit.mark;
  const colour = unit.encoding.color;
  if (colour?.field !== undefined) {
    const scale = (colour.scale ?? {}) as { domain?: string[]; range?: string[] };
    const domain = scale.domain ?? [];
    const range = scale.range ?? palette.series;
    const field = String(colour.field);
    return {
      colourOf: (row) => {
        const i = domain.indexOf(String(row[field]));
        return range[(i < 0 ? 0 : i) % range.length]!;
      },
    };
  }
  const fixed = typeof mark.color === "string" ? mark.color : fallback;
  return { colourOf: () => fixed };
}

/** Rows split by series and detail fields, in first-seen order. */
function groups(unit: Unit): Row[][] {
  const fields = ["color", "detail"].map((c) => unit.encoding[c]?.field).filter((f) =>
    f !== undefined
  ).map(String);
  const byKey = new Map<string, Row[]>();
  for (const row of unit.rows) {
    const key = JSON.stringify(fields.map((f) => row[f]));
    const list = byKey.get(key);
    if (list) list.push(row);
    else byKey.set(key, [row]);
  }
  return [...byKey.values()];
}

const isNumber = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);

interface Place {
  x: Scale | undefined;
  y: Scale | undefined;
  frame: Frame;
}

/** A channel's pixel position for a row: from a field, a datum, or a pixel value. */
function position(
  encoding: Spec | undefined,
  scale: Scale | undefined,
  row: Row,
  frame: Frame,
): number | undefined {
  if (encoding === undefined) return undefined;
  if (encoding.field !== undefined) {
    const v = row[String(encoding.field)];
    if (!isNumber(v) || scale === undefined) return undefined;
    if (scale.log && v <= 0) return undefined;
    return scale.at(v);
  }
  if (encoding.datum !== undefined) {
    if (!isNumber(encoding.datum) || scale === undefined) throw new Unsupported("datum");
    return scale.at(encoding.datum);
  }
  if (encoding.value !== undefined) return expr(encoding.value, frame);
  throw new Unsupported("an encoding without field, datum or value");
}

function strokeAttrs(mark: Spec, width: number): string {
  const dash = Array.isArray(mark.strokeDash)
    ? ` stroke-dasharray="${mark.strokeDash.join(",")}"`
    : "";
  const opacity = isNumber(mark.opacity) ? ` stroke-opacity="${mark.opacity}"` : "";
  return ` stroke-width="${
    n(isNumber(mark.strokeWidth) ? mark.strokeWidth : width)
  }"${dash}${opacity}`;
}

function drawLine(unit: Unit, at: Place): string {
  const paint = paintOf(unit, palette.series[0]);
  const order = unit.encoding.order?.field;
  const out: string[] = [];
  for (const group of groups(unit)) {
    const rows = [...group].sort((a, b) =>
      order !== undefined
        ? Number(a[String(order)]) - Number(b[String(order)])
        : Number(a[String(unit.encoding.x?.field)]) - Number(b[String(unit.encoding.x?.field)])
    );
    let d = "";
    let pen = false;
    for (const row of rows) {
      const x = position(unit.encoding.x, at.x, row, at.frame);
      const y = position(unit.encoding.y, at.y, row, at.frame);
      if (x === undefined || y === undefined) {
        pen = false;
        continue;
      }
      d += `${pen ? "L" : "M"}${n(x)},${n(y)}`;
      pen = true;
    }
    if (d === "") continue;
    out.push(
      `<path class="line" d="${d}" fill="none" stroke="${paint.colourOf(group[0]!)}"${
        strokeAttrs(unit.mark, 2)
      } stroke-linejoin="round"/>`,
    );
  }
  return out.join("");
}

function drawArea(unit: Unit, at: Place): string {
  const paint = paintOf(unit, palette.series[0]);
  const out: string[] = [];
  for (const group of groups(unit)) {
    const rows = [...group].sort((a, b) =>
      Number(a[String(unit.encoding.x?.field)]) - Number(b[String(unit.encoding.x?.field)])
    );
    const top: string[] = [];
    const base: string[] = [];
    for (const row of rows) {
      const x = position(unit.encoding.x, at.x, row, at.frame);
      const y = position(unit.encoding.y, at.y, row, at.frame);
      const y2 = position(unit.encoding.y2, at.y, row, at.frame) ?? at.y?.at(0);
      if (x === undefined || y === undefined || y2 === undefined) continue;
      top.push(`${n(x)},${n(y)}`);
      base.unshift(`${n(x)},${n(y2)}`);
    }
    if (top.length < 2) continue;
    const opacity = isNumber(unit.mark.opacity) ? ` fill-opacity="${unit.mark.opacity}"` : "";
    out.push(
      `<path class="area" d="M${[...top, ...base].join("L")}Z" fill="${
        paint.colourOf(group[0]!)
      }"${opacity}/>`,
    );
  }
  return out.join("");
}

function drawRule(unit: Unit, at: Place): string {
  const paint = paintOf(unit, palette.muted);
  const out: string[] = [];
  const rows = unit.rows.length > 0 ? unit.rows : [{}];
  for (const row of rows) {
    const e = unit.encoding;
    let x = position(e.x, at.x, row, at.frame);
    let x2 = position(e.x2, at.x, row, at.frame);
    let y = position(e.y, at.y, row, at.frame);
    let y2 = position(e.y2, at.y, row, at.frame);
    if (e.x === undefined) [x, x2] = [0, at.frame.width];
    if (e.y === undefined) [y, y2] = [0, at.frame.height];
    if (x === undefined || y === undefined) continue;
    x2 ??= x;
    y2 ??= y;
    out.push(
      `<line x1="${n(x)}" y1="${n(y)}" x2="${n(x2)}" y2="${n(y2)}" stroke="${paint.colourOf(row)}"${
        strokeAttrs(unit.mark, 1)
      }/>`,
    );
  }
  return out.length > 0 ? `<g class="rule">${out.join("")}</g>` : "";
}

function drawRect(unit: Unit, at: Place): string {
  const e = unit.encoding;
  const rows = unit.rows.length > 0 ? unit.rows : [{}];
  const fill = typeof unit.mark.color === "string" ? unit.mark.color : palette.series[0];
  return rows.map((row) => {
    const [x, x2] = [position(e.x, at.x, row, at.frame), position(e.x2, at.x, row, at.frame)];
    const [y, y2] = [position(e.y, at.y, row, at.frame), position(e.y2, at.y, row, at.frame)];
    if ([x, x2, y, y2].some((v) => v === undefined)) {
      throw new Unsupported("a rect without corners");
    }
    return `<rect x="${n(Math.min(x!, x2!))}" y="${n(Math.min(y!, y2!))}" width="${
      n(Math.abs(x2! - x!))
    }" height="${n(Math.abs(y2! - y!))}" fill="${fill}"/>`;
  }).join("");
}

/** A symbol's path centred on 0,0 with the given area in px² (vega-lite's `size`). */
function symbolPath(shape: string, size: number): string {
  const r = Math.sqrt(size / Math.PI);
  if (shape === "circle") {
    return `M${n(r)},0A${n(r)},${n(r)},0,1,1,${n(-r)},0A${n(r)},${n(r)},0,1,1,${n(r)},0Z`;
  }
  if (shape === "M-1,-1L1,1M-1,1L1,-1" || shape === "cross") {
    const h = Math.sqrt(size) / 2;
    return `M${n(-h)},${n(-h)}L${n(h)},${n(h)}M${n(-h)},${n(h)}L${n(h)},${n(-h)}`;
  }
  throw new Unsupported(`point shape ${shape}`);
}

function shapeOf(unit: Unit): (row: Row) => string {
  const shape = unit.encoding.shape;
  if (shape?.field !== undefined) {
    const scale = (shape.scale ?? {}) as { domain?: string[]; range?: string[] };
    return (row) => {
      const i = (scale.domain ?? []).indexOf(String(row[String(shape.field)]));
      return scale.range?.[i < 0 ? 0 : i] ?? "circle";
    };
  }
  const fixed = typeof unit.mark.shape === "string" ? unit.mark.shape : "circle";
  return () => fixed;
}

function drawPoint(unit: Unit, at: Place): string {
  const paint = paintOf(unit, palette.series[0]);
  const shape = shapeOf(unit);
  const size = isNumber(unit.mark.size) ? unit.mark.size : 30;
  const filled = unit.mark.filled === true;
  const out: string[] = [];
  for (const row of unit.rows) {
    const x = position(unit.encoding.x, at.x, row, at.frame);
    const y = position(unit.encoding.y, at.y, row, at.frame);
    if (x === undefined || y === undefined) continue;
    const colour = paint.colourOf(row);
    const paintAttrs = filled
      ? `fill="${colour}"`
      : `fill="none" stroke="${colour}"${strokeAttrs(unit.mark, 1)}`;
    out.push(
      `<path transform="translate(${n(x)},${n(y)})" d="${
        symbolPath(shape(row), size)
      }" ${paintAttrs}/>`,
    );
  }
  return out.length > 0 ? `<g class="point">${out.join("")}</g>` : "";
}

function drawText(unit: Unit, at: Place, font: string): string {
  const m = unit.mark;
  const size = isNumber(m.fontSize) ? m.fontSize : figureType.note;
  const anchor = m.align === "right" ? "end" : m.align === "center" ? "middle" : "start";
  const shift = baselineShift[(m.baseline as keyof typeof baselineShift) ?? "alphabetic"] ?? 0;
  const fill = typeof m.color === "string" ? m.color : palette.ink;
  const halo = typeof m.stroke === "string"
    ? ` stroke="${m.stroke}" stroke-width="${n(isNumber(m.strokeWidth) ? m.strokeWidth : 1)}"${
      m.strokeJoin === "round" ? ' stroke-linejoin="round"' : ""
    }`
    : "";
  const hidden = m.aria === false ? ' aria-hidden="true"' : "";
  const field = String(unit.encoding.text?.field ?? "text");
  const out: string[] = [];
  for (const row of unit.rows) {
    const x = position(unit.encoding.x, at.x, row, at.frame);
    const y = position(unit.encoding.y, at.y, row, at.frame);
    if (x === undefined || y === undefined) continue;
    const tx = x + (isNumber(m.dx) ? m.dx : 0);
    const ty = y + (isNumber(m.dy) ? m.dy : 0) + shift * size;
    out.push(
      `<text x="${n(tx)}" y="${n(ty)}" text-anchor="${anchor}" font-family="${
        esc(font)
      }" font-size="${size}" fill="${fill}"${halo}>${esc(String(row[field] ?? ""))}</text>`,
    );
  }
  return out.length > 0 ? `<g class="note"${hidden}>${out.join("")}</g>` : "";
}

// ---------------------------------------------------------------------------
// The figure.

interface Config {
  font: string;
  background: string;
  frame: string;
  grid: string;
  domain: string;
  label: string;
  title: string;
}

function configOf(spec: Spec): Config {
  const c = (spec.config ?? {}) as Record<string, Spec | string>;
  const axis = (c.axis ?? {}) as Spec;
  const view = (c.view ?? {}) as Spec;
  const str = (v: unknown, fallback: string) => (typeof v === "string" ? v : fallback);
  return {
    font: str(c.font, fontStack),
    background: str(c.background, palette.paper),
    frame: str(view.stroke, palette.rule),
    grid: str(axis.gridColor, "#e6eaee"),
    domain: str(axis.domainColor, palette.muted),
    label: str(axis.labelColor, palette.muted),
    title: str(axis.titleColor, palette.ink),
  };
}

const specKeys = new Set([
  "$schema",
  "title",
  "width",
  "height",
  "autosize",
  "config",
  "usermeta",
  "layer",
  "resolve",
]);

/** The figure drawn as SVG, or undefined when the specification is not one this writer reads. */
export function drawFigure(spec: Spec): string | undefined {
  try {
    return draw(spec);
  } catch (error) {
    if (error instanceof Unsupported) return undefined;
    throw error;
  }
}

/** The figure drawn as SVG; throws `Unsupported` for what it does not read. */
export function draw(spec: Spec): string {
  if ((spec.usermeta as Spec | undefined)?.figure === undefined) {
    throw new Unsupported("not a figure specification of tapsheet's");
  }
  for (const key of Object.keys(spec)) if (!specKeys.has(key)) throw new Unsupported(key);
  const width = Number(spec.width);
  const height = Number(spec.height);
  if (!isNumber(width) || !isNumber(height)) throw new Unsupported("a figure without a size");
  const config = configOf(spec);
  const all = units({ layer: spec.layer }, [], {}, []);

  // The axes: one x, and a y for each distinct y scale with a field.
  const xEncoding = all.map((u) => u.encoding.x).find((e) => e?.field !== undefined);
  const yEncodings = new Map<string, Spec>();
  for (const u of all) {
    const e = u.encoding.y;
    if (e?.field === undefined) continue;
    const key = JSON.stringify(e.scale ?? {});
    if (!yEncodings.has(key) || yEncodings.get(key)!.title === undefined) yEncodings.set(key, e);
  }
  if (xEncoding === undefined || yEncodings.size === 0) throw new Unsupported("no x or y field");

  // The legend: the first colour scale whose legend is not switched off.
  const legendEncoding = all.map((u) => u.encoding.color).find((c) =>
    c?.field !== undefined && c.legend !== null
  );
  const legendNames = ((legendEncoding?.scale as { domain?: string[] } | undefined)?.domain) ??
    [];
  const legendOptions = (legendEncoding?.legend ?? {}) as Spec;
  const columns = legendNames.length === 0
    ? 0
    : isNumber(legendOptions.columns)
    ? legendOptions.columns
    : legendNames.length;
  const legendRows = columns > 0 ? Math.ceil(legendNames.length / columns) : 0;

  const title = titleLines((spec.title as Spec | undefined)?.text ?? spec.title);
  const xTitle = titleLines(xEncoding.title);
  const top = padding + (title.length > 0 ? title.length * figureType.titleLine + 10 : 0);
  const bottom = padding + 24 + xTitle.length * figureType.axisTitleLine +
    (legendRows > 0 ? 12 + 17 * legendRows : 0);
  // The y axes first (they depend on the plot's height only): the plot's left edge makes room
  // for their labels and titles.
  const plotHeight = height - top - bottom;
  const yAxes = [...yEncodings].map(([key, e]) => {
    const s = scaleOf("y", e, { width: width - padding - yAxisRoom - padding, height: plotHeight });
    return { key, scale: s, axis: axisFor("y", e, s) };
  });
  const yRoom = Math.max(
    yAxisRoom,
    ...yAxes.map(({ axis }) =>
      tickSize + labelPadding +
      Math.max(0, ...axis.labels.map((l) => textWidth(l, figureType.label))) +
      6 + axis.title.length * figureType.axisTitleLine
    ),
  );
  const left = padding + yRoom;
  const frame: Frame = { width: width - left - padding, height: plotHeight };
  if (frame.width < 40 || frame.height < 40) throw new Unsupported("no room for the plot");

  const xScale = scaleOf("x", xEncoding, frame);
  const xAxis = axisFor("x", xEncoding, xScale);
  const yScaleOf = (e: Spec | undefined) => {
    if (e === undefined) return yAxes[0]!.scale;
    if (e.field === undefined && e.datum === undefined) return undefined;
    const key = JSON.stringify(e.scale ?? {});
    return (yAxes.find((a) => a.key === key) ?? yAxes[0]!).scale;
  };

  const parts: string[] = [];
  const font = esc(config.font);
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${
      esc(title.join(" "))
    }">`,
    `<title>${esc(title.join(" "))}</title>`,
    `<rect class="background" width="${width}" height="${height}" fill="${config.background}"/>`,
    `<defs><clipPath id="plot-clip"><rect width="${n(frame.width)}" height="${
      n(frame.height)
    }"/></clipPath></defs>`,
  );

  // Title, top left.
  title.forEach((line, i) => {
    parts.push(
      `<text class="figure-title" x="${padding}" y="${
        n(padding + i * figureType.titleLine + baselineShift.top * figureType.title)
      }" font-family="${font}" font-size="${figureType.title}" font-weight="bold" fill="${palette.ink}">${
        esc(line)
      }</text>`,
    );
  });

  parts.push(`<g class="plot" transform="translate(${n(left)},${n(top)})">`);
  parts.push(
    `<rect class="frame" width="${n(frame.width)}" height="${
      n(frame.height)
    }" fill="${config.background}" stroke="${config.frame}"/>`,
  );

  // Grid lines under the marks.
  const grid: string[] = [];
  for (const t of xAxis.ticks) {
    const x = xScale.at(t);
    grid.push(`<line x1="${n(x)}" y1="0" x2="${n(x)}" y2="${n(frame.height)}"/>`);
  }
  for (const { scale, axis } of yAxes) {
    for (const t of axis.ticks) {
      const y = scale.at(t);
      grid.push(`<line x1="0" y1="${n(y)}" x2="${n(frame.width)}" y2="${n(y)}"/>`);
    }
  }
  parts.push(`<g class="grid" stroke="${config.grid}" stroke-width="1">${grid.join("")}</g>`);

  // The marks, in layer order.
  for (const unit of all) {
    const at: Place = { x: xScale, y: yScaleOf(unit.encoding.y), frame };
    const type = String(unit.mark.type);
    const body = type === "line"
      ? drawLine(unit, at)
      : type === "area"
      ? drawArea(unit, at)
      : type === "rule"
      ? drawRule(unit, at)
      : type === "rect"
      ? drawRect(unit, at)
      : type === "point"
      ? drawPoint(unit, at)
      : type === "text"
      ? drawText(unit, at, config.font)
      : (() => {
        throw new Unsupported(`${type} mark`);
      })();
    if (body === "") continue;
    parts.push(
      unit.mark.clip === true
        ? `<g class="mark-${type}" clip-path="url(#plot-clip)">${body}</g>`
        : `<g class="mark-${type}">${body}</g>`,
    );
  }

  // Axes: the x axis along the bottom, each y axis along the left of its range.
  const axisParts: string[] = [];
  const labelAttrs = `font-family="${font}" font-size="${figureType.label}" fill="${config.label}"`;
  const titleAttrs =
    `font-family="${font}" font-size="${figureType.axisTitle}" fill="${config.title}"`;
  {
    const y0 = frame.height;
    axisParts.push(
      `<line x1="0" y1="${n(y0)}" x2="${n(frame.width)}" y2="${n(y0)}" stroke="${config.domain}"/>`,
    );
    xAxis.ticks.forEach((t, i) => {
      const x = xScale.at(t);
      axisParts.push(
        `<line x1="${n(x)}" y1="${n(y0)}" x2="${n(x)}" y2="${
          n(y0 + tickSize)
        }" stroke="${config.domain}"/>`,
      );
      const label = xAxis.labels[i]!;
      if (label === "") return;
      const w = textWidth(label, figureType.label);
      const anchor = x - w / 2 < -left + padding
        ? "start"
        : x + w / 2 > frame.width + padding
        ? "end"
        : "middle";
      axisParts.push(
        `<text x="${n(x)}" y="${
          n(y0 + tickSize + labelPadding + baselineShift.top * figureType.label)
        }" text-anchor="${anchor}" ${labelAttrs}>${esc(label)}</text>`,
      );
    });
    xAxis.title.forEach((line, i) => {
      axisParts.push(
        `<text class="axis-title" x="${n(frame.width / 2)}" y="${
          n(y0 + 24 + i * figureType.axisTitleLine + baselineShift.top * figureType.axisTitle - 4)
        }" text-anchor="middle" ${titleAttrs}>${esc(line)}</text>`,
      );
    });
  }
  for (const { scale, axis } of yAxes) {
    const [a, b] = [scale.range[0], scale.range[1]];
    axisParts.push(`<line x1="0" y1="${n(a)}" x2="0" y2="${n(b)}" stroke="${config.domain}"/>`);
    axis.ticks.forEach((t, i) => {
      const y = scale.at(t);
      axisParts.push(
        `<line x1="${-tickSize}" y1="${n(y)}" x2="0" y2="${n(y)}" stroke="${config.domain}"/>`,
        `<text x="${-(tickSize + labelPadding)}" y="${
          n(y + baselineShift.middle * figureType.label)
        }" text-anchor="end" ${labelAttrs}>${esc(axis.labels[i]!)}</text>`,
      );
    });
    // Title lines rotated, the first outermost, centred on the axis's range.
    const middle = (a + b) / 2;
    axis.title.forEach((line, i) => {
      const x = -yRoom + 2 + (i + 1) * figureType.axisTitleLine - 3;
      axisParts.push(
        `<text class="axis-title" transform="translate(${n(x)},${
          n(middle)
        }) rotate(-90)" text-anchor="middle" ${titleAttrs}>${esc(line)}</text>`,
      );
    });
  }
  parts.push(`<g class="axes">${axisParts.join("")}</g>`);
  parts.push(`</g>`);

  // Legend, under the x axis title, in rows of `columns`.
  if (legendNames.length > 0) {
    parts.push(legend(all, legendEncoding!, legendNames, columns, {
      left,
      top: top + frame.height + 24 + xTitle.length * figureType.axisTitleLine + 12,
      width: width - left - padding,
      labelAttrs: `font-family="${font}" font-size="${figureType.label}" fill="${palette.ink}"`,
    }));
  }
  parts.push("</svg>");
  return parts.join("") + "\n";
}

function legend(
  all: Unit[],
  encoding: Spec,
  names: string[],
  columns: number,
  at: { left: number; top: number; width: number; labelAttrs: string },
): string {
  const scale = (encoding.scale ?? {}) as { domain?: string[]; range?: string[] };
  const range = scale.range ?? palette.series;
  const field = String(encoding.field);
  const longest = Math.max(...names.map((name) => textWidth(name, figureType.label)));
  const column = Math.min(at.width / columns, longest + 40);
  const out: string[] = [];
  names.forEach((name, i) => {
    const colour = range[i % range.length]!;
    const x = at.left + (i % columns) * column;
    const y = at.top + Math.floor(i / columns) * 17;
    // The symbol follows the marks that draw this series: a dashed or solid stroke, or a point.
    const unit = all.find((u) =>
      u.encoding.color?.field === field && u.rows.some((r) => String(r[field]) === name)
    );
    const type = unit?.mark.type;
    let symbol: string;
    if (type === "point" && unit !== undefined) {
      const shape = shapeOf(unit)({
        [field]: name,
        ...unit.rows.find((r) => String(r[field]) === name),
      });
      const filled = unit.mark.filled === true;
      symbol = `<path transform="translate(${n(x + 8)},${n(y + 6)})" d="${symbolPath(shape, 50)}" ${
        filled ? `fill="${colour}"` : `fill="none" stroke="${colour}" stroke-width="1.5"`
      }/>`;
    } else {
      const dash = Array.isArray(unit?.mark.strokeDash)
        ? ` stroke-dasharray="${(unit!.mark.strokeDash as number[]).join(",")}"`
        : "";
      symbol = `<line x1="${n(x)}" y1="${n(y + 6)}" x2="${n(x + 16)}" y2="${
        n(y + 6)
      }" stroke="${colour}" stroke-width="2"${dash}/>`;
    }
    out.push(
      symbol,
      `<text x="${n(x + 22)}" y="${
        n(y + 6 + baselineShift.middle * figureType.label)
      }" ${at.labelAttrs}>${esc(name)}</text>`,
    );
  });
  return `<g class="legend">${out.join("")}</g>`;
}
