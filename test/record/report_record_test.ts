// record/report_record.ts: listings read back from their CSV, figures read
// back from the vega-lite specs the renderer writes (with usermeta, and as
// older reports wrote them, without it), and a report folder as a whole.
import assert from "node:assert/strict";
import { join } from "node:path";
import {
  figureFromSpec,
  NotAReportError,
  parseListingCsv,
  readReportRecord,
} from "../../record/report_record.ts";
import type { CoefficientsExhibit, FigureExhibit } from "../../record/types.ts";
import { figureToVegaLite } from "../../render/figures.ts";
import { listingCsv } from "../../render/report.ts";
import { manifest, row, writeRecordFolder } from "./_records.ts";

const where = { number: 1, path: "figures/01-f.vl.json" };

Deno.test("parseListingCsv reads back what the report writes: list, sections, codes", () => {
  const exhibits: CoefficientsExhibit[] = [
    { type: "coefficients", name: "a", values: [0.125, -2.5e-7, 1 / 3] },
    {
      type: "coefficients",
      name: "b",
      values: [0.25, -0.5, 0.125],
      codes: [8192, -16384, 4096],
      format: "Q1.15",
    },
    {
      type: "coefficients",
      name: "c",
      layout: "sections",
      values: [1, -1.9, 1, -1.8, 0.81, 1, 2, 1, 0.5, 0.25],
    },
  ];
  for (const e of exhibits) {
    const parsed = parseListingCsv(listingCsv(e));
    assert.deepEqual(parsed.values, e.values, e.name);
    assert.deepEqual(parsed.codes, e.codes, e.name);
  }
});

Deno.test("parseListingCsv refuses what is not a listing", () => {
  const bad: [string, RegExp][] = [
    ["name,value\n0,1\n", /starts with 'index,value'/],
    ["index,value\n0,abc\n", /line 2 has no number/],
    ["index,value,code\n0,0.5,1.5\n", /line 2 has no integer in its code column/],
    ["index,value\n0\n", /line 2 has no number/],
  ];
  for (const [text, message] of bad) {
    assert.throws(
      () => parseListingCsv(text),
      (e: Error) => e instanceof TypeError && message.test(e.message),
      text,
    );
  }
});

const response = (n: number, fs: number) => {
  const x = Array.from({ length: n }, (_, i) => (i * fs) / 2 / (n - 1));
  return { x, y: x.map((f) => -((f / 400) ** 2)) };
};

Deno.test("figureFromSpec: a figure's series, mask, kind and labels come back from its spec", () => {
  const fs = 4000;
  const mask = [
    { from: 0, to: 300, level: -1, bound: "lower" as const, label: "IDL-SRS-1" },
    { from: 1200, to: 2000, level: -40, toLevel: -50, bound: "upper" as const, label: "IDL-SRS-2" },
  ];
  const exhibit: FigureExhibit = {
    type: "figure",
    kind: "passband",
    title: "Passband of the IDL-7 lowpass with a title long enough to be wrapped onto two lines",
    series: [{ name: "41 taps", ...response(257, fs) }, { name: "45 taps", ...response(129, fs) }],
    mask,
    normaliseTo: fs,
    yLabel: "Gain (dB)",
  };
  const f = figureFromSpec(figureToVegaLite(exhibit), where);
  assert.equal(f.kind, "passband");
  assert.equal(f.kindInferred, false);
  assert.equal(f.title, exhibit.title);
  assert.equal(f.yLabel, "Gain (dB)");
  assert.equal(f.xLabel, undefined, "no x label was given");
  assert.equal(f.normaliseTo, fs);
  assert.deepEqual(f.mask, mask);
  assert.deepEqual(f.series.map((s) => s.name), ["41 taps", "45 taps"]);
  for (const [i, s] of f.series.entries()) {
    // The spec holds f / fs; multiplied back by fs, the Hz values come back up to rounding.
    const given = exhibit.series[i]!;
    assert.equal(s.x.length, given.x.length);
    s.x.forEach((v, k) => assert.ok(Math.abs(v - given.x[k]!) <= 1e-9 * fs, `x ${k}`));
    assert.deepEqual(s.y, given.y);
  }
});

