import assert from "node:assert";
import {
  applyDesign,
  decayLength,
  type FilterDesign,
  gainDbAt,
  groupDelayOf,
  impulseResponseOf,
  poleRadius,
  polesOf,
  responseAt,
  responseOf,
  type Section,
  stepResponseOf,
} from "../../../lib/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { fixture, referenceCase, sectionsOf } from "./_fixture.ts";

/** Multiply the sections out into B(z)/A(z) (test-side polynomial product). */
function expand(sections: readonly Section[]): { b: number[]; a: number[] } {
  const mul = (p: number[], q: number[]) => {
    const r = new Array(p.length + q.length - 1).fill(0);
    p.forEach((x, i) => q.forEach((y, j) => (r[i + j] += x * y)));
    return r;
  };
  let b = [1];
  let a = [1];
  for (const s of sections) {
    b = mul(b, [s.b0, s.b1, s.b2]);
    a = mul(a, [1, s.a1, s.a2]);
  }
  return { b, a };
}

Deno.test("responseOf agrees with responseAt for FIR and rational designs", () => {
  const taps = [0.1, -0.3, 0.7, 0.2];
  const f = [0, 123, 1000, 2500, 4000];
  const ours = responseOf({ kind: "fir", taps }, f, 8000);
  const ref = responseAt(taps, [1], f, 8000);
  assertClose(ours.re, ref.re, { abs: 1e-14 }, "re");
  assertClose(ours.im, ref.im, { abs: 1e-14 }, "im");
});

Deno.test("sections, their expanded rational form and SciPy agree (butter4)", () => {
  const c = referenceCase("butter4");
  const sections = sectionsOf(c);
  const { b, a } = expand(sections);
  const f = [0, 500, 800, 1000, 2000, 3999];
  const s = responseOf(c.design, f, fixture.fs);
  const r = responseOf({ kind: "rational", numerator: b, denominator: a }, f, fixture.fs);
  assertClose(s.re, r.re, { abs: 1e-12 }, "re");
  assertClose(s.im, r.im, { abs: 1e-12 }, "im");
  // source: scipy.signal.sosfreqz via test/reference/verify.json (SciPy 1.10.1): band-edge gains
  assertClose(
    gainDbAt(c.design, 800, fixture.fs),
    c.passband.minDb,
    { abs: 1e-9 },
    "gain at 800 Hz",
  );
  assertClose(
    gainDbAt(c.design, 2000, fixture.fs),
    c.stopband.maxDb,
    { abs: 1e-9 },
    "gain at 2 kHz",
  );
});

Deno.test("group delay matches scipy.signal.group_delay at the band extremes", () => {
  for (const name of ["fir31", "butter4"]) {
    const c = referenceCase(name);
    const g = c.groupDelay!;
    const grid = Array.from({ length: 401 }, (_, i) => g.from + ((g.to - g.from) * i) / 400);
    const d = groupDelayOf(c.design, grid, fixture.fs);
    // source: scipy.signal.group_delay (SciPy 1.10.1), test/reference/verify.json
    assertClose(Math.max(...d), g.max, { rel: 1e-9 }, `${name} max delay`);
    assertClose(Math.min(...d), g.min, { rel: 1e-9 }, `${name} min delay`);
  }
});

Deno.test("pole radius of sections and of the expanded polynomial match numpy.roots", () => {
  const c = referenceCase("butter4");
  const { a } = expand(sectionsOf(c));
  // source: numpy.roots of scipy.signal.sos2tf denominator (NumPy 1.24.2), verify.json
  assertClose(poleRadius(c.design), c.poleRadius!, { rel: 1e-12 }, "sections");
  assertClose(
    poleRadius({ kind: "rational", numerator: [1], denominator: a }),
    c.poleRadius!,
    { rel: 1e-9 },
    "roots of the 4th-order denominator",
  );
  assert.equal(polesOf({ kind: "rational", numerator: [1], denominator: a }).length, 4);
});

Deno.test("impulse-response norms of butter4 match scipy.signal.sosfilt", () => {
  const c = referenceCase("butter4");
  const h = impulseResponseOf(c.design);
  let l1 = 0;
  let l2 = 0;
  for (const v of h) {
    l1 += Math.abs(v);
    l2 += v * v;
  }
  // source: scipy.signal.sosfilt impulse response, 4000 samples (SciPy 1.10.1)
  assertClose(l1, c.impulseL1!, { rel: 1e-10 }, "L1");
  assertClose(Math.sqrt(l2), c.impulseL2!, { rel: 1e-12 }, "L2");
});

Deno.test("one-pole filter: impulse a^n and step 1 − a^(n+1) (textbook identity)", () => {
  const a = 0.8;
  const design: FilterDesign = { kind: "rational", numerator: [1 - a], denominator: [1, -a] };
  const h = impulseResponseOf(design, 10);
  const s = stepResponseOf(design, 10);
  for (let n = 0; n < 10; n++) {
    // source: common practice (geometric series)
    assertClose(h[n]!, (1 - a) * a ** n, { abs: 1e-15 }, `h[${n}]`);
    assertClose(s[n]!, 1 - a ** (n + 1), { abs: 1e-15 }, `s[${n}]`);
  }
  assert.equal(decayLength({ kind: "fir", taps: [1, 2] }), 2);
  assert.ok(decayLength(design) > Math.log(1e-13) / Math.log(a));
});

Deno.test("applyDesign runs sections in the same way as the rational form", () => {
  const c = referenceCase("ellip6");
  const { b, a } = expand(sectionsOf(c));
  const x = Array.from({ length: 200 }, (_, i) => Math.sin(i * 0.37) + (i % 7 === 0 ? 1 : 0));
  assertClose(
    applyDesign(c.design, x),
    applyDesign({ kind: "rational", numerator: b, denominator: a }, x),
    { abs: 1e-9 },
    "cascade vs direct form",
  );
});

Deno.test("bad designs and frequencies are refused with a clear error", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => responseOf({ kind: "fir", taps: [1, NaN] }, [0], 8000), TypeError, "FIR taps[1]"],
    [() => responseOf({ kind: "fir", taps: [] }, [0], 8000), RangeError, "at least 1"],
    [
      () => responseOf({ kind: "rational", numerator: [1], denominator: [0, 1] }, [0], 8000),
      RangeError,
      "a[0] must not be 0",
    ],
    [
      () => responseOf({ kind: "sections", sections: [] }, [0], 8000),
      TypeError,
      "non-empty array",
    ],
    [() => responseOf({ kind: "fir", taps: [1] }, [4001], 8000), RangeError, "fs/2 = 4000 Hz"],
    [
      () => responseOf({ kind: "iir" } as unknown as FilterDesign, [0], 8000),
      TypeError,
      "got iir",
    ],
    [
      () => impulseResponseOf({ kind: "rational", numerator: [1], denominator: [1, -1.01] }),
      RangeError,
      "not stable",
    ],
  ];
  for (const [run, kind, part] of cases) {
    assert.throws(run, (e: Error) => e instanceof kind && e.message.includes(part), part);
  }
});
