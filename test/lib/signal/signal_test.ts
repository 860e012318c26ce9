import assert from "node:assert/strict";
import {
  impulse,
  linearChirp,
  logarithmicChirp,
  pinkNoise,
  step,
  tone,
  whiteNoise,
} from "../../../lib/signal/mod.ts";
import { portableLog, Xoshiro128 } from "../../../lib/signal/_random.ts";
import { welchSpectrum } from "../../../lib/spectral/welch.ts";
import { assertClose } from "../../_tolerance.ts";

interface ChirpCase {
  method: "linear" | "logarithmic";
  startFrequency: number;
  endFrequency: number;
  length: number;
  fs: number;
  phase: number;
  reference: string;
  values: number[];
}
interface RandomCase {
  seed: number;
  uint32: number[];
  uniformAfter8Words: number[];
  reference: string;
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/analysis.json", import.meta.url)),
) as { chirps: ChirpCase[]; random: RandomCase[] };

Deno.test("chirps match SciPy", () => {
  for (const c of ref.chirps) {
    const make = c.method === "linear" ? linearChirp : logarithmicChirp;
    const x = make({
      length: c.length,
      fs: c.fs,
      startFrequency: c.startFrequency,
      endFrequency: c.endFrequency,
      phase: c.phase,
    });
    // source: scipy.signal.chirp (c.reference); phases reach ~1e4 rad, so 1e-9 absolute
    assertClose(x, c.values, { abs: 1e-9 }, c.reference);
  }
});

Deno.test("xoshiro128** with SplitMix64 seeding matches the reference C code's output", () => {
  for (const c of ref.random) {
    const g = new Xoshiro128(c.seed);
    // source: Python transcription of https://prng.di.unimi.it/xoshiro128starstar.c and splitmix64.c
    assert.deepEqual(Array.from({ length: 8 }, () => g.nextUint32()), c.uint32, `seed ${c.seed}`);
    assert.deepEqual(Array.from({ length: 4 }, () => g.uniform()), c.uniformAfter8Words);
  }
});

Deno.test("portable logarithm agrees with Math.log to 2 ulp", () => {
  for (const x of [1e-300, 1e-20, 0.001, 0.25, 0.5, 0.7071, 0.9999999, 1, 1.5, 2, 10, 12345.678]) {
    assertClose(portableLog(x), Math.log(x), { rel: 4.5e-16, abs: 1e-300 }, `ln ${x}`);
  }
});

Deno.test("white noise: repeatable, seeded, right moments", () => {
  const a = whiteNoise(50000, { seed: 42, standardDeviation: 2 });
  assert.deepEqual(a.slice(0, 10), whiteNoise(10, { seed: 42, standardDeviation: 2 }));
  assert.notDeepEqual(a.slice(0, 10), whiteNoise(10, { seed: 43, standardDeviation: 2 }));
  const mean = a.reduce((s, v) => s + v, 0) / a.length;
  const variance = a.reduce((s, v) => s + (v - mean) ** 2, 0) / a.length;
  const kurtosis = a.reduce((s, v) => s + (v - mean) ** 4, 0) / a.length / variance ** 2;
  // Gaussian: mean 0 (σ/√N = 0.009), variance 4, kurtosis 3 (standard error ≈ √(24/N) = 0.02).
  assertClose(mean, 0, { abs: 0.04 }, "mean");
  assertClose(variance, 4, { rel: 0.03 }, "variance");
  assertClose(kurtosis, 3, { abs: 0.1 }, "kurtosis");
  const u = whiteNoise(50000, { seed: 5, distribution: "uniform" });
  assert.ok(u.every((v) => Math.abs(v) <= Math.sqrt(3)), "uniform bounds ±√3");
  const uVar = u.reduce((s, v) => s + v * v, 0) / u.length;
  assertClose(uVar, 1, { rel: 0.03 }, "uniform variance");
  // A flat spectrum: Welch density 2σ²/fs one-sided for σ = 2, fs = 1 (common practice).
  const p = welchSpectrum(a, 1, { segmentLength: 512 });
  const low = p.power.slice(1, 128).reduce((s, v) => s + v, 0) / 127;
  const high = p.power.slice(128, 256).reduce((s, v) => s + v, 0) / 128;
  assertClose(low, 8, { rel: 0.1 }, "density low half");
  assertClose(high, 8, { rel: 0.1 }, "density high half");
});

