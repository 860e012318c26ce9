// The one tolerance helper for tests: relative and absolute, NaN-aware.
import { AssertionError } from "node:assert";

export interface Tolerance {
  /** Allowed relative error, |a - e| <= rel * |e|. @default 0 */
  rel?: number;
  /** Allowed absolute error, |a - e| <= abs. @default 0 */
  abs?: number;
}

/** True when `actual` is within tolerance of `expected` (NaN equals NaN). */
export function isClose(actual: number, expected: number, tol: Tolerance): boolean {
  if (Number.isNaN(expected) || Number.isNaN(actual)) {
    return Number.isNaN(expected) && Number.isNaN(actual);
  }
  if (actual === expected) return true;
  const diff = Math.abs(actual - expected);
  return diff <= (tol.abs ?? 0) || diff <= (tol.rel ?? 0) * Math.abs(expected);
}

/** Assert one number, or each element of two equally long arrays, is close. */
export function assertClose(
  actual: number | ArrayLike<number>,
  expected: number | ArrayLike<number>,
  tol: Tolerance,
  what = "value",
): void {
  if (typeof actual === "number" || typeof expected === "number") {
    if (typeof actual !== "number" || typeof expected !== "number") {
      throw new AssertionError({ message: `${what}: number compared with array` });
    }
    if (!isClose(actual, expected, tol)) {
      throw new AssertionError({
        message: `${what}: ${actual} differs from ${expected} by ${
          Math.abs(actual - expected)
        } (tolerance ${JSON.stringify(tol)})`,
      });
    }
    return;
  }
  if (actual.length !== expected.length) {
    throw new AssertionError({
      message: `${what}: length ${actual.length}, expected ${expected.length}`,
    });
  }
  for (let i = 0; i < expected.length; i++) {
    const a = actual[i] as number;
    const e = expected[i] as number;
    if (!isClose(a, e, tol)) {
      throw new AssertionError({
        message: `${what}[${i}]: ${a} differs from ${e} by ${Math.abs(a - e)} (tolerance ${
          JSON.stringify(tol)
        })`,
      });
    }
  }
}
