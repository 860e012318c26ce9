/**
 * Fast Fourier transforms.
 *
 * Conventions: forward transform X[k] = Σ x[n] e^(−j2πkn/N), no scaling; the
 * inverse carries the 1/N. Bin k lies at frequency k·fs/N Hz. Any length N
 * works: powers of two run on tapsheet's radix-4 kernel, others on Bluestein's
 * chirp-z algorithm.
 * Real transforms return the ⌊N/2⌋ + 1 non-negative-frequency bins.
 *
 * @module
 */
export * from "./fft.ts";
export * from "./complex_fft.ts";
export * from "./real_fft.ts";
export * from "./zero_pad.ts";
export * from "./bin_frequencies.ts";
