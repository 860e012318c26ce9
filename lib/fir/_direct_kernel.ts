// Private: the direct-form FIR inner loop shared by applyFirDirect and the
// streaming filter, so both give bit-identical outputs.
//
// y[i] = Σ_{j=0}^{N−1} reversed[j]·extended[i + j], where reversed[j] = h[N−1−j]
// and extended[i + N − 1] = x[i] (N − 1 samples of history in front). Every
// output is summed in the same order j = 0 … N−1, whatever the block it is
// computed in; four outputs share each tap load (register blocking).

/** Write `count` outputs into y[offset …] from `extended`. */
export function directKernel(
  reversed: Float64Array,
  extended: Float64Array,
  y: Float64Array,
  count: number,
  offset = 0,
): void {
  const n = reversed.length;
  let i = 0;
  for (; i + 3 < count; i += 4) {
    let a0 = 0;
    let a1 = 0;
    let a2 = 0;
    let a3 = 0;
    let x0 = extended[i]!;
    let x1 = extended[i + 1]!;
    let x2 = extended[i + 2]!;
    for (let j = 0; j < n; j++) {
      const h = reversed[j]!;
      const x3 = extended[i + j + 3]!;
      a0 += h * x0;
      a1 += h * x1;
      a2 += h * x2;
      a3 += h * x3;
      x0 = x1;
      x1 = x2;
      x2 = x3;
    }
    y[offset + i] = a0;
    y[offset + i + 1] = a1;
    y[offset + i + 2] = a2;
    y[offset + i + 3] = a3;
  }
  for (; i < count; i++) {
    let a = 0;
    for (let j = 0; j < n; j++) a += reversed[j]! * extended[i + j]!;
    y[offset + i] = a;
  }
}

/** The taps reversed, as the kernel wants them. */
export function reversedTaps(taps: ArrayLike<number>): Float64Array {
  const n = taps.length;
  const r = new Float64Array(n);
  for (let j = 0; j < n; j++) r[j] = taps[n - 1 - j]!;
  return r;
}
