import { requireInteger } from "../_validate.ts";

/**
 * Unit impulse δ[n − delay]: 1 at sample `delay`, 0 elsewhere.
 *
 * @param length Number of samples, ≥ 1.
 * @param delay Index of the 1, in [0, length − 1]. @default 0
 * @returns A Float64Array of `length` samples.
 * @throws {RangeError} When length < 1 or delay is outside the signal.
 * @example
 * ```ts
 * import { impulse } from "./impulse.ts";
 * const x = impulse(4, 1);
 * if (x.join() !== "0,1,0,0") throw new Error("impulse at 1");
 * ```
 */
export function impulse(length: number, delay = 0): Float64Array {
  requireInteger("Length", length, 1);
  requireInteger("Delay", delay, 0, length - 1);
  const x = new Float64Array(length);
  x[delay] = 1;
  return x;
}

/**
 * Unit step u[n − delay]: 0 before sample `delay`, 1 from it on.
 *
 * @param length Number of samples, ≥ 1.
 * @param delay Index of the first 1, in [0, length − 1]. @default 0
 * @returns A Float64Array of `length` samples.
 * @throws {RangeError} When length < 1 or delay is outside the signal.
 * @example
 * ```ts
 * import { step } from "./impulse.ts";
 * if (step(4, 2).join() !== "0,0,1,1") throw new Error("step at 2");
 * ```
 */
export function step(length: number, delay = 0): Float64Array {
  requireInteger("Length", length, 1);
  requireInteger("Delay", delay, 0, length - 1);
  const x = new Float64Array(length);
  x.fill(1, delay);
  return x;
}
