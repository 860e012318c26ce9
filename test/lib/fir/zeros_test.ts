import assert from "node:assert/strict";
import { firZeros } from "../../../lib/fir/zeros.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

Deno.test("firZeros matches numpy.roots", () => {
  // source: numpy.roots, NumPy 1.24.2 (test/reference/make_fir_design.py)
  for (const c of reference.zeros) {
    const ours = firZeros(c.taps);
    assert.equal(ours.length, c.zeros.length, c.name);
    // Pair each reference zero with the nearest of ours (order differs between solvers).
    const used = new Set<number>();
    for (const [re, im] of c.zeros as [number, number][]) {
      let best = -1;
      let distance = Infinity;
      ours.forEach((z, i) => {
        const d = Math.hypot(z.re - re, z.im - im);
        if (!used.has(i) && d < distance) {
          distance = d;
          best = i;
        }
      });
      used.add(best);
      assert.ok(distance < 1e-8, `${c.name}: zero ${re}+${im}j off by ${distance}`);
    }
  }
});

Deno.test("firZeros of a linear-phase filter come in reciprocal pairs", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §5.7.4: zeros at z and 1/z*.
  const c = reference.zeros[0];
  const zs = firZeros(c.taps);
  for (const z of zs) {
    const m = z.re * z.re + z.im * z.im;
    const partner = { re: z.re / m, im: z.im / m };
    assert.ok(
      zs.some((w) => Math.hypot(w.re - partner.re, w.im - partner.im) < 1e-7),
      `1/z* of ${z.re}`,
    );
  }
});

Deno.test("firZeros: trailing zero taps give zeros at the origin; all-zero taps are rejected", () => {
  const zs = firZeros([1, -1, 0]);
  assert.equal(zs.length, 2);
  assert.ok(zs.some((z) => z.re === 0 && z.im === 0));
  assert.ok(zs.some((z) => Math.abs(z.re - 1) < 1e-15 && z.im === 0));
  assert.throws(() => firZeros([0, 0]), RangeError);
  assert.throws(() => firZeros([1, Infinity]), TypeError);
});
