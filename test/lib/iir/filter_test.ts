import assert from "node:assert";
import { applyIir, applySections, createSectionState } from "../../../lib/iir/filter.ts";
import { designIir, type IirDesignOptions } from "../../../lib/iir/design.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { fixture, sectionsFromRows } from "./_fixture.ts";

for (const c of fixture.filtering) {
  Deno.test(`applySections matches ${c.sectionsReference}: ${c.name}`, () => {
    // source: scipy.signal.sosfilt, Debian SciPy 1.10.1 (make_iir.py); outputs within 1e-10.
    // Our own design (different pairing/gain placement) and SciPy's sections both checked.
    const ours = designIir(c.design as IirDesignOptions).sections;
    assertClose(applySections(ours, c.input), c.sectionsOutput, { abs: 1e-10 }, `${c.name} (ours)`);
    const theirs = sectionsFromRows(c.sos);
    assertClose(
      applySections(theirs, c.input),
      c.sectionsOutput,
      { abs: 1e-12 },
      `${c.name} (SciPy sections)`,
    );
  });
}

Deno.test(`applyIir matches ${fixture.rationalFilter.reference}`, () => {
  // source: scipy.signal.lfilter, Debian SciPy 1.10.1 (make_iir.py); within 1e-10.
  const r = fixture.rationalFilter;
  assertClose(applyIir(r.numerator, r.denominator, r.input), r.output, { abs: 1e-10 }, r.name);
});

Deno.test("applySections: block-wise with state equals one-shot, bit for bit", () => {
  const c = fixture.filtering[0];
  const s = designIir(c.design as IirDesignOptions).sections;
  const x: number[] = c.input;
  const whole = applySections(s, x);
  const state = createSectionState(s);
  const parts: number[] = [];
  for (const [a, b] of [[0, 1], [1, 100], [100, 100], [100, 1337], [1337, 2000]]) {
    parts.push(...applySections(s, x.slice(a, b), state));
  }
  assert.deepEqual(parts, [...whole]);
});

Deno.test("applyIir: block-wise with state equals one-shot; a0 is normalised", () => {
  const r = fixture.rationalFilter;
  const b = r.numerator.map((v: number) => 2 * v);
  const a = r.denominator.map((v: number) => 2 * v);
  const whole = applyIir(b, a, r.input);
  const state = new Float64Array(4);
  const first = applyIir(b, a, r.input.slice(0, 123), state);
  const second = applyIir(b, a, r.input.slice(123), state);
  assert.deepEqual([...first, ...second], [...whole]);
  assertClose(whole, r.output, { abs: 1e-10 }, "scaled a0");
});

Deno.test("applySections / applyIir reject bad input", () => {
  const s = [{ b0: 1, b1: 0, b2: 0, a1: 0, a2: 0 }];
  assertThrowsMatching(() => applySections([], [1]), RangeError, /at least 1 section/);
  assertThrowsMatching(
    () => applySections([{ b0: 1, b1: NaN, b2: 0, a1: 0, a2: 0 }], [1]),
    TypeError,
    /Section \[0\]\.b1 must be a finite number, got NaN/,
  );
  assertThrowsMatching(() => applySections(s, [1, Infinity]), TypeError, /Signal\[1\]/);
  assertThrowsMatching(
    () => applySections(s, [1], new Float64Array(3)),
    TypeError,
    /2 values per section \(2\), got length 3/,
  );
  assertThrowsMatching(() => applyIir([1], [0, 1], [1]), RangeError, /a\[0\] must not be 0/);
  assertThrowsMatching(
    () => applyIir([1, 2], [1], [1], new Float64Array(2)),
    TypeError,
    /max\(M, N\) = 1/,
  );
  assert.equal(applySections(s, []).length, 0);
});

Deno.test("applySections writes into a given output array, also in place", () => {
  const c = fixture.filtering[1];
  const s = designIir(c.design as IirDesignOptions).sections;
  const x = Float64Array.from(c.input as number[]);
  const expected = applySections(s, x);
  const out = new Float64Array(x.length);
  assert.equal(applySections(s, x, undefined, out), out);
  assert.deepEqual([...out], [...expected]);
  const inPlace = x.slice();
  applySections(s, inPlace, undefined, inPlace);
  assert.deepEqual([...inPlace], [...expected]);
  assertThrowsMatching(
    () => applySections(s, x, undefined, new Float64Array(3)),
    TypeError,
    /as long as the signal \(2000\), got length 3/,
  );
  // A non-finite sample is reported, and the state is left as it was.
  const state = createSectionState(s);
  const bad = x.slice();
  bad[1500] = NaN;
  assertThrowsMatching(
    () => applySections(s, bad, state),
    TypeError,
    /Signal\[1500\] must be a finite number, got NaN/,
  );
  assert.ok(state.every((v) => v === 0));
});
