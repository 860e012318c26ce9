/**
 * Spectral measurement: averaged power spectra and tone quality figures, for
 * verifying a filter with test signals.
 *
 * Conventions: frequencies in Hz with an explicit sample rate `fs`; spectra
 * are one-sided (0 … fs/2) with the power of negative frequencies folded in;
 * "density" is in units²/Hz, "spectrum" and powers in units² (mean square);
 * ratios are 10·log10 of power ratios, in dB.
 *
 * @module
 */
export * from "./welch.ts";
export * from "./tone_measurement.ts";
