// IIR benchmarks: deno bench --allow-read bench/iir_bench.ts
// Inputs are built outside the timed functions.
import {
  applyIir,
  applySections,
  applyZeroPhase,
  designIir,
  type IirDesignOptions,
  sectionsToPolynomial,
} from "../lib/mod.ts";

const lowpass: IirDesignOptions = {
  family: "elliptic",
  response: "lowpass",
  order: 8,
  fs: 48000,
  edges: 4000,
  passbandRippleDb: 0.1,
  stopbandAttenuationDb: 80,
};
const sections = designIir(lowpass).sections;
const { numerator, denominator } = sectionsToPolynomial(sections);

function noise(n: number): Float64Array {
  const x = new Float64Array(n);
  let seed = 7;
  for (let i = 0; i < n; i++) {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    x[i] = seed / 1073741824 - 1;
  }
  return x;
}
const signals = new Map([1e4, 1e5, 1e6].map((n) => [n, noise(n)]));

for (const [n, x] of signals) {
  const group = `filter ${n.toExponential(0)} samples, order-8 elliptic lowpass`;
  Deno.bench({
    name: `copy only (${n})`,
    group,
    baseline: true,
    fn() {
      x.slice();
    },
  });
  Deno.bench({
    name: `applySections, 4 sections (${n})`,
    group,
    fn() {
      applySections(sections, x);
    },
  });
  const out = new Float64Array(n);
  Deno.bench({
    name: `applySections into a reused output (${n})`,
    group,
    fn() {
      applySections(sections, x, undefined, out);
    },
  });
  Deno.bench({
    name: `applyIir, order-8 polynomial (${n})`,
    group,
    fn() {
      applyIir(numerator, denominator, x);
    },
  });
  Deno.bench({
    name: `applyZeroPhase (${n})`,
    group,
    fn() {
      applyZeroPhase(sections, x);
    },
  });
}

const designs: [string, IirDesignOptions][] = [
  ["Butterworth order-8 lowpass", {
    family: "butterworth",
    response: "lowpass",
    order: 8,
    fs: 48000,
    edges: 4000,
  }],
  ["elliptic order-8 lowpass", lowpass],
  [
    "elliptic order-8 bandpass (target < 5 ms)",
    {
      ...lowpass,
      response: "bandpass",
      edges: [1000, 2000],
      passbandRippleDb: 0.5,
      stopbandAttenuationDb: 70,
    },
  ],
  ["Bessel order-12 lowpass", {
    family: "bessel",
    response: "lowpass",
    order: 12,
    fs: 48000,
    edges: 4000,
  }],
];
designs.forEach(([name, options], i) => {
  Deno.bench({
    name,
    group: "design to sections",
    baseline: i === 0,
    fn() {
      designIir(options);
    },
  });
});
