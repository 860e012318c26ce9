import assert from "node:assert/strict";
import { searchComparisonTable, searchResponseOverlay } from "../../../lib/search/comparison.ts";
import { searchDesigns } from "../../../lib/search/search_designs.ts";
import type { SearchResult } from "../../../lib/search/types.ts";
import { magnitudeMask } from "../../../lib/verify/mask.ts";
import type { FilterSpec } from "../../../lib/verify/requirements.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";

/** Invented scenario: a 1 kHz lowpass at 8 kHz. */
const spec: FilterSpec = {
  fs: 8000,
  requirements: [
    { kind: "passbandRipple", from: 0, to: 1000, atMostDb: 0.5, id: "P-1" },
    { kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 50, id: "S-1" },
  ],
};
const target = { wordLength: 16, accumulatorBits: 40 };
const result = searchDesigns(spec, {
  target,
  methods: ["elliptic", "equiripple", "butterworth", "halfband"],
});

/** The same spec with at most 8 samples of delay: too little for the FIR, too uneven for the IIR. */
const strict: SearchResult = searchDesigns(
  {
    ...spec,
    requirements: [...spec.requirements, {
      kind: "groupDelayMaximum",
      from: 0,
      to: 1000,
      atMostSamples: 8,
      id: "D-1",
    }],
  },
  { target, methods: ["elliptic", "equiripple"] },
);

Deno.test("searchComparisonTable: one row per candidate with its cost, margin and verdict", () => {
  // common practice: the comparison table of a design review, one design per row.
  const table = searchComparisonTable(result);
  assert.equal(table.rows.length, result.candidates.length);
  assert.ok(table.rows.every((r) => r.length === table.columns.length));
  result.candidates.forEach((c, i) => {
    const e = table.entries[i]!;
    assert.equal(e.method, c.method);
    assert.equal(e.size, c.sizeLabel);
    assert.equal(e.multipliesPerOutput, c.cost?.multipliesPerOutput);
    assert.equal(e.memoryWords, c.cost?.memoryWords);
    assert.equal(e.latencySamples, c.cost?.latencySamples);
    const row = table.rows[i]!;
    assert.equal(row[3], c.cost?.multipliesPerOutput ?? "—");
    assert.equal(row[7], c.cost === undefined ? "—" : c.cost.latencySeconds * 1000);
  });
  assert.equal(table.entries[0]!.verdict, "chosen");
  assert.equal(table.entries[0]!.rank, 1);
  assert.equal(table.entries[0]!.method, result.chosen!.method);
  const half = table.entries.find((e) => e.method === "halfband")!;
  assert.equal(half.verdict, "not applicable");
  assert.match(half.note!, /fs\/4 = 2000 Hz/);
  // The worst margin names the requirement, its id and the sign of the margin.
  const worst = result.chosen!.worst!;
  assert.ok(
    table.entries[0]!.worstMargin!.startsWith(`${worst.result.id ?? worst.result.name}: +`),
  );
});

Deno.test("searchComparisonTable: a failing candidate says which requirement it misses and by how much", () => {
  // common practice: "achieved against limit, shortfall" as in a requirement table.
  assert.equal(strict.chosen, undefined);
  assert.equal(strict.candidates.filter((c) => c.status === "fails").length, 2);
  const table = searchComparisonTable(strict);
  for (let i = 0; i < strict.candidates.length; i++) {
    const c = strict.candidates[i]!;
    const e = table.entries[i]!;
    if (c.status !== "fails") continue;
    const f = c.failures[0]!;
    const r = f.result;
    assert.equal(e.verdict, "fails");
    assert.ok(e.failing!.startsWith(`${r.id ?? r.name}: `));
    const shortBy = Math.abs(r.margin);
    assert.match(
      e.failing!,
      new RegExp(`${String(Number(shortBy.toPrecision(6)))}.* short \\(${f.arithmetic}\\)`),
    );
    assert.equal(table.rows[i]![10], e.failing);
  }
});

