/**
 * Test signals: impulse, step, tone, chirps, white and pink noise.
 *
 * Conventions: signals are Float64Arrays of samples; time index n starts at 0
 * (t = n/fs); frequencies are in Hz with an explicit sample rate `fs`;
 * amplitudes are peak values, noise levels are standard deviations (RMS);
 * phases are in radians. Noise comes from a seeded generator (xoshiro128**)
 * that gives the same samples for the same seed on every machine.
 *
 * @module
 */
export * from "./impulse.ts";
export * from "./tone.ts";
export * from "./chirp.ts";
export * from "./noise.ts";
