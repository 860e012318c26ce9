/**
 * Multirate processing: decimation, interpolation and rational resampling with
 * polyphase FIR filters, and planning of multistage decimators.
 *
 * Conventions: a factor is an integer; `up` (L) inserts L − 1 zeros after each
 * sample, `down` (M) keeps every M-th sample. Filter taps run at the high
 * (upsampled) rate; rates and band edges are in Hz. Outputs are causal (the
 * filter's delay is not removed): decimating N samples by M gives ⌈N/M⌉,
 * interpolating by L gives N·L, resampling gives ⌈N·L/M⌉ samples.
 *
 * @module
 */
export * from "./resample.ts";
export * from "./multistage.ts";
