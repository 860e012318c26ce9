// record/compare.ts on hand-built records: every kind of change, the pairing
// of designs, listings and figures, the difference trace, and the rule that
// decides compare's exit code. source for the rule: the module comment of
// record/compare.ts (the project's own definition of "got worse").
import assert from "node:assert/strict";
import {
  compareCosts,
  compareExports,
  compareFigure,
  compareIdentity,
  compareListing,
  compareRecords,
  compareRequirements,
  compareRows,
  compareSettings,
  costFields,
  gotWorse,
  limitMove,
  matchFigures,
  pairUp,
  sameMask,
  seriesDifference,
} from "../../record/compare.ts";
import { assertClose } from "../_tolerance.ts";
import { figure, firCost, listing, manifest, record, row, unchecked } from "./_records.ts";

const labels = { old: "old", new: "new" };

Deno.test("limitMove: stricter and looser on both sides of a limit, and changes it cannot order", () => {
  const at = (relation: "atMost" | "atLeast", limit: number, unit = "dB") => ({
    text: "t",
    relation,
    limit,
    unit,
  });
  const cases: [ReturnType<typeof at>, ReturnType<typeof at>, string | undefined][] = [
    [at("atLeast", 50), at("atLeast", 55), "stricter"],
    [at("atLeast", 50), at("atLeast", 45), "looser"],
    [at("atMost", 0.5), at("atMost", 0.2), "stricter"],
    [at("atMost", 0.5), at("atMost", 0.8), "looser"],
    [at("atMost", 0.5), at("atMost", 0.5 + 1e-13), undefined], // rounding, not a change
    [at("atMost", 0.5), at("atLeast", 0.5), "not comparable"],
    [at("atMost", 1.5, "ms"), at("atMost", 72, "samples"), "not comparable"],
  ];
  for (const [was, now, expected] of cases) {
    assert.equal(limitMove(was, now), expected, JSON.stringify([was, now]));
  }
});

Deno.test("compareRequirements: added, removed, limit and text changes; unchanged ones left out", () => {
  const was = [row("R-1", 60), row("R-2", 0.1, { relation: "atMost", limit: 0.5 }), row("R-3", 70)];
  const now = [
    row("R-1", 60, { limit: 55 }),
    row("R-2", 0.1, { relation: "atMost", limit: 0.5, text: "Passband ripple, peak to peak" }),
    row("R-4", 1),
  ];
  const changes = compareRequirements(was, now);
  assert.deepEqual(changes.map((c) => [c.id, c.change, c.limit, c.textChanged]), [
    ["R-1", "changed", "stricter", false],
    ["R-2", "changed", undefined, true],
    ["R-4", "added", undefined, false],
    ["R-3", "removed", undefined, false],
  ]);
  assert.equal(changes[0]!.old!.limit, 50);
  assert.equal(changes[0]!.new!.limit, 55);
});

Deno.test("a limit made stricter is a change, a looser one got worse", () => {
  const was = manifest({ requirements: [row("R-1", 60, { limit: 50 })] });
  const stricter = manifest({ requirements: [row("R-1", 60, { limit: 55 })] });
  const looser = manifest({ requirements: [row("R-1", 60, { limit: 45 })] });
  const a = compareRecords(record(was), record(stricter), labels);
  assert.equal(a.requirements[0]!.limit, "stricter");
  assert.equal(gotWorse(a), false);
  const b = compareRecords(record(was), record(looser), labels);
  assert.deepEqual(b.worse, [{ id: "R-1", why: "limit looser" }]);
  assert.equal(gotWorse(b), true);
});

Deno.test("a verdict that went from met to not met got worse and is listed first", () => {
  const was = manifest({
    requirements: [row("R-1", 52), row("R-2", 48), row("R-3", 61), row("R-4", 70)],
  });
  const now = manifest({
    requirements: [row("R-1", 51), row("R-2", 53), row("R-3", 49), row("R-4", 70)],
  });
  const c = compareRecords(record(was), record(now), labels);
  assert.deepEqual(c.worse, [{ id: "R-3", why: "met to not met" }]);
  // Worse rows first, then other verdict changes, then the rest in declared order.
  assert.deepEqual(c.rows.map((r) => r.id), ["R-3", "R-2", "R-1", "R-4"]);
  const [r3, r2, r1] = c.rows;
  assert.equal(r3!.verdictChanged, true);
  assert.equal(r2!.verdictChanged, true);
  assert.equal(r2!.worse, undefined, "not met → met is better");
  assert.equal(r1!.worse, undefined, "a smaller margin that is still met is not worse");
  assertClose(r1!.marginChange!, (51 - 50) - (52 - 50), { abs: 1e-12 }, "margin change");
});

