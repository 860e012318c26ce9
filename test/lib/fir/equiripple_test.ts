import assert from "node:assert/strict";
import { ConvergenceError, designEquiripple } from "../../../lib/fir/equiripple.ts";
import type { EquirippleKind } from "../../../lib/fir/equiripple.ts";
import { measureBands } from "../../../lib/fir/band_error.ts";
import { responseAt } from "../../../lib/response/frequency_response.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

type Row = [number, number, number, number];
const toBands = (rows: Row[]) =>
  rows.map(([from, to, gain, weight]) => ({ from, to, gain, weight }));

Deno.test("designEquiripple matches scipy.signal.remez taps (all four types)", () => {
  // source: scipy.signal.remez, SciPy 1.10.1 (test/reference/make_fir_design.py).
  // The issue asks for 1e-6 on well-conditioned designs; the same MPR grid gives far closer.
  for (const c of reference.equiripple) {
    const d = designEquiripple({
      length: c.length,
      fs: c.fs,
      bands: toBands(c.bands),
      kind: c.kind as EquirippleKind,
      gridDensity: c.gridDensity,
    });
    assertClose(d.taps, c.taps, { abs: 1e-9 }, `${c.note} (${c.length} taps)`);
    assert.deepEqual(d.warnings, [], c.note);
  }
});

Deno.test("designEquiripple: error alternates with size δ at the extremal frequencies", () => {
  const bands = [{ from: 0, to: 1000, gain: 1, weight: 1 }, {
    from: 1500,
    to: 4000,
    gain: 0,
    weight: 4,
  }];
  const d = designEquiripple({ length: 41, fs: 8000, bands });
  const h = responseAt(d.taps, [1], d.extremalFrequencies, 8000);
  let sign = 0;
  d.extremalFrequencies.forEach((f, i) => {
    // Remove the linear phase: A(f) = Re(H e^{jπf(N−1)/fs}).
    const w = (2 * Math.PI * f * 20) / 8000;
    const a = h.re[i]! * Math.cos(w) - h.im[i]! * Math.sin(w);
    const band = f <= 1000 ? bands[0]! : bands[1]!;
    const e = band.weight * (a - band.gain);
    assertClose(Math.abs(e), d.deviation, { rel: 1e-9 }, `|E| at ${f} Hz`);
    if (sign !== 0) assert.equal(Math.sign(e), -sign, `alternation at ${f} Hz`);
    sign = Math.sign(e);
  });
  assert.equal(d.extremalFrequencies.length, 22); // r + 1 = (N + 1)/2 + 1
  assertClose(d.bandDeviations[1]!, d.deviation / 4, { rel: 1e-15 }, "stopband δ/W");
});

Deno.test("designEquiripple: 1023-tap lowpass ripple equal to or better than SciPy's", () => {
  // source: scipy.signal.remez + scipy.signal.freqz on 65536 points, SciPy 1.10.1.
  const c = reference.equirippleLong;
  const d = designEquiripple({ length: 1023, fs: 1, bands: toBands(c.bands) });
  const [pass, stop] = measureBands(d.taps, 1, toBands(c.bands), { points: 65537 });
  const db = (x: number) => 20 * Math.log10(x);
  // Achieved ripple and attenuation within 0.01 dB of SciPy's, or better.
  assert.ok(db(1 + pass!.maxDeviation) <= db(1 + c.passbandDeviation) + 0.01, "passband");
  assert.ok(db(stop!.maxGain) <= db(c.stopbandPeak) + 0.01, "stopband");
  assert.ok(Math.abs(db(stop!.maxGain) - db(c.stopbandPeak)) < 0.01, "same optimum");
});

Deno.test("designEquiripple: an over-met 1023-tap spec ends in a clear ConvergenceError", () => {
  // SciPy 1.10.1's remez raises "Failure to converge" on this one (bench/side_by_side_design.py).
  assert.throws(
    () =>
      designEquiripple({
        length: 1023,
        fs: 1,
        bands: [{ from: 0, to: 0.2, gain: 1 }, { from: 0.22, to: 0.5, gain: 0, weight: 10 }],
      }),
    (e: unknown) =>
      e instanceof ConvergenceError && /double precision/.test((e as Error).message) &&
      /fewer taps/.test((e as Error).message),
  );
});

Deno.test("designEquiripple: iteration limit gives a warning or a ConvergenceError, never a hang", () => {
  const spec = {
    length: 101,
    fs: 1,
    bands: [{ from: 0, to: 0.2, gain: 1 }, { from: 0.23, to: 0.5, gain: 0, weight: 10 }],
  };
  let outcome = "";
  try {
    const d = designEquiripple({ ...spec, maxIterations: 3 });
    outcome = d.warnings.map((w) => w.code).join();
  } catch (e) {
    assert.ok(e instanceof ConvergenceError, String(e));
    outcome = "error";
  }
  assert.ok(outcome === "error" || outcome === "not-converged", outcome);
  assert.deepEqual(designEquiripple(spec).warnings, []);
});

