// Entry checks shared by lib/iir (private).
import { requireFinite, requireInteger, show } from "../_validate.ts";

/** Highest analog prototype order accepted by the design functions. */
export const MAX_ORDER = 40;

export function requireOrder(order: number, max = MAX_ORDER): void {
  requireInteger("Filter order", order, 1, max);
}

/** Passband ripple in dB: finite and > 0. */
export function requireRipple(rippleDb: number): void {
  requireFinite("Passband ripple", rippleDb);
  if (rippleDb <= 0) {
    throw new RangeError(`Passband ripple must be greater than 0 dB, got ${show(rippleDb)} dB`);
  }
}

/** Stopband attenuation in dB: finite, > 0 and (when given) above the ripple. */
export function requireAttenuation(attenuationDb: number, rippleDb?: number): void {
  requireFinite("Stopband attenuation", attenuationDb);
  if (attenuationDb <= 0) {
    throw new RangeError(
      `Stopband attenuation must be greater than 0 dB, got ${show(attenuationDb)} dB`,
    );
  }
  if (rippleDb !== undefined && attenuationDb <= rippleDb) {
    throw new RangeError(
      `Stopband attenuation must exceed the passband ripple (${show(rippleDb)} dB), got ${
        show(attenuationDb)
      } dB`,
    );
  }
}

/** 10^(dB/10) − 1 without cancellation for small dB. */
export function powerRatioMinusOne(db: number): number {
  return Math.expm1((db / 10) * Math.LN10);
}
