import assert from "node:assert/strict";
import { designHalfband } from "../../../lib/fir/halfband.ts";
import { measureBands } from "../../../lib/fir/band_error.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

Deno.test("designHalfband equals the full Remez design of the same spec", () => {
  // source: scipy.signal.remez(N, [0, fp, fs/2 − fp, fs/2], [1, 0]), SciPy 1.10.1. The two
  // designs run on different dense grids, so they agree to grid accuracy, not to rounding.
  for (const c of reference.halfband) {
    const d = designHalfband({ length: c.length, fs: c.fs, passbandEdge: c.passbandEdge });
    assertClose(d.taps, c.taps, { abs: 5e-5 }, `${c.length} taps`);
    const bands = [
      { from: 0, to: c.passbandEdge, gain: 1 },
      { from: d.stopbandEdge, to: c.fs / 2, gain: 0 },
    ];
    const [pass, stop] = measureBands(d.taps, c.fs, bands);
    const [refPass, refStop] = measureBands(c.taps, c.fs, bands);
    const db = (x: number) => 20 * Math.log10(x);
    // Achieved stopband level within 0.01 dB of SciPy's, or better.
    assert.ok(db(stop!.maxGain) <= db(refStop!.maxGain) + 0.01, "stopband");
    assert.ok(pass!.maxDeviation <= refPass!.maxDeviation * 1.002, "passband");
    // The reported δ is the level on the design grid; the true peak lies within ~1% of it.
    assertClose(stop!.maxGain, d.deviation, { rel: 1e-2 }, "reported δ");
  }
});

Deno.test("designHalfband structure: centre ½, every second tap exactly 0, symmetric", () => {
  const d = designHalfband({ length: 31, fs: 1, passbandEdge: 0.2 });
  assert.equal(d.taps[15], 0.5);
  for (let k = 2; k <= 15; k += 2) {
    assert.equal(d.taps[15 - k], 0, `tap ${15 - k}`);
    assert.equal(d.taps[15 + k], 0, `tap ${15 + k}`);
  }
  for (let n = 0; n < 15; n++) assert.equal(d.taps[n], d.taps[30 - n]);
  assert.notEqual(d.taps[0], 0);
});

Deno.test("designHalfband rejects bad input with the rule and the value", () => {
  const cases: [Parameters<typeof designHalfband>[0], ErrorConstructor, string][] = [
    [
      { length: 25, fs: 1, passbandEdge: 0.2 },
      RangeError,
      "4k − 1 taps (7, 11, 15, …) so its end taps are non-zero, got 25",
    ],
    [{ length: 3, fs: 1, passbandEdge: 0.2 }, RangeError, "between 7 and 65535"],
    [{ length: 23, fs: 1, passbandEdge: 0.3 }, RangeError, "fs/4 = 0.25 Hz, got 0.3 Hz"],
    [{ length: 23, fs: 0, passbandEdge: 0.1 }, RangeError, "greater than 0 Hz"],
  ];
  for (const [options, kind, text] of cases) {
    assert.throws(
      () => designHalfband(options),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
