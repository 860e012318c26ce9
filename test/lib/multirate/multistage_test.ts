import assert from "node:assert/strict";
import {
  decimateMultistage,
  designMultistageDecimator,
  planMultistageDecimator,
} from "../../../lib/multirate/multistage.ts";
import { decimatePolyphase } from "../../../lib/multirate/resample.ts";
import { assertClose } from "../../_tolerance.ts";
import { estimateEquirippleLength } from "../../../lib/fir/equiripple_length.ts";
import { responseAt } from "../../../lib/response/frequency_response.ts";

const spec = {
  fs: 48000,
  factor: 48,
  passbandEdge: 400,
  passbandRippleDb: 0.1,
  stopbandAttenuationDb: 80,
};

Deno.test("planMultistageDecimator: split, edges and costs follow Crochiere & Rabiner", () => {
  // source: Crochiere & Rabiner, IEEE Trans. ASSP 23(5), 1975: stage i stops from
  // F_i − fs_stop, passband ripple δp/K per stage, cost Σ N_i·F_i.
  const plan = planMultistageDecimator(spec);
  assert.equal(plan.stages.reduce((p, s) => p * s.factor, 1), 48);
  let rate = 48000;
  for (const s of plan.stages) {
    assert.equal(s.inputRate, rate);
    rate /= s.factor;
    assert.equal(s.outputRate, rate);
    assert.equal(s.stopbandEdge, rate - 500);
    const e = estimateEquirippleLength({
      fs: s.inputRate,
      passbandEdge: 400,
      stopbandEdge: s.stopbandEdge,
      passbandRippleDb: s.passbandRippleDb,
      stopbandAttenuationDb: 80,
    });
    assert.equal(s.length, e.length);
    assert.equal(s.multiplicationsPerSecond, s.length * s.outputRate);
  }
  // Fact of the trade (C&R 1975): for large M a multistage split costs several times less.
  assert.ok(plan.multiplicationsPerSecond * 4 < plan.singleStage.multiplicationsPerSecond);
  assert.equal(plan.singleStage.factor, 48);
  // A prime factor admits one stage only.
  assert.equal(planMultistageDecimator({ ...spec, factor: 47 }).stages.length, 1);
  assert.equal(planMultistageDecimator({ ...spec, maxStages: 1 }).stages.length, 1);
});

Deno.test("designMultistageDecimator: the designed cascade meets the overall spec", () => {
  const plan = planMultistageDecimator(spec);
  const design = designMultistageDecimator(plan);
  assert.deepEqual(design.warnings, []);
  const stages = design.stages.map((s) => ({ taps: s.taps, rate: s.inputRate }));
  // Equivalent single-rate response H(f) = Π H_i(f) (each stage at its own rate, f folded).
  const magnitude = (f: number) =>
    stages.reduce((m, s) => {
      const g = f % s.rate;
      const h = responseAt(s.taps, [1], [g > s.rate / 2 ? s.rate - g : g], s.rate);
      return m * Math.hypot(h.re[0]!, h.im[0]!);
    }, 1);
  // Passband ripple within 0.1 dB overall.
  let lo = Infinity;
  let hi = 0;
  for (let f = 0; f <= 400; f += 10) {
    const m = magnitude(f);
    lo = Math.min(lo, m);
    hi = Math.max(hi, m);
  }
  assert.ok(20 * Math.log10(hi / lo) <= 0.1, `ripple ${20 * Math.log10(hi / lo)} dB`);
  // Everything that folds onto the passband after decimation (k·1000 ± 400 Hz) is 80 dB down.
  for (let k = 1; k <= 24; k++) {
    for (let f = k * 1000 - 400; f <= Math.min(24000, k * 1000 + 400); f += 20) {
      assert.ok(magnitude(f) <= 1e-4, `alias at ${f} Hz: ${20 * Math.log10(magnitude(f))} dB`);
    }
  }
});

Deno.test("decimateMultistage: a passband tone survives, an aliasing tone is 80 dB down", () => {
  const plan = planMultistageDecimator(spec);
  const design = designMultistageDecimator(plan);
  const n = 48 * 600;
  const tone = (f: number) =>
    Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * f * i) / 48000));
  const rms = (y: Float64Array) => {
    const tail = y.subarray(200); // past every stage's start-up
    return Math.sqrt(tail.reduce((a, v) => a + v * v, 0) / tail.length);
  };
  const pass = decimateMultistage(tone(250), design);
  assert.equal(pass.length, 600);
  assertClose(rms(pass), Math.SQRT1_2, { rel: 0.012 }, "250 Hz tone level"); // 0.1 dB
  // 3250 Hz folds onto 250 Hz at the 1 kHz output rate.
  const alias = decimateMultistage(tone(3250), design);
  assert.ok(
    rms(alias) < Math.SQRT1_2 * 1e-4,
    `alias level ${20 * Math.log10(rms(alias) / Math.SQRT1_2)} dB`,
  );
  // Stage by stage by hand gives the same samples.
  let x: Float64Array = Float64Array.from(tone(250));
  for (const s of design.stages) x = decimatePolyphase(x, s.factor, { taps: s.taps });
  assert.deepEqual([...x], [...pass]);
});

Deno.test("planMultistageDecimator rejects bad input", () => {
  const cases: [Parameters<typeof planMultistageDecimator>[0], string][] = [
    [{ ...spec, factor: 1 }, "between 2 and 1000000, got 1"],
    [
      { ...spec, passbandEdge: 600 },
      "Passband edge must be between 0 Hz and the stopband edge 500 Hz, got 600 Hz",
    ],
    [{ ...spec, stopbandEdge: 800 }, "at most fs/(2M) = 500 Hz, got 800 Hz"],
    [{ ...spec, passbandRippleDb: -1 }, "Passband ripple"],
    [{ ...spec, maxStages: 9 }, "between 1 and 6"],
  ];
  for (const [s, text] of cases) {
    assert.throws(
      () => planMultistageDecimator(s),
      (e: unknown) => e instanceof RangeError && (e as Error).message.includes(text),
      text,
    );
  }
});
