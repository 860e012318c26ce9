/**
 * Coefficient export: C header, CSV and JSON, built as strings (the runner
 * writes the files).
 *
 * Conventions: coefficients are exported in one fixed order — FIR taps
 * h[0..N−1]; sections row by row b0, b1, b2, a1, a2 (a0 = 1); rational
 * numerator then denominator. Integer formats hold codes with value =
 * code / 2^n. The SHA-256 of a design is taken over its coefficients as
 * IEEE-754 binary64 little-endian bytes in that order, computed in TypeScript
 * inside lib/ (no I/O, no Web Crypto).
 *
 * @module
 */
export * from "./digest.ts";
export * from "./c_header.ts";
export * from "./csv.ts";
export * from "./json.ts";
export type { ExportFormat } from "./_formats.ts";
