// Rounding modes applied to real values already scaled by 2^n.
import type { Rounding } from "./quantise.ts";

const roundings: readonly Rounding[] = ["nearest", "floor", "convergent"];

/** Throw a TypeError unless `rounding` is a known rounding mode. */
export function requireRounding(rounding: string): void {
  if (!roundings.includes(rounding as Rounding)) {
    throw new TypeError(
      `Rounding must be one of ${roundings.join(", ")}, got ${String(rounding)}`,
    );
  }
}

/** Round a real number (already scaled by 2^n) to an integer code. */
export function roundToCode(v: number, rounding: Rounding): number {
  switch (rounding) {
    case "floor":
      return Math.floor(v);
    case "nearest":
      return Math.sign(v) * Math.floor(Math.abs(v) + 0.5) + 0;
    case "convergent": {
      const r = Math.floor(v);
      const d = v - r;
      if (d > 0.5) return r + 1;
      if (d < 0.5) return r;
      return r % 2 === 0 ? r : r + 1;
    }
  }
}