Deno.test("rows: every way a row can get worse, and the ways it does not", () => {
  const cases: [string, ReturnType<typeof row>, ReturnType<typeof row>, string | undefined][] = [
    ["met → not met", row("R", 51), row("R", 49), "met to not met"],
    ["met → not checked", row("R", 51), unchecked("R"), "met to not checked"],
    ["not met → not checked", row("R", 40), unchecked("R"), "no longer checked"],
    ["not met, further short", row("R", 45), row("R", 44), "shortfall grew"],
    ["not met, less short", row("R", 44), row("R", 45), undefined],
    ["not met, short by the same up to rounding", row("R", 45), row("R", 45 - 1e-12), undefined],
    ["not checked → not met", unchecked("R"), row("R", 40), undefined],
    ["not checked → not checked", unchecked("R"), unchecked("R"), undefined],
    ["met → met, less margin", row("R", 60), row("R", 50.5), undefined],
  ];
  for (const [name, was, now, expected] of cases) {
    const rows = compareRows([was], [now]);
    assert.equal(rows.length, 1, name);
    assert.equal(rows[0]!.worse, expected, name);
    const c = compareRecords(
      record(manifest({ requirements: [was] })),
      record(manifest({ requirements: [now] })),
      labels,
    );
    assert.equal(gotWorse(c), expected !== undefined, name);
  }
});

Deno.test("a removed requirement got worse; an added one, even not met, did not", () => {
  const was = manifest({ requirements: [row("R-1", 60), row("R-2", 60)] });
  const now = manifest({ requirements: [row("R-1", 60), row("R-3", 10)] });
  const c = compareRecords(record(was), record(now), labels);
  assert.deepEqual(c.worse, [{ id: "R-2", why: "removed" }]);
  const added = c.rows.find((r) => r.id === "R-3")!;
  assert.equal(added.old, undefined);
  assert.equal(added.new!.status, "not met");
  assert.equal(added.worse, undefined);
});

Deno.test("designs: paired by name, a renamed one by order, a dropped one is no longer checked", () => {
  const was = [
    row("R-1", 60, { design: "floating point" }),
    row("R-1", 58, { design: "16-bit coefficients" }),
    row("R-1", 57, { design: "12-bit coefficients" }),
  ];
  const now = [
    row("R-1", 60, { design: "floating point" }),
    row("R-1", 56, { design: "14-bit coefficients" }),
  ];
  const rows = compareRows(was, now);
  const byDesign = new Map(rows.map((r) => [r.design, r]));
  assert.equal(byDesign.get("floating point")!.oldDesign, undefined);
  assert.equal(byDesign.get("14-bit coefficients")!.oldDesign, "16-bit coefficients");
  assert.equal(byDesign.get("14-bit coefficients")!.worse, undefined);
  const dropped = byDesign.get("12-bit coefficients")!;
  assert.equal(dropped.new!.status, "not checked");
  assert.equal(dropped.worse, "met to not checked");
  assert.equal(rows[0], dropped, "worse rows come first");
});

Deno.test("a run that stopped early leaves its rows unchecked: every met row got worse", () => {
  const was = manifest({ requirements: [row("R-1", 60), row("R-2", 61)] });
  const now = manifest({
    outcome: "error",
    verdict: "incomplete",
    requirements: [unchecked("R-1"), unchecked("R-2")],
  });
  const c = compareRecords(record(was), record(now), labels);
  assert.deepEqual(c.worse.map((w) => [w.id, w.why]), [
    ["R-1", "met to not checked"],
    ["R-2", "met to not checked"],
  ]);
});