Deno.test("searchResponseOverlay: every candidate's magnitude in dB on one grid, with the mask", () => {
  // source: the DFT of the taps, H(f) = Σ h[n]·e^(−j2πfn/fs) (Oppenheim & Schafer, DTSP 3rd ed., §2.7),
  // summed here directly for the FIR candidate.
  const overlay = searchResponseOverlay(result, { points: 201, arithmetic: "floating point" });
  assert.equal(overlay.frequencies.length, 201);
  assert.equal(overlay.frequencies[0], 0);
  assert.equal(overlay.frequencies[200], 4000);
  const designed = result.candidates.filter((c) => c.design !== undefined);
  assert.equal(overlay.series.length, designed.length);
  assert.deepEqual(overlay.mask, magnitudeMask(spec));
  const fir = result.candidates.find((c) => c.method === "equiripple")!;
  const series = overlay.series.find((s) => s.method === "equiripple")!;
  const taps = (fir.design as { kind: "fir"; taps: Float64Array }).taps;
  for (const i of [0, 37, 120, 200]) {
    const w = (2 * Math.PI * overlay.frequencies[i]!) / 8000;
    let re = 0;
    let im = 0;
    taps.forEach((h, n) => {
      re += h * Math.cos(w * n);
      im -= h * Math.sin(w * n);
    });
    const db = Math.max(-200, 20 * Math.log10(Math.hypot(re, im)));
    assertClose(series.y[i]!, db, { abs: 1e-6 }, `dB at ${overlay.frequencies[i]} Hz`);
  }
  const chosen = overlay.series.filter((s) => s.chosen);
  assert.equal(chosen.length, 1);
  assert.match(chosen[0]!.name, /\(chosen\)$/);
  // Quantised and floating-point curves differ, but only by rounding in the passband.
  const quantised = searchResponseOverlay(result, { points: 201 }).series.find((s) =>
    s.method === "equiripple"
  )!;
  assert.notDeepEqual(quantised.y, series.y);
  assertClose(quantised.y[0]!, series.y[0]!, { abs: 0.01 }, "DC gain");
});

Deno.test("searchResponseOverlay: magnitudes are floored", () => {
  // An even-length symmetric FIR (type II) has an exact zero at fs/2 (Oppenheim & Schafer, §5.7.3);
  // Oppenheim & Schafer's δp = 0.01, δs = 0.001 example needs 28 taps.
  const even = searchDesigns({
    fs: 2,
    requirements: [
      { kind: "passbandRipple", from: 0, to: 0.4, atMostDb: 20 * Math.log10(1.01 / 0.99) },
      { kind: "stopbandAttenuation", from: 0.6, to: 1, atLeastDb: 60 },
    ],
  }, { target: { wordLength: 24, accumulatorBits: 56 }, methods: ["equiripple"] });
  const taps = (even.candidates[0]!.design as { kind: "fir"; taps: Float64Array }).taps;
  assert.equal(taps.length % 2, 0, "this spec's smallest equiripple length is even");
  const overlay = searchResponseOverlay(even, { points: 65, floorDb: -120 });
  const y = overlay.series[0]!.y;
  assert.ok(y.every((v) => v >= -120));
  assert.equal(y[64], -120);
});

Deno.test("searchComparisonTable and searchResponseOverlay: invalid input is refused", () => {
  const table: [() => unknown, new (...a: never[]) => Error, RegExp][] = [
    [
      () => searchComparisonTable(null as unknown as SearchResult),
      TypeError,
      /result of searchDesigns/,
    ],
    [() => searchResponseOverlay({} as SearchResult), TypeError, /result of searchDesigns/],
    [
      () => searchResponseOverlay(result, { points: 1 }),
      RangeError,
      /Overlay points must be between 2/,
    ],
    [
      () => searchResponseOverlay(result, { floorDb: NaN }),
      TypeError,
      /Floor must be a finite number/,
    ],
    [
      () => searchResponseOverlay(result, { arithmetic: "fixed" as "quantised" }),
      TypeError,
      /arithmetic must be "quantised" or "floating point"/,
    ],
  ];
  for (const [fn, kind, pattern] of table) assertThrowsMatching(fn, kind, pattern);
});
