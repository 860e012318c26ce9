// Compare two multisets of complex numbers (test helper).
import { AssertionError } from "node:assert";
import type { Complex } from "../../../lib/types.ts";

/** Read [re, im] pairs from a fixture. */
export function complexList(pairs: number[][]): Complex[] {
  return pairs.map(([re, im]) => ({ re: re!, im: im! }));
}

/**
 * Assert two complex multisets are equal within |a − e| ≤ rel·|e| + abs, by
 * matching each expected value to the nearest unmatched actual value
 * (largest expected values first).
 */
export function assertSameMultiset(
  actual: readonly Complex[],
  expected: readonly Complex[],
  tol: { rel?: number; abs?: number },
  what: string,
): void {
  if (actual.length !== expected.length) {
    throw new AssertionError({
      message: `${what}: ${actual.length} values, expected ${expected.length}`,
    });
  }
  const used = new Array<boolean>(actual.length).fill(false);
  const order = expected.map((_, i) => i).sort((a, b) =>
    Math.hypot(expected[b]!.re, expected[b]!.im) - Math.hypot(expected[a]!.re, expected[a]!.im)
  );
  for (const i of order) {
    const e = expected[i]!;
    let best = -1;
    let bestD = Infinity;
    for (let j = 0; j < actual.length; j++) {
      if (used[j]) continue;
      const d = Math.hypot(actual[j]!.re - e.re, actual[j]!.im - e.im);
      if (d < bestD) {
        bestD = d;
        best = j;
      }
    }
    const allowed = (tol.rel ?? 0) * Math.hypot(e.re, e.im) + (tol.abs ?? 0);
    if (best < 0 || bestD > allowed) {
      throw new AssertionError({
        message: `${what}: expected ${e.re}${e.im >= 0 ? "+" : ""}${e.im}j, nearest differs by ${
          bestD.toPrecision(3)
        } (allowed ${allowed.toPrecision(3)})`,
      });
    }
    used[best] = true;
  }
}

/** Assert `fn` throws an instance of `kind` whose message matches `pattern`. */
export function assertThrowsMatching(
  fn: () => unknown,
  kind: new (...args: never[]) => Error,
  pattern: RegExp,
): void {
  let thrown: unknown;
  try {
    fn();
  } catch (e) {
    thrown = e;
  }
  if (!(thrown instanceof kind) || !pattern.test(thrown.message)) {
    throw new AssertionError({
      message: `expected ${kind.name} matching ${pattern}, got ${String(thrown)}`,
    });
  }
}
