// Speed of the analysis library: FFTs and FIR filtering. Run with
//   deno bench bench/analysis_bench.ts            (all groups)
//   deno bench bench/analysis_bench.ts --filter crossover
// Inputs are built outside the timed functions. The side-by-side comparison
// with NumPy/SciPy, where the speed targets live, is bench/side_by_side_analysis.ts.
// The measurements quoted in lib/fft/_engine.ts (fft.js against the radix-4
// kernel), lib/fir/overlap_add.ts (FFT length) and lib/fir/apply.ts (the
// direct/overlap-add crossover) come from the groups below.
import { kernel } from "../lib/fft/_fftjs.ts";
import { fftPlan, transformInterleaved } from "../lib/fft/_radix4.ts";
import { setKernelEnabled } from "../lib/fft/_kernel.ts";
import { complexFft, inverseRealFft, realFft } from "../lib/fft/mod.ts";
import { applyFir, applyFirDirect } from "../lib/fir/apply.ts";
import { applyFirOverlapAdd } from "../lib/fir/overlap_add.ts";
import { StreamingFirFilter } from "../lib/fir/streaming.ts";
import { frequencyResponse, groupDelay } from "../lib/response/mod.ts";
import { whiteNoise } from "../lib/signal/noise.ts";
import { welchSpectrum } from "../lib/spectral/welch.ts";

// ---------------------------------------------------------------- complex FFT kernels
// fft.js against tapsheet's radix-4 kernel, kernel calls only, per power of two.
// Measured: fft.js is faster at N = 2 and 4 (by 3–5 ns, 7 against 12 ns at
// N = 2), even at 16; the radix-4 kernel from 8 and from 32 on (0.65–0.9×).
// The public functions use the radix-4 kernel throughout: a few nanoseconds
// are under 1 % of a call, which validates and allocates (about 0.4 µs).
for (const size of [2, 4, 16, 64, 512, 2048, 4096, 32768]) {
  const x = whiteNoise(2 * size, { seed: size });
  const out = new Float64Array(2 * size);
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  const plan = fftPlan(size);
  const group = `complex FFT kernel N=${size}`;
  Deno.bench({
    name: `fft.js transform, N=${size}`,
    group,
    baseline: true,
    fn: () => kernel(size).transform(out, x),
  });
  Deno.bench({
    name: `radix-4 kernel, N=${size}`,
    group,
    fn: () => transformInterleaved(plan, x, re, im),
  });
}

// ---------------------------------------------------------------- real FFT
for (const size of [16, 1024, 16384, 65536]) {
  const x = whiteNoise(size, { seed: size });
  const out = new Float64Array(2 * size);
  const spectrum = realFft(x);
  const group = `real FFT N=${size}`;
  Deno.bench({
    name: `fft.js realTransform kernel only, N=${size}`,
    group,
    baseline: true,
    fn: () => kernel(size).realTransform(out, x),
  });
  Deno.bench({ name: `realFft, N=${size}`, group, fn: () => void realFft(x) });
  Deno.bench({
    name: `inverseRealFft, N=${size}`,
    group,
    fn: () => void inverseRealFft(spectrum, size),
  });
}
// ---------------------------------------------------------------- WebAssembly kernel
// The public functions with the WebAssembly kernel (lib/fft/_kernel.wat) and
// with it turned off (the TypeScript kernel); both give the same bits.
const kernels = [["TypeScript", false], ["WebAssembly", true]] as const;
/** fn run with the WebAssembly kernel on or off (it is on otherwise). */
const withKernel = (on: boolean, fn: () => unknown) => () => {
  setKernelEnabled(on);
  fn();
  setKernelEnabled(true);
};
for (const size of [64, 1024, 16384, 65536]) {
  const x = whiteNoise(size, { seed: size });
  const spectrum = realFft(x);
  const group = `FFT kernel, real N=${size}`;
  for (const [name, on] of kernels) {
    Deno.bench({
      name: `realFft, ${name} kernel, N=${size}`,
      group,
      baseline: !on,
      fn: withKernel(on, () => realFft(x)),
    });
    Deno.bench({
      name: `inverseRealFft, ${name} kernel, N=${size}`,
      group,
      fn: withKernel(on, () => inverseRealFft(spectrum, size)),
    });
  }
}
{
  const x = whiteNoise(100_000, { seed: 11 });
  const h = whiteNoise(255, { seed: 12 });
  for (const [name, on] of kernels) {
    Deno.bench({
      name: `applyFirOverlapAdd, ${name} kernel`,
      group: "FFT kernel, overlap-add 255 taps, 1e5 samples",
      baseline: !on,
      fn: withKernel(on, () => applyFirOverlapAdd(h, x)),
    });
  }
}

