// Polyphase kernel shared by decimation, interpolation and rational resampling
// (private to lib/multirate).

/**
 * y[n] = Σ_k h[k]·u[n·down − k] for n < outputLength, where u is x with
 * up − 1 zeros after each sample (u[j·up] = x[j]). Only the taps that meet a
 * real input sample are used: output n uses phase p = (n·down) mod up, the
 * sub-filter h[p], h[p + up], h[p + 2up], …, against x[⌊n·down/up⌋ − j].
 */
export function polyphase(
  x: Float64Array,
  h: Float64Array,
  up: number,
  down: number,
  outputLength: number,
): Float64Array {
  // Sub-filters stored contiguously: phase p holds h[p + j·up], j = 0, 1, …
  const phases: Float64Array[] = [];
  for (let p = 0; p < up; p++) {
    const count = p < h.length ? Math.ceil((h.length - p) / up) : 0;
    const sub = new Float64Array(count);
    for (let j = 0; j < count; j++) sub[j] = h[p + j * up]!;
    phases.push(sub);
  }
  const y = new Float64Array(outputLength);
  const n = x.length;
  for (let i = 0; i < outputLength; i++) {
    const t = i * down;
    const p = t % up;
    const base = (t - p) / up;
    const sub = phases[p]!;
    const jMax = Math.min(sub.length - 1, base);
    const jMin = Math.max(0, base - (n - 1));
    let acc = 0;
    for (let j = jMin; j <= jMax; j++) acc += sub[j]! * x[base - j]!;
    y[i] = acc;
  }
  return y;
}