Deno.test("compareListing: value differences, code differences in LSBs, and shape changes", () => {
  const lsb = 2 ** -15;
  const codesA = [12, -340, 9876, -340, 12];
  const codesB = [12, -337, 9870, -337, 12];
  const a = listing("IDL-7 lowpass (Q1.15)", codesA.map((c) => c * lsb), {
    codes: codesA,
    format: "Q1.15",
  });
  const b = listing("IDL-7 lowpass (Q1.15)", codesB.map((c) => c * lsb), {
    codes: codesB,
    format: "Q1.15",
  });
  const c = compareListing(a.listing.name, a, b);
  assert.deepEqual(c.structure, []);
  const steps = codesA.map((x, i) => Math.abs(codesB[i]! - x));
  const largest = Math.max(...steps);
  assert.equal(c.codes!.largestLsb, largest);
  assert.equal(c.codes!.at, steps.indexOf(largest));
  assert.equal(c.codes!.changed, steps.filter((s) => s !== 0).length);
  assertClose(
    c.values!.largest,
    largest * lsb,
    { rel: 1e-12 },
    "value change is the code change × LSB",
  );

  // Another format: codes count different steps, so they are not compared code by code.
  const other = listing(a.listing.name, a.values, {
    codes: codesA.map((x) => x * 2),
    format: "Q2.14",
  });
  const f = compareListing(a.listing.name, a, other);
  assert.deepEqual(f.structure, ["format"]);
  assert.equal(f.codes, undefined);
  assert.equal(f.codesNotCompared, "format differs");

  // Another length: the shape changed and values are not paired one by one.
  const longer = listing(a.listing.name, [...a.values, 0], {
    codes: [...codesA, 0],
    format: "Q1.15",
  });
  const g = compareListing(a.listing.name, a, longer);
  assert.deepEqual(g.structure, ["count"]);
  assert.equal(g.values, undefined);
  assert.equal(g.codesNotCompared, "values not comparable");

  // Codes on one side only.
  const plain = listing(a.listing.name, a.values);
  assert.deepEqual(compareListing(a.listing.name, plain, a).structure, ["format", "codes"]);
  assert.equal(compareListing(a.listing.name, plain, a).codesNotCompared, "codes on one side only");
});

Deno.test("listings are paired by name, then by order; a listing only on one side stands alone", () => {
  const c = compareRecords(
    record(manifest(), {
      listings: [listing("taps (16-bit)", [1, 2]), listing("notch sections", [1, 2, 3, 4, 5])],
    }),
    record(manifest(), {
      listings: [listing("notch sections", [1, 2, 3, 4, 5.5]), listing("taps (14-bit)", [1, 2.5])],
    }),
    labels,
  );
  assert.deepEqual(c.listings.map((l) => [l.name, l.oldName]), [
    ["notch sections", undefined],
    ["taps (14-bit)", "taps (16-bit)"],
  ]);
  assert.equal(c.listings[0]!.values!.at, 4);
  assertClose(c.listings[1]!.values!.largest, 0.5, { abs: 0 }, "largest change");
  assert.equal(gotWorse(c), false, "coefficients are not requirements");
});

Deno.test("compareCosts: the fields that changed with both values; added and removed costs", () => {
  const [a, b] = [firCost(41), firCost(45)];
  const costs = compareCosts(
    [{ name: "equiripple", cost: a }, { name: "Kaiser", cost: firCost(61) }],
    [{ name: "equiripple", cost: b }, { name: "half-band", cost: firCost(23) }],
  );
  const eq = costs[0]!;
  const expected = costFields.filter((f) => a[f] !== b[f]);
  assert.ok(expected.includes("multipliesPerOutput"));
  assert.deepEqual(eq.changed.map((f) => f.field), expected);
  const mults = eq.changed.find((f) => f.field === "multipliesPerOutput")!;
  assert.deepEqual([mults.old, mults.new], [a.multipliesPerOutput, b.multipliesPerOutput]);
  // "Kaiser" and "half-band" have no name in common, so they are paired by order.
  assert.equal(costs[1]!.name, "half-band");
  assert.equal(costs[1]!.oldName, "Kaiser");
  assert.deepEqual(
    compareCosts([{ name: "x", cost: a }], [{ name: "x", cost: a }])[0]!.changed,
    [],
  );
});

