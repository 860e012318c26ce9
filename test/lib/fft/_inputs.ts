// Inputs and comparisons shared by the FFT tests.

/**
 * Park & Miller's minimal standard generator, s ← 16807·s mod (2^31 − 1),
 * value s/(2^31 − 1) − 0.5 (exact in doubles, and the same recurrence as
 * test/reference/make_fft_sizes.py, which makes the inputs of fft_sizes.json).
 */
export function minimalStandard(n: number, seed: number): Float64Array {
  const out = new Float64Array(n);
  let s = seed;
  for (let i = 0; i < n; i++) {
    s = (s * 16807) % 2147483647;
    out[i] = s / 2147483647 - 0.5;
  }
  return out;
}

/** Index of the first element where a and b differ (bit for bit, NaN-aware), or −1. */
export function firstDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) return Math.min(a.length, b.length);
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return i;
  return -1;
}