Deno.test("figureFromSpec: a spec without usermeta (older reports) is read from its drawing", () => {
  const exhibit: FigureExhibit = {
    type: "figure",
    kind: "magnitude",
    title: "Magnitude response",
    series: [{ name: "lowpass", ...response(101, 4000) }],
    mask: [
      { from: 0, to: 300, level: -1, bound: "lower", label: "IDL-SRS-1" },
      { from: 1200, to: 2000, level: -40, bound: "upper", label: "IDL-SRS-2" },
    ],
  };
  const spec = figureToVegaLite(exhibit);
  delete spec.usermeta;
  const f = figureFromSpec(spec, where, "Magnitude response");
  assert.equal(f.kind, "magnitude");
  assert.equal(f.kindInferred, true);
  assert.equal(f.xLabel, "Frequency (Hz)");
  assert.deepEqual(
    f.mask.map((m) => [m.from, m.to, m.level, m.bound]),
    exhibit.mask!.map((m) => [m.from, m.to, m.level, m.bound]),
  );
  assert.deepEqual(f.series[0]!.y, exhibit.series[0]!.y);

  const delay = figureToVegaLite({ ...exhibit, kind: "groupDelay", mask: [] });
  delete delay.usermeta;
  assert.equal(figureFromSpec(delay, where).kind, "groupDelay");
  const impulse = figureToVegaLite({ ...exhibit, kind: "impulse", mask: [] });
  delete impulse.usermeta;
  assert.equal(figureFromSpec(impulse, where).kind, undefined, "not a frequency response");
});

Deno.test("figureFromSpec: stems are read once, and a quantised figure's gaps stay gaps", () => {
  const x = [0, 1, 2, 3, 4];
  const stems = figureFromSpec(
    figureToVegaLite({
      type: "figure",
      kind: "impulse",
      title: "Impulse",
      series: [{ name: "h", x, y: [0, 0.25, 0.5, 0.25, 0] }],
    }),
    where,
  );
  assert.deepEqual(stems.series[0]!.x, x, "each stem once, not once per mark");
  const quantised = figureFromSpec(
    figureToVegaLite({
      type: "figure",
      kind: "quantised",
      title: "Stopband",
      series: [
        { name: "floating point", x, y: [0, -20, -300, -40, -60] },
        { name: "Q15", x, y: [0, -20, -90, -41, -61] },
      ],
      yDomain: [-100, 5],
    }),
    where,
  );
  assert.deepEqual(quantised.series.map((s) => s.name), ["floating point", "Q15"]);
  assert.ok(quantised.series[0]!.y.some(Number.isNaN), "the point below the plot is a gap");
});

Deno.test("readReportRecord: manifest, listings and figures of a folder; unreadable files noted", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const codes = [3, -41, 517, -41, 3];
    const csv = listingCsv({
      type: "coefficients",
      name: "taps",
      values: codes.map((c) => c / 32768),
      codes,
      format: "Q1.15",
    });
    await writeRecordFolder(dir, manifest({ requirements: [row("IDL-SRS-2", 55)] }), {
      listings: [{ name: "taps", csv, format: "Q1.15", count: 5, hasCodes: true }],
      figures: [{
        type: "figure",
        kind: "magnitude",
        title: "Magnitude",
        series: [{ name: "lowpass", x: [0, 1000, 2000], y: [0, -30, -60] }],
      }],
      exports: { "idl7.h": "// taps\n" },
    });
    const r = await readReportRecord(dir);
    assert.equal(r.manifest.requirements[0]!.id, "IDL-SRS-2");
    assert.deepEqual(r.listings[0]!.codes, codes);
    assert.equal(r.figures.length, 1);
    assert.equal(r.figures[0]!.title, "Magnitude");
    assert.deepEqual(r.unreadable, []);

    await Deno.remove(join(dir, r.listings[0]!.listing.path));
    const damaged = await readReportRecord(dir);
    assert.equal(damaged.listings.length, 0);
    assert.equal(damaged.unreadable[0]!.path, r.listings[0]!.listing.path);

    await Deno.remove(join(dir, "manifest.json"));
    await assert.rejects(() => readReportRecord(dir), NotAReportError);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
