// Cancellation-free roots of a real quadratic (private).
import type { Complex } from "../types.ts";

/**
 * Roots of c0·x² + c1·x + c2 (c0 ≠ 0) without cancellation: the larger real
 * root from −(c1 + sign(c1)·√D)/2, the other from the product c2/c0.
 */
export function quadraticRoots(c0: number, c1: number, c2: number): Complex[] {
  const d = c1 * c1 - 4 * c0 * c2;
  if (d < 0) {
    const re = -c1 / (2 * c0);
    const im = Math.sqrt(-d) / (2 * Math.abs(c0));
    return [{ re, im }, { re, im: -im }];
  }
  const q = -(c1 + (c1 >= 0 ? 1 : -1) * Math.sqrt(d)) / 2;
  if (q === 0) return [{ re: 0, im: 0 }, { re: 0, im: 0 }];
  return [{ re: q / c0, im: 0 }, { re: c2 / q, im: 0 }];
}
