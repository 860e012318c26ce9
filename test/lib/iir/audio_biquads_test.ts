import assert from "node:assert";
import {
  designAllPassBiquad,
  designBandPassBiquad,
  designHighShelfBiquad,
  designLowShelfBiquad,
  designNotchBiquad,
  designPeakingBiquad,
} from "../../../lib/iir/audio_biquads.ts";
import { sectionsResponse, sectionStability } from "../../../lib/iir/analysis.ts";
import type { Section } from "../../../lib/types.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";

const fs = 48000;
function gainDb(s: Section, f: number): number {
  const h = sectionsResponse([s], [f], fs);
  return 20 * Math.log10(Math.hypot(h.re[0]!, h.im[0]!));
}

// source for every check below: R. Bristow-Johnson, "Cookbook formulae for audio EQ biquad filter
// coefficients" — the design properties the formulas are built to have (gain G at f0 for the
// peaking filter, G on the shelf and G/2 at the corner for shelves, unity far away, null at f0 for
// the notch, |H| = 1 for the all-pass, 0 dB peak at f0 for the band-pass).

Deno.test("peaking: requested dB at the centre, 0 dB at DC and fs/2", () => {
  for (const [f0, q, g] of [[1000, 1, 6], [100, 4, -12], [10000, 0.5, 3.5]]) {
    const s = designPeakingBiquad({ fs, frequency: f0!, q, gainDb: g! });
    assertClose(gainDb(s, f0!), g!, { abs: 1e-10 }, `centre ${f0}`);
    assertClose(gainDb(s, 0), 0, { abs: 1e-10 }, "DC");
    assertClose(gainDb(s, fs / 2), 0, { abs: 1e-10 }, "Nyquist");
    assert.ok(sectionStability([s]).stable);
  }
});

Deno.test("shelves: requested dB on the shelf, half of it at the corner, 0 dB on the far side", () => {
  for (const g of [-15, 6]) {
    const low = designLowShelfBiquad({ fs, frequency: 300, gainDb: g });
    assertClose(gainDb(low, 0), g, { abs: 1e-10 }, "low shelf DC");
    assertClose(gainDb(low, 300), g / 2, { abs: 1e-10 }, "low shelf corner");
    assertClose(gainDb(low, fs / 2), 0, { abs: 1e-10 }, "low shelf Nyquist");
    const high = designHighShelfBiquad({ fs, frequency: 5000, gainDb: g, q: 0.9 });
    assertClose(gainDb(high, fs / 2), g, { abs: 1e-10 }, "high shelf Nyquist");
    assertClose(gainDb(high, 5000), g / 2, { abs: 1e-10 }, "high shelf corner");
    assertClose(gainDb(high, 0), 0, { abs: 1e-10 }, "high shelf DC");
  }
});

Deno.test("notch, all-pass and band-pass design properties", () => {
  const notch = designNotchBiquad({ fs, frequency: 60, q: 10 });
  assert.ok(gainDb(notch, 60) < -200, "null at f0");
  // 1e-10 dB: at DC the numerator 2 − 2cos ω0 is formed by cancellation (ω0 ≈ 0.008 rad).
  assertClose(gainDb(notch, 0), 0, { abs: 1e-10 }, "notch DC");
  const ap = designAllPassBiquad({ fs, frequency: 2000, q: 2 });
  for (const f of [0, 500, 2000, 9000, 24000]) {
    assertClose(gainDb(ap, f), 0, { abs: 1e-12 }, `all-pass ${f}`);
  }
  const h = sectionsResponse([ap], [2000], fs);
  assertClose(
    Math.abs(Math.atan2(h.im[0]!, h.re[0]!)),
    Math.PI,
    { abs: 1e-9 },
    "all-pass phase −π at f0",
  );
  const bp = designBandPassBiquad({ fs, frequency: 3000, q: 8 });
  assertClose(gainDb(bp, 3000), 0, { abs: 1e-10 }, "band-pass peak");
  assert.ok(gainDb(bp, 300) < -30 && gainDb(bp, 20000) < -20, "band-pass skirts");
});

Deno.test("audio biquads reject bad input", () => {
  assertThrowsMatching(
    () => designPeakingBiquad({ fs, frequency: 30000, gainDb: 3 }),
    RangeError,
    /below fs\/2 = 24000 Hz, got 30000 Hz/,
  );
  assertThrowsMatching(
    () => designNotchBiquad({ fs, frequency: 50, q: 0 }),
    RangeError,
    /Q must be greater than 0, got 0/,
  );
  assertThrowsMatching(
    () => designLowShelfBiquad({ fs, frequency: 50, gainDb: 90 }),
    RangeError,
    /-60 dB and 60 dB, got 90/,
  );
  assertThrowsMatching(
    () => designAllPassBiquad({ fs: -1, frequency: 50 }),
    RangeError,
    /Sample rate/,
  );
  assertThrowsMatching(
    () => designHighShelfBiquad({ fs, frequency: 50, gainDb: NaN }),
    TypeError,
    /Gain must be a finite number/,
  );
});
