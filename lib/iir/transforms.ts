import type { Complex, ZerosPolesGain } from "../types.ts";
import { requirePositive } from "../_validate.ts";
import { abs, add, div, mul, neg, product, scale, sqrt, sub } from "../poly/_complex.ts";
import { requireZerosPolesGain } from "./_sections.ts";

function relativeDegree(zpk: ZerosPolesGain, noneAtOrigin = false): number {
  requireZerosPolesGain(zpk);
  if (noneAtOrigin) {
    for (const [name, list] of [["zero", zpk.zeros], ["pole", zpk.poles]] as const) {
      if (list.some((x) => x.re === 0 && x.im === 0)) {
        throw new RangeError(
          `A lowpass prototype for this transformation must have no ${name} at s = 0, got one`,
        );
      }
    }
  }
  const d = zpk.poles.length - zpk.zeros.length;
  if (d < 0) {
    throw new RangeError(
      `A prototype must have no more zeros than poles, got ${zpk.zeros.length} zeros and ${zpk.poles.length} poles`,
    );
  }
  return d;
}

/** Re( Π(−z) / Π(−p) ): the factor that keeps the gain at the mapped frequency. */
function gainRatio(zeros: readonly Complex[], poles: readonly Complex[]): number {
  return div(product(zeros.map(neg)), product(poles.map(neg))).re;
}

/**
 * Both roots of x² − 2b·x + w0² = 0, i.e. b ± √(b² − w0²), without
 * cancellation: the larger from b + sign·√, the other from the product w0².
 */
function splitRoot(b: Complex, w0: number): [Complex, Complex] {
  const root = sqrt(sub(mul(b, b), { re: w0 * w0, im: 0 }));
  const plus = add(b, root);
  const minus = sub(b, root);
  const big = abs(plus) >= abs(minus) ? plus : minus;
  if (abs(big) === 0) return [big, big];
  return [big, div({ re: w0 * w0, im: 0 }, big)];
}

/**
 * Move an analog lowpass prototype's cutoff from 1 rad/s to w0 rad/s by the
 * substitution s → s/w0: zeros and poles scale by w0, the gain by
 * w0^(poles − zeros).
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 7; T. W. Parks and C. S. Burrus, Digital Filter
 * Design (Wiley, 1987), analog frequency transformations.
 *
 * @param prototype Analog lowpass zeros, poles and gain (no more zeros than poles).
 * @param w0 New cutoff in rad/s, > 0.
 * @returns The scaled analog lowpass.
 * @throws {RangeError} When w0 ≤ 0 or there are more zeros than poles.
 * @example
 * ```ts
 * import { lowpassToLowpass } from "./transforms.ts";
 * const lp = lowpassToLowpass({ zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 }, 10);
 * if (lp.poles[0]!.re !== -10 || lp.gain !== 10) throw new Error("pole at −10, DC gain 1");
 * ```
 */
export function lowpassToLowpass(prototype: ZerosPolesGain, w0: number): ZerosPolesGain {
  requirePositive("Cutoff w0", w0, " rad/s");
  const d = relativeDegree(prototype);
  return {
    zeros: prototype.zeros.map((z) => scale(z, w0)),
    poles: prototype.poles.map((p) => scale(p, w0)),
    gain: prototype.gain * Math.pow(w0, d),
  };
}

/**
 * Analog lowpass prototype to highpass with cutoff w0 rad/s by s → w0/s:
 * each zero/pole x maps to w0/x, the excess poles put zeros at s = 0, and the
 * gain is multiplied by Re(Π(−z)/Π(−p)) so the passband level is kept.
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987), analog
 * frequency transformations.
 *
 * @param prototype Analog lowpass zeros, poles and gain; no zero or pole at 0.
 * @param w0 Cutoff in rad/s, > 0.
 * @returns The analog highpass.
 * @throws {RangeError} When w0 ≤ 0, there are more zeros than poles, or a zero or pole is at 0.
 * @throws {TypeError} When a value is not finite.
 * @example
 * ```ts
 * import { lowpassToHighpass } from "./transforms.ts";
 * const hp = lowpassToHighpass({ zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 }, 5);
 * // 1/(s + 1) becomes s/(s + 5).
 * if (hp.poles[0]!.re !== -5 || hp.zeros[0]!.re !== 0 || hp.gain !== 1) throw new Error("s/(s+5)");
 * ```
 */
export function lowpassToHighpass(prototype: ZerosPolesGain, w0: number): ZerosPolesGain {
  requirePositive("Cutoff w0", w0, " rad/s");
  const d = relativeDegree(prototype, true);
  const w = { re: w0, im: 0 };
  const zeros = prototype.zeros.map((z) => div(w, z));
  const poles = prototype.poles.map((p) => div(w, p));
  for (let i = 0; i < d; i++) zeros.push({ re: 0, im: 0 });
  return {
    zeros,
    poles,
    gain: prototype.gain * gainRatio(prototype.zeros, prototype.poles),
  };
}

