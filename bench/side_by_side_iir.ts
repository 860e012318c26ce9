// Driver for bench/side_by_side_iir.py: times tapsheet's IIR workloads and prints JSON.
// Run: deno run bench/side_by_side_iir.ts   (the Python script runs it for you)
import { applySections, designIir, type IirDesignOptions } from "../lib/mod.ts";

const lowpass: IirDesignOptions = {
  family: "elliptic",
  response: "lowpass",
  order: 8,
  fs: 48000,
  edges: 4000,
  passbandRippleDb: 0.1,
  stopbandAttenuationDb: 80,
};
const bandpass: IirDesignOptions = {
  family: "elliptic",
  response: "bandpass",
  order: 8,
  fs: 48000,
  edges: [1000, 2000],
  passbandRippleDb: 0.5,
  stopbandAttenuationDb: 70,
};

/** Best-of-`repeats` wall time in ms (median is printed too). */
function time(fn: () => void, repeats: number): { best: number; median: number } {
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return { best: times[0]!, median: times[Math.floor(times.length / 2)]! };
}

// Same input as the Python side: a deterministic pseudo-random signal (values do not matter for timing).
const n = 1_000_000;
const x = new Float64Array(n);
let seed = 12345;
for (let i = 0; i < n; i++) {
  seed = (seed * 1103515245 + 12345) % 2147483648;
  x[i] = seed / 1073741824 - 1;
}
const sections = designIir(lowpass).sections;
// Warm-up so the JIT has compiled the hot paths.
for (let i = 0; i < 5; i++) applySections(sections, x);
for (let i = 0; i < 200; i++) designIir(bandpass);

const filter = time(() => applySections(sections, x), 20);
// The same work into a reused output array: V8 pays heavily for a fresh 8 MB ArrayBuffer per call
// (page faults and external-memory GC), which SciPy's malloc mostly avoids.
const out = new Float64Array(n);
const filterReused = time(() => applySections(sections, x, undefined, out), 20);
const design = time(() => designIir(bandpass), 2000);
console.log(
  JSON.stringify({
    filterMs: filter,
    filterReusedMs: filterReused,
    designMs: design,
    sections: sections.length,
  }),
);
