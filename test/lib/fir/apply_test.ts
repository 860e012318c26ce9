import assert from "node:assert/strict";
import { applyFir, applyFirDirect } from "../../../lib/fir/apply.ts";
import { whiteNoise } from "../../../lib/signal/noise.ts";
import { assertClose } from "../../_tolerance.ts";

/** Index of the first element where a and b differ (bit for bit, NaN-aware), or −1. */
function firstDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) return Math.min(a.length, b.length);
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return i;
  return -1;
}

interface FilterCase {
  taps: number[];
  input: number[];
  reference: string;
  output: number[];
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/analysis.json", import.meta.url)),
) as { filtering: FilterCase[] };

Deno.test("direct form, overlap-add and automatic choice all match SciPy", () => {
  for (const c of ref.filtering) {
    const what = `${c.taps.length} taps`;
    // source: scipy.signal.lfilter(h, [1], x) (c.reference)
    const tol = { abs: 1e-12 };
    assertClose(applyFirDirect(c.taps, c.input), c.output, tol, `${what} direct`);
    assertClose(applyFir(c.taps, c.input), c.output, tol, `${what} auto`);
    assertClose(applyFir(c.taps, c.input, { method: "overlap-add" }), c.output, tol, `${what} FFT`);
    assertClose(
      applyFir(c.taps, c.input, { method: "direct" }),
      c.output,
      tol,
      `${what} forced direct`,
    );
  }
});

Deno.test("direct form: every output length and tap count around the 4-way unrolling", () => {
  for (let taps = 1; taps <= 6; taps++) {
    for (let length = 0; length <= 9; length++) {
      const h = Array.from({ length: taps }, (_, k) => (k + 1) / 7);
      const x = Array.from({ length }, (_, i) => Math.sin(i + 1));
      const y = applyFirDirect(h, x);
      for (let i = 0; i < length; i++) {
        let expected = 0;
        for (let k = 0; k <= Math.min(i, taps - 1); k++) expected += h[k]! * x[i - k]!;
        // source: the FIR difference equation y[n] = Σ h[k] x[n−k] (O&S §6.5.1)
        assertClose(y[i]!, expected, { abs: 1e-15 }, `N=${taps} L=${length} y[${i}]`);
      }
    }
  }
});

Deno.test("the automatic choice follows the measured crossover N ≥ 24 + 50 000/L", () => {
  const x = whiteNoise(100_000, { seed: 31 });
  const cases: [number, "direct" | "overlap-add"][] = [
    [8, "direct"],
    [24, "direct"],
    [25, "overlap-add"],
    [255, "overlap-add"],
  ];
  for (const [taps, expected] of cases) {
    const h = whiteNoise(taps, { seed: taps });
    // property: each method is deterministic, so the automatic result is bit for bit one of them
    const chosen = applyFir(h, x, { method: expected });
    assert.equal(firstDifference(applyFir(h, x), chosen), -1, `${taps} taps on 1e5: ${expected}`);
  }
  const short = whiteNoise(1024, { seed: 32 });
  for (const [taps, expected] of [[72, "direct"], [73, "overlap-add"]] as const) {
    const h = whiteNoise(taps, { seed: taps });
    const chosen = applyFir(h, short, { method: expected });
    assert.equal(
      firstDifference(applyFir(h, short), chosen),
      -1,
      `${taps} taps on 1024: ${expected}`,
    );
  }
});

Deno.test("two-tap average, the textbook case, by every method", () => {
  const x = [2, 4, 6, 8];
  for (const method of ["auto", "direct", "overlap-add"] as const) {
    assertClose(applyFir([0.5, 0.5], x, { method }), [1, 3, 5, 7], { abs: 1e-15 }, method);
  }
});

Deno.test("bad input to applyFir", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => applyFir([], [1, 2]), RangeError, "Taps must hold at least 1"],
    [() => applyFir([1], [1, Number.NaN]), TypeError, "Signal[1] must be a finite number"],
    [() => applyFir([1], [1], { method: "fast" as "auto" }), TypeError, 'got "fast"'],
    [() => applyFirDirect([Number.POSITIVE_INFINITY], [1]), TypeError, "Taps[0]"],
    // Float64Arrays take a faster check; it must find the same samples.
    [() => applyFir([1], Float64Array.of(1, 2, 3, 4, -Infinity)), TypeError, "Signal[4]"],
    [() => applyFir(Float64Array.of(1, Number.NaN), [1]), TypeError, "Taps[1]"],
    [() => applyFir([1, 2], new Float64Array(99).fill(Infinity, 60)), TypeError, "Signal[60]"],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(
      run,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
  assert.equal(applyFir([1, 2], []).length, 0);
  // Large finite values pass the check (x·0 is 0 for them).
  assert.equal(applyFir([1], Float64Array.of(1e308, -1e308, 5e-324))[0], 1e308);
});
