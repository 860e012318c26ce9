import assert from "node:assert/strict";
import {
  frequencyResponse,
  groupDelay,
  impulseResponse,
  magnitude,
  magnitudeDb,
  phaseDelay,
  responseAt,
  stepResponse,
  unwrappedPhase,
  wrappedPhase,
} from "../../../lib/response/mod.ts";
import { assertClose } from "../../_tolerance.ts";

interface ResponseCase {
  name: string;
  origin: string;
  numerator: number[];
  denominator: number[];
  fs: number;
  points: number;
  reference: string;
  response: { re: number[]; im: number[] };
  wrappedPhase: number[];
  unwrappedPhase: number[];
  groupDelayFrequencies: number[];
  groupDelay: number[];
  impulse?: number[];
  step?: number[];
  timeReference?: string;
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/analysis.json", import.meta.url)),
) as { responses: ResponseCase[] };

/**
 * Compare two phase vectors modulo 2π. A response error δH moves the phase by
 * about δH/|H|, so the tolerance grows where |H| is small: abs + 1e-14/|H|.
 */
function assertPhaseClose(
  actual: Float64Array,
  expected: number[],
  magnitudes: Float64Array,
  abs: number,
  what: string,
): void {
  assert.equal(actual.length, expected.length, what);
  for (let i = 0; i < expected.length; i++) {
    const d = actual[i]! - expected[i]!;
    const wrapped = d - 2 * Math.PI * Math.round(d / (2 * Math.PI));
    const tol = { abs: abs + 1e-14 / magnitudes[i]! };
    assertClose(wrapped, 0, tol, `${what}[${i}] (${actual[i]} vs ${expected[i]})`);
  }
}

/** |Σ c[n] e^(−jωn)| relative to Σ|c[n]| at each frequency: how far from a zero. */
function relativeSize(c: number[], frequencies: ArrayLike<number>, fs: number): Float64Array {
  const h = magnitude(responseAt(c, [1], frequencies, fs));
  const total = c.reduce((s, v) => s + Math.abs(v), 0);
  return h.map((v) => v / total);
}

Deno.test("dense-grid response matches SciPy within 1e-9 (FIR and rational, 2^k+1 and other grids)", () => {
  for (const c of ref.responses) {
    const h = frequencyResponse(c.numerator, c.fs, {
      points: c.points,
      denominator: c.denominator,
    });
    const what = `${c.name} points=${c.points}`;
    // source: scipy.signal.freqz (see c.reference)
    assertClose(h.re, c.response.re, { abs: 1e-9 }, `${what} re`);
    assertClose(h.im, c.response.im, { abs: 1e-9 }, `${what} im`);
    assertClose(h.frequencies[c.points - 1]!, c.fs / 2, { rel: 1e-15 }, `${what} last frequency`);
    // source: numpy.angle and numpy.unwrap of the same response. Where H is real and
    // negative (e.g. at fs/2) the sign of a rounding-level imaginary part decides
    // between +π and −π, so phases are compared modulo 2π.
    const mag = magnitude(h);
    assertPhaseClose(wrappedPhase(h), c.wrappedPhase, mag, 1e-9, `${what} wrapped phase`);
    assertPhaseClose(unwrappedPhase(h), c.unwrappedPhase, mag, 1e-8, `${what} unwrapped phase`);
    // the direct evaluation agrees with the FFT grid
    const direct = responseAt(c.numerator, c.denominator, h.frequencies, c.fs);
    assertClose(direct.re, c.response.re, { abs: 1e-9 }, `${what} responseAt`);
  }
});

