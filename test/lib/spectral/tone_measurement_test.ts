import assert from "node:assert/strict";
import { measureTone } from "../../../lib/spectral/mod.ts";
import { whiteNoise } from "../../../lib/signal/noise.ts";
import { assertClose } from "../../_tolerance.ts";

const fs = 48000;
const n = 16384;

function sine(amplitude: number, frequency: number, phase = 0): Float64Array {
  return Float64Array.from(
    { length: n },
    (_, i) => amplitude * Math.sin((2 * Math.PI * frequency * i) / fs + phase),
  );
}

function add(...parts: Float64Array[]): Float64Array {
  return parts[0]!.map((_, i) => parts.reduce((s, p) => s + p[i]!, 0));
}

Deno.test("THD of a tone with known harmonics (noise-free)", () => {
  // Fundamental at a non-bin frequency; 2nd at −40 dB, 3rd at −60 dB.
  const f0 = 997.3;
  const x = add(sine(1, f0), sine(0.01, 2 * f0, 0.4), sine(0.001, 3 * f0, 1.1));
  const m = measureTone(x, fs);
  // source: definition THD = Σ harmonic power / fundamental power (IEEE Std 1241, from memory)
  const expected = 10 * Math.log10(0.01 ** 2 + 0.001 ** 2);
  assertClose(m.thdDb, expected, { abs: 0.001 }, "THD");
  assertClose(m.tonePower, 0.5, { rel: 1e-4 }, "tone power A²/2");
  assertClose(m.harmonicPowers[0]!, 0.5e-4, { rel: 1e-3 }, "2nd harmonic power");
  assertClose(m.frequency, f0, { abs: 0.05 }, "frequency");
  // The window's −160 dB sidelobes over ~8000 bins leave a floor about 140 dB down.
  assert.ok(m.snrDb > 130, `noise-free SNR is high, got ${m.snrDb}`);
});

Deno.test("SNR and SINAD of a tone in white noise of known power", () => {
  const noise = whiteNoise(n, { seed: 1241, standardDeviation: 0.01 });
  const noisePower = noise.reduce((s, v) => s + v * v, 0) / n;
  const x = add(sine(0.9, 5012.7), noise, sine(0.009, 2 * 5012.7));
  const m = measureTone(x, fs, { frequency: 5000 });
  // source: definitions SNR = P_signal/P_noise, SINAD = P_signal/(P_noise + P_harmonics);
  // the estimate carries the periodogram's scatter (about 0.1 dB at this length).
  const signal = 0.9 ** 2 / 2;
  const harmonic = 0.009 ** 2 / 2;
  assertClose(m.snrDb, 10 * Math.log10(signal / noisePower), { abs: 0.15 }, "SNR");
  assertClose(m.sinadDb, 10 * Math.log10(signal / (noisePower + harmonic)), { abs: 0.15 }, "SINAD");
  assertClose(m.effectiveBits, (m.sinadDb - 1.76) / 6.02, { rel: 1e-15 }, "ENOB formula");
});

Deno.test("harmonics folding past fs/2 are found at their alias", () => {
  // 15 kHz: 2nd at 30 kHz folds to 18 kHz, 3rd at 45 kHz folds to 3 kHz.
  const x = add(sine(1, 15000), sine(0.01, 18000), sine(0.01, 3000));
  const m = measureTone(x, fs, { harmonics: 2 });
  assertClose(m.thdDb, 10 * Math.log10(2e-4), { abs: 0.001 }, "folded THD");
});

Deno.test("bad input to the tone measurement", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => measureTone(new Float64Array(10), fs), RangeError, "at least 64"],
    [
      () => measureTone(sine(1, 1000), fs, { harmonics: -1 }),
      RangeError,
      "Number of harmonics must be between 0 and 50",
    ],
    [
      () => measureTone(sine(1, 1000), fs, { lobeBins: 2 }),
      RangeError,
      "Lobe half-width must be between 7",
    ],
    [() => measureTone(sine(1, 1000), fs, { frequency: 30000 }), RangeError, "fs/2 = 24000 Hz"],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(
      run,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
