// Side-by-side: tapsheet's Parks–McClellan design against SciPy's Remez routine on
// the same machine. Run:
//   deno run --allow-read --allow-run bench/side_by_side_design.ts [repeats]
// Prints our time ÷ SciPy's (median of the repeats) and both achieved ripples.
import { ConvergenceError, designEquiripple } from "../lib/fir/equiripple.ts";
import { measureBands } from "../lib/fir/band_error.ts";

const repeats = Number(Deno.args[0] ?? 15);
const bands = [
  { from: 0, to: 0.2, gain: 1, weight: 1 },
  { from: 0.205, to: 0.5, gain: 0, weight: 10 },
];
const design = () => designEquiripple({ length: 1023, fs: 1, bands });

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

for (let i = 0; i < 3; i++) design(); // warm-up (JIT)
const ours: number[] = [];
let result = design();
for (let i = 0; i < repeats; i++) {
  const t0 = performance.now();
  result = design();
  ours.push((performance.now() - t0) / 1000);
}
const [pass, stop] = measureBands(result.taps, 1, bands, { points: 65537 });

const t0 = performance.now();
let overMet = "returned taps";
try {
  designEquiripple({
    length: 1023,
    fs: 1,
    bands: [{ from: 0, to: 0.2, gain: 1 }, { from: 0.22, to: 0.5, gain: 0, weight: 10 }],
  });
} catch (e) {
  overMet = e instanceof ConvergenceError ? `ConvergenceError: ${e.message}` : String(e);
}
const overMetSeconds = (performance.now() - t0) / 1000;

const python = new Deno.Command("/usr/bin/python3", {
  args: [new URL("./side_by_side_design.py", import.meta.url).pathname, String(repeats)],
  stdout: "piped",
  stderr: "inherit",
}).outputSync();
if (!python.success) throw new Error("bench/side_by_side_design.py failed");
const ref = JSON.parse(new TextDecoder().decode(python.stdout));

const db = (x: number) => 20 * Math.log10(x);
const ratio = median(ours) / ref.remez1023.median;
console.log(`Equiripple lowpass, 1023 taps, bands [0, 0.2] and [0.205, 0.5], weights 1 and 10`);
console.log(`  SciPy ${ref.scipy} / NumPy ${ref.numpy}, ${repeats} repeats each`);
console.log(
  `  tapsheet median ${(median(ours) * 1000).toFixed(1)} ms (best ${
    (Math.min(...ours) * 1000).toFixed(1)
  } ms, ${result.iterations} iterations)`,
);
console.log(
  `  SciPy    median ${(ref.remez1023.median * 1000).toFixed(1)} ms (best ${
    (ref.remez1023.best * 1000).toFixed(1)
  } ms)`,
);
console.log(`  time ratio (tapsheet ÷ SciPy, medians): ${ratio.toFixed(2)}`);
console.log(
  `  passband deviation: tapsheet ${pass!.maxDeviation.toExponential(4)} (${
    db(1 + pass!.maxDeviation).toFixed(6)
  } dB), SciPy ${ref.remez1023.passbandDeviation.toExponential(4)} (${
    db(1 + ref.remez1023.passbandDeviation).toFixed(6)
  } dB)`,
);
console.log(
  `  stopband peak: tapsheet ${db(stop!.maxGain).toFixed(4)} dB, SciPy ${
    db(ref.remez1023.stopbandPeak).toFixed(4)
  } dB`,
);
console.log(`Over-met spec (1023 taps, transition 0.02):`);
console.log(`  tapsheet after ${(overMetSeconds * 1000).toFixed(1)} ms: ${overMet}`);
console.log(
  `  SciPy    after ${(ref.overMet.seconds * 1000).toFixed(1)} ms: ${ref.overMet.outcome}`,
);
