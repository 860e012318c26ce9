import assert from "node:assert";
import {
  checkSpec,
  compareOutputs,
  findMinimumWordLength,
  qFormat,
  quantiseDesign,
  quantiseValues,
} from "../../../lib/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { fixture, referenceCase } from "../verify/_fixture.ts";

/** SNR of a full-scale sine quantised to W bits (Q(W−1)), nearest rounding. */
function sineSnr(wordLength: number): number {
  const n = 1 << 16;
  const amplitude = 1 - 2 ** -(wordLength - 1); // full scale, no saturation
  const x = new Float64Array(n);
  // An incommensurate frequency makes the error behave like white noise.
  for (let i = 0; i < n; i++) x[i] = amplitude * Math.sin(2 * Math.PI * 0.0123456789 * i + 0.3);
  const q = quantiseValues(x, qFormat(wordLength), "nearest");
  assert.equal(q.saturated, 0);
  return compareOutputs(x, q.values).snrDb;
}

Deno.test("quantisation noise: about 6.02 dB per bit for a full-scale sine (observed)", () => {
  const words = [8, 10, 12, 14, 16];
  const snr = words.map(sineSnr);
  for (let i = 0; i < words.length; i++) {
    // source: common practice, SNR ≈ 6.02·W + 1.76 dB for a full-scale sine (the white-noise
    // model is looser at 8 bits, hence 0.5 dB)
    assertClose(snr[i]!, 6.02 * words[i]! + 1.76, { abs: 0.5 }, `SNR at ${words[i]} bits`);
  }
  // Least-squares slope over the word lengths.
  const mw = words.reduce((a, b) => a + b) / words.length;
  const ms = snr.reduce((a, b) => a + b) / snr.length;
  let num = 0;
  let den = 0;
  words.forEach((w, i) => {
    num += (w - mw) * (snr[i]! - ms);
    den += (w - mw) ** 2;
  });
  // source: common practice, 20·log10(2) = 6.02 dB per bit
  assertClose(num / den, 20 * Math.log10(2), { abs: 0.05 }, "dB per bit");
});

Deno.test("sections get per-section formats; codes reproduce the quantised values", () => {
  const c = referenceCase("butter4");
  const q = quantiseDesign(c.design, 16);
  assert.equal(q.formats.length, 2);
  assert.equal(q.saturated, 0);
  if (q.design.kind !== "sections" || c.design.kind !== "sections") throw new Error("sections");
  q.design.sections.forEach((s, k) => {
    const n = q.formats[k]!.fractionBits;
    const codes = q.codes[k]!;
    assert.deepEqual([s.b0, s.b1, s.b2, s.a1, s.a2], Array.from(codes, (x) => x * 2 ** -n));
    const orig = c.design.kind === "sections" ? c.design.sections[k]! : s;
    // Half a step of error at most (round to nearest).
    for (const key of ["b0", "b1", "b2", "a1", "a2"] as const) {
      assert.ok(Math.abs(s[key] - orig[key]) <= 2 ** -(n + 1));
    }
  });
  // Section 1: largest |coefficient| 0.855 → 0.855·2^15 = 28030 fits Q0.15.
  // Section 2: b1 = 2 → 2·2^14 = 32768 > 32767, so Q2.13.
  assert.deepEqual(q.formats.map((f) => f.fractionBits), [15, 13]);
});

Deno.test("minimum coefficient word length: the word below fails, the one found passes", () => {
  const c = referenceCase("fir31");
  const spec = {
    fs: fixture.fs,
    requirements: [
      { kind: "passbandDeviation" as const, from: 0, to: 600, atMostDb: 0.1, id: "R1" },
      { kind: "stopbandAttenuation" as const, from: 1600, to: 4000, atLeastDb: 50, id: "R2" },
    ],
  };
  // The float design meets it: firwin's stopband peak is 50.78 dB (SciPy, verify.json).
  assert.ok(checkSpec(c.design, spec).every((r) => r.met));
  const s = findMinimumWordLength(c.design, spec);
  assert.ok(s.wordLength !== undefined && s.wordLength > 4 && s.wordLength < 16, `${s.wordLength}`);
  const last = s.trials[s.trials.length - 1]!;
  assert.equal(last.wordLength, s.wordLength);
  assert.equal(last.failed, 0);
  const below = s.trials[s.trials.length - 2]!;
  assert.ok(below.failed > 0);
  // Re-check independently at the word found and the one below.
  const at = checkSpec(quantiseDesign(c.design, s.wordLength).design, spec);
  assert.ok(at.every((r) => r.met));
  const under = checkSpec(quantiseDesign(c.design, s.wordLength - 1).design, spec);
  assert.ok(under.some((r) => !r.met));
  assert.deepEqual(s.results, at);
});

Deno.test("word-length search reports no word when none meets the spec", () => {
  const c = referenceCase("fir31");
  const s = findMinimumWordLength(c.design, {
    fs: fixture.fs,
    requirements: [{ kind: "stopbandAttenuation", from: 1600, to: 4000, atLeastDb: 80 }],
  }, { from: 20, to: 22 });
  assert.equal(s.wordLength, undefined);
  assert.deepEqual(s.trials.map((t) => t.wordLength), [20, 21, 22]);
  assert.throws(
    () => findMinimumWordLength(c.design, { fs: 8000, requirements: [] }, { from: 10, to: 5 }),
    (e: Error) => e instanceof RangeError && e.message.includes("Largest word length"),
  );
});