Deno.test("compareExports: changed, added and removed exports by SHA-256; other files ignored", () => {
  const was = [
    { path: "exports/idl7.h", sha256: "a".repeat(64) },
    { path: "exports/idl7.csv", sha256: "b".repeat(64) },
    { path: "exports/old.json", sha256: "c".repeat(64) },
    { path: "figures/01-m.svg", sha256: "d".repeat(64) },
  ];
  const now = [
    { path: "exports/idl7.h", sha256: "e".repeat(64) },
    { path: "exports/idl7.csv", sha256: "b".repeat(64) },
    { path: "exports/new.json", sha256: "f".repeat(64) },
    { path: "figures/01-m.svg", sha256: "9".repeat(64) },
  ];
  const { changes, unchanged } = compareExports(was, now);
  assert.deepEqual(changes, [
    { path: "exports/idl7.h", change: "changed", old: "a".repeat(64), new: "e".repeat(64) },
    { path: "exports/new.json", change: "added", new: "f".repeat(64) },
    { path: "exports/old.json", change: "removed", old: "c".repeat(64) },
  ]);
  assert.equal(unchanged, 1);
});

Deno.test("settings and identity: what changed, was added or removed", () => {
  assert.deepEqual(
    compareSettings(
      { fs: 4000, edges: [300, 500], window: "hann", gone: true },
      { fs: 8000, edges: [300, 500], window: "hann", added: 3 },
    ),
    [{ name: "fs", old: 4000, new: 8000 }, { name: "added", new: 3 }, { name: "gone", old: true }],
  );
  assert.deepEqual(compareSettings({ edges: [300, 500] }, { edges: [300, 550] }), [
    { name: "edges", old: [300, 500], new: [300, 550] },
  ]);
  assert.deepEqual(
    compareIdentity(
      { title: "T", document: "D-1", revision: "A" },
      { title: "T", document: "D-1", revision: "B" },
    ),
    [{ field: "revision", old: "A", new: "B" }],
  );
  const c = compareRecords(
    record(manifest({ settings: { fs: 4000 } })),
    record(manifest({ settings: { fs: 8000 }, revision: "B" })),
    labels,
  );
  assert.equal(c.settings.length, 1);
  assert.equal(c.identity.length, 1);
  assert.equal(gotWorse(c), false, "settings are not requirements");
});

Deno.test("pairUp: equal names first, the rest by position, then old items left over", () => {
  const p = pairUp(["a", "b", "c", "d"], ["c", "x", "a"], (s) => s);
  assert.deepEqual(p.map((q) => [q.old, q.new, q.byOrder]), [
    ["c", "c", false],
    ["b", "x", true],
    ["a", "a", false],
    ["d", undefined, false],
  ]);
});

Deno.test("seriesDifference: new − old on the new points inside both ranges, old interpolated", () => {
  // A straight line is interpolated exactly.
  const oldX = Array.from({ length: 11 }, (_, i) => i * 100);
  const newX = Array.from({ length: 10 }, (_, i) => 50 + i * 100);
  const d = seriesDifference(
    { name: "a", x: oldX, y: oldX.map((x) => 0.02 * x) },
    { name: "a", x: [...newX, 2000], y: [...newX.map((x) => 0.02 * x + 1), 0] },
  );
  assert.deepEqual(d.x, newX, "2000 Hz lies outside the old series");
  assertClose(d.y, newX.map(() => 1), { abs: 1e-12 }, "offset of a line");

  // A smooth curve: linear interpolation errs by at most h²/8 · max|y''|.
  // source: the remainder of linear interpolation (any numerical analysis text).
  const h = 10;
  const f = (x: number) => Math.sin(x / 300);
  const fineX = Array.from({ length: 201 }, (_, i) => i * h);
  const coarseX = Array.from({ length: 40 }, (_, i) => 3 + i * 47);
  const e = seriesDifference(
    { name: "b", x: fineX, y: fineX.map(f) },
    { name: "b", x: coarseX, y: coarseX.map((x) => f(x) + 0.25) },
  );
  const bound = (h * h) / 8 / (300 * 300);
  assertClose(e.y, e.x.map(() => 0.25), { abs: bound }, "offset of a sine");

  // A gap in either series is a gap in the difference.
  const g = seriesDifference(
    { name: "c", x: [0, 1, 2, 3], y: [0, NaN, 0, 0] },
    { name: "c", x: [0, 0.5, 2, 3], y: [1, 1, 1, NaN] },
  );
  assert.deepEqual(g.y.map((v) => Number.isNaN(v) ? "gap" : v), [1, "gap", 1, "gap"]);
});

