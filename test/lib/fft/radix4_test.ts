// Tests of tapsheet's own FFT kernel (lib/fft/_radix4.ts) and of the real and
// complex transforms built on it, at every power of two from 1 to 2^16.
import assert from "node:assert/strict";
import { kernel } from "../../../lib/fft/_fftjs.ts";
import {
  fftPlan,
  transformInterleaved,
  transformSplit,
  transformSplitTimes,
} from "../../../lib/fft/_radix4.ts";
import { complexFft, inverseComplexFft, inverseRealFft, realFft } from "../../../lib/fft/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { firstDifference, minimalStandard } from "./_inputs.ts";

interface SizeCase {
  kind: "real" | "inverseReal" | "complex";
  length: number;
  seed?: number;
  seedRe?: number;
  seedIm?: number;
  reference: string;
  indices: number[];
  re?: number[];
  im?: number[];
  output?: number[];
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fft_sizes.json", import.meta.url)),
) as { versions: Record<string, string>; cases: SizeCase[] };

const eps = Number.EPSILON;
/**
 * Absolute tolerance for a forward transform of N values of size ≤ 0.5: two
 * units of ε·log2(2N)·√N, about ten times the largest error seen against NumPy
 * (0.35 units, a Bluestein length; 0.2 units for powers of two).
 */
const forwardTolerance = (n: number) => ({ abs: 2 * eps * Math.log2(2 * n) * Math.sqrt(n) });
/** The same for an inverse transform, whose outputs are √N times smaller per value. */
const inverseTolerance = (n: number) => ({ abs: 2 * eps * Math.log2(2 * n) / Math.sqrt(n) });

const pick = (v: ArrayLike<number>, indices: number[]) => indices.map((i) => v[i]!);

Deno.test("real, inverse real and complex FFTs match NumPy at every power of two to 2^16", () => {
  assert.ok(ref.cases.length >= 3 * 17, "cases for 17 powers of two");
  for (const c of ref.cases) {
    const n = c.length;
    const what = `${c.kind} N=${n} vs ${c.reference}`;
    if (c.kind === "real") {
      const X = realFft(minimalStandard(n, c.seed!));
      assert.equal(X.re.length, Math.floor(n / 2) + 1, what);
      // source: numpy.fft.rfft (test/reference/fft_sizes.json)
      assertClose(pick(X.re, c.indices), c.re!, forwardTolerance(n), `${what} re`);
      assertClose(pick(X.im, c.indices), c.im!, forwardTolerance(n), `${what} im`);
    } else if (c.kind === "inverseReal") {
      const bins = Math.floor(n / 2) + 1;
      const spectrum = {
        re: minimalStandard(bins, c.seedRe!),
        im: minimalStandard(bins, c.seedIm!),
      };
      const x = inverseRealFft(spectrum, n);
      // source: numpy.fft.irfft(X, n) (test/reference/fft_sizes.json)
      assertClose(pick(x, c.indices), c.output!, inverseTolerance(n), what);
    } else {
      const z = { re: minimalStandard(n, c.seedRe!), im: minimalStandard(n, c.seedIm!) };
      const Z = complexFft(z);
      // source: numpy.fft.fft (test/reference/fft_sizes.json)
      assertClose(pick(Z.re, c.indices), c.re!, forwardTolerance(n), `${what} re`);
      assertClose(pick(Z.im, c.indices), c.im!, forwardTolerance(n), `${what} im`);
    }
  }
});

Deno.test("the radix-4 kernel equals fft.js's complex transform from 2 to 2^16 points", () => {
  for (let n = 2; n <= 1 << 16; n *= 2) {
    const interleaved = minimalStandard(2 * n, 7 + n);
    const expected = new Float64Array(2 * n);
    kernel(n).transform(expected, interleaved);
    const plan = fftPlan(n);
    const re = new Float64Array(n);
    const im = new Float64Array(n);
    transformInterleaved(plan, interleaved, re, im);
    const tol = forwardTolerance(n);
    // source: fft.js 4.0.4 (npm), an independent radix-4 implementation
    assertClose(re, expected.filter((_, i) => i % 2 === 0), tol, `interleaved N=${n} re`);
    assertClose(im, expected.filter((_, i) => i % 2 === 1), tol, `interleaved N=${n} im`);
    const inRe = interleaved.filter((_, i) => i % 2 === 0);
    const inIm = interleaved.filter((_, i) => i % 2 === 1);
    const keepRe = inRe.slice();
    const keepIm = inIm.slice();
    const splitRe = new Float64Array(n);
    const splitIm = new Float64Array(n);
    transformSplit(plan, inRe, inIm, splitRe, splitIm);
    // property: both input layouts run the same butterflies, so the results agree exactly
    assert.equal(firstDifference(splitRe, re), -1, `split N=${n} re`);
    assert.equal(firstDifference(splitIm, im), -1, `split N=${n} im`);
    // property: the kernel leaves its inputs alone (the engine relies on it)
    assert.equal(firstDifference(inRe, keepRe), -1, `input re kept N=${n}`);
    assert.equal(firstDifference(inIm, keepIm), -1, `input im kept N=${n}`);
  }
});

