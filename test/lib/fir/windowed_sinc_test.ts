import assert from "node:assert/strict";
import { designWindowedSinc } from "../../../lib/fir/windowed_sinc.ts";
import type { DesignWindow, WindowedSincOptions } from "../../../lib/fir/windowed_sinc.ts";
import { kaiserParameters } from "../../../lib/fir/kaiser_parameters.ts";
import { measureBands } from "../../../lib/fir/band_error.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

function windowOf(w: { name: string; beta?: number }): DesignWindow {
  return w.name === "kaiser" ? { name: "kaiser", beta: w.beta! } : (w.name as DesignWindow);
}

Deno.test("designWindowedSinc matches scipy.signal.firwin for every band shape", () => {
  // source: scipy.signal.firwin, SciPy 1.10.1 (test/reference/make_fir_design.py)
  for (const c of reference.windowedSinc) {
    const multiStop = c.response === "multiband-stop";
    const options: WindowedSincOptions = {
      length: c.length,
      fs: c.fs,
      cutoff: c.cutoff,
      response: multiStop ? "multiband" : c.response,
      window: windowOf(c.window),
    };
    if (multiStop) options.firstBand = "stop";
    assertClose(designWindowedSinc(options), c.taps, { abs: 1e-14 }, `${c.response} ${c.length}`);
  }
});

Deno.test("designWindowedSinc lowpass: unit DC gain and symmetric taps for every window and length", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §7.5: the window method scales for unit gain
  // at DC, and a symmetric window times the symmetric ideal response gives symmetric
  // (linear-phase) taps, h[n] = h[N−1−n].
  for (const window of ["rectangular", "hann", "hamming", "blackman"] as const) {
    for (const length of [1, 2, 15, 31, 64, 101]) {
      if (length === 2 && (window === "hann" || window === "blackman")) {
        // Both windows are zero at their ends, so 2 taps leave nothing (common practice).
        assert.throws(
          () => designWindowedSinc({ length, fs: 8000, cutoff: 1000, window }),
          (e: unknown) => e instanceof RangeError && /non-zero filter, got \d taps/.test(e.message),
        );
        continue;
      }
      const h = designWindowedSinc({ length, fs: 8000, cutoff: 1000, window });
      assert.equal(h.length, length);
      assertClose(h.reduce((a, b) => a + b, 0), 1, { abs: 1e-14 }, `DC gain ${window} ${length}`);
      for (let n = 0; n < length; n++) {
        assert.equal(h[n], h[length - 1 - n], `symmetry ${window} ${length} at ${n}`);
      }
    }
  }
});

Deno.test("Kaiser window method meets the spec its formulas were computed for", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §7.6.1 example: ωp = 0.4π, ωs = 0.6π,
  // δ = 0.001 → β = 5.653, M = 37 (quoted from memory of the worked example).
  const k = kaiserParameters({ fs: 2, transitionWidth: 0.2, ripple: 0.001 });
  assert.equal(k.order, 37);
  assert.equal(k.length, 38);
  assertClose(k.beta, 5.653, { abs: 5e-4 }, "β");
  // Cutoff midway between the edges; the design meets δ ≈ 0.001 in both bands.
  const h = designWindowedSinc({
    length: k.length,
    fs: 2,
    cutoff: 0.5,
    window: { name: "kaiser", beta: k.beta },
  });
  const [pass, stop] = measureBands(h, 2, [{ from: 0, to: 0.4, gain: 1 }, {
    from: 0.6,
    to: 1,
    gain: 0,
  }]);
  assert.ok(pass!.maxDeviation < 0.0012, `passband deviation ${pass!.maxDeviation}`);
  assert.ok(stop!.maxGain < 0.0012, `stopband peak ${stop!.maxGain}`);
});

Deno.test("kaiserParameters agrees with scipy.signal.kaiserord", () => {
  // source: scipy.signal.kaiserord / kaiser_beta, SciPy 1.10.1. SciPy uses 7.95 where
  // O&S print 8 in the length formula, so lengths may differ by one tap.
  for (const c of reference.kaiserOrder) {
    const k = kaiserParameters({
      fs: 2,
      transitionWidth: c.widthOverNyquist,
      attenuationDb: c.attenuationDb,
    });
    assertClose(k.beta, c.beta, { abs: 1e-12 }, `β for ${c.attenuationDb} dB`);
    assert.ok(Math.abs(k.length - c.numtaps) <= 1, `length ${k.length} vs ${c.numtaps}`);
  }
});

Deno.test("designWindowedSinc rejects bad input with the rule and the value", () => {
  const cases: [WindowedSincOptions, ErrorConstructor, string][] = [
    [{ length: 31, fs: 8000, cutoff: 4000 }, RangeError, "below fs/2 = 4000 Hz, got 4000 Hz"],
    [{ length: 31, fs: 8000, cutoff: 5000 }, RangeError, "below fs/2"],
    [{ length: 31, fs: 8000, cutoff: 0 }, RangeError, "above 0 Hz"],
    [
      { length: 30, fs: 8000, cutoff: 1000, response: "highpass" },
      RangeError,
      "odd number of taps, got 30",
    ],
    [{ length: 30, fs: 8000, cutoff: [1000, 2000], response: "bandstop" }, RangeError, "type II"],
    [
      { length: 31, fs: 8000, cutoff: [2000, 1000], response: "bandpass" },
      RangeError,
      "Cutoffs must increase",
    ],
    [{ length: 31, fs: 8000, cutoff: [1000, 2000] }, RangeError, "lowpass takes one cutoff, got 2"],
    [{ length: 0, fs: 8000, cutoff: 1000 }, RangeError, "Number of taps"],
    [
      { length: 31, fs: 8000, cutoff: 1000, window: "triangle" as "hann" },
      TypeError,
      "Window must be",
    ],
    [
      { length: 31, fs: 8000, cutoff: 1000, window: { name: "kaiser", beta: -1 } },
      RangeError,
      "beta",
    ],
    [
      { length: 31, fs: 8000, cutoff: 1000, response: "notch" as "lowpass" },
      TypeError,
      "Response must be",
    ],
  ];
  for (const [options, kind, text] of cases) {
    assert.throws(
      () => designWindowedSinc(options),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
