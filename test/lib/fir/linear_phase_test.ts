import assert from "node:assert/strict";
import { detectLinearPhase } from "../../../lib/fir/linear_phase.ts";
import { designEquiripple } from "../../../lib/fir/equiripple.ts";
import { designWindowedSinc } from "../../../lib/fir/windowed_sinc.ts";

Deno.test("detectLinearPhase classifies the four types and their forced zeros", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §5.7.3 (types I–IV and their zeros at z = ±1).
  const cases: [number[], number | null, string[]][] = [
    [[1, 2, 1], 1, []],
    [[1, 2, 2, 1], 2, ["nyquist"]],
    [[1, 0, -1], 3, ["dc", "nyquist"]],
    [[1, 2, -2, -1], 4, ["dc"]],
    [[1, 2, 3], null, []],
    [[0.5], 1, []],
  ];
  for (const [taps, type, zeros] of cases) {
    const r = detectLinearPhase(taps);
    assert.equal(r.type, type, `type of ${taps}`);
    assert.deepEqual(r.forcedZeros, zeros, `zeros of ${taps}`);
    assert.equal(r.groupDelay, type === null ? null : (taps.length - 1) / 2);
  }
  // An antisymmetric odd-length filter needs a zero middle tap.
  assert.equal(detectLinearPhase([1, 0.1, -1]).type, null);
});

Deno.test("detectLinearPhase on designed filters, and its tolerance", () => {
  const hilbert = designEquiripple({
    length: 30,
    fs: 1,
    kind: "hilbert",
    bands: [{ from: 0.05, to: 0.5, gain: 1 }],
  });
  assert.equal(detectLinearPhase(hilbert.taps).type, 4);
  const lp = designWindowedSinc({ length: 64, fs: 1, cutoff: 0.2 });
  assert.equal(detectLinearPhase(lp).type, 2);
  const nudged = Float64Array.from(lp);
  nudged[3]! += 1e-9;
  assert.equal(detectLinearPhase(nudged).type, null);
  const r = detectLinearPhase(nudged, { tolerance: 1e-6 });
  assert.equal(r.type, 2);
  assert.ok(r.mismatch > 1e-9 && r.mismatch < 1e-7, String(r.mismatch));
  assert.throws(() => detectLinearPhase([1, 2], { tolerance: -1 }), RangeError);
  assert.throws(() => detectLinearPhase([1, NaN]), TypeError);
});
