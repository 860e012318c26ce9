import assert from "node:assert";
import { applyZeroPhase } from "../../../lib/iir/zero_phase.ts";
import { designIir, type IirDesignOptions } from "../../../lib/iir/design.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { fixture, sectionsFromRows } from "./_fixture.ts";

for (const c of fixture.filtering) {
  Deno.test(`applyZeroPhase matches ${c.zeroPhaseReference}: ${c.name}`, () => {
    // source: scipy.signal.sosfiltfilt (odd padding, padlen 3(2K+1) less first-order sections,
    // steady-state initial conditions), Debian SciPy 1.10.1 (make_iir.py); within 1e-10.
    assertClose(
      applyZeroPhase(sectionsFromRows(c.sos), c.input),
      c.zeroPhaseOutput,
      { abs: 1e-10 },
      c.name,
    );
    const ours = designIir(c.design as IirDesignOptions).sections;
    assertClose(
      applyZeroPhase(ours, c.input),
      c.zeroPhaseOutput,
      { abs: 1e-10 },
      `${c.name} (ours)`,
    );
  });
}

Deno.test("applyZeroPhase has zero phase: a symmetric pulse stays symmetric", () => {
  // common practice: forward–backward filtering gives H(f)·conj(H(f)) = |H(f)|², a real response.
  const s = designIir({ family: "butterworth", response: "lowpass", order: 4, fs: 1000, edges: 50 })
    .sections;
  const x = new Float64Array(401);
  x[200] = 1;
  const y = applyZeroPhase(s, x);
  for (let k = 1; k < 150; k++) assertClose(y[200 - k]!, y[200 + k]!, { abs: 1e-12 }, `tap ±${k}`);
  assert.ok(y[200]! > y[199]!, "peak at the centre");
});

Deno.test("applyZeroPhase rejects a signal not longer than the pad", () => {
  const s = [{ b0: 0.5, b1: 0.5, b2: 0, a1: 0, a2: 0 }];
  assertThrowsMatching(
    () => applyZeroPhase(s, [1, 2, 3]),
    RangeError,
    /longer than the pad length 6 .*got 3 samples/,
  );
  assertThrowsMatching(
    () => applyZeroPhase(s, [1, 2, 3], { padLength: -1 }),
    RangeError,
    /Pad length/,
  );
  assert.equal(applyZeroPhase(s, [1, 2, 3], { padLength: 0 }).length, 3);
});
