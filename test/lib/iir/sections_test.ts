import assert from "node:assert";
import {
  polynomialToSections,
  polynomialToZerosPoles,
  sectionsToPolynomial,
  sectionsToZerosPoles,
  zerosPolesToPolynomial,
  zerosPolesToSections,
} from "../../../lib/iir/sections.ts";
import { designIir } from "../../../lib/iir/design.ts";
import { sectionsResponse } from "../../../lib/iir/analysis.ts";
import { responseAt } from "../../../lib/response/frequency_response.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertSameMultiset, assertThrowsMatching } from "../poly/_match.ts";

const elliptic = designIir({
  family: "elliptic",
  response: "bandpass",
  order: 4,
  fs: 8000,
  edges: [1000, 1400],
  passbandRippleDb: 0.5,
  stopbandAttenuationDb: 60,
});

Deno.test("sections → zeros/poles/gain round trip reproduces the design", () => {
  const back = sectionsToZerosPoles(elliptic.sections);
  assertSameMultiset(
    back.zeros,
    elliptic.zerosPolesGain.zeros,
    { rel: 1e-12, abs: 1e-12 },
    "zeros",
  );
  assertSameMultiset(back.poles, elliptic.zerosPolesGain.poles, { rel: 1e-12 }, "poles");
  assertClose(back.gain, elliptic.zerosPolesGain.gain, { rel: 1e-12 }, "gain");
});

Deno.test("pairing and ordering: most resonant pair last, with the zero pair nearest to it", () => {
  // source: L. B. Jackson, Digital Filters and Signal Processing (from memory) (pair poles with nearest zeros)
  // Ordering: pole radius increases along the cascade (most resonant section last).
  const radii = elliptic.sections.map((s) => Math.sqrt(s.a2));
  for (let i = 1; i < radii.length; i++) {
    assert.ok(radii[i]! >= radii[i - 1]!, `radius order at ${i}`);
  }
  // The most resonant pole pair gets the zero pair nearest to it among all zeros.
  const last = sectionsToZerosPoles([elliptic.sections.at(-1)!]);
  const p = last.poles.find((q) => q.im > 0)!;
  const nearest = elliptic.zerosPolesGain.zeros.reduce((best, z) =>
    Math.hypot(z.re - p.re, z.im - p.im) < Math.hypot(best.re - p.re, best.im - p.im) ? z : best
  );
  assert.ok(
    last.zeros.some((z) =>
      Math.abs(z.re - nearest.re) < 1e-12 && Math.abs(z.im - nearest.im) < 1e-12
    ),
  );
});

Deno.test("unit-peak gain placement: every section but the last peaks at exactly 1", () => {
  const f = Array.from({ length: 2001 }, (_, i) => (i * 4000) / 2000);
  elliptic.sections.slice(0, -1).forEach((s, i) => {
    const h = sectionsResponse([s], f, 8000);
    let peak = 0;
    for (let k = 0; k < f.length; k++) peak = Math.max(peak, Math.hypot(h.re[k]!, h.im[k]!));
    assertClose(peak, 1, { rel: 2e-3 }, `section ${i} peak (2001-point grid)`);
  });
  // "first" placement gives the same overall response.
  const first = zerosPolesToSections(elliptic.zerosPolesGain, { gainPlacement: "first" });
  const a = sectionsResponse(first, [1200, 500], 8000);
  const b = sectionsResponse(elliptic.sections, [1200, 500], 8000);
  assertClose(a.re, b.re, { rel: 1e-12, abs: 1e-15 }, "re");
  assertClose(a.im, b.im, { rel: 1e-12, abs: 1e-15 }, "im");
});

Deno.test("sections → polynomial agrees with the section response", () => {
  const { numerator, denominator, warnings } = sectionsToPolynomial(elliptic.sections);
  assert.equal(numerator.length, 9);
  assert.equal(denominator[0], 1);
  assert.deepEqual(warnings, []);
  const f = [0, 900, 1000, 1200, 1400, 2500, 4000];
  const viaPoly = responseAt(numerator, denominator, f, 8000);
  const viaSections = sectionsResponse(elliptic.sections, f, 8000);
  assertClose(viaPoly.re, viaSections.re, { abs: 1e-10 }, "re");
  assertClose(viaPoly.im, viaSections.im, { abs: 1e-10 }, "im");
});

