import assert from "node:assert/strict";
import { besselI0, kaiserWindow } from "../../../lib/window/kaiser.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

Deno.test("besselI0 matches SciPy to a few ulp", () => {
  // source: scipy.special.i0, SciPy 1.10.1 (test/reference/make_fir_design.py)
  const { x, values } = reference.besselI0;
  for (let i = 0; i < x.length; i++) {
    assertClose(besselI0(x[i]), values[i], { rel: 2e-15 }, `I0(${x[i]})`);
  }
});

Deno.test("besselI0 published values", () => {
  // source: Abramowitz & Stegun, Table 9.8 (values from memory, agree with SciPy above): I0(2) = 2.2795853023, e^-10·I0(10) = 0.1278333372.
  assertClose(besselI0(2), 2.2795853023, { abs: 1e-10 }, "I0(2)");
  assertClose(besselI0(10) * Math.exp(-10), 0.1278333372, { abs: 1e-10 }, "e^-10 I0(10)");
  assert.equal(besselI0(-3), besselI0(3));
});

Deno.test("kaiserWindow matches scipy.signal.windows.kaiser within 1e-12", () => {
  // source: scipy.signal.windows.kaiser, SciPy 1.10.1
  for (const c of reference.kaiserWindows) {
    const w = kaiserWindow(c.length, c.beta, { symmetry: c.symmetric ? "symmetric" : "periodic" });
    assertClose(w, c.values, { abs: 1e-12 }, `kaiser(${c.length}, ${c.beta}, sym=${c.symmetric})`);
  }
});

Deno.test("kaiserWindow properties: symmetric, peak 1, beta 0 is rectangular", () => {
  const w = kaiserWindow(64, 7);
  for (let n = 0; n < 32; n++) assert.equal(w[n], w[63 - n]);
  assert.ok(w.every((v) => v > 0 && v <= 1));
  assert.deepEqual([...kaiserWindow(4, 0)], [1, 1, 1, 1]);
  // A periodic window of N is the symmetric window of N + 1 without its last sample.
  const p = kaiserWindow(16, 5, { symmetry: "periodic" });
  const s = kaiserWindow(17, 5);
  assertClose(p, s.subarray(0, 16), { abs: 1e-15 }, "periodic vs symmetric");
});

Deno.test("kaiserWindow rejects bad input", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => kaiserWindow(0, 5), RangeError, "at least 1"],
    [() => kaiserWindow(8.5, 5), RangeError, "integer"],
    [() => kaiserWindow(8, -1), RangeError, "between 0 and 10000, got -1"],
    [() => kaiserWindow(8, NaN), TypeError, "finite"],
    [() => kaiserWindow(8, 4, { symmetry: "odd" as "periodic" }), TypeError, "symmetry"],
    [() => besselI0(Infinity), TypeError, "finite"],
  ];
  for (const [call, kind, text] of cases) {
    assert.throws(call, (e: unknown) => e instanceof kind && (e as Error).message.includes(text));
  }
});