{
  // Bluestein: a length with a large prime factor against the next power of two.
  const x = whiteNoise(65521, { seed: 3 });
  const y = whiteNoise(65536, { seed: 4 });
  Deno.bench({
    name: "complexFft N=65536 (radix-4)",
    group: "complex FFT, prime length",
    baseline: true,
    fn: () => void complexFft({ re: y }),
  });
  Deno.bench({
    name: "complexFft N=65521 (prime, Bluestein)",
    group: "complex FFT, prime length",
    fn: () => void complexFft({ re: x }),
  });
}

// ---------------------------------------------------------------- FIR filtering
{
  const x = whiteNoise(1_000_000, { seed: 1 });
  const h = whiteNoise(255, { seed: 2 });
  const group = "FIR 255 taps, 1e6 samples";
  Deno.bench({
    name: "direct form",
    group,
    baseline: true,
    n: 5,
    warmup: 2,
    fn: () => void applyFirDirect(h, x),
  });
  Deno.bench({
    name: "overlap-add",
    group,
    n: 20,
    warmup: 5,
    fn: () => void applyFirOverlapAdd(h, x),
  });
  Deno.bench({
    name: "applyFir (automatic)",
    group,
    n: 20,
    warmup: 5,
    fn: () => void applyFir(h, x),
  });
  Deno.bench({
    name: "streaming, 1024-sample blocks",
    group,
    n: 5,
    warmup: 2,
    fn: () => {
      const f = new StreamingFirFilter(h);
      for (let i = 0; i < x.length; i += 1024) f.process(x.subarray(i, i + 1024));
    },
  });
}
// FFT length of overlap-add: the default against fixed lengths, for a short,
// a middling and a long filter on 1e6 samples. Each case allocates 8 MB per
// call, so the garbage collector's timing adds noise of ±15 % here.
for (const taps of [32, 255, 1024]) {
  const x = whiteNoise(1_000_000, { seed: 9 });
  const h = whiteNoise(taps, { seed: 10 });
  const group = `overlap-add FFT length, ${taps} taps, 1e6 samples`;
  Deno.bench({
    name: "default length",
    group,
    baseline: true,
    n: 10,
    warmup: 5,
    fn: () => void applyFirOverlapAdd(h, x),
  });
  for (let m = 512; m <= 32768; m *= 4) {
    if (m < 2 * taps) continue;
    Deno.bench({
      name: `M=${m}`,
      group,
      n: 10,
      warmup: 5,
      fn: () => void applyFirOverlapAdd(h, x, { fftLength: m }),
    });
  }
}
// Direct form against overlap-add across the crossover N ≥ 24 + 50 000/L
// (lib/fir/apply.ts): 72.8 taps at L = 1024, 27 at 16384, 24.4 at 131072.
for (const length of [1024, 16384, 131072]) {
  const x = whiteNoise(length, { seed: 5 });
  for (const taps of [8, 16, 24, 32, 48, 64, 96, 192]) {
    const h = whiteNoise(taps, { seed: 6 });
    const group = `FIR crossover, ${taps} taps, ${length} samples`;
    Deno.bench({ name: "direct form", group, baseline: true, fn: () => void applyFirDirect(h, x) });
    Deno.bench({ name: "overlap-add", group, fn: () => void applyFirOverlapAdd(h, x) });
  }
}

// ---------------------------------------------------------------- responses and spectra
{
  const h = whiteNoise(1023, { seed: 7 });
  const group = "response of 1023 taps";
  Deno.bench({
    name: "frequencyResponse 4097 points",
    group,
    baseline: true,
    fn: () => void frequencyResponse(h, 48000),
  });
  Deno.bench({
    name: "frequencyResponse 5000 points (Bluestein)",
    group,
    fn: () => void frequencyResponse(h, 48000, { points: 5000 }),
  });
  Deno.bench({ name: "groupDelay 4097 points", group, fn: () => void groupDelay(h, 48000) });
}
{
  const x = whiteNoise(1 << 20, { seed: 8 });
  Deno.bench({
    name: "welchSpectrum 2^20 samples, 4096-point segments",
    group: "Welch",
    fn: () => void welchSpectrum(x, 48000, { segmentLength: 4096 }),
  });
}
