// Rounded arithmetic right shift of a BigInt.
import type { Rounding } from "./quantise.ts";

/** v·2^−s rounded to an integer (s ≥ 0), or v·2^(−s) exactly when s < 0. */
export function shiftRound(v: bigint, s: number, rounding: Rounding): bigint {
  if (s <= 0) return v << BigInt(-s);
  const shift = BigInt(s);
  const q = v >> shift; // floor
  if (rounding === "floor") return q;
  const rem = v - (q << shift);
  const half = 1n << (shift - 1n);
  if (rem > half) return q + 1n;
  if (rem < half) return q;
  if (rounding === "nearest") return v >= 0n ? q + 1n : q;
  return (q & 1n) === 0n ? q : q + 1n;
}
