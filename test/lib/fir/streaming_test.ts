import assert from "node:assert/strict";
import { applyFirDirect } from "../../../lib/fir/apply.ts";
import { StreamingFirFilter } from "../../../lib/fir/streaming.ts";
import { whiteNoise } from "../../../lib/signal/noise.ts";

/** Bitwise equality, element by element (+0 and −0 count as equal). */
function assertSame(actual: ArrayLike<number>, expected: ArrayLike<number>, what: string): void {
  assert.equal(actual.length, expected.length, `${what} length`);
  for (let i = 0; i < expected.length; i++) {
    assert.ok(actual[i] === expected[i], `${what}[${i}]: ${actual[i]} !== ${expected[i]}`);
  }
}

Deno.test("block streaming equals one-shot filtering exactly, for any block sizes", () => {
  const x = whiteNoise(3000, { seed: 77 });
  for (const taps of [1, 2, 5, 31, 255]) {
    const h = whiteNoise(taps, { seed: 100 + taps });
    const oneShot = applyFirDirect(h, x);
    for (const sizes of [[1], [3], [4], [7, 1, 0, 13], [500], [2999, 1]]) {
      const filter = new StreamingFirFilter(h);
      const parts: number[] = [];
      let at = 0;
      for (let b = 0; at < x.length; b++) {
        const size = sizes[b % sizes.length]!;
        parts.push(...filter.process(x.subarray(at, at + size)));
        at += size;
      }
      // property: block streaming equals one-shot, bit for bit
      assertSame(parts, oneShot, `${taps} taps, blocks ${sizes.join("/")}`);
    }
  }
});

Deno.test("reset returns the filter to rest", () => {
  const filter = new StreamingFirFilter([1, 1, 1]);
  filter.process([5, 5, 5]);
  filter.reset();
  assertSame(filter.process([1, 0, 0, 0]), [1, 1, 1, 0], "after reset");
  assert.deepEqual([...filter.taps], [1, 1, 1]);
});

Deno.test("bad input to the streaming filter", () => {
  assert.throws(() => new StreamingFirFilter([]), RangeError);
  const filter = new StreamingFirFilter([1]);
  assert.throws(
    () => filter.process([1, Number.NaN]),
    (e: unknown) =>
      e instanceof TypeError && e.message.includes("Block[1] must be a finite number"),
  );
});
