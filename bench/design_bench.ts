// FIR design and multirate benchmarks. Run: deno bench --allow-read bench/design_bench.ts
// Inputs are built outside the timed functions.
import { designEquiripple } from "../lib/fir/equiripple.ts";
import { designLeastSquares } from "../lib/fir/least_squares.ts";
import { designWindowedSinc } from "../lib/fir/windowed_sinc.ts";
import { designFrequencySampling } from "../lib/fir/frequency_sampling.ts";
import { decimatePolyphase, designResamplingFilter } from "../lib/multirate/resample.ts";
import { kaiserWindow } from "../lib/window/kaiser.ts";

const lowpass = (transition: number) => [
  { from: 0, to: 0.2, gain: 1, weight: 1 },
  { from: 0.2 + transition, to: 0.5, gain: 0, weight: 10 },
];

// Equiripple, sweeping the length (transition shrinking with it so δ stays resolvable).
for (
  const [length, transition, baseline] of [
    [63, 0.05, true],
    [255, 0.02, false],
    [511, 0.01, false],
    [1023, 0.005, false],
  ] as const
) {
  const bands = lowpass(transition);
  Deno.bench({
    name: `equiripple ${length} taps`,
    group: "equiripple length sweep",
    baseline,
    fn: () => {
      designEquiripple({ length, fs: 1, bands });
    },
  });
}

// One 255-tap lowpass spec, four methods.
const spec = lowpass(0.02);
Deno.bench({
  name: "window method (Kaiser β = 8)",
  group: "methods at 255 taps",
  baseline: true,
  fn: () => {
    designWindowedSinc({ length: 255, fs: 1, cutoff: 0.21, window: { name: "kaiser", beta: 8 } });
  },
});
Deno.bench({
  name: "frequency sampling",
  group: "methods at 255 taps",
  fn: () => {
    designFrequencySampling({
      length: 255,
      fs: 1,
      frequencies: [0, 0.2, 0.22, 0.5],
      gains: [1, 1, 0, 0],
    });
  },
});
Deno.bench({
  name: "weighted least squares",
  group: "methods at 255 taps",
  fn: () => {
    designLeastSquares({ length: 255, fs: 1, bands: spec });
  },
});
Deno.bench({
  name: "equiripple (Parks–McClellan)",
  group: "methods at 255 taps",
  fn: () => {
    designEquiripple({ length: 255, fs: 1, bands: spec });
  },
});

// Kaiser window sweep.
for (const [n, baseline] of [[256, true], [4096, false], [65536, false]] as const) {
  Deno.bench({
    name: `Kaiser window ${n}`,
    group: "kaiser window",
    baseline,
    fn: () => {
      kaiserWindow(n, 8.6);
    },
  });
}

// Decimation by 8 of 1e5 samples: polyphase against filter-everything-then-discard.
const x = Float64Array.from({ length: 100_000 }, (_, i) => Math.sin(0.001 * i * i));
const h = designResamplingFilter(1, 8);
Deno.bench({
  name: "filter every sample, keep 1 in 8",
  group: "decimate by 8, 161 taps",
  baseline: true,
  fn: () => {
    const y = new Float64Array(Math.ceil(x.length / 8));
    for (let i = 0; i < x.length; i++) {
      let acc = 0;
      for (let k = 0; k < h.length && k <= i; k++) acc += h[k]! * x[i - k]!;
      if (i % 8 === 0) y[i / 8] = acc;
    }
  },
});
Deno.bench({
  name: "polyphase (kept outputs only)",
  group: "decimate by 8, 161 taps",
  fn: () => {
    decimatePolyphase(x, 8, { taps: h });
  },
});
