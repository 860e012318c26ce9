// Data shapes shared by every area of lib/.

/** A complex number. */
export interface Complex {
  /** Real part. */
  re: number;
  /** Imaginary part. */
  im: number;
}

/**
 * One second-order section (biquad), normalised so that a0 = 1:
 * H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2).
 */
export interface Section {
  /** Numerator coefficient of z⁰. */
  b0: number;
  /** Numerator coefficient of z⁻¹. */
  b1: number;
  /** Numerator coefficient of z⁻². */
  b2: number;
  /** Denominator coefficient of z⁻¹ (a0 = 1). */
  a1: number;
  /** Denominator coefficient of z⁻². */
  a2: number;
}

/** A rational transfer function as zeros, poles and gain (s- or z-plane). */
export interface ZerosPolesGain {
  /** Zeros (roots of the numerator). */
  zeros: Complex[];
  /** Poles (roots of the denominator). */
  poles: Complex[];
  /** Overall gain factor. */
  gain: number;
}

/**
 * A soft numeric problem the report should show but that does not stop the
 * design: ill-conditioning, a design that only just converged.
 */
export interface DesignWarning {
  /** Short machine-readable code, e.g. "slow-convergence". */
  code: string;
  /** One sentence for the report. */
  message: string;
}

/**
 * One straight piece of a requirement mask drawn on a response figure: the
 * response must stay below (`bound: "upper"`) or above (`bound: "lower"`) the
 * line from (from, level) to (to, toLevel ?? level). Frequencies in Hz (or
 * seconds on a time-axis figure), levels in the figure's y unit (dB, samples…).
 */
export interface MaskSegment {
  /** Start of the segment (Hz, or s on a time axis). */
  from: number;
  /** End of the segment. */
  to: number;
  /** Limit at `from`, in the figure's y unit. */
  level: number;
  /** Limit at `to`. @default level */
  toLevel?: number;
  /** Whether the response must stay below (upper) or above (lower) the line. */
  bound: "upper" | "lower";
  /** Short label, e.g. the requirement id. */
  label?: string;
}