Deno.test("group delay matches SciPy where the numerator is clear of its zeros", () => {
  for (const c of ref.responses) {
    const what = `${c.name} points=${c.points}`;
    const grid = groupDelay(c.numerator, c.fs, { points: c.points, denominator: c.denominator });
    const at = groupDelay(c.numerator, c.fs, {
      frequencies: c.groupDelayFrequencies,
      denominator: c.denominator,
    });
    // source: scipy.signal.group_delay (see c.reference). SciPy takes the ramp ratio of
    // c = b * reversed(a), which loses digits near a zero of C: forward error about
    // 1e-14·len(c)/(|C|/Σ|c|), the allowance added to 1e-8 at each frequency. (SciPy's
    // own value for the 31-tap linear-phase filter is 3e-9 from the exact 15 near its nulls.)
    const conv = new Array<number>(c.numerator.length + c.denominator.length - 1).fill(0);
    c.numerator.forEach((bv, i) =>
      c.denominator.forEach((_, j) =>
        conv[i + j]! += bv * c.denominator[c.denominator.length - 1 - j]!
      )
    );
    const size = relativeSize(conv, c.groupDelayFrequencies, c.fs);
    // Our ratios are taken for b and a separately, with the same kind of bound each.
    const sizeB = relativeSize(c.numerator, c.groupDelayFrequencies, c.fs);
    const sizeA = relativeSize(c.denominator, c.groupDelayFrequencies, c.fs);
    const onGrid = c.groupDelayFrequencies.map((f) => Math.round((f / c.fs) * 2 * (c.points - 1)));
    for (let i = 0; i < c.groupDelay.length; i++) {
      const ours = c.numerator.length / sizeB[i]! + c.denominator.length / sizeA[i]!;
      const tol = { abs: 1e-8 + 1e-14 * (conv.length / size[i]! + ours) };
      assertClose(grid.samples[onGrid[i]!]!, c.groupDelay[i]!, tol, `${what} grid [${i}]`);
      assertClose(at.samples[i]!, c.groupDelay[i]!, tol, `${what} at frequencies [${i}]`);
    }
    assertClose(at.seconds[3]!, at.samples[3]! / c.fs, { rel: 1e-15 }, `${what} seconds`);
  }
});

Deno.test("impulse and step responses match SciPy's difference equation", () => {
  for (const c of ref.responses.filter((r) => r.impulse !== undefined)) {
    const opts = { denominator: c.denominator };
    // source: scipy.signal.lfilter with a unit impulse / step (c.timeReference)
    assertClose(
      impulseResponse(c.numerator, 64, opts),
      c.impulse!,
      { abs: 1e-12 },
      `${c.name} impulse`,
    );
    assertClose(stepResponse(c.numerator, 64, opts), c.step!, { abs: 1e-12 }, `${c.name} step`);
  }
});

Deno.test("two-tap average [0.5, 0.5]: |H| = |cos(πf/fs)|, −3.01 dB at fs/4, null at fs/2, phase −πf/fs", () => {
  // source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §5.1 (moving average)
  const fs = 1000;
  const h = frequencyResponse([0.5, 0.5], fs, { points: 1001 });
  const mag = magnitude(h);
  const phase = wrappedPhase(h);
  for (let k = 0; k < h.frequencies.length; k++) {
    const f = h.frequencies[k]!;
    assertClose(mag[k]!, Math.abs(Math.cos((Math.PI * f) / fs)), { abs: 1e-15 }, `|H| at ${f}`);
    if (k < 1000) assertClose(phase[k]!, (-Math.PI * f) / fs, { abs: 1e-13 }, `phase at ${f}`);
  }
  assertClose(magnitudeDb(h)[500]!, -3.0103, { abs: 1e-4 }, "−3.01 dB at fs/4");
  assert.ok(mag[1000]! < 1e-15, "null at fs/2");
  // Group delay 0.5 sample everywhere, including the null at fs/2 (limit of the ramp formula).
  const d = groupDelay([0.5, 0.5], fs, { points: 1001 });
  for (let k = 0; k < 1001; k++) {
    // the grid of 1001 points runs on a 2000-point Bluestein FFT: allow 5e-14/|H|
    const tol = { abs: 1e-12 + 5e-14 / Math.max(mag[k]!, 1e-300) };
    assertClose(d.samples[k]!, 0.5, tol, `group delay at ${h.frequencies[k]}`);
  }
  assertClose(
    groupDelay([0.5, 0.5], fs, { frequencies: [500] }).samples[0]!,
    0.5,
    { abs: 1e-12 },
    "at fs/2",
  );
});

