import assert from "node:assert";
import {
  checkSpec,
  type FilterSpec,
  groupDelayMask,
  magnitudeMask,
  validateSpec,
} from "../../../lib/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { fixture, referenceCase } from "./_fixture.ts";

const spec: FilterSpec = {
  fs: 8000,
  requirements: [
    { kind: "passbandDeviation", from: 0, to: 1000, atMostDb: 0.25, id: "ECG-12" },
    { kind: "passbandRipple", from: 0, to: 1000, atMostDb: 0.501, id: "ECG-13" },
    { kind: "stopbandAttenuation", from: 1340, to: 4000, atLeastDb: 59.9, id: "ECG-14" },
    { kind: "maximumGain", atMostDb: 0.1, id: "ECG-15" },
    { kind: "groupDelayMaximum", from: 0, to: 900, atMostSamples: 40, id: "ECG-16" },
    { kind: "stabilityMargin", atLeast: 0.001, id: "ECG-17" },
  ],
};

Deno.test("checkSpec yields one row per requirement, in order, with the ids", () => {
  const c = referenceCase("ellip6");
  const rows = checkSpec(c.design, spec);
  assert.deepEqual(rows.map((r) => r.id), [
    "ECG-12",
    "ECG-13",
    "ECG-14",
    "ECG-15",
    "ECG-16",
    "ECG-17",
  ]);
  // source: scipy.signal.ellip(6, 0.5, 60, …): passband between −0.5 and 0 dB, so deviation 0.5 dB
  assertClose(rows[0]!.achieved, 0.5, { abs: 1e-6 }, "deviation");
  assert.equal(rows[0]!.met, false);
  assert.equal(rows[1]!.met, true);
  assert.equal(rows[2]!.met, true);
  assert.equal(rows[3]!.met, true);
  for (const r of rows) assert.equal(r.met, r.margin >= 0);
});

Deno.test("a spec whose passband overlaps its stopband is refused, naming both", () => {
  const bad: FilterSpec = {
    fs: 8000,
    requirements: [
      { kind: "passbandRipple", from: 0, to: 1500, atMostDb: 0.5, id: "P-1" },
      { kind: "stopbandAttenuation", from: 1400, to: 4000, atLeastDb: 60, id: "S-1" },
    ],
  };
  assert.throws(
    () => checkSpec(referenceCase("fir31").design, bad),
    (e: Error) =>
      e instanceof RangeError && e.message.includes("P-1") && e.message.includes("S-1") &&
      e.message.includes("overlaps"),
  );
  // Touching edges leave no transition band either.
  const touching: FilterSpec = {
    fs: 8000,
    requirements: [
      { kind: "passbandDeviation", from: 0, to: 1000, atMostDb: 0.5 },
      { kind: "stopbandAttenuation", from: 1000, to: 4000, atLeastDb: 60 },
    ],
  };
  assert.throws(() => validateSpec(touching), RangeError);
});

Deno.test("bad specs: band outside (0, fs/2), bad fs, wrong shape", () => {
  const cases: [unknown, ErrorConstructor, string[]][] = [
    [
      {
        fs: 8000,
        requirements: [{
          kind: "stopbandAttenuation",
          from: 3000,
          to: 4500,
          atLeastDb: 60,
          id: "S-2",
        }],
      },
      RangeError,
      ["S-2", "fs/2 = 4000 Hz"],
    ],
    [{ fs: -1, requirements: [] }, RangeError, ["Sample rate"]],
    [{ fs: 8000 }, TypeError, ["requirements"]],
    [{ fs: 8000, requirements: [null] }, TypeError, ["object"]],
  ];
  for (const [s, kind, parts] of cases) {
    assert.throws(
      () => validateSpec(s as FilterSpec),
      (e: Error) => e instanceof kind && parts.every((p) => e.message.includes(p)),
      parts.join(" / "),
    );
  }
});

Deno.test("magnitude and group-delay masks follow the spec", () => {
  const m = magnitudeMask(spec);
  assert.deepEqual(m, [
    { from: 0, to: 1000, level: 0.25, bound: "upper", label: "ECG-12" },
    { from: 0, to: 1000, level: -0.25, bound: "lower", label: "ECG-12" },
    { from: 1340, to: 4000, level: -59.9, bound: "upper", label: "ECG-14" },
    { from: 0, to: 4000, level: 0.1, bound: "upper", label: "ECG-15" },
  ]);
  assert.deepEqual(groupDelayMask(spec), [
    { from: 0, to: 900, level: 40, bound: "upper", label: "ECG-16" },
  ]);
  assert.equal(groupDelayMask(spec, fixture.fs)[0]!.level, 40 / 8000);
});
