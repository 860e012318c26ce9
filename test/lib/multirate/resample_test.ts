import assert from "node:assert/strict";
import {
  decimatePolyphase,
  designResamplingFilter,
  interpolatePolyphase,
  resampleRational,
} from "../../../lib/multirate/resample.ts";
import { assertClose } from "../../_tolerance.ts";

const reference = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/fir_design.json", import.meta.url)),
);

Deno.test("resampleRational equals the first ⌈N·up/down⌉ samples of scipy.signal.upfirdn", () => {
  // source: scipy.signal.upfirdn, SciPy 1.10.1 (test/reference/make_fir_design.py)
  for (const c of reference.polyphase) {
    const y = resampleRational(c.signal, c.up, c.down, { taps: c.taps });
    const n = Math.ceil((c.signal.length * c.up) / c.down);
    assert.equal(y.length, n);
    assertClose(y, c.output.slice(0, n), { abs: 1e-13 }, `up ${c.up} down ${c.down}`);
  }
});

/** Plain zero-stuff, filter, keep every down-th: the definition the polyphase form must match. */
function naive(x: number[], h: Float64Array, up: number, down: number): number[] {
  const u = new Array(x.length * up).fill(0);
  x.forEach((v, i) => (u[i * up] = v));
  const out: number[] = [];
  for (let n = 0; n * down < u.length; n++) {
    let acc = 0;
    for (let k = 0; k < h.length; k++) {
      const i = n * down - k;
      if (i >= 0 && i < u.length) acc += h[k]! * u[i];
    }
    out.push(acc);
  }
  return out;
}

Deno.test("decimatePolyphase and interpolatePolyphase equal the naive definition", () => {
  const x = Array.from({ length: 37 }, (_, i) => Math.sin(0.3 * i) + 0.1 * i);
  const h4 = designResamplingFilter(1, 4);
  assertClose(decimatePolyphase(x, 4), naive(x, h4, 1, 4), { abs: 1e-13 }, "decimate by 4");
  const h3 = designResamplingFilter(3, 1);
  assertClose(interpolatePolyphase(x, 3), naive(x, h3, 3, 1), { abs: 1e-13 }, "interpolate by 3");
  const h = designResamplingFilter(5, 3);
  assertClose(resampleRational(x, 5, 3), naive(x, h, 5, 3), { abs: 1e-13 }, "5/3");
  assert.deepEqual([...decimatePolyphase([1, 2, 3], 1)], [1, 2, 3]);
});

Deno.test("resampling keeps a slow tone's level and frequency", () => {
  // A 0.01-cycles/sample tone resampled by 3/2 is a 0.01·2/3-cycles/sample tone of the same
  // amplitude once the filter delay (60/2 samples at the high rate) has passed (common practice).
  const x = Array.from({ length: 600 }, (_, i) => Math.cos(2 * Math.PI * 0.01 * i));
  const y = resampleRational(x, 3, 2);
  const delay = (designResamplingFilter(3, 2).length - 1) / 2; // at the upsampled rate
  for (let n = 100; n < 800; n += 37) {
    const t = (n * 2 - delay) / 3; // input-rate time of output sample n
    assertClose(y[n]!, Math.cos(2 * Math.PI * 0.01 * t), { abs: 2e-3 }, `y[${n}]`);
  }
});

Deno.test("polyphase rate changers reject bad input", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => decimatePolyphase([1, 2], 0), RangeError, "between 1 and 4096, got 0"],
    [() => interpolatePolyphase([1, 2], 2.5), RangeError, "integer"],
    [() => resampleRational([1, NaN], 2, 1), TypeError, "Signal[1]"],
    [() => resampleRational([1, 2], 2, 1, { taps: [] }), RangeError, "Taps must hold at least 1"],
    [() => designResamplingFilter(1, 1), RangeError, "up or down above 1"],
  ];
  for (const [call, kind, text] of cases) {
    assert.throws(
      call,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});
