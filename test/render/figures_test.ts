import assert from "node:assert/strict";
import { figureToVegaLite, thin } from "../../render/figures.ts";
import { vegaLiteToSvg } from "../../render/svg.ts";
import { figureSize, figureType, palette } from "../../render/theme.ts";
import type { FigureExhibit, FigureKind } from "../../record/types.ts";
import { plotArea, plotTexts, svgSize, svgTexts, titleOrigin } from "./_svg.ts";

type Spec = Record<string, unknown>;

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

/** Every sub-spec of a spec, depth first (layers inside layers). */
function allLayers(spec: Spec): Spec[] {
  const inner = (spec.layer as Spec[] | undefined) ?? [];
  return [spec, ...inner.flatMap(allLayers)];
}

const markType = (layer: Spec) => (layer.mark as { type?: string } | undefined)?.type;

function figure(over: Partial<FigureExhibit>): FigureExhibit {
  return {
    type: "figure",
    kind: "magnitude",
    title: "m",
    series: [{ name: "h", x: [0, 1000, 4000], y: [0, -3, -80] }],
    ...over,
  };
}

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
    const text = svgTexts(svg).join("\n");
    assert.ok(text.includes(figure.title), "title in the SVG");
    const json = JSON.stringify(spec);
    for (const axis of (json.match(/"title":"([^"]+)"/g) ?? []).slice(0, 3)) {
      const title = axis.slice(9, -1);
      if (title !== figure.title) assert.ok(text.includes(title), `axis title ${title}`);
    }
  });
}

// --- 1. Masks -------------------------------------------------------------------------------

Deno.test("figures: a mask shades its whole forbidden region, up to the top or down to the bottom", () => {
  const spec = figureToVegaLite(figure({
    mask: [
      { from: 2000, to: 4000, level: -60, bound: "upper" },
      { from: 0, to: 1000, level: -1, bound: "lower" },
    ],
    yDomain: [-100, 5],
  }));
  const area = allLayers(spec).find((l) => markType(l) === "area");
  assert.ok(area, "an area layer");
  const mask = allLayers(spec).find((l) => (l.layer as Spec[] | undefined)?.includes(area!))!;
  const values = (mask.data as { values: { x: number; y: number; edge: number }[] }).values;
  // Above the stopband ceiling up to the top of the y axis…
  assert.deepEqual(values.filter((v) => v.y === -60).map((v) => [v.x, v.edge]), [
    [2000, 5],
    [4000, 5],
  ]);
  // …and below a passband floor down to the bottom, not a strip.
  assert.deepEqual(values.filter((v) => v.y === -1).map((v) => [v.x, v.edge]), [
    [0, -100],
    [1000, -100],
  ]);
  assert.equal((area!.mark as { clip?: boolean }).clip, true, "clipped to the plot");
});

Deno.test("figures: a mask beyond the x axis is cut to it, its limit interpolated at the cut", () => {
  const spec = figureToVegaLite(figure({
    series: [{ name: "h", x: [0, 1000, 2000], y: [0, -3, -80] }],
    mask: [{ from: 1000, to: 3000, level: -20, toLevel: -60, bound: "upper", label: "S" }],
  }));
  const json = JSON.stringify(spec);
  // From −20 dB at 1 kHz to −60 dB at 3 kHz is −40 dB at 2 kHz, where the axis ends.
  assert.match(json, /"x":1000,"y":-20,"edge"/);
  assert.match(json, /"x":2000,"y":-40,"edge"/);
  assert.doesNotMatch(json, /"x":3000/);
});

