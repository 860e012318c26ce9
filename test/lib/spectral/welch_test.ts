import assert from "node:assert/strict";
import { welchSpectrum } from "../../../lib/spectral/mod.ts";
import { blackmanHarrisWindow } from "../../../lib/window/windows.ts";
import { assertClose } from "../../_tolerance.ts";

interface WelchCase {
  options: {
    segmentLength?: number;
    overlap?: number;
    fftLength?: number;
    scaling?: "density" | "spectrum";
    detrend?: "constant" | "none";
    window?: string;
  };
  fs: number;
  reference: string;
  frequencies: number[];
  power: number[];
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/analysis.json", import.meta.url)),
) as { welch: WelchCase[]; welchInput: number[] };

Deno.test("Welch spectrum matches SciPy", () => {
  for (const c of ref.welch) {
    const { window, ...rest } = c.options;
    const options = window === "blackmanharris"
      ? { ...rest, window: blackmanHarrisWindow(rest.segmentLength!, { symmetry: "periodic" }) }
      : rest;
    const p = welchSpectrum(ref.welchInput, c.fs, options);
    // source: scipy.signal.welch (c.reference)
    assertClose(p.frequencies, c.frequencies, { rel: 1e-14 }, `${c.reference} frequencies`);
    const peak = Math.max(...c.power);
    assertClose(p.power, c.power, { abs: 1e-12 * peak }, `${c.reference} power`);
  }
});

Deno.test("Welch: density integrates to the mean square; a tone shows A²/2 in spectrum scaling", () => {
  const fs = 1000;
  const n = 8192;
  // 125 Hz sits on a bin of a 256-point DFT at 1000 Hz (bin 32).
  const x = Float64Array.from({ length: n }, (_, i) => 2 * Math.sin((2 * Math.PI * 125 * i) / fs));
  const s = welchSpectrum(x, fs, { segmentLength: 256, scaling: "spectrum" });
  // source: common practice — power spectrum scaling shows a sine of amplitude A at A²/2
  assertClose(s.power[32]!, 2, { rel: 1e-12 }, "peak A²/2");
  const d = welchSpectrum(x, fs, { segmentLength: 256 });
  const df = fs / 256;
  const integral = d.power.reduce((acc, v) => acc + v * df, 0);
  // Parseval for the averaged periodogram: Σ P·Δf = mean square (A²/2 = 2).
  assertClose(integral, 2, { rel: 1e-3 }, "∫ density df");
  assert.equal(s.segments, Math.floor((n - 128) / 128));
});

Deno.test("bad input to the Welch spectrum", () => {
  const x = new Float64Array(100);
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [
      () => welchSpectrum(x, 1000, { segmentLength: 101 }),
      RangeError,
      "Segment length must be between 1 and 100, got 101",
    ],
    [
      () => welchSpectrum(x, 1000, { segmentLength: 50, overlap: 50 }),
      RangeError,
      "Overlap must be between 0 and 49, got 50",
    ],
    [
      () => welchSpectrum(x, 1000, { segmentLength: 50, fftLength: 40 }),
      RangeError,
      "FFT length must be at least 50",
    ],
    [
      () => welchSpectrum(x, 1000, { segmentLength: 50, window: [1, 2] }),
      TypeError,
      "segment length 50, got 2",
    ],
    [() => welchSpectrum(x, -1), RangeError, "Sample rate fs must be greater than 0 Hz"],
    [() => welchSpectrum(x, 1000, { scaling: "power" as "density" }), TypeError, 'got "power"'],
    [() => welchSpectrum(x, 1000, { detrend: "linear" as "none" }), TypeError, 'got "linear"'],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(
      run,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
