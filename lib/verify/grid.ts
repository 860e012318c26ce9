import { requireFinite, requireInteger, show } from "../_validate.ts";

/**
 * Equally spaced frequencies from `from` to `to` inclusive, with both band
 * edges exactly on the grid: f_i = from + (to − from)·i/(points − 1), and the
 * last point set to `to` itself (no rounding drift).
 *
 * @param from Lower band edge in Hz (finite).
 * @param to Upper band edge in Hz, > from.
 * @param points Number of frequencies, 2 … 2^20.
 * @returns The grid.
 * @throws {RangeError} When to ≤ from or points is out of range.
 * @example
 * ```ts
 * import { bandGrid } from "./grid.ts";
 * const f = bandGrid(0, 0.3, 4);
 * if (f[0] !== 0 || f[3] !== 0.3 || f.length !== 4) throw new Error("edges exact");
 * ```
 */
export function bandGrid(from: number, to: number, points: number): Float64Array {
  requireFinite("Band lower edge", from);
  requireFinite("Band upper edge", to);
  if (!(to > from)) {
    throw new RangeError(
      `Band upper edge must be above the lower edge ${show(from)} Hz, got ${show(to)} Hz`,
    );
  }
  requireInteger("Number of grid points", points, 2, 1 << 20);
  const f = new Float64Array(points);
  for (let i = 0; i < points; i++) f[i] = from + ((to - from) * i) / (points - 1);
  f[0] = from;
  f[points - 1] = to;
  return f;
}
