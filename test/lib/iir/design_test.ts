import assert from "node:assert";
import { designIir, type IirDesignOptions } from "../../../lib/iir/design.ts";
import { sectionsResponse } from "../../../lib/iir/analysis.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertSameMultiset, assertThrowsMatching } from "../poly/_match.ts";
import { complexList, fixture } from "./_fixture.ts";

for (const c of fixture.designs) {
  const options = c.options as IirDesignOptions;
  Deno.test(`designIir matches ${c.reference}: ${c.name}`, () => {
    // source: c.reference with fs in Hz, Debian SciPy 1.10.1 (make_iir.py); zpk within 1e-9 relative.
    const d = designIir(options);
    const zeroTol = { rel: 1e-9, abs: 1e-12 }; // abs: zeros at z = 0 or ±1 compare absolutely
    assertSameMultiset(d.zerosPolesGain.zeros, complexList(c.zeros), zeroTol, `${c.name} zeros`);
    assertSameMultiset(
      d.zerosPolesGain.poles,
      complexList(c.poles),
      { rel: 1e-9 },
      `${c.name} poles`,
    );
    assertClose(d.zerosPolesGain.gain, c.gain, { rel: 1e-9 }, `${c.name} gain`);
  });
  Deno.test(`section response matches ${c.responseReference}: ${c.name}`, () => {
    // source: scipy.signal.sosfreqz of SciPy's own sections (different pairing and gain placement
    // from ours, same transfer function); 1e-9 relative to |H| plus 1e-12 absolute.
    const d = designIir(options);
    const h = sectionsResponse(d.sections, c.frequencies, options.fs);
    const expected = complexList(c.response);
    expected.forEach((e, i) => {
      const diff = Math.hypot(h.re[i]! - e.re, h.im[i]! - e.im);
      const allowed = 1e-9 * Math.hypot(e.re, e.im) + 1e-12;
      assert.ok(diff <= allowed, `${c.name} at ${c.frequencies[i]} Hz: differs by ${diff}`);
    });
  });
}

Deno.test("designIir edges land where asked (pre-warping)", () => {
  // source: definition of the edge per family (Butterworth −3.0103 dB; Chebyshev I / elliptic: loss
  // equals the ripple at the passband edge; Chebyshev II: loss equals As at the stopband edge).
  const fs = 8000;
  const db = (o: IirDesignOptions, f: number) => {
    const h = sectionsResponse(designIir(o).sections, [f], fs);
    return -20 * Math.log10(Math.hypot(h.re[0]!, h.im[0]!));
  };
  const base = { fs, order: 5 } as const;
  assertClose(
    db({ ...base, family: "butterworth", response: "lowpass", edges: 3000 }, 3000),
    10 * Math.log10(2),
    { abs: 1e-9 },
    "Butterworth −3 dB",
  );
  assertClose(
    db(
      { ...base, family: "chebyshev1", response: "highpass", edges: 700, passbandRippleDb: 0.5 },
      700,
    ),
    0.5,
    { abs: 1e-9 },
    "Chebyshev I ripple edge",
  );
  assertClose(
    db({
      ...base,
      family: "chebyshev2",
      response: "lowpass",
      edges: 1200,
      stopbandAttenuationDb: 55,
    }, 1200),
    55,
    { abs: 1e-7 },
    "Chebyshev II stopband edge",
  );
  const band = { ...base, family: "elliptic", response: "bandpass", edges: [1000, 1500] } as const;
  for (const f of [1000, 1500]) {
    assertClose(
      db({ ...band, passbandRippleDb: 0.25, stopbandAttenuationDb: 60 }, f),
      0.25,
      { abs: 1e-9 },
      `elliptic band edge ${f} Hz`,
    );
  }
});

Deno.test("designIir sections: order, first-order section for odd lowpass, stable", () => {
  const d = designIir({
    family: "butterworth",
    response: "lowpass",
    order: 5,
    fs: 1000,
    edges: 100,
  });
  assert.equal(d.order, 5);
  assert.equal(d.sections.length, 3);
  assert.equal(d.sections.filter((s) => s.a2 === 0 && s.b2 === 0).length, 1);
  const bp = designIir({
    family: "elliptic",
    response: "bandpass",
    order: 8,
    fs: 48000,
    edges: [1000, 2000],
    passbandRippleDb: 0.5,
    stopbandAttenuationDb: 70,
  });
  assert.equal(bp.order, 16);
  assert.equal(bp.sections.length, 8);
  assert.deepEqual(bp.warnings, []);
});

Deno.test("designIir warns about sections very close to the unit circle", () => {
  // A 0.001 Hz cutoff at fs = 48 kHz puts a near-double pole pair 1e-7 from z = 1, where one ulp
  // in a1, a2 moves the poles by a few % of that distance; at 0.01 Hz there is no warning.
  const d = designIir({
    family: "butterworth",
    response: "lowpass",
    order: 4,
    fs: 48000,
    edges: 0.001,
  });
  const fine = designIir({
    family: "butterworth",
    response: "lowpass",
    order: 4,
    fs: 48000,
    edges: 0.01,
  });
  assert.deepEqual(fine.warnings, []);
  assert.ok(
    d.warnings.some((w) => w.code === "section-ill-conditioned"),
    JSON.stringify(d.warnings),
  );
});

Deno.test("designIir rejects bad input with the rule and the value", () => {
  const ok: IirDesignOptions = {
    family: "butterworth",
    response: "lowpass",
    order: 4,
    fs: 1000,
    edges: 100,
  };
  const cases: [
    Partial<IirDesignOptions>,
    ErrorConstructor | RangeErrorConstructor | TypeErrorConstructor,
    RegExp,
  ][] = [
    [{ edges: 600 }, RangeError, /below fs\/2 = 500 Hz, got 600 Hz/],
    [{ edges: 0 }, RangeError, /above 0 Hz, got 0 Hz/],
    [{ edges: -5 }, RangeError, /above 0 Hz/],
    [{ fs: 0 }, RangeError, /Sample rate fs must be greater than 0/],
    [{ order: 0 }, RangeError, /order must be between 1 and 40, got 0/],
    [{ order: 500 }, RangeError, /between 1 and 40, got 500/],
    [{ response: "bandpass" }, TypeError, /two frequencies/],
    [{ response: "bandpass", edges: [200, 100] }, RangeError, /increasing.*\[200, 100\]/],
    [{ response: "notch" as "lowpass" }, TypeError, /Response must be one of/],
    [{ family: "chebyshev1" }, TypeError, /needs passbandRippleDb/],
    [
      { family: "chebyshev1", passbandRippleDb: 0 },
      RangeError,
      /ripple must be greater than 0 dB, got 0 dB/,
    ],
    [{ family: "chebyshev2" }, TypeError, /needs stopbandAttenuationDb/],
    [
      { family: "elliptic", passbandRippleDb: 1, stopbandAttenuationDb: 1 },
      RangeError,
      /exceed the passband ripple/,
    ],
    [{ family: "magic" as "bessel" }, TypeError, /Family must be one of/],
  ];
  for (const [change, kind, pattern] of cases) {
    assertThrowsMatching(() => designIir({ ...ok, ...change } as IirDesignOptions), kind, pattern);
  }
});

Deno.test("designIir refuses an unstable result", () => {
  // A 1e-12 Hz cutoff at fs = 48 kHz: 2fs ± p rounds to 2fs, so the bilinear poles land on z = 1.
  assertThrowsMatching(
    () =>
      designIir({ family: "butterworth", response: "lowpass", order: 4, fs: 48000, edges: 1e-12 }),
    RangeError,
    /must be stable .* pole radius of/,
  );
});
