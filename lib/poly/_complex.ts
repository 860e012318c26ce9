// Small complex-arithmetic helpers shared by lib/poly and lib/iir (private).
import type { Complex } from "../types.ts";

export function cx(re: number, im = 0): Complex {
  return { re, im };
}

export function add(a: Complex, b: Complex): Complex {
  return { re: a.re + b.re, im: a.im + b.im };
}

export function sub(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

export function mul(a: Complex, b: Complex): Complex {
  return { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
}

export function scale(a: Complex, s: number): Complex {
  return { re: a.re * s, im: a.im * s };
}

/** a / b by Smith's algorithm (no overflow for large |b|). */
export function div(a: Complex, b: Complex): Complex {
  if (Math.abs(b.re) >= Math.abs(b.im)) {
    const r = b.im / b.re;
    const d = b.re + b.im * r;
    return { re: (a.re + a.im * r) / d, im: (a.im - a.re * r) / d };
  }
  const r = b.re / b.im;
  const d = b.re * r + b.im;
  return { re: (a.re * r + a.im) / d, im: (a.im * r - a.re) / d };
}

export function inv(b: Complex): Complex {
  return div({ re: 1, im: 0 }, b);
}

export function neg(a: Complex): Complex {
  return { re: -a.re, im: -a.im };
}

export function conj(a: Complex): Complex {
  return { re: a.re, im: -a.im };
}

export function abs(a: Complex): number {
  return Math.hypot(a.re, a.im);
}

/** Principal square root, accurate in both parts (no cancellation). */
export function sqrt(a: Complex): Complex {
  if (a.re === 0 && a.im === 0) return { re: 0, im: 0 };
  const m = Math.hypot(a.re, a.im);
  if (a.re >= 0) {
    const t = Math.sqrt((m + a.re) / 2);
    return { re: t, im: a.im / (2 * t) };
  }
  const t = Math.sqrt((m - a.re) / 2);
  return { re: Math.abs(a.im) / (2 * t), im: a.im >= 0 ? t : -t };
}

/** e^(jθ). */
export function expj(theta: number): Complex {
  return { re: Math.cos(theta), im: Math.sin(theta) };
}

/** Product of a list of complex numbers. */
export function product(values: readonly Complex[]): Complex {
  let p: Complex = { re: 1, im: 0 };
  for (const v of values) p = mul(p, v);
  return p;
}
