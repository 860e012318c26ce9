// Private: shared check of a rational filter's denominator.
import { requireSamples } from "../_validate.ts";

/** Check a denominator and return it as a Float64Array (undefined when it is [1]). */
export function checkedDenominator(
  denominator: ArrayLike<number> | undefined,
): Float64Array | undefined {
  if (denominator === undefined) return undefined;
  requireSamples("Denominator", denominator);
  if (denominator[0] === 0) throw new RangeError("Denominator a[0] must not be 0, got 0");
  if (denominator.length === 1) return undefined;
  return Float64Array.from(denominator);
}
