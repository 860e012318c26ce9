/**
 * Frequency- and time-response analysis of filters.
 *
 * Conventions: frequencies in Hz with an explicit sample rate `fs`; the
 * transfer function is in powers of z^−1 (b[0] multiplies the newest sample);
 * FIR taps are the numerator of a filter whose denominator is [1]; dB means
 * 20·log10 of a magnitude; phase is in radians; delays are in samples (and
 * seconds where a field says so). Dense grids run from 0 to fs/2 inclusive.
 *
 * @module
 */
export * from "./frequency_response.ts";
export * from "./group_delay.ts";
export * from "./phase_delay.ts";
export * from "./time_response.ts";
