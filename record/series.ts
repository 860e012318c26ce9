// Small helpers on (x, y) series shared by the renderer and the comparison.

/**
 * Linear interpolation of points sorted by x at `at`; NaN outside them or
 * next to a gap (a NaN y).
 */
export function interpolate(x: readonly number[], y: readonly number[], at: number): number {
  let lo = 0;
  let hi = x.length - 1;
  if (hi < 0 || !(at >= x[0]! && at <= x[hi]!)) return NaN;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid]! <= at) lo = mid;
    else hi = mid;
  }
  if (x[lo] === at) return y[lo]!;
  if (x[hi] === at) return y[hi]!;
  const t = (at - x[lo]!) / (x[hi]! - x[lo]!);
  return y[lo]! + t * (y[hi]! - y[lo]!);
}
