import type { DesignWarning, Section, ZerosPolesGain } from "../types.ts";
import { show } from "../_validate.ts";
import { requireAttenuation, requireRipple } from "./_checks.ts";
import { prewarp, requireEdges, requireShape } from "./_edges.ts";
import {
  type BesselNormalisation,
  besselPrototype,
  butterworthPrototype,
  chebyshev1Prototype,
  chebyshev2Prototype,
  ellipticPrototype,
} from "./prototypes.ts";
import {
  bilinearTransform,
  lowpassToBandpass,
  lowpassToBandstop,
  lowpassToHighpass,
  lowpassToLowpass,
} from "./transforms.ts";
import { type GainPlacement, zerosPolesToSections } from "./sections.ts";

/** The four classic band shapes (same values as the FIR side's BandShape). */
export type IirBandShape = "lowpass" | "highpass" | "bandpass" | "bandstop";

/** The classic IIR families. */
export type IirFamily = "butterworth" | "chebyshev1" | "chebyshev2" | "elliptic" | "bessel";

/** What {@link designIir} needs. */
export interface IirDesignOptions {
  /** Approximation family. */
  family: IirFamily;
  /** Band shape. */
  response: IirBandShape;
  /**
   * Order N of the analog lowpass prototype, 1..40 (Bessel 1..25). Lowpass
   * and highpass designs have N poles; bandpass and bandstop designs 2N.
   */
  order: number;
  /** Sample rate in Hz, > 0. */
  fs: number;
  /**
   * Band edge(s) in Hz, each inside (0, fs/2); one for lowpass/highpass,
   * [low, high] for bandpass/bandstop. Meaning by family: Butterworth, the
   * −3 dB point; Chebyshev I and elliptic, the passband edge (gain first
   * leaves the ripple band); Chebyshev II, the stopband edge (gain first
   * reaches −As); Bessel, per `besselNormalisation`.
   */
  edges: number | readonly [number, number];
  /** Passband ripple in dB, > 0; required for Chebyshev I and elliptic. */
  passbandRippleDb?: number;
  /** Minimum stopband attenuation in dB, > 0 (> ripple); required for Chebyshev II and elliptic. */
  stopbandAttenuationDb?: number;
  /** Frequency scaling of a Bessel prototype. @default "phase" */
  besselNormalisation?: BesselNormalisation;
  /** Gain placement across the sections. @default "unit-peak" */
  gainPlacement?: GainPlacement;
}

/** A digital IIR design. */
export interface IirDesign {
  /** Digital zeros, poles and gain (z-plane), straight from the bilinear transform. */
  zerosPolesGain: ZerosPolesGain;
  /** The same filter as second-order sections (pairing and order as in zerosPolesToSections). */
  sections: Section[];
  /** Number of poles of the digital filter. */
  order: number;
  /** Soft numeric trouble worth showing in a report. */
  warnings: DesignWarning[];
}

function prototypeFor(options: IirDesignOptions): ZerosPolesGain {
  const { family, order } = options;
  switch (family) {
    case "butterworth":
      return butterworthPrototype(order);
    case "chebyshev1": {
      const rp = options.passbandRippleDb;
      if (rp === undefined) throw new TypeError("Chebyshev type I design needs passbandRippleDb");
      return chebyshev1Prototype(order, rp);
    }
    case "chebyshev2": {
      const rs = options.stopbandAttenuationDb;
      if (rs === undefined) {
        throw new TypeError("Chebyshev type II design needs stopbandAttenuationDb");
      }
      return chebyshev2Prototype(order, rs);
    }
    case "elliptic": {
      const rp = options.passbandRippleDb;
      const rs = options.stopbandAttenuationDb;
      if (rp === undefined || rs === undefined) {
        throw new TypeError("Elliptic design needs passbandRippleDb and stopbandAttenuationDb");
      }
      requireRipple(rp);
      requireAttenuation(rs, rp);
      return ellipticPrototype(order, rp, rs);
    }
    case "bessel":
      return besselPrototype(order, options.besselNormalisation ?? "phase");
    default:
      throw new TypeError(
        `Family must be one of butterworth, chebyshev1, chebyshev2, elliptic, bessel, got ${
          String(family)
        }`,
      );
  }
}

