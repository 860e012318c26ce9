// Data shapes shared by every area of lib/.

/** A complex number. */
export interface Complex {
  re: number;
  im: number;
}

/**
 * One second-order section (biquad), normalised so that a0 = 1:
 * H(z) = (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2).
 */
export interface Section {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

/** A rational transfer function as zeros, poles and gain (s- or z-plane). */
export interface ZerosPolesGain {
  zeros: Complex[];
  poles: Complex[];
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
  from: number;
  to: number;
  level: number;
  toLevel?: number;
  bound: "upper" | "lower";
  /** Short label, e.g. the requirement id. */
  label?: string;
}
