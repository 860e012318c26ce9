/**
 * IIR filter design, conversion, filtering and analysis.
 *
 * Conventions:
 * - `order` is the order N of the analog lowpass PROTOTYPE; lowpass and
 *   highpass designs have N poles, bandpass and bandstop designs 2N.
 * - Frequencies are in Hz with an explicit sample rate `fs`; band edges lie
 *   strictly inside (0, fs/2). Analog prototypes and transforms work in rad/s.
 * - dB: ripple and attenuation are positive numbers of dB (loss); gains in dB
 *   are 20·log10 of a magnitude, negative for a cut.
 * - A `Section` is {b0, b1, b2, a1, a2} with a0 = 1:
 *   H(z) = (b0 + b1 z⁻¹ + b2 z⁻²)/(1 + a1 z⁻¹ + a2 z⁻²). A cascade is applied
 *   first to last. Filter state is 2 numbers per section (transposed direct form II).
 * - Polynomials (numerator/denominator) are highest power of z first, i.e.
 *   ascending powers of z⁻¹; zeros/poles are z-plane (digital) or s-plane
 *   (analog prototypes) `Complex` values with conjugates paired.
 *
 * @module
 */
export * from "./analysis.ts";
export * from "./audio_biquads.ts";
export * from "./design.ts";
export * from "./elliptic_functions.ts";
export * from "./filter.ts";
export * from "./hum_remover.ts";
export * from "./order.ts";
export * from "./prototypes.ts";
export * from "./sections.ts";
export * from "./transforms.ts";
export * from "./zero_phase.ts";
