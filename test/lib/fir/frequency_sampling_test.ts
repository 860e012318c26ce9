import assert from "node:assert/strict";
import { designFrequencySampling } from "../../../lib/fir/frequency_sampling.ts";
import type { FrequencySamplingOptions } from "../../../lib/fir/frequency_sampling.ts";
import type { DesignWindow } from "../../../lib/fir/types.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

Deno.test("designFrequencySampling matches scipy.signal.firwin2 (types I–IV)", () => {
  // source: scipy.signal.firwin2, SciPy 1.10.1 (test/reference/make_fir_design.py)
  for (const c of reference.frequencySampling) {
    const window: DesignWindow = c.window === null
      ? "rectangular"
      : c.window.name === "kaiser"
      ? { name: "kaiser", beta: c.window.beta }
      : c.window.name;
    const options: FrequencySamplingOptions = {
      length: c.length,
      fs: c.fs,
      frequencies: c.frequencies,
      gains: c.gains,
      window,
      antisymmetric: c.antisymmetric,
    };
    if (c.gridPoints !== null) options.gridPoints = c.gridPoints;
    assertClose(designFrequencySampling(options), c.taps, { abs: 1e-13 }, `${c.length} taps`);
  }
});

Deno.test("designFrequencySampling: with N = 2(points − 1) the response passes through the samples", () => {
  // The defining property of frequency sampling (Rabiner, Gold & McGonegal 1970): with no
  // window and no truncation, |H(k·fs/N)| equals the wanted gain at every grid frequency.
  const frequencies = [0, 0.2, 0.3, 0.5];
  const gains = [1, 1, 0, 0];
  const h = designFrequencySampling({
    length: 16,
    fs: 1,
    frequencies,
    gains,
    window: "rectangular",
    gridPoints: 9,
  });
  for (let k = 0; k <= 8; k++) {
    const f = k / 16;
    const wanted = f <= 0.2 ? 1 : f >= 0.3 ? 0 : (0.3 - f) / 0.1;
    let re = 0;
    let im = 0;
    h.forEach((v, n) => {
      re += v * Math.cos(2 * Math.PI * f * n);
      im -= v * Math.sin(2 * Math.PI * f * n);
    });
    assertClose(Math.hypot(re, im), wanted, { abs: 1e-14 }, `|H(${f})|`);
  }
  for (let n = 0; n < 8; n++) assertClose(h[n]!, h[15 - n]!, { abs: 1e-15 }, `symmetry ${n}`);
});

Deno.test("designFrequencySampling rejects bad input with the rule and the value", () => {
  const base = { length: 31, fs: 2, frequencies: [0, 0.5, 1], gains: [1, 1, 0] };
  const cases: [FrequencySamplingOptions, ErrorConstructor, string][] = [
    [{ ...base, frequencies: [0.1, 0.5, 1] }, RangeError, "start at 0 Hz and end at fs/2 = 1 Hz"],
    [
      { ...base, frequencies: [0, 0.6, 0.5, 1], gains: [1, 1, 0, 0] },
      RangeError,
      "must not decrease",
    ],
    [
      { ...base, frequencies: [0, 0.5, 0.5, 0.5, 1], gains: [1, 1, 0, 0, 0] },
      RangeError,
      "three times",
    ],
    [{ ...base, gains: [1, 1] }, TypeError, "equal length"],
    [{ ...base, length: 30, gains: [1, 1, 1] }, RangeError, "type II"],
    [{ ...base, antisymmetric: true }, RangeError, "zero at 0 Hz"],
    [{ ...base, gridPoints: 9 }, RangeError, "Grid points must satisfy"],
    [{ ...base, gains: [1, NaN, 0] }, TypeError, "Gain 2"],
  ];
  for (const [options, kind, text] of cases) {
    assert.throws(
      () => designFrequencySampling(options),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
