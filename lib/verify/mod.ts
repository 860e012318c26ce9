/**
 * Requirement verification.
 *
 * Conventions: limits are `{ atMost }` or `{ atLeast }`; margin is positive on
 * the passing side; attenuation is a positive number of dB below the passband
 * reference; frequencies in Hz.
 *
 * @module
 */
export * from "./requirement.ts";
