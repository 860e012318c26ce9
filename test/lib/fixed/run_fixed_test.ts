import assert from "node:assert";
import {
  applyDesign,
  compareOutputs,
  qFormat,
  quantiseDesign,
  quantiseValues,
  roundoffNoiseGain,
  runFixed,
} from "../../../lib/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { referenceCase } from "../verify/_fixture.ts";

/** Deterministic uniform numbers in [−1, 1) (a 32-bit LCG, Numerical Recipes constants). */
function uniform(n: number, seed: number): Float64Array {
  const out = new Float64Array(n);
  let s = seed >>> 0;
  for (let i = 0; i < n; i++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    out[i] = s / 2 ** 31 - 1;
  }
  return out;
}

/** round(num / 2^shift) with ties away from zero, by exact rational comparison (test-side). */
function roundNearestExact(num: bigint, shift: number): bigint {
  const den = 1n << BigInt(shift);
  const mag = num < 0n ? -num : num;
  const q = (2n * mag + den) / (2n * den); // floor((|num| + den/2) / den)
  return num < 0n ? -q : q;
}

/** floor(num / 2^shift) by exact division (test-side). */
function floorExact(num: bigint, shift: number): bigint {
  const den = 1n << BigInt(shift);
  const q = num / den; // truncates toward zero
  return num < 0n && q * den !== num ? q - 1n : q;
}

Deno.test("integer FIR equals the exact rational computation (BigInt) on a short input", () => {
  const taps = [0.0123, -0.25, 0.61803, -0.25, 0.0123, 0.001];
  const input = Array.from(uniform(24, 7), (v) => 0.9 * v);
  for (const rounding of ["nearest", "floor"] as const) {
    const q = quantiseDesign({ kind: "fir", taps }, 16, { rounding });
    const n = q.formats[0]!.fractionBits;
    const r = runFixed(q, input, { rounding, accumulatorBits: 40 });
    assert.equal(r.accumulatorOverflows, 0);
    assert.equal(r.outputOverflows, 0);
    const x = quantiseValues(input, qFormat(16, 15), rounding).codes;
    const h = q.codes[0]!;
    for (let i = 0; i < input.length; i++) {
      let acc = 0n;
      for (let k = 0; k < h.length && k <= i; k++) acc += BigInt(h[k]!) * BigInt(x[i - k]!);
      // source: exact rational arithmetic, y = Σ h·x / 2^n rounded by the stated rule
      const expected = rounding === "nearest" ? roundNearestExact(acc, n) : floorExact(acc, n);
      assert.equal(BigInt(r.outputCodes[i]!), expected, `${rounding} y[${i}]`);
    }
    // And within half a step (nearest) or one step (floor) of the float run on the same numbers.
    const float = applyDesign(q.design, r.input);
    const c = compareOutputs(float, r.output);
    assert.ok(c.maxError <= (rounding === "nearest" ? 2 ** -16 : 2 ** -15), `${c.maxError}`);
  }
});

Deno.test("accumulator overflow: saturate clamps, wrap is two's complement (hand example)", () => {
  // Taps 32767/32768 twice, input 32767 twice: the second partial sum 2·32767² = 2147352578
  // exceeds a 31-bit accumulator (max 2^30 − 1 = 1073741823).
  const q = quantiseDesign({ kind: "fir", taps: [32767 / 32768, 32767 / 32768] }, 16, {
    fractionBits: 15,
  });
  const x = [32767 / 32768, 32767 / 32768];
  const sat = runFixed(q, x, { accumulatorBits: 31, overflow: "saturate" });
  assert.equal(sat.accumulatorOverflows, 1);
  // Saturated acc 1073741823 / 2^15 = 32767.99… → 32768 → output saturates to 32767.
  assert.equal(sat.outputCodes[1], 32767);
  assert.equal(sat.outputOverflows, 1);
  const wrap = runFixed(q, x, { accumulatorBits: 31, overflow: "wrap" });
  // 2147352578 − 2^31 = −131070; −131070 / 32768 = −3.99994 → −4.
  assert.equal(wrap.accumulatorOverflows, 1);
  assert.equal(wrap.outputCodes[1], -4);
  const wide = runFixed(q, x, { accumulatorBits: 32 });
  assert.equal(wide.accumulatorOverflows, 0);
  // 2147352578 / 32768 = 65530.0… → saturates the 16-bit output.
  assert.equal(wide.outputCodes[1], 32767);
  assert.equal(wide.outputOverflows, 1);
});

Deno.test("integer sections (TDF-II): output noise matches the round-off noise gain", () => {
  const c = referenceCase("butter4");
  const q = quantiseDesign(c.design, 16);
  const input = Array.from(uniform(20000, 3), (v) => 0.5 * v);
  const r = runFixed(q, input, { accumulatorBits: 40 });
  assert.equal(r.accumulatorOverflows, 0);
  assert.equal(r.outputOverflows, 0);
  const float = applyDesign(q.design, r.input);
  const err = compareOutputs(float, r.output);
  const gain = roundoffNoiseGain(q.design);
  const predicted = gain * 2 ** -30 / 12;
  // source: common practice, additive white rounding noise of variance q²/12 per rounding
  // (Oppenheim & Schafer §6.9); statistical, so 25 % tolerance on the variance
  assertClose(err.rmsError ** 2, predicted, { rel: 0.25 }, "output noise variance");
  assert.ok(err.snrDb > 60);
});

Deno.test("integer sections: a narrow accumulator overflows, a wide one does not", () => {
  const c = referenceCase("butter4");
  const q = quantiseDesign(c.design, 16);
  const input = Array.from(uniform(500, 11), (v) => 0.99 * v);
  assert.ok(runFixed(q, input, { accumulatorBits: 24 }).accumulatorOverflows > 0);
  assert.equal(runFixed(q, input, { accumulatorBits: 40 }).accumulatorOverflows, 0);
});

Deno.test("bad fixed-point runs give a clear error", () => {
  const q = quantiseDesign({ kind: "fir", taps: [0.5] }, 16);
  const rational = quantiseDesign(
    { kind: "rational", numerator: [0.5], denominator: [1, -0.5] },
    16,
  );
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => runFixed(q, [0], { accumulatorBits: 1 }), RangeError, "Accumulator bits"],
    [() => runFixed(q, [0], { accumulatorBits: 129 }), RangeError, "Accumulator bits"],
    [() => runFixed(q, [NaN]), TypeError, "Input[0]"],
    [() => runFixed(rational, [0]), TypeError, "rational"],
    [
      () => runFixed(q, [0], { dataFormat: { wordLength: 40, fractionBits: 15 } }),
      RangeError,
      "Word length",
    ],
    [() => runFixed(q, [0], { overflow: "clip" as "wrap" }), TypeError, "Overflow"],
  ];
  for (const [run, kind, part] of cases) {
    assert.throws(run, (e: Error) => e instanceof kind && e.message.includes(part), part);
  }
});