/**
 * Digital IIR filter from a classic analog prototype: prototype (zeros,
 * poles, gain) → frequency transformation at the pre-warped edges
 * Ω = 2fs·tan(πf/fs) → bilinear transform → second-order sections. The edges
 * land exactly where asked because of the pre-warping.
 *
 * The result is checked: a pole on or outside the unit circle (possible only
 * for extreme edge/order combinations in floating point) throws. Sections
 * whose pole positions are sensitive to coefficient rounding carry a
 * "section-ill-conditioned" warning.
 *
 * Source: A. V. Oppenheim and R. W. Schafer, Discrete-Time Signal
 * Processing, 3rd ed., ch. 7 (bilinear transformation, pre-warping);
 * T. W. Parks and C. S. Burrus, Digital Filter Design (Wiley, 1987), IIR design chapters.
 *
 * @param options Family, band shape, order, fs, edges, ripple/attenuation.
 * @returns Zeros/poles/gain, sections, order and warnings.
 * @throws {RangeError} Edges outside (0, fs/2) or not increasing, ripple ≤ 0,
 *   attenuation ≤ ripple, order outside its range, or an unstable result.
 * @throws {TypeError} Unknown family or shape, missing ripple/attenuation, wrong edge count.
 * @example
 * ```ts
 * import { designIir } from "./design.ts";
 * const d = designIir({ family: "butterworth", response: "lowpass", order: 4, fs: 1000, edges: 100 });
 * if (d.sections.length !== 2 || d.order !== 4) throw new Error("two biquads");
 * // Butterworth DC gain is exactly 1: the product of section DC gains.
 * const dc = d.sections.reduce((g, s) => g * (s.b0 + s.b1 + s.b2) / (1 + s.a1 + s.a2), 1);
 * if (Math.abs(dc - 1) > 1e-12) throw new Error("unit DC gain");
 * ```
 */
export function designIir(options: IirDesignOptions): IirDesign {
  if (options === null || typeof options !== "object") {
    throw new TypeError(`IIR design options must be an object, got ${String(options)}`);
  }
  const { response, fs } = options;
  requireShape(response);
  const edges = requireEdges("Band edges", options.edges as number | number[], response, fs);
  const prototype = prototypeFor(options);
  const warped = edges.map((f) => prewarp(f, fs));
  let analog: ZerosPolesGain;
  if (response === "lowpass") analog = lowpassToLowpass(prototype, warped[0]!);
  else if (response === "highpass") analog = lowpassToHighpass(prototype, warped[0]!);
  else {
    const w0 = Math.sqrt(warped[0]! * warped[1]!);
    const bw = warped[1]! - warped[0]!;
    analog = response === "bandpass"
      ? lowpassToBandpass(prototype, w0, bw)
      : lowpassToBandstop(prototype, w0, bw);
  }
  const digital = bilinearTransform(analog, fs);
  let largest = 0;
  for (const p of digital.poles) largest = Math.max(largest, Math.hypot(p.re, p.im));
  if (!(largest < 1)) {
    throw new RangeError(
      `Designed filter must be stable (all poles inside the unit circle), got a pole radius of ${
        show(largest)
      }; lower the order or move the edges away from 0 and fs/2`,
    );
  }
  const sections = zerosPolesToSections(digital, { gainPlacement: options.gainPlacement });
  return {
    zerosPolesGain: digital,
    sections,
    order: digital.poles.length,
    warnings: sectionWarnings(sections),
  };
}

/**
 * Warn when rounding a section's a1, a2 by one ulp could move its poles by
 * more than 1/1000 of their distance to the unit circle.
 */
function sectionWarnings(sections: readonly Section[]): DesignWarning[] {
  const warnings: DesignWarning[] = [];
  sections.forEach((s, i) => {
    const disc = s.a1 * s.a1 - 4 * s.a2;
    const radius = disc < 0 ? Math.sqrt(s.a2) : (Math.abs(s.a1) + Math.sqrt(disc)) / 2;
    const separation = Math.sqrt(Math.abs(disc));
    const movement = (2.22e-16 * Math.max(1, Math.abs(s.a1))) / Math.max(separation, 1e-300);
    const distance = 1 - radius;
    if (movement > 1e-3 * distance) {
      const share = movement / distance;
      warnings.push({
        code: "section-ill-conditioned",
        message: `Section ${i + 1}: pole radius ${
          radius.toPrecision(12)
        } is so close to the unit circle that rounding a1, a2 can move the poles ${
          share >= 1 ? "across it" : `by ${share.toPrecision(2)} of their distance to it`
        }; consider a lower sample rate (decimate first) for such narrow features.`,
      });
    }
  });
  return warnings;
}
