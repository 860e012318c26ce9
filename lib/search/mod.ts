/**
 * Design search and implementation cost.
 *
 * Conventions: frequencies in Hz with the spec's sample rate `fs`. A size is
 * a number of taps N for FIR methods (order N − 1), the analog prototype order
 * for IIR families (a bandpass or bandstop of order N has 2N poles), and a
 * tightening step for the multistage decimator. Costs are per OUTPUT sample:
 * with decimation by M an output comes every M input samples. Multiplies by
 * 0 or ±1 are not counted; a symmetric FIR pair shares one multiplier.
 * Memory is in words (state plus coefficients). Latency is in input samples
 * and seconds: (N − 1)/2 for linear-phase FIR, the group delay at a stated
 * frequency otherwise. Requirements are checked twice, in floating point and
 * with the coefficients quantised to the target's word length; margins are
 * positive on the passing side, and a relative margin is margin/|limit|.
 *
 * @module
 */
export * from "./types.ts";
export * from "./band_layout.ts";
export * from "./implementation_cost.ts";
export * from "./search_designs.ts";
export * from "./comparison.ts";
