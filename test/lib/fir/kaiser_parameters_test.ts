import assert from "node:assert/strict";
import { kaiserBeta, kaiserParameters } from "../../../lib/fir/kaiser_parameters.ts";
import { assertClose } from "../../_tolerance.ts";

Deno.test("kaiserBeta follows Kaiser's three-piece formula", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., eq. (7.75) (coefficients from memory,
  // cross-checked against scipy.signal.kaiser_beta in windowed_sinc_test.ts).
  assert.equal(kaiserBeta(0), 0);
  assert.equal(kaiserBeta(20.9), 0);
  assertClose(kaiserBeta(21), 0, { abs: 0 }, "β(21)");
  assertClose(kaiserBeta(30), 0.5842 * 9 ** 0.4 + 0.07886 * 9, { rel: 1e-15 }, "β(30)");
  assertClose(kaiserBeta(80), 0.1102 * 71.3, { rel: 1e-15 }, "β(80)");
});

Deno.test("kaiserParameters accepts ripple or attenuation and rejects bad input", () => {
  const a = kaiserParameters({ fs: 1000, transitionWidth: 50, attenuationDb: 60 });
  const b = kaiserParameters({ fs: 1000, transitionWidth: 50, ripple: 0.001 });
  assert.deepEqual(a, b);
  // M = (60 − 8)/(2.285 · 2π · 0.05) = 72.4 → 73.
  assert.equal(a.order, 73);
  const cases: [Parameters<typeof kaiserParameters>[0], ErrorConstructor, string][] = [
    [
      { fs: 1000, transitionWidth: 0, attenuationDb: 60 },
      RangeError,
      "greater than 0 Hz, got 0 Hz",
    ],
    [{ fs: 1000, transitionWidth: 600, attenuationDb: 60 }, RangeError, "below fs/2 = 500 Hz"],
    [
      { fs: 1000, transitionWidth: 50, attenuationDb: -3 },
      RangeError,
      "between 0 and 300 dB, got -3 dB",
    ],
    [{ fs: 1000, transitionWidth: 50, ripple: 1.5 }, RangeError, "between 0 and 1"],
    [{ fs: 1000, transitionWidth: 50 }, TypeError, "attenuationDb or ripple"],
  ];
  for (const [spec, kind, text] of cases) {
    assert.throws(
      () => kaiserParameters(spec),
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
