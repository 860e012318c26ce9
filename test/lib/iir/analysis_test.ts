import assert from "node:assert";
import {
  isMinimumPhase,
  sectionsGroupDelay,
  sectionsResponse,
  sectionStability,
} from "../../../lib/iir/analysis.ts";
import { designIir } from "../../../lib/iir/design.ts";
import { designNotchBiquad } from "../../../lib/iir/audio_biquads.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { fixture, sectionsFromRows } from "./_fixture.ts";

for (const c of fixture.groupDelay) {
  Deno.test(`sectionsGroupDelay matches ${c.reference}: ${c.name}`, () => {
    // source: scipy.signal.group_delay on (b, a), Debian SciPy 1.10.1 (make_iir.py); 1e-9 relative.
    const got = sectionsGroupDelay(sectionsFromRows(c.sos), c.frequencies, c.fs);
    assertClose(got, c.groupDelay, { rel: 1e-9, abs: 1e-9 }, c.name);
  });
}

Deno.test("sectionsGroupDelay equals −dφ/dω from the response (finite difference)", () => {
  // common practice: group delay is the negative derivative of the unwrapped phase.
  const s = designIir({
    family: "elliptic",
    response: "lowpass",
    order: 6,
    fs: 1000,
    edges: 100,
    passbandRippleDb: 0.5,
    stopbandAttenuationDb: 60,
  }).sections;
  const fs = 1000;
  for (const f of [5, 40, 95, 300]) {
    const df = 1e-4;
    const h = sectionsResponse(s, [f - df, f + df], fs);
    const p0 = Math.atan2(h.im[0]!, h.re[0]!);
    let p1 = Math.atan2(h.im[1]!, h.re[1]!);
    if (p1 - p0 > Math.PI) p1 -= 2 * Math.PI;
    if (p1 - p0 < -Math.PI) p1 += 2 * Math.PI;
    const numeric = -(p1 - p0) / ((2 * Math.PI * 2 * df) / fs);
    assertClose(sectionsGroupDelay(s, [f], fs)[0]!, numeric, { rel: 1e-5 }, `τ at ${f} Hz`);
  }
});

Deno.test("sectionsGroupDelay stays finite on a notch zero (limit value)", () => {
  // source: a symmetric numerator 1 − 2cos θ z⁻¹ + z⁻² has linear phase with delay 1 sample
  // everywhere (its zeros on the unit circle contribute 1/2 each, including the limit at θ).
  const s = designNotchBiquad({ fs: 1000, frequency: 50, q: 10 });
  const atNotch = sectionsGroupDelay([s], [50], 1000)[0]!;
  const denominatorOnly = sectionsGroupDelay(
    [{ b0: 1, b1: 0, b2: 0, a1: s.a1, a2: s.a2 }],
    [50],
    1000,
  )[0]!;
  assertClose(atNotch, 1 + denominatorOnly, { abs: 1e-12 }, "notch delay");
});

Deno.test("sectionStability and isMinimumPhase", () => {
  // source: Oppenheim & Schafer, 3rd ed., ch. 3 (stable iff poles inside) and ch. 5 (minimum phase).
  const s = designIir({
    family: "chebyshev1",
    response: "lowpass",
    order: 6,
    fs: 1000,
    edges: 200,
    passbandRippleDb: 1,
  });
  const st = sectionStability(s.sections);
  let largest = 0;
  for (const p of s.zerosPolesGain.poles) largest = Math.max(largest, Math.hypot(p.re, p.im));
  assertClose(st.largestPoleRadius, largest, { rel: 1e-13 }, "radius");
  assert.ok(st.stable && st.margin > 0);
  const unstable = sectionStability([{ b0: 1, b1: 0, b2: 0, a1: -2.1, a2: 1.1 }]);
  assert.ok(!unstable.stable && unstable.margin < 0);
  // Zeros at z = −1 lie on the unit circle: minimum phase only when such zeros are allowed.
  assert.equal(isMinimumPhase(s.sections), false);
  assert.equal(isMinimumPhase(s.sections, { allowZerosOnUnitCircle: true }), true);
  assert.equal(isMinimumPhase([{ b0: 1, b1: -0.5, b2: 0, a1: -2.1, a2: 1.1 }]), false, "unstable");
});

Deno.test("analysis rejects frequencies outside [0, fs/2]", () => {
  const s = [{ b0: 1, b1: 0, b2: 0, a1: 0, a2: 0 }];
  assertThrowsMatching(
    () => sectionsResponse(s, [600], 1000),
    RangeError,
    /fs\/2 = 500 Hz, got 600 Hz/,
  );
  assertThrowsMatching(() => sectionsGroupDelay(s, [-1], 1000), RangeError, /got -1 Hz/);
  assertThrowsMatching(() => sectionsResponse(s, [1], 0), RangeError, /Sample rate/);
});