Deno.test("figures: each mask label is drawn once per run of touching segments, inside the plot", async () => {
  const exhibit = figure({
    series: [{ name: "h", x: f, y: db }],
    mask: [
      // A passband limit has an upper and a lower line with the same id: one label.
      { from: 0, to: 1800, level: 0.5, bound: "upper", label: "PB-1" },
      { from: 0, to: 1800, level: -0.5, bound: "lower", label: "PB-1" },
      // The same id on two bands apart from each other: one label each.
      { from: 2500, to: 3500, level: -50, bound: "upper", label: "SB-2" },
      { from: 4500, to: 6400, level: -50, bound: "upper", label: "SB-2" },
      // A third id along the whole axis, near PB-1's lines: its label must not sit on PB-1's.
      { from: 0, to: 6400, level: 1, bound: "upper", label: "MG-3" },
      { from: 2000, to: 2400, level: -20, bound: "upper" },
    ],
    yDomain: [-100, 5],
  });
  const svg = await vegaLiteToSvg(figureToVegaLite(exhibit));
  const plot = plotArea(svg);
  const labels = plotTexts(svg).filter((t) => !t.halo);
  const count = (id: string) => labels.filter((t) => t.text === id).length;
  assert.equal(count("PB-1"), 1);
  assert.equal(count("SB-2"), 2);
  assert.equal(count("MG-3"), 1);
  assert.equal(labels.length, 4, "an unlabelled segment gets no text");
  // Boxes as drawn: about 0.6 em a character of DejaVu Sans (from memory), one line high.
  const boxes = labels.map((t) => {
    const w = 0.62 * figureType.note * t.text.length;
    const left = t.anchor === "start" ? t.x : t.anchor === "end" ? t.x - w : t.x - w / 2;
    return { left, right: left + w, top: t.y - figureType.note, bottom: t.y + 3 };
  });
  for (const b of boxes) {
    assert.ok(b.left >= 0 && b.right <= plot.width, `label inside the plot's width: ${b.left}`);
    assert.ok(b.top >= 0 && b.bottom <= plot.height, `label inside the plot's height: ${b.top}`);
  }
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const [a, b] = [boxes[i]!, boxes[j]!];
      const apart = a.right <= b.left || b.right <= a.left || a.bottom <= b.top ||
        b.bottom <= a.top;
      assert.ok(apart, `labels ${labels[i]!.text} and ${labels[j]!.text} do not overlap`);
    }
  }
});

// --- 2. Worst points ------------------------------------------------------------------------

Deno.test("figures: a worst case is ringed on the first series, coloured by its verdict, with its id", async () => {
  const exhibit = figure({
    series: [
      { name: "h", x: [0, 1000, 2000, 4000], y: [0, -10, -30, -80] },
      { name: "other", x: [0, 4000], y: [5, 5] },
    ],
    normaliseTo: 8000,
  });
  const spec = figureToVegaLite(exhibit, {
    worst: [
      { id: "R-1", at: 1500, met: true },
      { id: "R-2", at: 3000, met: false },
      { id: "R-3", at: 5000, met: true }, // beyond the axis
    ],
  });
  const rings = allLayers(spec).filter((l) =>
    markType(l) === "point" && (l.mark as { filled?: boolean }).filled === false
  );
  const ringAt = (colour: string) =>
    rings.filter((r) => (r.mark as { color: string }).color === colour)
      .flatMap((r) => (r.data as { values: { x: number; y: number }[] }).values);
  // x divided by fs like the series; y interpolated on the first series: halfway from
  // −10 dB to −30 dB is −20 dB, halfway from −30 dB to −80 dB is −55 dB.
  assert.deepEqual(ringAt(palette.pass), [{ x: 1500 / 8000, y: -20 }]);
  assert.deepEqual(ringAt(palette.fail), [{ x: 3000 / 8000, y: -55 }]);
  const texts = plotTexts(await vegaLiteToSvg(spec)).filter((t) => !t.halo).map((t) => t.text);
  assert.ok(texts.includes("R-1"));
  assert.ok(texts.some((t) => t.startsWith("R-2")), "the failed one is named too");
  assert.ok(!texts.some((t) => t.startsWith("R-3")), "a worst case off the axis is not drawn");
});

Deno.test("figures: a worst case where the first series has no finite value, or at f = 0 on a log axis, is left out", () => {
  const spec = figureToVegaLite(
    figure({ series: [{ name: "h", x: [0, 10, 100, 1000], y: [0, NaN, -2, -3] }], xScale: "log" }),
    { worst: [{ id: "gap", at: 20, met: true }, { id: "dc", at: 0, met: true }] },
  );
  const json = JSON.stringify(spec);
  assert.doesNotMatch(json, /"text":"gap"|"text":"dc"/);
  assert.ok(!allLayers(spec).some((l) => (l.mark as { filled?: boolean })?.filled === false));
});

// --- 3. Titles ------------------------------------------------------------------------------