/**
 * Analog lowpass prototype to bandpass centred on w0 rad/s with bandwidth bw
 * rad/s by s → (s² + w0²)/(bw·s): each zero/pole x becomes the two roots of
 * s² − x·bw·s + w0² = 0, the excess poles put zeros at s = 0, and the gain is
 * multiplied by bw^(poles − zeros). The prototype's ±1 rad/s edges land on
 * the two frequencies whose geometric mean is w0 and difference is bw.
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987), analog
 * frequency transformations.
 *
 * @param prototype Analog lowpass zeros, poles and gain.
 * @param w0 Centre (geometric mean of the edges) in rad/s, > 0.
 * @param bw Bandwidth in rad/s, > 0.
 * @returns The analog bandpass, twice the prototype's order.
 * @throws {RangeError} When w0 or bw ≤ 0 or there are more zeros than poles.
 * @example
 * ```ts
 * import { lowpassToBandpass } from "./transforms.ts";
 * const bp = lowpassToBandpass({ zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 }, 1, 0.5);
 * // 1/(s + 1) becomes 0.5s/(s² + 0.5s + 1): two poles with product 1.
 * const [a, b] = bp.poles;
 * if (Math.abs(a!.re * b!.re - a!.im * b!.im - 1) > 1e-15 || bp.gain !== 0.5) throw new Error("bandpass");
 * ```
 */
export function lowpassToBandpass(
  prototype: ZerosPolesGain,
  w0: number,
  bw: number,
): ZerosPolesGain {
  requirePositive("Centre frequency w0", w0, " rad/s");
  requirePositive("Bandwidth", bw, " rad/s");
  const d = relativeDegree(prototype);
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  for (const z of prototype.zeros) zeros.push(...splitRoot(scale(z, bw / 2), w0));
  for (const p of prototype.poles) poles.push(...splitRoot(scale(p, bw / 2), w0));
  for (let i = 0; i < d; i++) zeros.push({ re: 0, im: 0 });
  return { zeros, poles, gain: prototype.gain * Math.pow(bw, d) };
}

/**
 * Analog lowpass prototype to bandstop centred on w0 rad/s with stopband
 * width bw rad/s by s → bw·s/(s² + w0²): each zero/pole x becomes the two
 * roots of s² − (bw/x)·s + w0² = 0, the excess poles put zero pairs at
 * ±j·w0, and the gain is multiplied by Re(Π(−z)/Π(−p)).
 *
 * Source: T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987), analog
 * frequency transformations.
 *
 * @param prototype Analog lowpass zeros, poles and gain; no zero or pole at 0.
 * @param w0 Centre (geometric mean of the band edges) in rad/s, > 0.
 * @param bw Width between the band edges in rad/s, > 0.
 * @returns The analog bandstop, twice the prototype's order.
 * @throws {RangeError} When w0 or bw ≤ 0, there are more zeros than poles, or a zero or pole is at 0.
 * @throws {TypeError} When a value is not finite.
 * @example
 * ```ts
 * import { lowpassToBandstop } from "./transforms.ts";
 * const bs = lowpassToBandstop({ zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 }, 2, 1);
 * // The notch zeros sit at ±2j.
 * if (bs.zeros.length !== 2 || Math.abs(Math.abs(bs.zeros[0]!.im) - 2) > 1e-15) throw new Error("±2j");
 * ```
 */
export function lowpassToBandstop(
  prototype: ZerosPolesGain,
  w0: number,
  bw: number,
): ZerosPolesGain {
  requirePositive("Centre frequency w0", w0, " rad/s");
  requirePositive("Bandwidth", bw, " rad/s");
  const d = relativeDegree(prototype, true);
  const half = { re: bw / 2, im: 0 };
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  for (const z of prototype.zeros) zeros.push(...splitRoot(div(half, z), w0));
  for (const p of prototype.poles) poles.push(...splitRoot(div(half, p), w0));
  for (let i = 0; i < d; i++) zeros.push({ re: 0, im: w0 }, { re: 0, im: -w0 });
  return {
    zeros,
    poles,
    gain: prototype.gain * gainRatio(prototype.zeros, prototype.poles),
  };
}

/**
 * Bilinear transform of an analog filter to a digital one at sample rate fs:
 * s = 2fs·(z − 1)/(z + 1), so each zero/pole x maps to (2fs + x)/(2fs − x),
 * zeros at infinity map to z = −1, and the gain becomes
 * k·Re(Π(2fs − z)/Π(2fs − p)). The frequency axis is warped,
 * Ω = 2fs·tan(πf/fs); designs pre-warp their band edges with the same formula
 * so the edges land where asked.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 7 (bilinear transformation).
 *
 * @param analog Analog zeros, poles (in rad/s) and gain; no more zeros than poles.
 * @param fs Sample rate in Hz, > 0.
 * @returns Digital zeros, poles and gain in the z-plane.
 * @throws {RangeError} When fs ≤ 0 or there are more zeros than poles.
 * @example
 * ```ts
 * import { bilinearTransform } from "./transforms.ts";
 * // 1/(s + 1) at fs = 0.5 Hz: pole (1 − 1)/(1 + 1) = 0, zero at −1, gain 1/2.
 * const d = bilinearTransform({ zeros: [], poles: [{ re: -1, im: 0 }], gain: 1 }, 0.5);
 * if (d.poles[0]!.re !== 0 || d.zeros[0]!.re !== -1 || d.gain !== 0.5) throw new Error("bilinear");
 * ```
 */
export function bilinearTransform(analog: ZerosPolesGain, fs: number): ZerosPolesGain {
  requirePositive("Sample rate fs", fs, " Hz");
  const d = relativeDegree(analog);
  const fs2 = { re: 2 * fs, im: 0 };
  const map = (x: Complex): Complex => div(add(fs2, x), sub(fs2, x));
  const zeros = analog.zeros.map(map);
  const poles = analog.poles.map(map);
  for (let i = 0; i < d; i++) zeros.push({ re: -1, im: 0 });
  const ratio = div(
    product(analog.zeros.map((z) => sub(fs2, z))),
    product(analog.poles.map((p) => sub(fs2, p))),
  );
  return { zeros, poles, gain: analog.gain * ratio.re };
}
