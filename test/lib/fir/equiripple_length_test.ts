import assert from "node:assert/strict";
import { estimateEquirippleLength } from "../../../lib/fir/equiripple_length.ts";
import type { EquirippleLengthSpec } from "../../../lib/fir/equiripple_length.ts";
import { designEquiripple } from "../../../lib/fir/equiripple.ts";
import { assertClose } from "../../_tolerance.ts";

Deno.test("estimateEquirippleLength (Kaiser) is O&S eq. (7.117)", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., eq. (7.117): M = (−10 log10(δ1 δ2) − 13)/(2.324 Δω).
  const e = estimateEquirippleLength({
    fs: 2,
    passbandEdge: 0.4,
    stopbandEdge: 0.6,
    passbandRippleDb: 20 * Math.log10(1.01 / 0.99),
    stopbandAttenuationDb: 60,
    formula: "kaiser",
  });
  assertClose(e.passbandDeviation, 0.01, { rel: 1e-12 }, "δp");
  const m = (-10 * Math.log10(0.01 * 0.001) - 13) / (2.324 * 0.2 * Math.PI);
  assertClose(e.exact, m + 1, { rel: 1e-3 }, "N = M + 1");
});

/** Smallest length whose equiripple design (weights 1 : δp/δs) meets δp and δs. */
function shortestMeeting(spec: EquirippleLengthSpec, from: number): number {
  const e = estimateEquirippleLength(spec);
  const bands = [
    { from: 0, to: spec.passbandEdge, gain: 1, weight: 1 },
    { from: spec.stopbandEdge, to: spec.fs / 2, gain: 0, weight: e.weights[1] },
  ];
  for (let n = from; n < from + 40; n += 2) {
    const d = designEquiripple({ length: n, fs: spec.fs, bands });
    if (d.bandDeviations[0]! <= e.passbandDeviation) return n;
  }
  throw new Error("no length met the spec");
}

Deno.test("estimateEquirippleLength (Herrmann) lands within a few taps of the shortest design", () => {
  // source: Herrmann, Rabiner & Chan, BSTJ 52(6), 1973, report the formula within a few
  // percent for lowpass filters; here checked against our own Parks–McClellan designs.
  const specs: EquirippleLengthSpec[] = [
    {
      fs: 2,
      passbandEdge: 0.4,
      stopbandEdge: 0.6,
      passbandRippleDb: 0.1737,
      stopbandAttenuationDb: 60,
    },
    {
      fs: 48000,
      passbandEdge: 8000,
      stopbandEdge: 10000,
      passbandRippleDb: 0.5,
      stopbandAttenuationDb: 70,
    },
    {
      fs: 1,
      passbandEdge: 0.1,
      stopbandEdge: 0.14,
      passbandRippleDb: 0.01,
      stopbandAttenuationDb: 50,
    },
  ];
  for (const spec of specs) {
    const e = estimateEquirippleLength(spec);
    const odd = e.length % 2 === 1 ? e.length : e.length + 1;
    const best = shortestMeeting(spec, Math.max(5, odd - 10));
    assert.ok(Math.abs(best - e.length) <= 4, `estimate ${e.length}, shortest odd ${best}`);
  }
});

Deno.test("estimateEquirippleLength rejects bad input", () => {
  const base = {
    fs: 1,
    passbandEdge: 0.1,
    stopbandEdge: 0.2,
    passbandRippleDb: 1,
    stopbandAttenuationDb: 40,
  };
  const cases: [EquirippleLengthSpec, ErrorConstructor, string][] = [
    [{ ...base, stopbandEdge: 0.1 }, RangeError, "must differ"],
    [{ ...base, stopbandEdge: 0.5 }, RangeError, "below fs/2 = 0.5 Hz"],
    [{ ...base, passbandRippleDb: 0 }, RangeError, "between 0 and 10 dB, got 0 dB"],
    [{ ...base, stopbandAttenuationDb: 400 }, RangeError, "between 0 and 300 dB"],
    [{ ...base, formula: "bellanger" as "kaiser" }, TypeError, "Formula must be"],
  ];
  for (const [spec, kind, text] of cases) {
    assert.throws(
      () => estimateEquirippleLength(spec),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