Deno.test("figures: a long title wraps onto lines inside the canvas and leaves the plot's width alone", async () => {
  const long = "Magnitude response of the 63-tap equiripple decimation filter of the vibration " +
    "front end, floating point, with the requirement mask of the system specification and the " +
    "worst cases of every magnitude requirement";
  const short = await vegaLiteToSvg(figureToVegaLite(figure({ title: "Magnitude" })));
  const spec = figureToVegaLite(figure({ title: long }));
  const lines = (spec.title as { text: string[] }).text;
  assert.ok(Array.isArray(lines) && lines.length >= 3, "wrapped onto several lines");
  assert.equal(lines.join(" "), long, "no word lost");
  const svg = await vegaLiteToSvg(spec);
  assert.deepEqual(svgSize(svg), { width: figureSize.width, height: figureSize.height });
  const texts = svgTexts(svg);
  for (const line of lines) assert.ok(texts.includes(line), `title line in the SVG: ${line}`);
  assert.ok(titleOrigin(svg).y >= 0, "title starts inside the canvas");
  const [wide, narrow] = [plotArea(svg), plotArea(short)];
  assert.equal(wide.width, narrow.width, "the plot keeps its width");
  // Each extra title line takes one line of height from the plot, no more.
  assert.ok(narrow.height - wide.height <= (lines.length - 1) * figureType.titleLine + 1);
});

Deno.test("figures: a long y-axis title wraps, so the plot keeps its height and the title its place", async () => {
  const short = await vegaLiteToSvg(figureToVegaLite(figure({ title: "Attenuation" })));
  const yTitleOf = (spec: Spec) => {
    const axis = allLayers(spec).map((l) => l.encoding as { y?: { title?: unknown } } | undefined)
      .find((e) => e?.y?.title !== undefined);
    return axis!.y!.title as string | string[];
  };
  const cases = [
    { yLabel: "Minimum stopband attenuation relative to the passband gain (dB)", whole: true },
    {
      // Too long even for three lines: words go from the middle, the unit stays.
      yLabel: "Minimum stopband attenuation relative to the passband gain at the reference " +
        "frequency of 1 kHz (dB)",
      whole: false,
    },
  ];
  for (const { yLabel, whole } of cases) {
    const spec = figureToVegaLite(figure({ title: "Attenuation", yLabel }));
    const lines = yTitleOf(spec);
    assert.ok(Array.isArray(lines) && lines.length > 1, "the y title became lines");
    const joined = lines.join(" ");
    if (whole) assert.equal(joined, yLabel);
    else {
      assert.match(joined, /^Minimum stopband attenuation .*… \(dB\)$/);
      assert.ok(yLabel.startsWith(joined.slice(0, joined.indexOf(" …"))), joined);
    }
    const svg = await vegaLiteToSvg(spec);
    assert.deepEqual(svgSize(svg), { width: figureSize.width, height: figureSize.height });
    const texts = svgTexts(svg);
    for (const line of lines) assert.ok(texts.includes(line), `y title line ${line}`);
    assert.ok(titleOrigin(svg).y >= 0);
    const [plot, plain] = [plotArea(svg), plotArea(short)];
    assert.equal(plot.height, plain.height, "the plot keeps its height");
    assert.ok(plain.width - plot.width <= (lines.length - 1) * figureType.axisTitleLine + 1);
  }
});

// --- 4. Quantised: difference panel ---------------------------------------------------------