Deno.test("sections → polynomial warns when a high-order denominator is ill-conditioned", () => {
  // common practice: a narrow order-16 elliptic bandpass should not be run as one polynomial.
  const narrow = designIir({
    family: "elliptic",
    response: "bandpass",
    order: 8,
    fs: 48000,
    edges: [1000, 1100],
    passbandRippleDb: 0.5,
    stopbandAttenuationDb: 80,
  });
  const { warnings } = sectionsToPolynomial(narrow.sections);
  assert.ok(warnings.some((w) => w.code === "polynomial-ill-conditioned"));
  assert.ok(zerosPolesToPolynomial(narrow.zerosPolesGain).warnings.length === 1);
});

Deno.test("zeros/poles ⇄ polynomial round trip", () => {
  const zpk = {
    zeros: [{ re: -1, im: 0 }, { re: 0.3, im: 0.8 }, { re: 0.3, im: -0.8 }],
    poles: [{ re: 0.5, im: 0 }, { re: 0.2, im: 0.6 }, { re: 0.2, im: -0.6 }],
    gain: 0.7,
  };
  const { numerator, denominator } = zerosPolesToPolynomial(zpk);
  const back = polynomialToZerosPoles(numerator, denominator);
  assertSameMultiset(back.zeros, zpk.zeros, { abs: 1e-14 }, "zeros");
  assertSameMultiset(back.poles, zpk.poles, { abs: 1e-14 }, "poles");
  assertClose(back.gain, 0.7, { rel: 1e-15 }, "gain");
});

Deno.test("zerosPolesToSections: fewer zeros than poles fills with zeros at the origin", () => {
  const s = zerosPolesToSections({
    zeros: [],
    poles: [{ re: 0.5, im: 0 }, { re: -0.25, im: 0 }, { re: 0.1, im: 0 }],
    gain: 2,
  }, {
    gainPlacement: "first",
  });
  assert.equal(s.length, 2);
  const back = sectionsToZerosPoles(s);
  assert.equal(back.poles.length + 0, back.poles.length);
  assert.equal(back.zeros.filter((z) => z.re === 0 && z.im === 0).length, back.zeros.length);
  assertClose(back.gain, 2, { rel: 1e-15 }, "gain");
});

Deno.test("conversions reject malformed input", () => {
  assertThrowsMatching(
    () => zerosPolesToSections({ zeros: [{ re: 0, im: 1 }], poles: [{ re: 0.5, im: 0 }], gain: 1 }),
    TypeError,
    /conjugate pairs/,
  );
  assertThrowsMatching(
    () => zerosPolesToSections({ zeros: [], poles: [], gain: 1 }),
    RangeError,
    /at least one zero or pole/,
  );
  assertThrowsMatching(
    () => zerosPolesToSections({ zeros: [], poles: [{ re: NaN, im: 0 }], gain: 1 }),
    TypeError,
    /Pole \[0\] must be a finite complex number/,
  );
  assertThrowsMatching(
    () =>
      zerosPolesToSections({ zeros: [], poles: [{ re: 0, im: 0 }], gain: 1 }, {
        gainPlacement: "even" as "first",
      }),
    TypeError,
    /Gain placement/,
  );
  assertThrowsMatching(() => sectionsToPolynomial([]), RangeError, /at least 1 section/);
  assertThrowsMatching(() => polynomialToZerosPoles([0], [1]), RangeError, /non-zero/);
});

Deno.test("polynomial → sections reproduces the response of an order-8 design", () => {
  // Elliptic: all zeros simple. (An m-fold root, like the 4-fold notch zeros of a Chebyshev I
  // bandstop, is only determined to about ε^(1/m) by its polynomial — the reason to keep sections.)
  const d = designIir({
    family: "elliptic",
    response: "lowpass",
    order: 8,
    fs: 1000,
    edges: 100,
    passbandRippleDb: 0.5,
    stopbandAttenuationDb: 60,
  });
  const { numerator, denominator } = sectionsToPolynomial(d.sections);
  const back = polynomialToSections(numerator, denominator);
  assert.equal(back.length, 4);
  const f = [0, 50, 100, 150, 200, 300, 500];
  const a = sectionsResponse(back, f, 1000);
  const b = sectionsResponse(d.sections, f, 1000);
  assertClose(a.re, b.re, { abs: 1e-9 }, "re");
  assertClose(a.im, b.im, { abs: 1e-9 }, "im");
  assertThrowsMatching(() => polynomialToSections([1], [0, 1]), RangeError, /a\[0\] must not be 0/);
});