Deno.test("designEquiripple: Hilbert transformer and differentiator shapes", () => {
  const hilbert = designEquiripple({
    length: 31,
    fs: 2,
    kind: "hilbert",
    bands: [{ from: 0.1, to: 0.9, gain: 1 }],
  });
  for (let n = 0; n < 31; n++) {
    assertClose(hilbert.taps[n]!, -hilbert.taps[30 - n]!, { abs: 0 }, "antisymmetric");
  }
  // Type III: every other tap is zero (common practice for a half-band Hilbert transformer).
  for (let n = 1; n < 31; n += 2) assert.ok(Math.abs(hilbert.taps[n]!) < 1e-9, `tap ${n}`);
  const diff = designEquiripple({
    length: 20,
    fs: 1,
    kind: "differentiator",
    bands: [{ from: 0, to: 0.45, gain: 1 }],
  });
  // |H(f)| ≈ ω = 2πf in the band.
  const at = [0.05, 0.2, 0.4];
  const mag = responseAt(diff.taps, [1], at, 1);
  at.forEach((f, i) => {
    assertClose(Math.hypot(mag.re[i]!, mag.im[i]!), 2 * Math.PI * f, { rel: 2e-3 }, `|H(${f})|`);
  });
});

Deno.test("designEquiripple rejects bad input with the rule and the value", () => {
  const lp = [{ from: 0, to: 0.1, gain: 1 }, { from: 0.2, to: 0.5, gain: 0 }];
  const hp = [{ from: 0, to: 0.1, gain: 0 }, { from: 0.2, to: 0.5, gain: 1 }];
  const cases: [Parameters<typeof designEquiripple>[0], ErrorConstructor, string][] = [
    [{ length: 32, fs: 1, bands: hp }, RangeError, "even number of taps forces a zero at fs/2"],
    [{ length: 2, fs: 1, bands: lp }, RangeError, "between 3 and 65536, got 2"],
    [{ length: 31.5, fs: 1, bands: lp }, RangeError, "integer"],
    [{ length: 31, fs: -1, bands: lp }, RangeError, "greater than 0 Hz"],
    [{ length: 31, fs: 1, bands: [] }, TypeError, "non-empty"],
    [
      { length: 31, fs: 1, bands: [{ from: 0, to: 0.6, gain: 1 }] },
      RangeError,
      "fs/2 = 0.5 Hz, got 0–0.6",
    ],
    [
      {
        length: 31,
        fs: 1,
        bands: [{ from: 0, to: 0.3, gain: 1 }, { from: 0.2, to: 0.5, gain: 0 }],
      },
      RangeError,
      "edges must increase",
    ],
    [
      { length: 31, fs: 1, bands: [{ from: 0.3, to: 0.1, gain: 1 }] },
      RangeError,
      "edges must increase",
    ],
    [
      { length: 31, fs: 1, bands: [{ from: 0, to: 0.1, gain: 1, weight: -2 }] },
      RangeError,
      "weight must be greater than 0, got -2",
    ],
    [
      { length: 31, fs: 1, bands: [{ from: 0, to: 0.1, gain: NaN }] },
      TypeError,
      "gain must be a finite",
    ],
    [{ length: 31, fs: 1, kind: "hilbert", bands: lp }, RangeError, "zero at 0 Hz"],
    [
      { length: 31, fs: 1, kind: "hilbert", bands: [{ from: 0.1, to: 0.5, gain: 1 }] },
      RangeError,
      "type III",
    ],
    [{ length: 31, fs: 1, kind: "lowpass" as "hilbert", bands: lp }, TypeError, "Kind must be"],
    [{ length: 31, fs: 1, bands: lp, gridDensity: 2 }, RangeError, "Grid density"],
  ];
  for (const [options, kind, text] of cases) {
    assert.throws(
      () => designEquiripple(options),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});

Deno.test("designEquiripple on hard multiband specs: as good as SciPy, or a clear refusal", () => {
  // source: scipy.signal.remez + freqz (65536 points), SciPy 1.10.1: the weighted error each
  // design really achieves between its band edges (test/reference/make_fir_design.py).
  for (const c of reference.equirippleHard) {
    const bands = toBands(c.bands);
    let d;
    try {
      d = designEquiripple({ length: c.length, fs: 1, bands });
    } catch (e) {
      // Known limitation (see the report): with transition bands this wide the grid optimum can
      // blow up between grid points; that must end in this message, never in returned taps.
      assert.ok(e instanceof ConvergenceError, String(e));
      assert.match((e as Error).message, /transition bands are too wide|cannot resolve/);
      assert.equal(c.length, 69, `only the 69-tap case is expected to be refused`);
      continue;
    }
    const measured = measureBands(d.taps, 1, bands, { points: 65537 });
    const worst = Math.max(...measured.map((m, i) => m.maxDeviation * bands[i]!.weight));
    assert.ok(
      worst <= c.weightedError * 1.001,
      `${c.length} taps: ${worst} vs SciPy ${c.weightedError}`,
    );
  }
});

Deno.test("designEquiripple refuses a design that blows up between grid points", () => {
  // 47 taps with two narrow bands and 0.24 of don't-care band between them.
  assert.throws(
    () =>
      designEquiripple({
        length: 47,
        fs: 1,
        bands: [{ from: 0, to: 0.145, gain: 0, weight: 3 }, { from: 0.389, to: 0.447, gain: 1 }],
      }),
    (e: unknown) =>
      e instanceof ConvergenceError && /between grid points/.test((e as Error).message),
  );
});