Deno.test("group delay at unit-circle zeros: limit, not a spike (linear-phase FIR)", () => {
  // A symmetric FIR of N taps has group delay (N−1)/2 at every frequency (O&S §5.7.3).
  // (1 + z^−1)^2 (1 − 2cos(θ)z^−1 + z^−2) has a double zero at fs/2 and a pair on the circle at θ.
  const theta = Math.PI / 4; // exactly on the 9-point grid (k = 2)
  const c = Math.cos(theta);
  const b = [1, 2 - 2 * c, 2 - 4 * c, 2 - 2 * c, 1];
  const d = groupDelay(b, 8, { points: 5 });
  assertClose(d.samples, [2, 2, 2, 2, 2], { abs: 1e-9 }, "symmetric 5 taps");
  const at = groupDelay(b, 8, { frequencies: [1, 4] });
  assertClose(at.samples, [2, 2], { abs: 1e-9 }, "at the zeros");
});

Deno.test("antisymmetric taps (1 − z^−2)^3: delay 3 samples, also at the triple zeros at DC and fs/2", () => {
  // source: Oppenheim & Schafer §5.7.3 — a type III FIR of N taps has group delay (N − 1)/2
  const b = [1, 0, -3, 0, 3, 0, -1];
  const d = groupDelay(b, 48000, { points: 513 });
  assertClose(d.samples[0]!, 3, { abs: 1e-12 }, "DC");
  assertClose(d.samples[512]!, 3, { abs: 1e-12 }, "fs/2");
  // Next to a triple zero, |B| ≈ 8·(π/512)^3/8 ≈ 2e-7: the ratio keeps about 8 digits.
  assertClose(d.samples, new Float64Array(513).fill(3), { abs: 1e-6 }, "all");
  assertClose(
    groupDelay(b, 48000, { frequencies: [0, 24000] }).samples,
    [3, 3],
    { abs: 1e-12 },
    "direct",
  );
});

Deno.test("group delay of a rational filter: one pole, τ = (r cos ω − r²)/(1 − 2r cos ω + r²)", () => {
  // source: Oppenheim & Schafer §5.3.1, group delay of a first-order factor (1 − r e^{jθ} z^−1)^−1
  const r = 0.9;
  const d = groupDelay([1], 2, { points: 9, denominator: [1, -r] });
  for (let k = 0; k < 9; k++) {
    const w = (Math.PI * k) / 8;
    const expected = (r * Math.cos(w) - r * r) / (1 - 2 * r * Math.cos(w) + r * r);
    assertClose(d.samples[k]!, expected, { rel: 1e-12, abs: 1e-13 }, `ω = ${w}`);
  }
});

Deno.test("phase delay of a linear-phase FIR equals its group delay in the passband", () => {
  const taps = [0.1, 0.2, 0.4, 0.2, 0.1];
  const p = phaseDelay(taps, 1000, { points: 65 });
  for (let k = 0; k < 20; k++) {
    assertClose(p.samples[k]!, 2, { abs: 1e-12 }, `f = ${p.frequencies[k]}`);
  }
  // sign inversion at DC: the limit does not exist
  assert.ok(Number.isNaN(phaseDelay([-1, 0], 1000, { points: 5 }).samples[0]!));
});

Deno.test("bad input to response analysis", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => frequencyResponse([1], 0), RangeError, "Sample rate fs must be greater than 0 Hz"],
    [() => frequencyResponse([1], 1000, { points: 1 }), RangeError, "at least 2, got 1"],
    [() => frequencyResponse([1], 1000, { denominator: [0, 1] }), RangeError, "a[0] must not be 0"],
    [() => frequencyResponse([], 1000), RangeError, "Taps must hold at least 1"],
    [
      () => groupDelay([1, 2], 1000, { frequencies: [600] }),
      RangeError,
      "fs/2 = 500 Hz, got 600 Hz",
    ],
    [() => groupDelay([1, Number.NaN], 1000), TypeError, "Taps[1] must be a finite number"],
    [() => impulseResponse([1], 0), RangeError, "Length must be at least 1"],
    [() => stepResponse([1], 4, { denominator: [0] }), RangeError, "a[0] must not be 0"],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(
      run,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
