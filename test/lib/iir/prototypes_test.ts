import assert from "node:assert";
import {
  besselPrototype,
  butterworthPrototype,
  chebyshev1Prototype,
  chebyshev2Prototype,
  ellipticPrototype,
} from "../../../lib/iir/prototypes.ts";
import type { ZerosPolesGain } from "../../../lib/types.ts";
import { polynomialFromRoots } from "../../../lib/poly/polynomial.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertSameMultiset, assertThrowsMatching } from "../poly/_match.ts";
import { complexList, fixture, type Json } from "./_fixture.ts";

function prototypeOf(c: Json): ZerosPolesGain {
  switch (c.family) {
    case "butterworth":
      return butterworthPrototype(c.order);
    case "chebyshev1":
      return chebyshev1Prototype(c.order, c.rippleDb);
    case "chebyshev2":
      return chebyshev2Prototype(c.order, c.attenuationDb);
    case "elliptic":
      return ellipticPrototype(c.order, c.rippleDb, c.attenuationDb);
    default:
      return besselPrototype(c.order, c.normalisation);
  }
}

for (const c of fixture.prototypes) {
  Deno.test(`prototype matches ${c.reference}: ${c.name}`, () => {
    // source: c.reference, Debian SciPy 1.10.1 (test/reference/make_iir.py); 1e-9 relative.
    const got = prototypeOf(c);
    assertSameMultiset(got.zeros, complexList(c.zeros), { rel: 1e-9 }, `${c.name} zeros`);
    assertSameMultiset(got.poles, complexList(c.poles), { rel: 1e-9 }, `${c.name} poles`);
    assertClose(got.gain, c.gain, { rel: 1e-9 }, `${c.name} gain`);
  });
}

/** |H(jω)| of an analog zpk. */
function analogMagnitude(zpk: ZerosPolesGain, w: number): number {
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(z.re, w - z.im);
  for (const p of zpk.poles) m /= Math.hypot(p.re, w - p.im);
  return m;
}

Deno.test("Butterworth poles lie on the unit circle at angles π/2 + (2k − 1)π/(2N)", () => {
  // source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., ch. 7 (Butterworth poles)
  for (const n of [3, 6, 7]) {
    const angles = butterworthPrototype(n).poles.map((p) => Math.atan2(p.im, p.re)).sort((a, b) =>
      a - b
    );
    const expected = Array.from({ length: n }, (_, k) => {
      const a = Math.PI / 2 + ((2 * (k + 1) - 1) * Math.PI) / (2 * n);
      return a > Math.PI ? a - 2 * Math.PI : a;
    }).sort((a, b) => a - b);
    assertClose(angles, expected, { abs: 1e-14 }, `N=${n} angles`);
    for (const p of butterworthPrototype(n).poles) {
      assertClose(Math.hypot(p.re, p.im), 1, { abs: 1e-15 }, "radius");
    }
  }
});

Deno.test("Butterworth normalised polynomials match the textbook table", () => {
  // source: the normalised Butterworth polynomial table, e.g. A. B. Williams and F. J. Taylor,
  // Electronic Filter Design Handbook, Table "Butterworth polynomials" (closed forms from memory:
  // N=4 coefficients 1/sin(π/8) = 2.6131259 and 2 + √2; N=5 coefficients 1 + √5 and 3 + √5).
  const table: Record<number, number[]> = {
    1: [1, 1],
    2: [1, Math.SQRT2, 1],
    3: [1, 2, 2, 1],
    4: [1, 1 / Math.sin(Math.PI / 8), 2 + Math.SQRT2, 1 / Math.sin(Math.PI / 8), 1],
    5: [1, 1 + Math.sqrt(5), 3 + Math.sqrt(5), 3 + Math.sqrt(5), 1 + Math.sqrt(5), 1],
  };
  for (const [n, coefficients] of Object.entries(table)) {
    const c = polynomialFromRoots(butterworthPrototype(Number(n)).poles);
    assertClose(c, coefficients, { rel: 1e-14 }, `N=${n}`);
  }
});

Deno.test("Chebyshev I poles lie on the ellipse with semi-axes sinh μ and cosh μ", () => {
  // source: Parks & Burrus, Digital Filter Design (from memory): p_k = −sinh μ sin θ_k + j cosh μ cos θ_k,
  // μ = asinh(1/ε)/N — here checked as (Re p / sinh μ)² + (Im p / cosh μ)² = 1.
  for (const [n, rp] of [[4, 1], [5, 0.25]] as const) {
    const eps = Math.sqrt(10 ** (rp / 10) - 1);
    const mu = Math.asinh(1 / eps) / n;
    for (const p of chebyshev1Prototype(n, rp).poles) {
      assertClose(
        (p.re / Math.sinh(mu)) ** 2 + (p.im / Math.cosh(mu)) ** 2,
        1,
        { abs: 1e-14 },
        "ellipse",
      );
    }
    // The passband edge is where the loss equals the ripple: |H(j1)|² = 1/(1 + ε²).
    const zpk = chebyshev1Prototype(n, rp);
    assertClose(-20 * Math.log10(analogMagnitude(zpk, 1)), rp, { abs: 1e-12 }, "loss at 1 rad/s");
  }
});

