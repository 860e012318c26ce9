import assert from "node:assert";
import {
  type FilterDesign,
  outputNorms,
  responseOf,
  roundoffNoiseGain,
  scaleSections,
  sectionNodeNorms,
  sequenceNorms,
} from "../../../lib/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { fixture, referenceCase, sectionsOf } from "../verify/_fixture.ts";

Deno.test("one-pole section: norms and noise gain in closed form", () => {
  for (const a of [0.5, 0.9, -0.7]) {
    const design: FilterDesign = {
      kind: "sections",
      sections: [{ b0: 1, b1: 0, b2: 0, a1: -a, a2: 0 }],
    };
    const n = outputNorms(design);
    // source: common practice, h[n] = a^n: L1 = 1/(1 − |a|), L2 = 1/√(1 − a²), L∞ = 1
    assertClose(n.l1, 1 / (1 - Math.abs(a)), { rel: 1e-12 }, `L1 a=${a}`);
    assertClose(n.l2, 1 / Math.sqrt(1 - a * a), { rel: 1e-12 }, `L2 a=${a}`);
    assert.equal(n.lInfinity, 1);
    // Peak gain 1/(1 − |a|) at DC (a > 0) or Nyquist (a < 0).
    assertClose(n.peakGain, 1 / (1 - Math.abs(a)), { rel: 1e-9 }, `peak gain a=${a}`);
    assertClose(n.headroomBits, -Math.log2(1 / (1 - Math.abs(a))), { abs: 1e-9 }, "headroom");
    assert.equal(n.growthBits, Math.ceil(Math.log2(1 / (1 - Math.abs(a)))));
    // source: Jackson, Digital Filters and Signal Processing §11.3: noise gain 1/(1 − a²)
    assertClose(roundoffNoiseGain(design), 1 / (1 - a * a), { rel: 1e-12 }, `noise gain a=${a}`);
    assertClose(
      roundoffNoiseGain({ kind: "rational", numerator: [1], denominator: [1, -a] }),
      1 / (1 - a * a),
      { rel: 1e-12 },
      "direct form",
    );
  }
  assert.equal(roundoffNoiseGain({ kind: "fir", taps: [0.2, 0.3] }), 1);
});

Deno.test("two-pole resonator norms: SciPy lfilter and the closed-form L2", () => {
  const [one, a1, a2] = fixture.resonator.denominator as [number, number, number];
  const n = outputNorms({ kind: "rational", numerator: [one], denominator: [1, a1, a2] });
  // source: scipy.signal.lfilter impulse response, 6000 samples (SciPy 1.10.1), verify.json
  assertClose(n.l1, fixture.resonator.l1, { rel: 1e-10 }, "L1");
  assertClose(n.l2, fixture.resonator.l2, { rel: 1e-12 }, "L2");
  assertClose(n.lInfinity, fixture.resonator.linf, { rel: 1e-14 }, "L∞");
  // source: from memory, Σh² = (1 + a2) / ((1 − a2)((1 + a2)² − a1²)) for 1/(1 + a1 z^−1 + a2 z^−2)
  assertClose(n.l2 ** 2, (1 + a2) / ((1 - a2) * ((1 + a2) ** 2 - a1 * a1)), { rel: 1e-12 }, "L2²");
});

Deno.test("section node norms: one pole by hand, butter4 output = whole-design norms", () => {
  const [k] = sectionNodeNorms([{ b0: 1, b1: 0, b2: 0, a1: -0.5, a2: 0 }]);
  // s1[n] = 0.5·y[n] = 0.5^(n+1): L1 = 1, L2² = 1/3, L∞ = 0.5
  assertClose(k!.state1.l1, 1, { rel: 1e-12 }, "s1 L1");
  assertClose(k!.state1.l2 ** 2, 1 / 3, { rel: 1e-12 }, "s1 L2²");
  assert.equal(k!.state1.lInfinity, 0.5);
  assert.deepEqual(k!.state2, { l1: 0, l2: 0, lInfinity: 0 });
  const c = referenceCase("butter4");
  const nodes = sectionNodeNorms(sectionsOf(c));
  // source: scipy.signal.sosfilt impulse response norms (SciPy 1.10.1), verify.json
  assertClose(nodes[1]!.output.l1, c.impulseL1!, { rel: 1e-10 }, "cascade L1");
  assertClose(nodes[1]!.output.l2, c.impulseL2!, { rel: 1e-12 }, "cascade L2");
});

Deno.test("scaling sections holds each inner node's norm to 1 and keeps the response", () => {
  const c = referenceCase("butter4");
  const original = sectionsOf(c);
  for (const norm of ["l1", "l2", "peakGain"] as const) {
    const scaled = scaleSections(original, norm);
    const nodes = sectionNodeNorms(scaled.sections);
    if (norm === "l1") assertClose(nodes[0]!.output.l1, 1, { rel: 1e-12 }, "L1 node");
    if (norm === "l2") assertClose(nodes[0]!.output.l2, 1, { rel: 1e-12 }, "L2 node");
    if (norm === "peakGain") {
      const n = outputNorms({ kind: "sections", sections: scaled.sections.slice(0, 1) });
      assertClose(n.peakGain, 1, { rel: 1e-9 }, "peak gain node");
    }
    assertClose(scaled.factors.reduce((a, b) => a * b), 1, { rel: 1e-12 }, "factors multiply to 1");
    const f = [0, 300, 1000, 2500];
    const a = responseOf({ kind: "sections", sections: original }, f, 8000);
    const b = responseOf({ kind: "sections", sections: scaled.sections }, f, 8000);
    assertClose(b.re, a.re, { abs: 1e-14 }, `${norm} re`);
    assertClose(b.im, a.im, { abs: 1e-14 }, `${norm} im`);
  }
  assert.throws(
    () => scaleSections([{ b0: 1, b1: 0, b2: 0, a1: -1.2, a2: 0 }, original[0]!]),
    (e: Error) => e instanceof RangeError && e.message.includes("stable"),
  );
});

Deno.test("norms of an unstable design are refused; sequence norms by hand", () => {
  assert.throws(
    () => outputNorms({ kind: "rational", numerator: [1], denominator: [1, -1] }),
    (e: Error) => e instanceof RangeError && e.message.includes("stable"),
  );
  assert.deepEqual(sequenceNorms([1, -2, 2]), { l1: 5, l2: 3, lInfinity: 2 });
});