Deno.test("figures: a quantised figure has a panel of each variant minus the reference, on the reference's grid", async () => {
  const x = Array.from({ length: 11 }, (_, i) => i * 100);
  const spec = figureToVegaLite({
    type: "figure",
    kind: "quantised",
    title: "Float against Q15",
    series: [
      { name: "float", x, y: x.map((v) => -v / 100) },
      // Another grid: interpolated onto the reference's (exact, both are straight lines).
      { name: "Q15", x: [0, 250, 500, 750, 1000], y: [0, 250, 500, 750, 1000].map((v) => -v / 50) },
    ],
    yDomain: [-25, 1],
  });
  const line = allLayers(spec).find((l) =>
    markType(l) === "line" && (l.encoding as { y?: { field?: string } }).y?.field === "d"
  );
  assert.ok(line, "a difference line");
  const rows = (line!.data as { values: { x: number; d: number; series: string }[] }).values;
  assert.deepEqual(rows.map((r) => r.x), x);
  // Q15 − float = −v/50 + v/100 = −v/100.
  for (const r of rows) assert.ok(Math.abs(r.d - -r.x / 100) < 1e-12, `difference at ${r.x}`);
  const svg = await vegaLiteToSvg(spec);
  assert.deepEqual(svgSize(svg), { width: figureSize.width, height: figureSize.withDifference });
  assert.match(svg, /aria-label="Y-axis titled 'Difference \(dB\)'/);
  assert.match(svg, /aria-label="Y-axis titled 'Magnitude \(dB\)'/);
  assert.equal((svg.match(/aria-label="X-axis/g) ?? []).length, 1, "one shared x axis");
});

Deno.test("figures: the difference is left out where either curve is off the main plot, and the main curves stop at its edge", () => {
  const x = [0, 100, 200, 300, 400];
  const spec = figureToVegaLite({
    type: "figure",
    kind: "quantised",
    title: "q",
    series: [
      { name: "float", x, y: [0, -10, -200, -10, 0] },
      { name: "Q7", x, y: [0, -9, -60, -9, 1] },
    ],
    yDomain: [-100, 5],
  });
  const diff = allLayers(spec).find((l) =>
    (l.encoding as { y?: { field?: string } } | undefined)?.y?.field === "d" &&
    markType(l) === "line"
  )!;
  const d = (diff.data as { values: { x: number; d: number | null }[] }).values;
  assert.deepEqual(d.filter((r) => r.d !== null).map((r) => [r.x, r.d]), [
    [0, 0],
    [100, 1],
    [300, 1],
    [400, 1],
  ]);
  assert.ok(d.some((r) => r.d === null), "a break where the reference is below the plot");
  const main = allLayers(spec).filter((l) =>
    markType(l) === "line" && (l.encoding as { y?: { field?: string } }).y?.field === "y" &&
    (l.data as { values?: { series?: string }[] } | undefined)?.values?.[0]?.series !== undefined
  );
  const float = main.flatMap((l) =>
    (l.data as { values: { x: number; y: number | null; series: string }[] }).values
  )
    .filter((r) => r.series === "float");
  // From −10 dB at 100 Hz to −200 dB at 200 Hz the curve crosses −100 dB at 100 + 90/190 · 100 Hz.
  const crossing = float.find((r) => r.y === -100);
  assert.ok(crossing && Math.abs(crossing.x - (100 + 9000 / 190)) < 1e-9, "cut at the bottom edge");
  assert.ok(float.every((r) => r.y === null || r.y >= -100), "nothing below the plot");
});

// --- 5. Stems -------------------------------------------------------------------------------

Deno.test("figures: impulse and step axes reach past the end stems", async () => {
  for (const kind of ["impulse", "step"] as const) {
    const n = Array.from({ length: 9 }, (_, i) => i);
    const spec = figureToVegaLite({
      type: "figure",
      kind,
      title: kind,
      series: [{ name: "h", x: n, y: n.map((i) => (i === 0 || i === 8 ? 1 : 0.2)) }],
    });
    const x = allLayers(spec).find((l) => markType(l) === "rule")!.encoding as {
      x: { scale: { domain: number[] } };
    };
    assert.deepEqual(x.x.scale.domain, [-0.5, 8.5], "half a sample each side");
    const svg = await vegaLiteToSvg(spec);
    const plot = plotArea(svg);
    const dots = [...svg.matchAll(/aria-roledescription="point" transform="translate\(([-\d.]+),/g)]
      .map((m) => Number(m[1]));
    assert.equal(dots.length, 9);
    const radius = Math.sqrt(22 / Math.PI); // mark size is the dot's area in px²
    assert.ok(Math.min(...dots) > radius, "first dot whole");
    assert.ok(Math.max(...dots) < plot.width - radius, "last dot whole");
  }
  // A long response: half a sample is too little, 1 % of the span is kept free.
  const long = Array.from({ length: 1001 }, (_, i) => i);
  const spec = figureToVegaLite({
    type: "figure",
    kind: "impulse",
    title: "long",
    series: [{ name: "h", x: long, y: long.map(() => 0.1) }],
  });
  const domain = (allLayers(spec).find((l) => markType(l) === "rule")!.encoding as {
    x: { scale: { domain: number[] } };
  }).x.scale.domain;
  assert.deepEqual(domain, [-10, 1010]);
});

// --- Earlier behaviour ----------------------------------------------------------------------

Deno.test("figures: a logarithmic axis leaves out f = 0 instead of failing; normalised axes divide by fs", () => {
  const log = JSON.stringify(figureToVegaLite({
    type: "figure",
    kind: "magnitude",
    title: "log",
    xScale: "log",
    series: [{ name: "h", x: [0, 10, 100], y: [0, -1, -2] }],
    mask: [{ from: 0, to: 50, level: 1, bound: "upper" }],
  }));
  assert.doesNotMatch(log, /"x":0,/);
  assert.match(log, /"type":"log"/);
  assert.match(log, /"x":10,"y":1,"edge"/, "a mask from 0 Hz starts where the axis does");
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
  assert.ok(thin(x, y, 100).x.length <= 100, "a smaller budget");
});
