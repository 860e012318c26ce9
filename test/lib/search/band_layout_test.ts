import assert from "node:assert/strict";
import { inferBandLayout } from "../../../lib/search/band_layout.ts";
import type { FilterSpec, Requirement } from "../../../lib/verify/requirements.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";

const pass = (from: number, to: number, atMostDb = 1): Requirement => ({
  kind: "passbandRipple",
  from,
  to,
  atMostDb,
});
const stop = (from: number, to: number, atLeastDb = 60): Requirement => ({
  kind: "stopbandAttenuation",
  from,
  to,
  atLeastDb,
});

Deno.test("inferBandLayout: the four shapes, their edges and transition widths", () => {
  // common practice: the order of pass and stop bands along frequency names the shape.
  const fs = 8000;
  const cases: [Requirement[], string, unknown, unknown, number][] = [
    [[pass(0, 1000), stop(1500, 4000)], "lowpass", 1000, 1500, 500],
    [[stop(0, 900), pass(1200, 4000)], "highpass", 1200, 900, 300],
    [
      [stop(0, 800), pass(1000, 1500), stop(1800, 4000)],
      "bandpass",
      [1000, 1500],
      [800, 1800],
      200,
    ],
    [
      [pass(0, 900), stop(1000, 1200), pass(1400, 4000)],
      "bandstop",
      [900, 1400],
      [1000, 1200],
      100,
    ],
  ];
  for (const [requirements, shape, passband, stopband, width] of cases) {
    // The requirement order in the spec does not matter.
    const layout = inferBandLayout({ fs, requirements: [...requirements].reverse() });
    assert.equal(layout.response, shape);
    assert.deepEqual(layout.passband, passband);
    assert.deepEqual(layout.stopband, stopband);
    assert.equal(layout.transitionWidth, width);
    // Design bands cover 0 … fs/2 with the transition bands left out, gains 1 and 0.
    assert.equal(layout.bands[0]!.from, 0);
    assert.equal(layout.bands[layout.bands.length - 1]!.to, fs / 2);
    assert.equal(layout.bands.length, requirements.length);
  }
});

Deno.test("inferBandLayout: ripple and attenuation become δp, δs and equiripple weights", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §7.7 example: δp = 0.01 is a peak-to-peak
  // ripple of 20·log10(1.01/0.99) = 0.1737 dB; δs = 0.001 is 60 dB; weight δp/δs = 10.
  const layout = inferBandLayout({
    fs: 2,
    requirements: [pass(0, 0.4, 20 * Math.log10(1.01 / 0.99)), stop(0.6, 1, 60)],
  });
  assertClose(layout.passbandDeviation, 0.01, { rel: 1e-12 }, "δp");
  assertClose(layout.stopbandDeviation, 0.001, { rel: 1e-12 }, "δs");
  assertClose(layout.bands[1]!.weight!, 10, { rel: 1e-12 }, "stopband weight");
  assert.equal(layout.bands[0]!.weight, 1);
  // A deviation limit d about the gain allows 1 − 10^(−d/20), the tighter side (common practice).
  const dev = inferBandLayout({
    fs: 2,
    requirements: [
      { kind: "passbandDeviation", from: 0, to: 0.4, atMostDb: 0.5, gainDb: 6 },
      { kind: "stopbandAttenuation", from: 0.6, to: 1, atLeastDb: 50, referenceDb: 6 },
      pass(0, 0.3, 3),
    ],
  });
  assertClose(dev.passbandDeviation, 1 - 10 ** (-0.5 / 20), { rel: 1e-12 }, "δp from 0.5 dB");
  assert.equal(dev.passbandRippleDb, 0.5);
  assert.equal(dev.gainDb, 6);
  // 50 dB below a 6 dB reference with a 6 dB nominal gain: 50 dB below the gain.
  assert.equal(dev.stopbandAttenuationDb, 50);
});

Deno.test("inferBandLayout: each stopband keeps its own weight; the design target is the largest attenuation", () => {
  // common practice: weights δp/δs per band make the equiripple errors meet each band's limit.
  const layout = inferBandLayout({
    fs: 8000,
    requirements: [
      stop(0, 800, 40),
      pass(1000, 1500, 1),
      stop(1800, 4000, 60),
      stop(3000, 4000, 70),
    ],
  });
  const dp = layout.passbandDeviation;
  assertClose(layout.bands[0]!.weight!, dp / 10 ** (-40 / 20), { rel: 1e-12 }, "lower stopband");
  assertClose(layout.bands[2]!.weight!, dp / 10 ** (-70 / 20), { rel: 1e-12 }, "upper stopband");
  assert.equal(layout.stopbandAttenuationDb, 70);
});

Deno.test("inferBandLayout: specs without a band shape are refused with the rule", () => {
  const fs = 8000;
  const table: [FilterSpec, new (...a: never[]) => Error, RegExp][] = [
    [{ fs, requirements: [pass(0, 1000)] }, RangeError, /one stopband requirement.*got 1 and 0/],
    [{ fs, requirements: [stop(1000, 4000)] }, RangeError, /passband requirement.*got 0 and 1/],
    [
      { fs, requirements: [pass(0, 500), stop(800, 1000), pass(1500, 2000), stop(2500, 4000)] },
      RangeError,
      /lowpass, highpass, bandpass or bandstop.*pass 0–500 Hz, stop 800–1000 Hz/,
    ],
    [{ fs, requirements: [pass(0, 1200), stop(1000, 4000)] }, RangeError, /overlaps/],
    [{ fs, requirements: [pass(0, 1000), stop(1500, 5000)] }, RangeError, /fs\/2 = 4000 Hz/],
    [{ fs, requirements: [pass(0, 1000, 0), stop(1500, 4000)] }, RangeError, /above 0 dB, got 0/],
    [
      {
        fs,
        requirements: [pass(0, 1000), {
          kind: "stopbandAttenuation",
          from: 1500,
          to: 4000,
          atLeastDb: 10,
          referenceDb: 20,
        }],
      },
      RangeError,
      /attenuated below the nominal passband gain/,
    ],
    [{ fs, requirements: "none" } as unknown as FilterSpec, TypeError, /requirements/],
  ];
  for (const [spec, kind, pattern] of table) {
    assertThrowsMatching(() => inferBandLayout(spec), kind, pattern);
  }
});
