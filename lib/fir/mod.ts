/**
 * FIR filter design and filtering.
 *
 * Conventions: `length` is the number of taps N; the filter order is N − 1.
 * Frequencies are in Hz with an explicit sample rate `fs`; a cutoff must lie
 * strictly inside (0, fs/2). Designed taps are symmetric (linear phase) unless
 * a function says otherwise. Windows used for design are the symmetric form.
 *
 * @module
 */
export * from "./apply.ts";
export * from "./windowed_sinc.ts";
