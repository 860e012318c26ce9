import assert from "node:assert/strict";
import {
  binFrequencies,
  complexFft,
  inverseComplexFft,
  inverseRealFft,
  realFft,
  realSpectrum,
  zeroPad,
  zeroPadToPowerOfTwo,
} from "../../../lib/fft/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { minimalStandard } from "./_inputs.ts";

interface ComplexJson {
  re: number[];
  im: number[];
}
interface FftCase {
  kind: "complex" | "inverseComplex" | "real" | "inverseReal";
  length: number;
  input: ComplexJson | number[];
  reference: string;
  output: ComplexJson | number[];
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/analysis.json", import.meta.url)),
) as { fft: FftCase[] };

/** Largest magnitude in a complex or real vector, for an absolute tolerance scale. */
function scale(v: ComplexJson | number[]): number {
  const parts = Array.isArray(v) ? [v] : [v.re, v.im];
  return Math.max(1, ...parts.flat().map(Math.abs));
}

Deno.test("FFTs match NumPy for powers of two and other lengths", () => {
  for (const c of ref.fft) {
    const tol = { abs: 1e-12 * scale(c.output) * Math.log2(c.length + 1) };
    const what = `${c.kind} N=${c.length} vs ${c.reference}`;
    if (c.kind === "complex" || c.kind === "inverseComplex") {
      const f = c.kind === "complex" ? complexFft : inverseComplexFft;
      const y = f(c.input as ComplexJson);
      const e = c.output as ComplexJson;
      // source: numpy.fft.fft / numpy.fft.ifft (see analysis.json)
      assertClose(y.re, e.re, tol, `${what} re`);
      assertClose(y.im, e.im, tol, `${what} im`);
    } else if (c.kind === "real") {
      const y = realFft(c.input as number[], { size: c.length });
      const e = c.output as ComplexJson;
      // source: numpy.fft.rfft
      assertClose(y.re, e.re, tol, `${what} re`);
      assertClose(y.im, e.im, tol, `${what} im`);
    } else {
      // source: numpy.fft.irfft
      const y = inverseRealFft(c.input as ComplexJson, c.length);
      assertClose(y, c.output as number[], tol, what);
    }
  }
});

/** Naive O(N²) DFT with exact argument reduction, as an independent check. */
function naiveDft(re: Float64Array, im: Float64Array): { re: Float64Array; im: Float64Array } {
  const n = re.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let sr = 0;
    let si = 0;
    for (let t = 0; t < n; t++) {
      const a = (-2 * Math.PI * ((k * t) % n)) / n;
      sr += re[t]! * Math.cos(a) - im[t]! * Math.sin(a);
      si += re[t]! * Math.sin(a) + im[t]! * Math.cos(a);
    }
    outRe[k] = sr;
    outIm[k] = si;
  }
  return { re: outRe, im: outIm };
}

Deno.test("Bluestein (and radix-4) path equals a direct DFT", () => {
  for (const n of [1, 2, 3, 4, 6, 9, 11, 31, 64, 97, 210, 243, 500]) {
    const re = minimalStandard(n, 11 + n);
    const im = minimalStandard(n, 29 + n);
    const fast = complexFft({ re, im });
    const slow = naiveDft(re, im);
    // property: FFT path equals direct path; tolerance grows with the sum of N terms of size ≤ 0.5
    const tol = { abs: 1e-13 * n };
    assertClose(fast.re, slow.re, tol, `N=${n} re`);
    assertClose(fast.im, slow.im, tol, `N=${n} im`);
  }
});

Deno.test("inverse transforms undo the forward transforms", () => {
  for (const n of [1, 2, 5, 8, 13, 100, 128, 1000, 1024, 4093]) {
    const re = minimalStandard(n, 3 * n + 1);
    const im = minimalStandard(n, 5 * n + 2);
    const back = inverseComplexFft(complexFft({ re, im }));
    assertClose(back.re, re, { abs: 1e-14 * Math.log2(n + 1) }, `complex N=${n}`);
    assertClose(back.im, im, { abs: 1e-14 * Math.log2(n + 1) }, `complex N=${n}`);
    const real = inverseRealFft(realFft(re), n);
    assertClose(real, re, { abs: 1e-14 * Math.log2(n + 1) }, `real N=${n}`);
  }
});

