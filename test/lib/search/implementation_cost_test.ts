import assert from "node:assert/strict";
import { designEquiripple } from "../../../lib/fir/equiripple.ts";
import { designHalfband } from "../../../lib/fir/halfband.ts";
import { designIir } from "../../../lib/iir/design.ts";
import {
  designMultistageDecimator,
  planMultistageDecimator,
} from "../../../lib/multirate/multistage.ts";
import { type CostedDesign, implementationCost } from "../../../lib/search/implementation_cost.ts";
import { impulseResponseOf } from "../../../lib/verify/filter_design.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";

const lowpass = (length: number) =>
  designEquiripple({
    length,
    fs: 8000,
    bands: [{ from: 0, to: 1000, gain: 1 }, { from: 1500, to: 4000, gain: 0 }],
  }).taps;

Deno.test("implementationCost: a linear-phase FIR shares one multiplier per symmetric pair", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §6.5.3 (linear-phase structures): ⌈N/2⌉
  // multipliers, N − 1 adders, N − 1 delays, group delay (N − 1)/2.
  for (const n of [31, 30]) {
    const c = implementationCost({ kind: "fir", taps: lowpass(n) }, { fs: 8000 });
    assert.equal(c.multipliesPerOutput, Math.ceil(n / 2));
    assert.equal(c.addsPerOutput, n - 1);
    assert.equal(c.stateWords, n - 1);
    assert.equal(c.coefficientWords, Math.ceil(n / 2));
    assert.equal(c.memoryWords, n - 1 + Math.ceil(n / 2));
    assert.equal(c.latencySamples, (n - 1) / 2);
    assert.equal(c.latencySeconds, (n - 1) / 2 / 8000);
    assert.equal(c.latencyFrequency, undefined);
    assert.equal(c.multipliesPerSecond, Math.ceil(n / 2) * 8000);
    assert.match(c.structure, n % 2 === 1 ? /symmetric FIR \(type I\)/ : /type II/);
  }
  // Type III: the middle tap of an antisymmetric odd filter is 0 and costs nothing.
  const hilbert = implementationCost({ kind: "fir", taps: [-0.3, 0, 0.3] }, { fs: 1 });
  assert.equal(hilbert.multipliesPerOutput, 1);
  assert.equal(hilbert.addsPerOutput, 1);
  assert.match(hilbert.structure, /antisymmetric FIR \(type III\)/);
});

Deno.test("implementationCost: taps of 0 and ±1 need no multiplier; a half-band filter costs (N + 1)/4 + 1", () => {
  // common practice: a coefficient of ±1 is an add, 0 is nothing.
  const c = implementationCost({ kind: "fir", taps: [1, 0, 0.25, 0, 1] }, { fs: 1 });
  assert.equal(c.multipliesPerOutput, 1);
  assert.equal(c.addsPerOutput, 2);
  // source: Vaidyanathan & Nguyen, IEEE Trans. CAS 34(3), 1987: every second tap of a
  // half-band filter is zero; with symmetry (N + 1)/4 multipliers plus the centre ½.
  const taps = designHalfband({ length: 23, fs: 48000, passbandEdge: 9000 }).taps;
  const h = implementationCost({ kind: "fir", taps }, { fs: 48000 });
  assert.equal(h.multipliesPerOutput, (23 + 1) / 4 + 1);
  assert.equal(h.addsPerOutput, (23 + 1) / 2 + 1 - 1);
  assert.match(h.structure, /13 non-zero/);
});

Deno.test("implementationCost: an FIR without symmetry counts every tap; latency is its group delay", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §5.1.2: τ(0) = Σ n·h[n] / Σ h[n].
  const taps = [0.5, 0.3, 0.2];
  const c = implementationCost({ kind: "fir", taps }, { fs: 100 });
  assert.equal(c.multipliesPerOutput, 3);
  assert.equal(c.addsPerOutput, 2);
  assertClose(c.latencySamples, (0.3 + 2 * 0.2) / 1, { rel: 1e-12 }, "centroid");
  assert.equal(c.latencyFrequency, 0);
});

Deno.test("implementationCost: second-order sections in transposed direct form II", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., §6.5 (TDF-II biquad: 5 multipliers, 4 adders,
  // 2 delays); τ(0) = Σ n·h[n] / Σ h[n] from the impulse response (§5.1.2).
  const d = designIir({
    family: "butterworth",
    response: "lowpass",
    order: 4,
    fs: 1000,
    edges: 100,
  });
  const design = { kind: "sections" as const, sections: d.sections };
  const c = implementationCost(design, { fs: 1000 });
  assert.equal(c.multipliesPerOutput, 10);
  assert.equal(c.addsPerOutput, 8);
  assert.equal(c.stateWords, 4);
  assert.equal(c.coefficientWords, 10);
  const h = impulseResponseOf(design);
  let moment = 0;
  let sum = 0;
  h.forEach((v, n) => {
    moment += n * v;
    sum += v;
  });
  assertClose(c.latencySamples, moment / sum, { rel: 1e-9 }, "DC group delay");
  // The designIir result itself is accepted, and counted the same way.
  assert.equal(implementationCost(d, { fs: 1000 }).multipliesPerOutput, 10);
  // A first-order section needs one state word; b0 = 1 needs no multiplier.
  const first = implementationCost({
    kind: "sections",
    sections: [{ b0: 1, b1: 0.5, b2: 0, a1: -0.25, a2: 0 }],
  }, { fs: 1 });
  assert.equal(first.stateWords, 1);
  assert.equal(first.multipliesPerOutput, 2);
  assert.equal(first.addsPerOutput, 2);
});

