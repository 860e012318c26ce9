/**
 * Fixed-point implementation checks: coefficient quantisation, integer
 * simulation, scaling norms, round-off noise and word-length search.
 *
 * Conventions: a Q format is a two's-complement word of `wordLength` bits
 * (2 … 32, sign included) with `fractionBits` bits right of the binary point
 * (0 … 64); code k stands for k·2^−n; Qm.n has m = W − 1 − n. Q15 is
 * { wordLength: 16, fractionBits: 15 }. Rounding is "nearest" (ties away from
 * zero), "floor" (toward −∞) or "convergent" (ties to even); quantisation
 * saturates. Sections run in transposed direct form II with a0 = 1. Norms are
 * of impulse responses from the input (L1, L2, L∞ = max|h|), plus the peak gain
 * max|H(f)|. Integer runs use BigInt, so they are exact at any accumulator width.
 *
 * @module
 */
export * from "./q_format.ts";
export * from "./quantise.ts";
export * from "./quantise_design.ts";
export * from "./scale_sections.ts";
export * from "./run_fixed.ts";
export * from "./compare.ts";
export * from "./norms.ts";
export * from "./word_length.ts";
