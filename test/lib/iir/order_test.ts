import assert from "node:assert";
import { estimateIirOrder, type IirRequirements } from "../../../lib/iir/order.ts";
import { designIir } from "../../../lib/iir/design.ts";
import { sectionsResponse } from "../../../lib/iir/analysis.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { fixture } from "./_fixture.ts";

for (const c of fixture.orders) {
  Deno.test(`estimateIirOrder matches ${c.reference}: ${c.name}`, () => {
    // source: c.reference with fs in Hz, Debian SciPy 1.10.1 (make_iir.py): same order, and the
    // same natural frequencies (1e-9 relative) for the edges designIir takes.
    const e = estimateIirOrder(c.requirements as IirRequirements);
    assert.equal(e.order, c.order);
    const edges = typeof e.edges === "number" ? [e.edges] : [...e.edges];
    assertClose(edges, c.edges, { rel: 1e-9 }, `${c.name} edges`);
  });
}

function lossDb(
  sections: ReturnType<typeof designIir>["sections"],
  f: number[],
  fs: number,
): number[] {
  const h = sectionsResponse(sections, f, fs);
  return f.map((_, i) => -20 * Math.log10(Math.hypot(h.re[i]!, h.im[i]!)));
}

Deno.test("estimateIirOrder → designIir meets the requirement, and one order less does not", () => {
  // common practice: the estimate is the smallest order meeting both limits.
  const fs = 8000;
  const cases: IirRequirements[] = [
    {
      family: "butterworth",
      response: "bandstop",
      fs,
      passband: [500, 1500],
      stopband: [800, 1100],
      passbandRippleDb: 1,
      stopbandAttenuationDb: 30,
    },
    {
      family: "elliptic",
      response: "bandstop",
      fs,
      passband: [500, 1500],
      stopband: [800, 1100],
      passbandRippleDb: 1,
      stopbandAttenuationDb: 60,
    },
    {
      family: "chebyshev2",
      response: "bandpass",
      fs,
      passband: [1000, 1300],
      stopband: [800, 1600],
      passbandRippleDb: 0.5,
      stopbandAttenuationDb: 50,
    },
    {
      family: "bessel",
      response: "lowpass",
      fs,
      passband: 200,
      stopband: 1200,
      passbandRippleDb: 1,
      stopbandAttenuationDb: 40,
    },
    {
      family: "bessel",
      response: "bandpass",
      fs,
      passband: [1000, 1500],
      stopband: [400, 3000],
      passbandRippleDb: 3,
      stopbandAttenuationDb: 20,
    },
    {
      family: "chebyshev1",
      response: "bandstop",
      fs,
      passband: [900, 1300],
      stopband: [1000, 1100],
      passbandRippleDb: 0.2,
      stopbandAttenuationDb: 45,
    },
    {
      family: "bessel",
      response: "highpass",
      fs,
      passband: 2000,
      stopband: 300,
      passbandRippleDb: 3,
      stopbandAttenuationDb: 30,
    },
  ];
  for (const r of cases) {
    const e = estimateIirOrder(r);
    const check = (order: number): boolean => {
      const d = designIir({ ...e, order });
      const pass = typeof r.passband === "number" ? [r.passband] : [...r.passband];
      const stop = typeof r.stopband === "number" ? [r.stopband] : [...r.stopband];
      const grid = (a: number, b: number) =>
        Array.from({ length: 201 }, (_, i) => a + ((b - a) * i) / 200);
      let passF: number[];
      let stopF: number[];
      if (r.response === "lowpass") [passF, stopF] = [grid(1, pass[0]!), grid(stop[0]!, fs / 2)];
      else if (r.response === "highpass") {
        [passF, stopF] = [grid(pass[0]!, fs / 2), grid(1, stop[0]!)];
      } else if (r.response === "bandpass") {
        [passF, stopF] = [grid(pass[0]!, pass[1]!), [
          ...grid(1, stop[0]!),
          ...grid(stop[1]!, fs / 2),
        ]];
      } else {[passF, stopF] = [
          [...grid(1, pass[0]!), ...grid(pass[1]!, fs / 2)],
          grid(stop[0]!, stop[1]!),
        ];}
      const passLoss = Math.max(...lossDb(d.sections, passF, fs));
      const stopLoss = Math.min(...lossDb(d.sections, stopF, fs));
      return passLoss <= r.passbandRippleDb + 1e-9 && stopLoss >= r.stopbandAttenuationDb - 1e-9;
    };
    assert.ok(check(e.order), `${r.family} ${r.response} order ${e.order} meets`);
    if (e.order > 1) {
      assert.ok(!check(e.order - 1), `${r.family} ${r.response} order ${e.order - 1} fails`);
    }
  }
});

Deno.test("estimateIirOrder rejects impossible or malformed requirements", () => {
  const ok: IirRequirements = {
    family: "elliptic",
    response: "lowpass",
    fs: 1000,
    passband: 100,
    stopband: 150,
    passbandRippleDb: 1,
    stopbandAttenuationDb: 60,
  };
  const cases: [Partial<IirRequirements>, ErrorConstructor, RegExp][] = [
    [
      { stopband: 80 },
      RangeError,
      /stopband edge above the passband edge, got passband 100 Hz and stopband 80 Hz/,
    ],
    [{ response: "highpass" }, RangeError, /stopband edge below the passband edge/],
    [
      { response: "bandpass", passband: [100, 200], stopband: [120, 300] },
      RangeError,
      /s1 < p1 < p2 < s2/,
    ],
    [
      { response: "bandstop", passband: [100, 200], stopband: [50, 150] },
      RangeError,
      /p1 < s1 < s2 < p2/,
    ],
    [{ stopband: 500 }, RangeError, /below fs\/2 = 500 Hz, got 500 Hz/],
    [{ passbandRippleDb: 0 }, RangeError, /ripple must be greater than 0 dB/],
    [{ stopbandAttenuationDb: 0.5 }, RangeError, /exceed the passband ripple/],
    [{ family: "butterworth", stopband: 100.01 }, RangeError, /order must be at most 40, got/],
    [{ family: "fancy" as "bessel" }, TypeError, /Family must be one of/],
    [{ response: "bandpass" }, TypeError, /two frequencies/],
  ];
  for (const [change, kind, pattern] of cases) {
    assertThrowsMatching(
      () => estimateIirOrder({ ...ok, ...change } as IirRequirements),
      kind,
      pattern,
    );
  }
});