Deno.test("matchFigures: by title, then by kind and order; other kinds are not overlaid", () => {
  const s = [{ name: "s", x: [0, 1], y: [0, 1] }];
  const was = [
    figure(1, "Magnitude, 41 taps", s),
    figure(2, "Group delay", s, { kind: "groupDelay" }),
    figure(3, "Impulse response", s, { kind: "impulse" }),
    figure(4, "Passband", s, { kind: "passband" }),
  ];
  const now = [
    figure(1, "Magnitude, 45 taps", s),
    figure(2, "Passband", s, { kind: "passband" }),
    figure(3, "Impulse response", s, { kind: "impulse" }),
    figure(4, "Phase", s, { kind: "phase" }),
  ];
  const { pairs, unmatched } = matchFigures(was, now);
  assert.deepEqual(pairs.map(([a, b, by]) => [a.number, b.number, by]), [
    [1, 1, "kind and order"],
    [4, 2, "title"],
  ]);
  assert.deepEqual(unmatched.map((u) => [u.side, u.title]), [
    ["old", "Group delay"],
    ["new", "Phase"],
  ]);
});

Deno.test("compareFigure: series paired, largest change located, the new mask kept", () => {
  const x = [0, 500, 1000, 1500, 2000];
  const mask = [{ from: 1200, to: 2000, level: -50, bound: "upper" as const, label: "IDL-SRS-4" }];
  const was = figure(1, "Magnitude", [{ name: "41 taps", x, y: [0, -1, -30, -55, -60] }], {
    mask: [{ ...mask[0]!, level: -45 }],
  });
  const now = figure(1, "Magnitude", [{ name: "45 taps", x, y: [0, -1, -33, -62, -60] }], { mask });
  const c = compareFigure(was, now, "title");
  assert.equal(c.series.length, 1);
  assert.equal(c.series[0]!.oldName, "41 taps");
  assert.deepEqual(c.series[0]!.largest, { delta: -7, at: 1500 });
  assert.deepEqual(c.mask, mask);
  assert.equal(c.maskChanged, true);
  assert.equal(compareFigure(now, now, "title").maskChanged, false);
});

Deno.test("sameMask: limits up to rounding; labels only when both masks carry them", () => {
  const labelled = [
    { from: 0, to: 300, level: -1, bound: "lower" as const, label: "IDL-SRS-1" },
    { from: 900, to: 2000, level: -40, bound: "upper" as const, label: "IDL-SRS-2" },
  ];
  const drawn = labelled.map(({ label: _, ...m }) => m); // as read from an older spec
  assert.equal(sameMask(labelled, drawn), true);
  assert.equal(sameMask(labelled, labelled.map((m) => ({ ...m, level: m.level + 1e-12 }))), true);
  assert.equal(
    sameMask(labelled, labelled.map((m, i) => (i === 1 ? { ...m, level: -45 } : m))),
    false,
  );
  assert.equal(
    sameMask(labelled, labelled.map((m, i) => (i === 0 ? { ...m, label: "X" } : m))),
    false,
  );
  assert.equal(sameMask(labelled, labelled.slice(1)), false);
  assert.equal(sameMask(drawn, drawn.map((m) => ({ ...m, bound: "upper" as const }))), false);
});

Deno.test("identical records: nothing changed, nothing got worse", () => {
  const m = manifest({
    requirements: [row("R-1", 60), row("R-2", 40)],
    costs: [{ name: "equiripple", cost: firCost(41) }],
    files: [{ path: "exports/idl7.h", sha256: "a".repeat(64) }],
  });
  const s = [{ name: "s", x: [0, 1000, 2000], y: [0, -20, -60] }];
  const r = record(m, { listings: [listing("taps", [0.1, 0.2])], figures: [figure(1, "M", s)] });
  const c = compareRecords(r, r, labels);
  assert.equal(gotWorse(c), false);
  assert.deepEqual(
    [c.identity, c.settings, c.requirements, c.exports, c.unmatchedFigures],
    [[], [], [], [], []],
  );
  assert.ok(c.rows.every((x) => !x.verdictChanged && x.marginChange === 0));
  assert.equal(c.listings[0]!.values!.changed, 0);
  assert.deepEqual(c.costs[0]!.changed, []);
  assert.equal(c.figures[0]!.series[0]!.largest!.delta, 0);
});