Deno.test("Chebyshev II gain first reaches −As at 1 rad/s and stays below it beyond", () => {
  // source: Parks & Burrus, Digital Filter Design (from memory) (inverse Chebyshev: equiripple stopband from Ω = 1)
  const zpk = chebyshev2Prototype(5, 45);
  assertClose(-20 * Math.log10(analogMagnitude(zpk, 1)), 45, { abs: 1e-10 }, "loss at 1 rad/s");
  for (let w = 1; w < 20; w += 0.01) {
    assert.ok(-20 * Math.log10(analogMagnitude(zpk, w)) >= 45 - 1e-9, `loss at ${w}`);
  }
});

Deno.test("Elliptic stopband edge 1/k satisfies the degree equation", () => {
  // source: degree equation N = K(k)·K′(k1) / (K′(k)·K(k1)) (Daniels, Approximation Methods for
  // Electronic Filter Design, ch. 5; Orfanidis, Lecture notes on elliptic filter design, eq. (4)).
  // The design's equiripple stopband starts at Ω_s = 1/k: the loss there equals As exactly, and
  // the ratio computed from that edge equals N.
  const n = 5;
  const rp = 0.5;
  const as = 60;
  const zpk = ellipticPrototype(n, rp, as);
  // Find Ω_s: the first frequency > 1 where the loss reaches As, by bisection.
  let lo = 1;
  let hi = 10;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (-20 * Math.log10(analogMagnitude(zpk, mid)) < as) lo = mid;
    else hi = mid;
  }
  const k = 1 / ((lo + hi) / 2);
  const k1 = Math.sqrt((10 ** (rp / 10) - 1) / (10 ** (as / 10) - 1));
  const bigK = (m: number) => {
    let a = 1;
    let b = Math.sqrt(1 - m);
    for (let i = 0; i < 40; i++) [a, b] = [(a + b) / 2, Math.sqrt(a * b)];
    return Math.PI / (2 * a);
  };
  const ratio = (bigK(k * k) * bigK(1 - k1 * k1)) / (bigK(1 - k * k) * bigK(k1 * k1));
  assertClose(ratio, n, { rel: 1e-9 }, "degree equation");
  // The passband ripple is exactly Rp at 1 rad/s.
  assertClose(-20 * Math.log10(analogMagnitude(zpk, 1)), rp, { abs: 1e-10 }, "loss at 1 rad/s");
});

Deno.test("Bessel delay-normalised group delay is maximally flat: 1 − τ(ω) grows like ω^(2N)", () => {
  // source: W. E. Thomson, Proc. IEE 96 (1949): the Bessel delay τ(ω) = 1 − O(ω^(2N)) near DC
  // (maximally flat delay), so (1 − τ(2ω))/(1 − τ(ω)) → 2^(2N) as ω → 0.
  const tau = (poles: { re: number; im: number }[], w: number) =>
    poles.reduce((t, p) => t - p.re / (p.re * p.re + (w - p.im) ** 2), 0);
  for (const n of [2, 3, 4]) {
    const { poles } = besselPrototype(n, "delay");
    assertClose(tau(poles, 0), 1, { abs: 1e-13 }, `τ(0), N=${n}`);
    const w = 0.08;
    const ratio = (1 - tau(poles, 2 * w)) / (1 - tau(poles, w));
    assertClose(ratio, 2 ** (2 * n), { rel: 0.05 }, `flatness ratio N=${n}`);
  }
});

Deno.test("Bessel magnitude normalisation puts −3.0103 dB at 1 rad/s", () => {
  // source: definition of the "magnitude" normalisation (|H(j1)|² = 1/2), common practice
  for (const n of [2, 5, 9]) {
    const zpk = besselPrototype(n, "magnitude");
    assertClose(analogMagnitude(zpk, 1) ** 2, 0.5, { abs: 1e-13 }, `N=${n}`);
  }
});

Deno.test("prototypes reject bad input", () => {
  assertThrowsMatching(
    () => butterworthPrototype(0),
    RangeError,
    /order must be between 1 and 40, got 0/,
  );
  assertThrowsMatching(() => butterworthPrototype(2.5), RangeError, /integer/);
  assertThrowsMatching(() => butterworthPrototype(1000), RangeError, /between 1 and 40, got 1000/);
  assertThrowsMatching(
    () => chebyshev1Prototype(3, 0),
    RangeError,
    /ripple must be greater than 0 dB, got 0/,
  );
  assertThrowsMatching(() => chebyshev1Prototype(3, -1), RangeError, /ripple/);
  assertThrowsMatching(
    () => chebyshev2Prototype(3, 0),
    RangeError,
    /attenuation must be greater than 0/,
  );
  assertThrowsMatching(
    () => ellipticPrototype(3, 1, 0.5),
    RangeError,
    /exceed the passband ripple \(1 dB\), got 0.5/,
  );
  assertThrowsMatching(() => besselPrototype(30), RangeError, /between 1 and 25, got 30/);
  assertThrowsMatching(() => besselPrototype(3, "group" as "phase"), TypeError, /normalisation/);
  assertThrowsMatching(() => chebyshev1Prototype(3, NaN), TypeError, /finite/);
});
