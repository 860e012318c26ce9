// Design-search benchmarks: deno bench -A bench/search_bench.ts
// Target: a full search (every method, 16-bit coefficients, 40-bit accumulator) finishes in
// under 1 s for each spec on the project machine. Specs are built outside the timed functions;
// the baseline in each group is one equiripple design of the chosen FIR length, checked once.
import {
  checkSpec,
  designEquiripple,
  type FilterSpec,
  inferBandLayout,
  searchDesigns,
  type SearchTarget,
} from "../lib/mod.ts";

/** Invented scenarios. */
const specs: { name: string; spec: FilterSpec; target: SearchTarget }[] = [
  {
    name: "audio lowpass (48 kHz, 0.1 dB to 15 kHz, 70 dB from 17 kHz)",
    spec: {
      fs: 48000,
      requirements: [
        { kind: "passbandRipple", from: 0, to: 15000, atMostDb: 0.1 },
        { kind: "stopbandAttenuation", from: 17000, to: 24000, atLeastDb: 70 },
      ],
    },
    target: { wordLength: 16, accumulatorBits: 40 },
  },
  {
    name: "narrow bandpass (8 kHz, 950–1050 Hz, 50 dB outside 800–1200 Hz)",
    spec: {
      fs: 8000,
      requirements: [
        { kind: "stopbandAttenuation", from: 0, to: 800, atLeastDb: 50 },
        { kind: "passbandRipple", from: 950, to: 1050, atMostDb: 1 },
        { kind: "stopbandAttenuation", from: 1200, to: 4000, atLeastDb: 50 },
      ],
    },
    target: { wordLength: 16, accumulatorBits: 40 },
  },
  {
    name: "decimate by 8 (48 kHz → 6 kHz, 0.2 dB to 2.4 kHz, 70 dB from 3 kHz)",
    spec: {
      fs: 48000,
      requirements: [
        { kind: "passbandRipple", from: 0, to: 2400, atMostDb: 0.2 },
        { kind: "stopbandAttenuation", from: 3000, to: 24000, atLeastDb: 70 },
      ],
    },
    target: { wordLength: 16, accumulatorBits: 40, decimation: 8 },
  },
];

for (const { name, spec, target } of specs) {
  const group = `search: ${name}`;
  const layout = inferBandLayout(spec);
  const once = searchDesigns(spec, { target, methods: ["equiripple"] });
  const length = once.candidates[0]!.size;
  Deno.bench({
    name: `one equiripple design of ${length} taps, checked once (baseline)`,
    group,
    baseline: true,
    fn() {
      const d = designEquiripple({ length, fs: spec.fs, bands: layout.bands });
      checkSpec({ kind: "fir", taps: d.taps }, spec);
    },
  });
  Deno.bench({
    name: "equiripple only",
    group,
    fn() {
      searchDesigns(spec, { target, methods: ["equiripple"] });
    },
  });
  Deno.bench({
    name: "IIR families only",
    group,
    fn() {
      searchDesigns(spec, {
        target,
        methods: ["elliptic", "chebyshev1", "chebyshev2", "butterworth", "bessel"],
      });
    },
  });
  Deno.bench({
    name: "full search (every method)",
    group,
    fn() {
      searchDesigns(spec, { target });
    },
  });
}
