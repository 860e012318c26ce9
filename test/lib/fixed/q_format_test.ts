import assert from "node:assert";
import {
  formatForRange,
  formatName,
  formatRange,
  qFormat,
  quantiseDesign,
  quantiseValue,
  quantiseValues,
  type Rounding,
} from "../../../lib/mod.ts";

Deno.test("Q15 covers [−1, 1 − 2^−15] in steps of 2^−15", () => {
  const q15 = qFormat(16, 15);
  const r = formatRange(q15);
  // source: common practice (Q15 = 16-bit two's complement, 15 fraction bits)
  assert.equal(r.min, -1);
  assert.equal(r.max, 1 - 2 ** -15);
  assert.equal(r.step, 2 ** -15);
  assert.equal(r.minCode, -32768);
  assert.equal(r.maxCode, 32767);
  assert.equal(formatName(q15), "Q0.15");
  // Every multiple of 2^−15 in range is held exactly; one step beyond either end saturates.
  for (const k of [-32768, -32767, -1, 0, 1, 12345, 32767]) {
    const q = quantiseValue(k * 2 ** -15, q15);
    assert.equal(q.code, k);
    assert.equal(q.saturated, false);
  }
  assert.equal(quantiseValue(1, q15).saturated, true);
  assert.equal(quantiseValue(1, q15).code, 32767);
  assert.equal(quantiseValue(-1 - 2 ** -15, q15).code, -32768);
  assert.equal(quantiseValue(-1 - 2 ** -15, q15).saturated, true);
  // source: common practice (Q31 range [−1, 1 − 2^−31])
  const q31 = formatRange(qFormat(32, 31));
  assert.equal(q31.min, -1);
  assert.equal(q31.max, 1 - 2 ** -31);
});

Deno.test("rounding modes: nearest (ties away), toward −∞, convergent (ties to even)", () => {
  const f = qFormat(8, 0);
  // source: common practice (IEEE 754 roundTiesToAway / roundTowardNegative / roundTiesToEven)
  const table: [number, Rounding, number][] = [
    [2.5, "nearest", 3],
    [-2.5, "nearest", -3],
    [2.4, "nearest", 2],
    [-2.6, "nearest", -3],
    [2.5, "floor", 2],
    [-2.5, "floor", -3],
    [-2.1, "floor", -3],
    [2.9, "floor", 2],
    [2.5, "convergent", 2],
    [3.5, "convergent", 4],
    [-2.5, "convergent", -2],
    [-3.5, "convergent", -4],
    [2.6, "convergent", 3],
    [200, "nearest", 127],
    [-200, "floor", -128],
  ];
  for (const [v, mode, code] of table) {
    assert.equal(quantiseValue(v, f, mode).code, code, `${v} ${mode}`);
  }
});

Deno.test("fraction bits derived from the coefficient range", () => {
  // Largest |v| = 1.9 needs 1 integer bit: Q1.14 in 16 bits.
  assert.deepEqual(formatForRange([1.9, -0.5], 16), { wordLength: 16, fractionBits: 14 });
  // 0.999 rounds to 1 in Q0.15's last code? 0.999·32768 = 32735 < 32767: Q0.15 fits.
  assert.equal(formatForRange([0.999], 16).fractionBits, 15);
  // 1 − 2^−17 rounds to 32768 in Q0.15, which saturates: Q1.14 is needed.
  assert.equal(formatForRange([1 - 2 ** -17], 16).fractionBits, 14);
  // Small taps get more fraction bits than the word holds: 0.1 → 0.1·2^18 = 26214 ≤ 32767.
  assert.equal(formatForRange([0.1, -0.05], 16).fractionBits, 18);
  // −1 exactly fits Q0.15 (code −32768).
  assert.equal(formatForRange([-1], 16).fractionBits, 15);
});

Deno.test("word length and fraction bits out of range give a clear error", () => {
  const cases: [() => unknown, string][] = [
    [() => qFormat(1), "Word length must be between 2 and 32, got 1"],
    [() => qFormat(33), "Word length must be between 2 and 32, got 33"],
    [() => qFormat(16.5), "Word length must be an integer"],
    [() => qFormat(16, -1), "Fraction bits must be between 0 and 64, got -1"],
    [() => qFormat(16, 65), "Fraction bits must be between 0 and 64, got 65"],
    [() => quantiseValues([0.5], { wordLength: 40, fractionBits: 3 }), "Word length"],
    [() => quantiseDesign({ kind: "fir", taps: [0.5] }, 1), "Word length"],
    [() => quantiseDesign({ kind: "fir", taps: [0.5] }, 16, { fractionBits: 70 }), "Fraction bits"],
    [() => formatForRange([3e9], 32), "do not fit a 32-bit word"],
  ];
  for (const [run, part] of cases) {
    assert.throws(run, (e: Error) => e instanceof RangeError && e.message.includes(part), part);
  }
  assert.throws(
    () => quantiseValue(0.5, qFormat(16), "up" as Rounding),
    (e: Error) => e instanceof TypeError && e.message.includes("nearest, floor, convergent"),
  );
});
