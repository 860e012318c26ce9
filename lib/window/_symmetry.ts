// Private: the symmetric/periodic switch shared by the window functions.
import type { WindowOptions } from "./windows.ts";

/** True for the periodic form; throws a TypeError for an unknown symmetry. */
export function isPeriodic(options: WindowOptions): boolean {
  const symmetry = options.symmetry ?? "symmetric";
  if (symmetry !== "symmetric" && symmetry !== "periodic") {
    throw new TypeError(
      `Window symmetry must be "symmetric" or "periodic", got ${JSON.stringify(symmetry)}`,
    );
  }
  return symmetry === "periodic";
}

/**
 * Build a window from its symmetric formula: the periodic form of length N is
 * the symmetric form of length N + 1 with its last sample dropped.
 */
export function withSymmetry(
  length: number,
  options: WindowOptions,
  symmetric: (length: number) => Float64Array,
): Float64Array {
  if (!isPeriodic(options) || length === 1) return symmetric(length);
  return symmetric(length + 1).slice(0, length);
}
