// The WebAssembly FFT kernel (lib/fft/_kernel.wat): its committed bytes are
// what the source assembles to, it loads under the sandbox's V8 flags, and it
// gives the same bits as the TypeScript kernel for every public transform
// that uses it. Its agreement with outside references is checked where the
// public functions are: radix4_test.ts (NumPy at every power of two to 2^16,
// fft.js from 2 to 2^16), fft_test.ts (NumPy), overlap_add_test.ts and
// apply_test.ts (SciPy); those now run on this kernel.
import assert from "node:assert/strict";
import { kernelMinimumSize, setKernelEnabled, wasmKernel } from "../../../lib/fft/_kernel.ts";
import { kernelBase64 } from "../../../lib/fft/_kernel_wasm.ts";
import { complexFft, inverseComplexFft, inverseRealFft, realFft } from "../../../lib/fft/mod.ts";
import { applyFirOverlapAdd } from "../../../lib/fir/overlap_add.ts";
import { assembleKernel, kernelModuleText } from "../../../tools/kernel_assembly.ts";
import { runToEnd } from "../../_process.ts";
import { minimalStandard } from "./_inputs.ts";

/** The same values bit for bit (−0 and +0 count as equal), with the first difference named. */
function assertSameBits(a: ArrayLike<number>, b: ArrayLike<number>, what: string): void {
  assert.equal(a.length, b.length, `${what}: length`);
  for (let i = 0; i < a.length; i++) {
    if (a[i] !== b[i]) assert.fail(`${what}: index ${i}, ${a[i]} against ${b[i]}`);
  }
}

/** fn with the WebAssembly kernel and with the TypeScript kernel. */
function bothKernels<T>(fn: () => T): [T, T] {
  assert.ok(wasmKernel() !== undefined, "the WebAssembly kernel loads here");
  const wasm = fn();
  setKernelEnabled(false);
  try {
    assert.equal(wasmKernel(), undefined);
    return [wasm, fn()];
  } finally {
    setKernelEnabled(true);
  }
}

Deno.test("the committed kernel bytes are what _kernel.wat assembles to", async () => {
  // source: wabt 1.0.37's wat2wasm (npm package wabt), the WebAssembly text format's reference assembler
  const text = await Deno.readTextFile(new URL("../../../lib/fft/_kernel.wat", import.meta.url));
  const bytes = await assembleKernel(text);
  const committed = await Deno.readTextFile(
    new URL("../../../lib/fft/_kernel_wasm.ts", import.meta.url),
  );
  assert.equal(committed, kernelModuleText(bytes), "run: deno run -A tools/build_kernel.ts");
  assert.equal(atob(kernelBase64).length, bytes.length);
});

Deno.test("the kernel loads in a process with the sandbox's V8 flags", async () => {
  const kernel = new URL("../../../lib/fft/_kernel.ts", import.meta.url).href;
  const code = `import { wasmKernel } from ${JSON.stringify(kernel)};
    console.log(wasmKernel() === undefined ? "missing" : "loaded");`;
  const run = await runToEnd(Deno.execPath(), [
    "eval",
    "--no-config",
    "--v8-flags=--disallow-code-generation-from-strings",
    code,
  ]);
  assert.equal(run.code, 0, run.stderr);
  assert.equal(run.stdout.trim(), "loaded");
});

Deno.test("real and complex transforms: the same bits from both kernels, 2 to 2^17 points", () => {
  for (let n = 2; n <= 1 << 17; n *= 2) {
    const x = minimalStandard(n, n + 1);
    const y = minimalStandard(n, 7 * n + 3);
    const [wasm, ts] = bothKernels(() => {
      const real = realFft(x);
      const complex = complexFft({ re: x, im: y });
      return {
        real,
        inverseReal: inverseRealFft(real, n),
        complex,
        inverseComplex: inverseComplexFft(complex),
      };
    });
    assertSameBits(wasm.real.re, ts.real.re, `realFft N=${n} re`);
    assertSameBits(wasm.real.im, ts.real.im, `realFft N=${n} im`);
    assertSameBits(wasm.inverseReal, ts.inverseReal, `inverseRealFft N=${n}`);
    assertSameBits(wasm.complex.re, ts.complex.re, `complexFft N=${n} re`);
    assertSameBits(wasm.complex.im, ts.complex.im, `complexFft N=${n} im`);
    assertSameBits(wasm.inverseComplex.re, ts.inverseComplex.re, `inverse N=${n} re`);
    assertSameBits(wasm.inverseComplex.im, ts.inverseComplex.im, `inverse N=${n} im`);
  }
});

Deno.test("Bluestein lengths (power-of-two convolutions inside): the same bits from both kernels", () => {
  for (const n of [15, 100, 1000, 4099]) {
    const x = minimalStandard(n, n);
    const [wasm, ts] = bothKernels(() => ({
      real: realFft(x),
      inverse: inverseRealFft(realFft(x), n),
    }));
    assertSameBits(wasm.real.re, ts.real.re, `realFft N=${n} re`);
    assertSameBits(wasm.real.im, ts.real.im, `realFft N=${n} im`);
    assertSameBits(wasm.inverse, ts.inverse, `inverseRealFft N=${n}`);
  }
});

Deno.test("overlap-add: the same bits from both kernels, across chunks and ragged ends", () => {
  // [taps, signal length, FFT length]: the default length, the smallest the
  // kernel takes, signals shorter than one block, odd lengths, and signals of
  // several output chunks (about 32 Ki samples each) ending mid-block.
  const cases: [number, number, number | undefined][] = [
    [255, 100_000, undefined],
    [255, 1_000_003, 2048],
    [7, 5, kernelMinimumSize],
    [8, 9, kernelMinimumSize],
    [31, 1000, 64],
    [100, 70_001, 512],
    [513, 40_000, 4096],
    [1, 33, 16],
  ];
  for (const [taps, length, fftLength] of cases) {
    const h = minimalStandard(taps, taps + 11);
    const x = minimalStandard(length, length);
    const options = fftLength === undefined ? {} : { fftLength };
    const [wasm, ts] = bothKernels(() => applyFirOverlapAdd(h, x, options));
    assertSameBits(wasm, ts, `${taps} taps, ${length} samples, M=${fftLength ?? "default"}`);
  }
});

Deno.test("the kernel's results do not depend on what it computed before", () => {
  // Tables of many sizes and work arrays of different lengths share one
  // memory; a transform repeated after others must not change.
  const x = minimalStandard(4096, 5);
  const first = realFft(x);
  for (let n = 16; n <= 1 << 16; n *= 4) realFft(minimalStandard(n, n));
  applyFirOverlapAdd(minimalStandard(200, 1), minimalStandard(50_000, 2));
  const again = realFft(x);
  assertSameBits(again.re, first.re, "re");
  assertSameBits(again.im, first.im, "im");
});
