import assert from "node:assert/strict";
import { measureBands } from "../../../lib/fir/band_error.ts";
import { assertClose } from "../../_tolerance.ts";

Deno.test("measureBands on a filter with a known closed-form response", () => {
  // h = [1, 2, 1]/4: H(f) = e^{−j2πf/fs}·cos²(πf/fs) (common practice).
  const h = [0.25, 0.5, 0.25];
  const [pass, stop] = measureBands(h, 1000, [
    { from: 0, to: 100, gain: 1 },
    { from: 400, to: 500, gain: 0 },
  ]);
  const amp = (f: number) => Math.cos((Math.PI * f) / 1000) ** 2;
  assertClose(pass!.maxGain, 1, { abs: 1e-15 }, "max pass");
  assertClose(pass!.minGain, amp(100), { abs: 1e-15 }, "min pass at the edge");
  assertClose(pass!.maxDeviation, 1 - amp(100), { abs: 1e-15 }, "deviation");
  assert.equal(pass!.worstAt, 100);
  assertClose(pass!.rippleDb, -20 * Math.log10(amp(100)), { abs: 1e-12 }, "ripple dB");
  assertClose(stop!.maxGain, amp(400), { abs: 1e-15 }, "stop peak at its lower edge");
  assertClose(stop!.attenuationDb, -20 * Math.log10(amp(400)), { abs: 1e-12 }, "attenuation");
});

Deno.test("measureBands follows a sloped wanted gain and rejects bad bands", () => {
  // A pure gain of 0.5 against a band sloping from 0 to 1: worst deviation 0.5 at both ends.
  const [m] = measureBands([0.5], 2, [{ from: 0, to: 1, gain: 0, endGain: 1 }], { points: 17 });
  assertClose(m!.maxDeviation, 0.5, { abs: 1e-15 }, "sloped band");
  assert.throws(() => measureBands([1], 2, [{ from: 0, to: 2, gain: 1 }]), RangeError);
  assert.throws(
    () => measureBands([1], 2, [{ from: 0, to: 0.5, gain: 1 }], { points: 1 }),
    RangeError,
  );
});