Deno.test("the transform with the product folded in equals transform, then product", () => {
  for (let n = 1; n <= 1 << 12; n *= 2) {
    const plan = fftPlan(n);
    const [xr, xi, hr, hi] = [1, 2, 3, 4].map((s) => minimalStandard(n, 100 * s + n));
    const re = new Float64Array(n);
    const im = new Float64Array(n);
    transformSplit(plan, xr!, xi!, re, im);
    const expectedRe = re.map((r, k) => r * hr![k]! - im[k]! * hi![k]!);
    const expectedIm = re.map((r, k) => r * hi![k]! + im[k]! * hr![k]!);
    const fusedRe = new Float64Array(n);
    const fusedIm = new Float64Array(n);
    transformSplitTimes(plan, xr!, xi!, hr!, hi!, fusedRe, fusedIm);
    // property: the same operations in the same order, so the results agree exactly
    assert.equal(firstDifference(fusedRe, expectedRe), -1, `N=${n} re`);
    assert.equal(firstDifference(fusedIm, expectedIm), -1, `N=${n} im`);
  }
});

Deno.test("realFft equals fft.js's real transform from 2 to 2^16 points", () => {
  for (let n = 2; n <= 1 << 16; n *= 2) {
    const x = minimalStandard(n, 11 + n);
    const full = new Float64Array(2 * n);
    kernel(n).realTransform(full, x);
    const X = realFft(x);
    const re = new Float64Array(n / 2 + 1);
    const im = new Float64Array(n / 2 + 1);
    for (let k = 0; k <= n / 2; k++) re[k] = full[2 * k]!;
    // fft.js leaves the imaginary parts of the DC and Nyquist bins unset; they are 0 for real input.
    for (let k = 1; k < n / 2; k++) im[k] = full[2 * k + 1]!;
    // source: fft.js 4.0.4 (npm) realTransform
    assertClose(X.re, re, forwardTolerance(n), `N=${n} re`);
    assertClose(X.im, im, forwardTolerance(n), `N=${n} im`);
  }
});

Deno.test("round trips: the inverses undo the forward transforms, 1 to 2^16 points", () => {
  const lengths = [...Array.from({ length: 17 }, (_, e) => 2 ** e), 3, 7, 10, 96, 1025];
  for (const n of lengths) {
    const x = minimalStandard(n, 13 + n);
    const y = minimalStandard(n, 17 + n);
    // property: inverse round trip; error of order ε·log2 N for values ≤ 0.5
    const tol = { abs: 4 * eps * Math.log2(2 * n) };
    assertClose(inverseRealFft(realFft(x), n), x, tol, `real N=${n}`);
    const back = inverseComplexFft(complexFft({ re: x, im: y }));
    assertClose(back.re, x, tol, `complex N=${n} re`);
    assertClose(back.im, y, tol, `complex N=${n} im`);
  }
});

Deno.test("the two result arrays never overlap, whether or not they share a buffer", () => {
  for (const n of [2, 1020, 1022, 1024, 4096, 5000]) {
    const X = realFft(minimalStandard(n, n));
    const im = X.im.slice();
    X.re.fill(7);
    assert.equal(firstDifference(X.im, im), -1, `realFft N=${n}`);
    const Z = complexFft({ re: minimalStandard(n, n) });
    const zim = Z.im.slice();
    Z.re.fill(7);
    assert.equal(firstDifference(Z.im, zim), -1, `complexFft N=${n}`);
  }
});

Deno.test("inverseRealFft ignores the imaginary parts of the DC and Nyquist bins", () => {
  for (const n of [2, 8, 1024, 6, 9]) {
    const X = realFft(minimalStandard(n, 5 + n));
    const expected = inverseRealFft(X, n);
    X.im[0] = 3;
    if (n % 2 === 0) X.im[n / 2] = -2;
    // source: the definition (a real signal has real DC and Nyquist bins); numpy.fft.irfft does the same
    assertClose(inverseRealFft(X, n), expected, { abs: 0 }, `N=${n}`);
  }
});