Deno.test("implementationCost: B(z)/A(z) is normalised by a0 before counting", () => {
  // common practice: a direct form with a0 = 1; b = [1, 2, 1] needs one multiplier (by 2).
  for (const scale of [1, 2]) {
    const c = implementationCost({
      kind: "rational",
      numerator: [scale, 2 * scale, scale],
      denominator: [scale, -0.5 * scale, 0.25 * scale],
    }, { fs: 1 });
    assert.equal(c.multipliesPerOutput, 3);
    assert.equal(c.addsPerOutput, 4);
    assert.equal(c.stateWords, 2);
  }
});

Deno.test("implementationCost: decimation saves M times for FIR, nothing for a recursion", () => {
  // source: Crochiere & Rabiner, Multirate DSP, 1983, §3.3: a polyphase (or output-only)
  // decimator by M computes one output per M inputs with the full filter.
  const taps = lowpass(31);
  const full = implementationCost({ kind: "fir", taps }, { fs: 8000 });
  const dec = implementationCost({ kind: "fir", taps }, { fs: 8000, decimation: 4 });
  assert.equal(dec.multipliesPerOutput, full.multipliesPerOutput);
  assert.equal(dec.multipliesPerInput, full.multipliesPerOutput / 4);
  assert.equal(dec.multipliesPerSecond, full.multipliesPerSecond / 4);
  assert.equal(dec.outputRate, 2000);
  assert.equal(dec.stateWords, full.stateWords);
  const d = designIir({
    family: "elliptic",
    response: "lowpass",
    order: 4,
    fs: 8000,
    edges: 800,
    passbandRippleDb: 1,
    stopbandAttenuationDb: 50,
  });
  const iir = implementationCost(d, { fs: 8000, decimation: 4 });
  const single = implementationCost(d, { fs: 8000 });
  assert.equal(iir.multipliesPerOutput, 4 * single.multipliesPerOutput);
  assert.equal(iir.multipliesPerSecond, single.multipliesPerSecond);
  assert.match(iir.structure, /recursion runs at the input rate/);
});

Deno.test("implementationCost: a multistage decimator costs the sum of its stages", () => {
  // source: Crochiere & Rabiner, IEEE Trans. ASSP 23(5), 1975: the total rate is Σ cᵢ·Fᵢ over the
  // stages (cᵢ per output at rate Fᵢ), and delays add at each stage's own rate.
  const plan = planMultistageDecimator({
    fs: 48000,
    factor: 8,
    passbandEdge: 2000,
    passbandRippleDb: 0.2,
    stopbandAttenuationDb: 60,
  });
  const designed = designMultistageDecimator(plan);
  for (const multistage of [designed, plan] as CostedDesign[]) {
    const total = implementationCost(multistage, { fs: 48000 });
    let perSecond = 0;
    let seconds = 0;
    let state = 0;
    for (const s of (multistage as typeof designed).stages) {
      const taps = "taps" in s ? s.taps : lowpassOfLength((s as { length: number }).length);
      const c = implementationCost({ kind: "fir", taps }, {
        fs: s.inputRate,
        decimation: s.factor,
      });
      perSecond += c.multipliesPerSecond;
      seconds += c.latencySeconds;
      state += c.stateWords;
    }
    assertClose(total.multipliesPerSecond, perSecond, { rel: 1e-12 }, "multiplies per second");
    assertClose(total.latencySeconds, seconds, { rel: 1e-12 }, "latency");
    assert.equal(total.stateWords, state);
    assert.equal(total.decimation, 8);
    assert.equal(total.outputRate, 6000);
    assertClose(total.multipliesPerOutput, perSecond / 6000, { rel: 1e-12 }, "per output");
  }
  // Fact of the trade (C&R 1975): cheaper than one stage of the same spec.
  const one = implementationCost(designed, { fs: 48000 });
  assert.ok(one.multipliesPerSecond < Math.ceil(plan.singleStage.length / 2) * 6000);
});

/** Symmetric taps of a given length (only their count and symmetry matter for a cost). */
function lowpassOfLength(n: number): number[] {
  return Array.from({ length: n }, (_, i) => 0.1 + Math.min(i, n - 1 - i));
}

Deno.test("implementationCost: invalid input is refused with the rule", () => {
  const fir = { kind: "fir" as const, taps: [0.5, 0.5] };
  const plan = planMultistageDecimator({
    fs: 48000,
    factor: 4,
    passbandEdge: 2000,
    passbandRippleDb: 0.2,
    stopbandAttenuationDb: 60,
  });
  const table: [() => unknown, new (...a: never[]) => Error, RegExp][] = [
    [() => implementationCost(fir, { fs: 0 }), RangeError, /Sample rate fs must be greater than 0/],
    [
      () => implementationCost(fir, { fs: 8000, decimation: 0 }),
      RangeError,
      /Decimation factor must be between 1/,
    ],
    [
      () => implementationCost(fir, { fs: 8000, latencyFrequency: 5000 }),
      RangeError,
      /fs\/2 = 4000 Hz, got 5000/,
    ],
    [
      () => implementationCost(fir, { fs: 8000, symmetryTolerance: 1 }),
      RangeError,
      /below 1, got 1/,
    ],
    [() => implementationCost({ kind: "fir", taps: [1, NaN] }, { fs: 8000 }), TypeError, /finite/],
    [
      () => implementationCost({} as CostedDesign, { fs: 8000 }),
      TypeError,
      /taps, sections or stages/,
    ],
    [() => implementationCost(plan, { fs: 48000, decimation: 4 }), RangeError, /own factors/],
    [
      () => implementationCost(plan, { fs: 44100 }),
      RangeError,
      /first stage must run at fs = 44100 Hz/,
    ],
  ];
  for (const [fn, kind, pattern] of table) assertThrowsMatching(fn, kind, pattern);
});
