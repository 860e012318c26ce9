// Private: y = B(z)/A(z) x by the transposed direct form II, normalised by a[0].

/** Filter x through b/a from rest (zero initial state); output has x's length. */
export function filterRational(
  b: ArrayLike<number>,
  a: ArrayLike<number>,
  x: ArrayLike<number>,
): Float64Array {
  const order = Math.max(b.length, a.length);
  const a0 = a[0]!;
  const bn = new Float64Array(order);
  const an = new Float64Array(order);
  for (let i = 0; i < b.length; i++) bn[i] = b[i]! / a0;
  for (let i = 0; i < a.length; i++) an[i] = a[i]! / a0;
  const state = new Float64Array(order);
  const y = new Float64Array(x.length);
  for (let n = 0; n < x.length; n++) {
    const xn = x[n]!;
    const yn = bn[0]! * xn + state[0]!;
    for (let i = 1; i < order; i++) {
      state[i - 1] = bn[i]! * xn - an[i]! * yn + state[i]!;
    }
    state[order - 1] = 0;
    y[n] = yn;
  }
  return y;
}
