import assert from "node:assert/strict";
import { designLeastSquares } from "../../../lib/fir/least_squares.ts";
import type { LeastSquaresOptions } from "../../../lib/fir/least_squares.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

Deno.test("designLeastSquares matches scipy.signal.firls", () => {
  // source: scipy.signal.firls, SciPy 1.10.1 (odd lengths only there)
  for (const c of reference.leastSquares) {
    const bands = c.bands.map(([from, to, gain, endGain, weight]: number[]) => ({
      from,
      to,
      gain,
      endGain,
      weight,
    }));
    const d = designLeastSquares({ length: c.length, fs: c.fs, bands });
    assertClose(d.taps, c.taps, { abs: 1e-10 }, `${c.length} taps`);
    assert.deepEqual(d.warnings, []);
  }
});

/** Weighted squared error by brute-force quadrature, to check the closed forms. */
function quadratureError(taps: Float64Array, opts: LeastSquaresOptions): number {
  let total = 0;
  for (const b of opts.bands) {
    const steps = 4000;
    const a0 = (2 * Math.PI * b.from) / opts.fs;
    const a1 = (2 * Math.PI * b.to) / opts.fs;
    const dw = (a1 - a0) / steps;
    for (let i = 0; i <= steps; i++) {
      const w = a0 + i * dw;
      // Linear phase removed: H·e^{jω(N−1)/2} = A(ω) (symmetric) or j·A(ω) (antisymmetric).
      let re = 0;
      let im = 0;
      taps.forEach((h, n) => {
        re += h * Math.cos(w * (n - (taps.length - 1) / 2));
        im -= h * Math.sin(w * (n - (taps.length - 1) / 2));
      });
      const amp = opts.symmetry === "antisymmetric" ? im : re;
      const t = i / steps;
      const want = b.gain + t * ((b.endGain ?? b.gain) - b.gain);
      const trap = i === 0 || i === steps ? 0.5 : 1;
      total += trap * dw * (b.weight ?? 1) * (amp - want) ** 2;
    }
  }
  return total / Math.PI;
}

Deno.test("designLeastSquares: all four types reach their reported minimum", () => {
  const specs: LeastSquaresOptions[] = [
    {
      length: 24,
      fs: 1,
      bands: [{ from: 0, to: 0.2, gain: 1 }, { from: 0.28, to: 0.5, gain: 0, weight: 3 }],
    },
    {
      length: 25,
      fs: 1,
      symmetry: "antisymmetric",
      bands: [{ from: 0.05, to: 0.45, gain: 1 }],
    },
    {
      length: 26,
      fs: 1,
      symmetry: "antisymmetric",
      bands: [{ from: 0, to: 0.5, gain: 0, endGain: Math.PI }],
    },
  ];
  for (const spec of specs) {
    const d = designLeastSquares(spec);
    assertClose(
      quadratureError(d.taps, spec),
      d.squaredError,
      { rel: 1e-3, abs: 1e-9 },
      `E for ${spec.length}`,
    );
    // A small change to any tap must not lower the error (first-order optimality).
    for (const n of [0, 3, 7]) {
      const bumped = Float64Array.from(d.taps);
      const m = spec.length - 1 - n;
      bumped[n]! += 1e-3;
      bumped[m]! += spec.symmetry === "antisymmetric" ? -1e-3 : 1e-3;
      assert.ok(quadratureError(bumped, spec) >= quadratureError(d.taps, spec), `bump ${n}`);
    }
  }
});

Deno.test("designLeastSquares: ill-conditioned bands give a warning, not garbage", () => {
  const d = designLeastSquares({
    length: 301,
    fs: 1,
    bands: [{ from: 0, to: 0.01, gain: 1 }, { from: 0.02, to: 0.03, gain: 0 }],
  });
  assert.ok(d.warnings.some((w) => w.code === "ill-conditioned"));
  assert.ok(d.taps.every(Number.isFinite));
});

Deno.test("designLeastSquares rejects bad input with the rule and the value", () => {
  const hp = [{ from: 0, to: 0.1, gain: 0 }, { from: 0.2, to: 0.5, gain: 1 }];
  const cases: [LeastSquaresOptions, ErrorConstructor, string][] = [
    [{ length: 30, fs: 1, bands: hp }, RangeError, "type II"],
    [{ length: 31, fs: 1, bands: hp, symmetry: "antisymmetric" }, RangeError, "type III"],
    [
      { length: 31, fs: 1, bands: [{ from: 0, to: 0.2, gain: 1 }], symmetry: "antisymmetric" },
      RangeError,
      "zero at 0 Hz",
    ],
    [
      { length: 31, fs: 1, bands: [{ from: 0, to: 0.2, gain: 1, weight: -1 }] },
      RangeError,
      "weight must be greater than 0, got -1",
    ],
    [
      { length: 31, fs: 1, bands: [{ from: 0.2, to: 0.2, gain: 1 }] },
      RangeError,
      "edges must increase",
    ],
    [
      { length: 31, fs: 1, bands: hp, symmetry: "odd" as "symmetric" },
      TypeError,
      "Symmetry must be",
    ],
  ];
  for (const [options, kind, text] of cases) {
    assert.throws(
      () => designLeastSquares(options),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
