import type { Section } from "../types.ts";
import { type FilterDesign, requireDesign } from "../verify/filter_design.ts";
import { sha256Hex } from "./_sha256.ts";

/**
 * The coefficients of a design in their export order: FIR taps h[0..N−1];
 * for sections b0, b1, b2, a1, a2 of each section in turn; for a rational
 * design the numerator b[0..M] then the denominator a[0..N].
 *
 * @param design The filter.
 * @returns The coefficients, flattened.
 * @example
 * ```ts
 * import { coefficientList } from "./digest.ts";
 * const c = coefficientList({ kind: "sections", sections: [{ b0: 1, b1: 2, b2: 3, a1: 4, a2: 5 }] });
 * if (c.join() !== "1,2,3,4,5") throw new Error("b0 b1 b2 a1 a2");
 * ```
 */
export function coefficientList(design: FilterDesign): Float64Array {
  requireDesign(design);
  switch (design.kind) {
    case "fir":
      return Float64Array.from(design.taps);
    case "sections":
      return Float64Array.from(
        design.sections.flatMap((s: Section) => [s.b0, s.b1, s.b2, s.a1, s.a2]),
      );
    case "rational":
      return Float64Array.from([
        ...Array.from(design.numerator),
        ...Array.from(design.denominator),
      ]);
  }
}

/** What the coefficient digest is taken over, for the comment blocks of the exports. */
export const DIGEST_RULE =
  "SHA-256 of the coefficients as IEEE-754 binary64 little-endian bytes, in array order";

/**
 * SHA-256 of a design's coefficients: the hash of their IEEE-754 binary64
 * little-endian bytes in the order of {@link coefficientList}. The same digest
 * is reproduced in Python by
 * `hashlib.sha256(numpy.asarray(c, "<f8").tobytes()).hexdigest()`.
 * The hash is computed here in TypeScript (NIST FIPS 180-4), so lib/ stays pure.
 *
 * Source: NIST FIPS 180-4, Secure Hash Standard (2015), §6.2.
 *
 * @param design The filter.
 * @returns 64 lowercase hex digits.
 * @example
 * ```ts
 * import { coefficientDigest } from "./digest.ts";
 * // The eight bytes of 1.0 are 00 00 00 00 00 00 f0 3f.
 * const d = coefficientDigest({ kind: "fir", taps: [1] });
 * if (d.length !== 64 || d === coefficientDigest({ kind: "fir", taps: [-1] })) throw new Error("digest");
 * ```
 */
export function coefficientDigest(design: FilterDesign): string {
  const c = coefficientList(design);
  const bytes = new Uint8Array(c.length * 8);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < c.length; i++) view.setFloat64(8 * i, c[i] as number, true);
  return sha256Hex(bytes);
}
