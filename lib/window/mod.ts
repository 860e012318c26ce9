/**
 * Windows for FIR design and spectral analysis.
 *
 * Conventions: `length` is the number of samples N. Symmetric windows
 * (w[n] = w[N−1−n], the default) are for filter design; periodic windows are
 * for spectral analysis with an N-point DFT.
 *
 * @module
 */
export * from "./windows.ts";
export * from "./kaiser.ts";
