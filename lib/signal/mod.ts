/**
 * Test signals.
 *
 * Conventions: signals are Float64Arrays of samples; time index n starts at 0;
 * frequencies are in Hz with an explicit sample rate `fs`.
 *
 * @module
 */
export * from "./impulse.ts";