Deno.test("Parseval: Σ|x|² = (1/N) Σ|X|² (Oppenheim & Schafer §8.6.5)", () => {
  for (const n of [7, 64, 100, 1023]) {
    const x = minimalStandard(n, 77 + n);
    const X = realFft(x);
    const energy = x.reduce((s, v) => s + v * v, 0);
    let spectral = 0;
    for (let k = 0; k < X.re.length; k++) {
      const p = X.re[k]! ** 2 + X.im[k]! ** 2;
      // Bins other than DC and (even N) Nyquist stand for two conjugate bins.
      const twice = k > 0 && !(n % 2 === 0 && k === n / 2);
      spectral += twice ? 2 * p : p;
    }
    assertClose(spectral / n, energy, { rel: 1e-13 }, `N=${n}`);
  }
});

Deno.test("real FFT of a real signal equals the complex FFT's first half", () => {
  for (const n of [6, 16, 21]) {
    const x = minimalStandard(n, n);
    const half = realFft(x);
    const full = complexFft({ re: x });
    assertClose(half.re, full.re.slice(0, Math.floor(n / 2) + 1), { abs: 1e-13 }, `N=${n}`);
    assertClose(half.im, full.im.slice(0, Math.floor(n / 2) + 1), { abs: 1e-13 }, `N=${n}`);
  }
});

Deno.test("realSpectrum keeps its power-of-two behaviour", () => {
  const x = minimalStandard(100, 5);
  const a = realSpectrum(x, 128);
  const b = realFft(x, { size: 128 });
  // two different pow-2 algorithms (fft.js real transform, packed complex transform)
  assertClose(a.re, b.re, { abs: 1e-13 }, "re");
  assertClose(a.im, b.im, { abs: 1e-13 }, "im");
});

Deno.test("zero-padding helpers and bin frequencies", () => {
  assert.deepEqual([...zeroPad([1, 2, 3], 5)], [1, 2, 3, 0, 0]);
  assert.equal(zeroPadToPowerOfTwo(new Float64Array(65)).length, 128);
  assert.equal(zeroPadToPowerOfTwo([1], 1).length, 1);
  assert.deepEqual([...binFrequencies(5, 1000)], [0, 200, 400]);
  assert.deepEqual([...binFrequencies(5, 1000, false)], [0, 200, 400, -400, -200]);
});

Deno.test("bad input to the FFT functions", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => realFft([]), RangeError, "at least 1"],
    [() => realFft([1, Number.NaN]), TypeError, "Signal[1]"],
    [() => realFft(Float64Array.of(1, 2, Infinity, 4)), TypeError, "Signal[2]"],
    [() => realFft(Float64Array.of(1, -Infinity, 3, 4, 5)), TypeError, "Signal[1]"],
    [() => realFft(Float64Array.of(Number.NaN, 0), { size: 8 }), TypeError, "Signal[0]"],
    [() => realFft([1, 2, 3], { size: 2 }), RangeError, "Transform size must be at least 3"],
    [() => realFft([1, 2], { size: 2.5 }), RangeError, "must be an integer"],
    [() => complexFft({ re: [1, 2], im: [1] }), TypeError, "imaginary part must have"],
    [() => inverseRealFft({ re: [1, 2], im: [0, 0] }, 5), RangeError, "needs 3 spectrum bins"],
    [() => zeroPad([1, 2, 3], 2), RangeError, "Padded length must be at least 3"],
    [() => binFrequencies(4, 0), RangeError, "greater than 0 Hz"],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(run, (e: unknown) => e instanceof kind && (e as Error).message.includes(text));
  }
});
