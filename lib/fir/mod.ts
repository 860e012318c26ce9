/**
 * FIR filter design and filtering.
 *
 * Conventions: `length` is the number of taps N; the filter order is N − 1.
 * Frequencies are in Hz with an explicit sample rate `fs`; a cutoff must lie
 * strictly inside (0, fs/2). Band specifications are lists of
 * `{ from, to, gain, weight? }` in Hz, increasing and not touching; gains are
 * linear amplitudes (1 pass, 0 stop), attenuations and ripples are in dB only
 * where a name says so. Designed taps are symmetric (linear phase) unless a
 * function says otherwise. Windows used for design are the symmetric form.
 * Linear-phase types: symmetric taps with odd N (I) or even N (II, zero at fs/2);
 * antisymmetric with odd N (III, zeros at 0 and fs/2) or even N (IV, zero at 0).
 * Soft numeric trouble comes back as `warnings: DesignWarning[]` in a design's
 * result; an equiripple exchange that cannot give a trustworthy filter throws
 * `ConvergenceError` with a message saying what to change.
 *
 * @module
 */
export * from "./apply.ts";
export * from "./types.ts";
export * from "./windowed_sinc.ts";
export * from "./kaiser_parameters.ts";
export * from "./equiripple.ts";
export * from "./equiripple_length.ts";
export * from "./band_error.ts";
export * from "./least_squares.ts";
export * from "./frequency_sampling.ts";
export * from "./halfband.ts";
export * from "./linear_phase.ts";
export * from "./zeros.ts";
export * from "./kaiser_design.ts";
export * from "./overlap_add.ts";
export * from "./streaming.ts";
