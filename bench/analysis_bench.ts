// Speed of the analysis library: FFTs and FIR filtering. Run with
//   deno bench bench/analysis_bench.ts
// Inputs are built outside the timed functions. The side-by-side comparison
// with NumPy/SciPy is bench/side_by_side_analysis.ts.
import { kernel } from "../lib/fft/_fftjs.ts";
import { complexFft, realFft } from "../lib/fft/mod.ts";
import { applyFir, applyFirDirect } from "../lib/fir/apply.ts";
import { applyFirOverlapAdd } from "../lib/fir/overlap_add.ts";
import { StreamingFirFilter } from "../lib/fir/streaming.ts";
import { frequencyResponse, groupDelay } from "../lib/response/mod.ts";
import { whiteNoise } from "../lib/signal/noise.ts";
import { welchSpectrum } from "../lib/spectral/welch.ts";

// ---------------------------------------------------------------- real FFT
for (const size of [1024, 16384, 65536]) {
  const x = whiteNoise(size, { seed: size });
  const out = new Float64Array(2 * size);
  const k = kernel(size);
  Deno.bench({
    name: `fft.js realTransform kernel only, N=${size}`,
    group: `real FFT N=${size}`,
    baseline: true,
    fn: () => k.realTransform(out, x),
  });
  Deno.bench({
    name: `realFft, N=${size}`,
    group: `real FFT N=${size}`,
    fn: () => void realFft(x),
  });
}
{
  // Bluestein: a length with a large prime factor against the next power of two.
  const x = whiteNoise(65521, { seed: 3 });
  const y = whiteNoise(65536, { seed: 4 });
  Deno.bench({
    name: "complexFft N=65536 (fft.js)",
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
    fn: () => void applyFirDirect(h, x),
  });
  Deno.bench({ name: "overlap-add", group, n: 5, fn: () => void applyFirOverlapAdd(h, x) });
  Deno.bench({ name: "applyFir (automatic)", group, n: 5, fn: () => void applyFir(h, x) });
  Deno.bench({
    name: "streaming, 1024-sample blocks",
    group,
    n: 5,
    fn: () => {
      const f = new StreamingFirFilter(h);
      for (let i = 0; i < x.length; i += 1024) f.process(x.subarray(i, i + 1024));
    },
  });
}
for (const taps of [8, 32, 48, 96, 512]) {
  const x = whiteNoise(100_000, { seed: 5 });
  const h = whiteNoise(taps, { seed: 6 });
  const group = `FIR crossover, ${taps} taps, 1e5 samples`;
  Deno.bench({ name: "direct form", group, baseline: true, fn: () => void applyFirDirect(h, x) });
  Deno.bench({ name: "overlap-add", group, fn: () => void applyFirOverlapAdd(h, x) });
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
