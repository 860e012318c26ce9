// Helpers for section lists and conjugate bookkeeping (private).
import type { Complex, Section, ZerosPolesGain } from "../types.ts";
import { show } from "../_validate.ts";

/** Throw a TypeError unless `sections` is a non-empty array of finite Sections. */
export function requireSections(sections: readonly Section[]): void {
  if (!Array.isArray(sections)) {
    throw new TypeError(
      `Sections must be an array of {b0, b1, b2, a1, a2}, got ${typeof sections}`,
    );
  }
  if (sections.length === 0) throw new RangeError("Sections must hold at least 1 section, got 0");
  for (let i = 0; i < sections.length; i++) {
    const s = sections[i] as Section | undefined;
    if (s === null || typeof s !== "object") {
      throw new TypeError(
        `Section [${i}] must be an object {b0, b1, b2, a1, a2}, got ${String(s)}`,
      );
    }
    for (const key of ["b0", "b1", "b2", "a1", "a2"] as const) {
      const v = s[key];
      if (typeof v !== "number" || !Number.isFinite(v)) {
        throw new TypeError(`Section [${i}].${key} must be a finite number, got ${String(v)}`);
      }
    }
  }
}

/** Throw a TypeError unless `zpk` holds finite zeros, poles and gain. */
export function requireZerosPolesGain(zpk: ZerosPolesGain): void {
  if (
    zpk === null || typeof zpk !== "object" || !Array.isArray(zpk.zeros) ||
    !Array.isArray(zpk.poles)
  ) {
    throw new TypeError(
      "Zeros/poles/gain must be an object { zeros: Complex[], poles: Complex[], gain }",
    );
  }
  for (const [name, list] of [["Zero", zpk.zeros], ["Pole", zpk.poles]] as const) {
    list.forEach((z, i) => {
      if (z === null || typeof z !== "object" || !Number.isFinite(z.re) || !Number.isFinite(z.im)) {
        throw new TypeError(
          `${name} [${i}] must be a finite complex number, got ${JSON.stringify(z)}`,
        );
      }
    });
  }
  if (typeof zpk.gain !== "number" || !Number.isFinite(zpk.gain)) {
    throw new TypeError(`Gain must be a finite number, got ${String(zpk.gain)}`);
  }
}

/**
 * Split values of a real rational function into conjugate pairs (returned as
 * their upper members, im > 0, averaged with their partner) and real values.
 * A value whose mirror image is nearer to itself than to any other value is real.
 */
export function splitConjugates(values: readonly Complex[]): { pairs: Complex[]; reals: number[] } {
  const n = values.length;
  const used = new Uint8Array(n);
  const order = values.map((_, i) => i).sort((a, b) =>
    Math.abs(values[a]!.im) - Math.abs(values[b]!.im)
  );
  const pairs: Complex[] = [];
  const reals: number[] = [];
  for (const i of order) {
    if (used[i]) continue;
    used[i] = 1;
    const z = values[i]!;
    let best = -1;
    let bestDistance = Infinity;
    for (let j = 0; j < n; j++) {
      if (used[j]) continue;
      const d = Math.hypot(values[j]!.re - z.re, values[j]!.im + z.im);
      if (d < bestDistance) {
        bestDistance = d;
        best = j;
      }
    }
    const tolerance = 1e-6 * Math.max(Math.hypot(z.re, z.im), 1e-300);
    const lone = best < 0 || 2 * Math.abs(z.im) <= bestDistance;
    if (lone && Math.abs(z.im) <= tolerance) {
      reals.push(z.re);
      continue;
    }
    const w = lone ? z : values[best]!;
    if (lone || bestDistance > tolerance) {
      throw new TypeError(
        `Complex values must come in conjugate pairs, got ${show(z.re)}${z.im >= 0 ? "+" : ""}${
          show(z.im)
        }j without its conjugate`,
      );
    }
    used[best] = 1;
    pairs.push({ re: (z.re + w.re) / 2, im: Math.abs(z.im - w.im) / 2 });
  }
  return { pairs, reals };
}
