/**
 * Fast Fourier transforms.
 *
 * Conventions: forward transform X[k] = Σ x[n] e^(−j2πkn/N), no scaling;
 * bin k lies at frequency k·fs/N Hz.
 *
 * @module
 */
export * from "./fft.ts";
