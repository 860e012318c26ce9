import assert from "node:assert/strict";
import { applyFirDirect } from "../../../lib/fir/apply.ts";
import { applyFirOverlapAdd } from "../../../lib/fir/overlap_add.ts";
import { whiteNoise } from "../../../lib/signal/noise.ts";
import { assertClose } from "../../_tolerance.ts";

Deno.test("overlap-add equals the direct form (FFT path vs direct path)", () => {
  const x = whiteNoise(5000, { seed: 8 });
  for (const taps of [1, 2, 7, 48, 101, 256, 1000]) {
    const h = whiteNoise(taps, { seed: taps });
    const sum = h.reduce((s, v) => s + Math.abs(v), 0);
    const direct = applyFirDirect(h, x);
    // property: block convolution by FFT is exact up to rounding, ~1e-15·Σ|h|·max|x|
    const tol = { abs: 1e-14 * sum * 5 };
    assertClose(applyFirOverlapAdd(h, x), direct, tol, `${taps} taps, best FFT length`);
    for (let m = 2; m <= 8192; m *= 2) {
      if (m <= taps || m > 4 * (taps + 64)) continue;
      assertClose(applyFirOverlapAdd(h, x, { fftLength: m }), direct, tol, `${taps} taps, M=${m}`);
    }
  }
});

Deno.test("overlap-add on a long signal stays within 1e-14·Σ|h|·max|x| of the direct form", () => {
  const x = whiteNoise(200_000, { seed: 21 });
  const scaleX = x.reduce((s, v) => Math.max(s, Math.abs(v)), 0);
  for (const taps of [25, 255, 1024]) {
    const h = whiteNoise(taps, { seed: 22 + taps });
    const sum = h.reduce((s, v) => s + Math.abs(v), 0);
    // property: FFT path vs direct path; |y| ≤ Σ|h|·max|x|, and the rounding
    // of both paths stays near ε·log2(M) of that bound (seen: 2e-16 relative)
    assertClose(
      applyFirOverlapAdd(h, x),
      applyFirDirect(h, x),
      { abs: 1e-14 * sum * scaleX },
      `${taps} taps`,
    );
  }
});

Deno.test("overlap-add on signals shorter than the filter and of odd block counts", () => {
  const h = whiteNoise(64, { seed: 1 });
  for (const length of [1, 3, 63, 64, 65, 130, 131]) {
    const x = whiteNoise(length, { seed: length });
    assertClose(applyFirOverlapAdd(h, x), applyFirDirect(h, x), { abs: 1e-13 }, `L=${length}`);
  }
});

Deno.test("bad FFT length", () => {
  assert.throws(
    () => applyFirOverlapAdd([1, 2, 3], [1, 2, 3, 4], { fftLength: 3 }),
    (e: unknown) =>
      e instanceof RangeError && e.message.includes("FFT length must be at least 4, got 3"),
  );
  assert.throws(
    () => applyFirOverlapAdd([1, 2, 3], [1, 2, 3, 4], { fftLength: 6 }),
    (e: unknown) => e instanceof RangeError && e.message.includes("power of two, got 6"),
  );
});