Deno.test("pink noise: spectrum falls 10 dB per decade (3 dB per octave)", () => {
  const x = pinkNoise(1 << 18, { seed: 9 });
  const rms = Math.sqrt(x.reduce((s, v) => s + v * v, 0) / x.length);
  assertClose(rms, 1, { rel: 0.15 }, "RMS");
  const fs = 1;
  const p = welchSpectrum(x, fs, { segmentLength: 8192 });
  // Least-squares slope of 10·log10(P) against log10(f) over 0.0005 … 0.2 cycles/sample.
  let sx = 0, sy = 0, sxx = 0, sxy = 0, n = 0;
  for (let k = 1; k < p.power.length; k++) {
    const f = p.frequencies[k]!;
    if (f < 0.0005 || f > 0.2) continue;
    const lx = Math.log10(f);
    const ly = 10 * Math.log10(p.power[k]!);
    sx += lx;
    sy += ly;
    sxx += lx * lx;
    sxy += lx * ly;
    n++;
  }
  const slope = (n * sxy - sx * sy) / (n * sxx - sx * sx);
  // source: the definition of pink noise, PSD ∝ 1/f (Gardner 1978); Voss–McCartney ripple allowed.
  assertClose(slope, -10, { abs: 1 }, "dB per decade");
  assert.deepEqual(pinkNoise(5, { seed: 9 }), x.slice(0, 5), "repeatable");
});

Deno.test("tone: A·cos(2πfn/fs + φ)", () => {
  const x = tone({ length: 1000, fs: 48000, frequency: 1234.5, amplitude: 0.5, phase: 0.3 });
  for (let n = 0; n < 1000; n += 37) {
    // source: definition of a sampled sinusoid (O&S §2.1)
    assertClose(
      x[n]!,
      0.5 * Math.cos((2 * Math.PI * 1234.5 * n) / 48000 + 0.3),
      { abs: 1e-12 },
      `n=${n}`,
    );
  }
  assert.deepEqual([...tone({ length: 3, fs: 10, frequency: 5 })].map(Math.round), [1, -1, 1]);
});

Deno.test("impulse and step", () => {
  assert.deepEqual([...impulse(3)], [1, 0, 0]);
  assert.deepEqual([...step(3, 1)], [0, 1, 1]);
});

Deno.test("bad input to signal generators", () => {
  const base = { length: 10, fs: 1000, startFrequency: 10, endFrequency: 100 };
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => tone({ length: 10, fs: 1000, frequency: 600 }), RangeError, "fs/2 = 500 Hz, got 600 Hz"],
    [() => tone({ length: 0, fs: 1000, frequency: 60 }), RangeError, "Length must be at least 1"],
    [
      () => tone({ length: 4, fs: 1000, frequency: 60, phase: Number.NaN }),
      TypeError,
      "Phase must be a finite",
    ],
    [() => linearChirp({ ...base, length: 1 }), RangeError, "Length must be at least 2"],
    [
      () => linearChirp({ ...base, endFrequency: 501 }),
      RangeError,
      "End frequency must be between",
    ],
    [
      () => logarithmicChirp({ ...base, startFrequency: 0 }),
      RangeError,
      "above 0 Hz for a logarithmic sweep",
    ],
    [() => whiteNoise(10, { seed: -1 }), RangeError, "Seed must be between 0 and"],
    [() => whiteNoise(10, { seed: 1.5 }), RangeError, "Seed must be an integer"],
    [
      () => whiteNoise(10, { standardDeviation: 0 }),
      RangeError,
      "Standard deviation must be greater than 0",
    ],
    [() => whiteNoise(10, { distribution: "pink" as "uniform" }), TypeError, 'got "pink"'],
    [
      () => pinkNoise(10, { rows: 31 }),
      RangeError,
      "Number of rows must be between 1 and 30, got 31",
    ],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(
      run,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
