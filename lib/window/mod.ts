/**
 * Windows for FIR design and spectral analysis, and their figures of merit.
 *
 * Conventions: `length` is the number of samples N. Symmetric windows
 * (w[n] = w[N−1−n], the default) are for filter design; periodic windows (the
 * symmetric window of N + 1 samples without its last one) are for spectral
 * analysis with an N-point DFT. Window metrics count bandwidths in DFT bins
 * (one bin = fs/N) and levels in dB relative to the main-lobe peak.
 *
 * @module
 */
export * from "./windows.ts";
export * from "./kaiser.ts";
export * from "./chebyshev.ts";
export * from "./tukey.ts";
export * from "./gaussian.ts";
export * from "./metrics.ts";
