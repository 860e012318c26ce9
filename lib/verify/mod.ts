/**
 * Requirement verification.
 *
 * Conventions: limits are `{ atMost }` or `{ atLeast }`; margin is positive on
 * the passing side; attenuation is a positive number of dB below the passband
 * reference; frequencies in Hz with an explicit sample rate `fs`; group delay
 * in samples; settling time in seconds. A `FilterDesign` is FIR taps, a cascade
 * of second-order sections (a0 = 1) or a rational B(z)/A(z) in powers of z^−1.
 * Band requirements are judged on a dense grid that holds both band edges exactly.
 *
 * @module
 */
export * from "./requirement.ts";
export * from "./requirements.ts";
export * from "./filter_design.ts";
export * from "./grid.ts";
export * from "./check.ts";
export * from "./spec.ts";
export * from "./mask.ts";
