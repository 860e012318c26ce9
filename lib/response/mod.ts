/**
 * Frequency-response analysis of filters.
 *
 * Conventions: frequencies in Hz with an explicit sample rate `fs`; the
 * transfer function is in powers of z^−1 (b[0] multiplies the newest sample);
 * dB means 20·log10 of a magnitude; phase is in radians unless a name says degrees.
 *
 * @module
 */
export * from "./frequency_response.ts";
