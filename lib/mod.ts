/**
 * tapsheet's DSP library: pure functions on numbers and typed arrays, no I/O.
 *
 * Conventions across every area: frequencies in Hz with an explicit sample
 * rate `fs`; `length` counts taps or samples (a filter of N taps has order
 * N − 1); dB is 20·log10 of a magnitude; phases are in radians.
 *
 * @module
 */
export * from "./types.ts";
export * from "./signal/mod.ts";
export * from "./fft/mod.ts";
export * from "./window/mod.ts";
export * from "./response/mod.ts";
export * from "./spectral/mod.ts";
export * from "./fir/mod.ts";
export * from "./verify/mod.ts";
export * from "./poly/mod.ts";
export * from "./fixed/mod.ts";
export * from "./export/mod.ts";
export * from "./iir/mod.ts";
export * from "./multirate/mod.ts";
export * from "./search/mod.ts";
