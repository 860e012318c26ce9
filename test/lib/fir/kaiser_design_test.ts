import assert from "node:assert/strict";
import { designKaiserFilter } from "../../../lib/fir/kaiser_design.ts";
import { measureBands } from "../../../lib/fir/band_error.ts";
import { assertClose } from "../../_tolerance.ts";

Deno.test("designKaiserFilter sizes a window design that meets the spec within a tap or two", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §7.6.2: the highpass example (ωs = 0.35π,
  // ωp = 0.5π, δ = 0.021 → β = 2.6, M = 24), quoted from memory; the length is forced odd here.
  const d = designKaiserFilter({
    fs: 2,
    cutoff: 0.425,
    response: "highpass",
    transitionWidth: 0.15,
    ripple: 0.021,
  });
  assertClose(d.beta, 2.6, { abs: 0.01 }, "β");
  assert.equal(d.length, 25);
  const [stop, pass] = measureBands(d.taps, 2, [
    { from: 0, to: 0.35, gain: 0 },
    { from: 0.5, to: 1, gain: 1 },
  ]);
  assert.ok(stop!.maxGain < 0.021 * 1.1, `stopband ${stop!.maxGain}`);
  assert.ok(pass!.maxDeviation < 0.021 * 1.1, `passband ${pass!.maxDeviation}`);
  assert.throws(
    () => designKaiserFilter({ fs: 2, cutoff: 0.5, transitionWidth: 0.1 }),
    (e: unknown) => e instanceof TypeError && /attenuationDb or ripple/.test((e as Error).message),
  );
});
