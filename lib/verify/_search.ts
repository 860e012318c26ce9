// Extremes on a grid, refined between neighbouring grid points by golden-section search.

/** Index of the largest (`sign` = 1) or smallest (`sign` = −1) value. */
function extremeIndex(values: ArrayLike<number>, sign: number): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) {
    if (sign * (values[i] as number) > sign * (values[best] as number)) best = i;
  }
  return best;
}

/**
 * The largest (`which` = "max") or smallest value of `fn` over a grid, the grid
 * value refined by golden-section search between the grid neighbours of the
 * best point. `values[i]` must equal fn(grid[i]).
 */
export function extremeOf(
  fn: (x: number) => number,
  grid: ArrayLike<number>,
  values: ArrayLike<number>,
  which: "max" | "min",
): { value: number; at: number } {
  const sign = which === "max" ? 1 : -1;
  const i = extremeIndex(values, sign);
  let bestAt = grid[i] as number;
  let best = values[i] as number;
  let lo = grid[Math.max(0, i - 1)] as number;
  let hi = grid[Math.min(grid.length - 1, i + 1)] as number;
  if (hi > lo) {
    const g = (Math.sqrt(5) - 1) / 2;
    let x1 = hi - g * (hi - lo);
    let x2 = lo + g * (hi - lo);
    let f1 = sign * fn(x1);
    let f2 = sign * fn(x2);
    for (let k = 0; k < 60 && hi - lo > 1e-12 * Math.max(1, Math.abs(hi)); k++) {
      if (f1 > f2) {
        hi = x2;
        x2 = x1;
        f2 = f1;
        x1 = hi - g * (hi - lo);
        f1 = sign * fn(x1);
      } else {
        lo = x1;
        x1 = x2;
        f1 = f2;
        x2 = lo + g * (hi - lo);
        f2 = sign * fn(x2);
      }
    }
    const [x, f] = f1 > f2 ? [x1, f1] : [x2, f2];
    // Keep the grid point unless the refinement is better by more than rounding noise.
    if (f > sign * best + 1e-12 * Math.max(1, Math.abs(best))) {
      best = sign * f;
      bestAt = x;
    }
  }
  return { value: best, at: bestAt };
}
