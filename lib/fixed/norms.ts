import { requireSamples } from "../_validate.ts";
import type { Section } from "../types.ts";
import {
  applyDesign,
  decayLength,
  type FilterDesign,
  poleRadius,
  requireDesign,
} from "../verify/filter_design.ts";
import { peakGainOf } from "./_peak_gain.ts";

/** Norms of a finite sequence h. */
export interface SequenceNorms {
  /** L1 = Σ|h[n]|: the worst-case peak gain for any bounded input. */
  l1: number;
  /** L2 = √Σ h[n]²: the RMS gain for white noise. */
  l2: number;
  /** L∞ = max|h[n]|: the largest single sample. */
  lInfinity: number;
}

/**
 * L1, L2 and L∞ norms of a sequence: Σ|h|, √Σh², max|h|.
 *
 * @param h Samples (finite).
 * @returns The three norms.
 * @throws {TypeError} When a sample is not finite.
 * @example
 * ```ts
 * import { sequenceNorms } from "./norms.ts";
 * const n = sequenceNorms([3, -4]);
 * if (n.l1 !== 7 || n.l2 !== 5 || n.lInfinity !== 4) throw new Error("7, 5, 4");
 * ```
 */
export function sequenceNorms(h: ArrayLike<number>): SequenceNorms {
  requireSamples("Sequence", h, 0);
  let l1 = 0;
  let sq = 0;
  let peak = 0;
  for (let i = 0; i < h.length; i++) {
    const v = Math.abs(h[i] as number);
    l1 += v;
    sq += v * v;
    peak = Math.max(peak, v);
  }
  return { l1, l2: Math.sqrt(sq), lInfinity: peak };
}

/** Norms from the input to the output of a design, with the headroom they imply. */
export interface OutputNorms extends SequenceNorms {
  /** Peak gain max|H(f)| over frequency (the frequency-domain L∞ norm). */
  peakGain: number;
  /** Samples of impulse response the norms were taken over. */
  length: number;
  /**
   * Integer bits of growth to reserve so that no input within full scale can
   * overflow the output: max(0, ⌈log2 L1⌉).
   */
  growthBits: number;
  /**
   * Headroom in bits for a full-scale sine, −log2(peakGain): positive when the
   * output stays below full scale, negative when it can exceed it.
   */
  headroomBits: number;
}

function impulse(design: FilterDesign, what: string): Float64Array {
  const length = decayLength(design);
  if (!Number.isFinite(length)) {
    throw new RangeError(
      `${what} needs a stable design; the largest pole radius is ${
        poleRadius(design).toPrecision(6)
      }`,
    );
  }
  const x = new Float64Array(length);
  x[0] = 1;
  return applyDesign(design, x);
}

/**
 * Norms of the impulse response from the input to the output, taken over the
 * decay length (until the tail is below 1e−13 of the start), with the peak
 * gain over frequency, the growth bits and the headroom bits.
 *
 * Source: L. B. Jackson, Digital Filters and Signal Processing, 3rd ed.,
 * §11.4 (Lp norms and scaling).
 *
 * @param design A stable design.
 * @returns The norms.
 * @throws {RangeError} When the design is not stable.
 * @example
 * ```ts
 * import { outputNorms } from "./norms.ts";
 * // One pole at 0.5: h[n] = 0.5^n, L1 = 2, L2 = 1/√(1 − 0.25), peak gain 2 at DC.
 * const n = outputNorms({ kind: "rational", numerator: [1], denominator: [1, -0.5] });
 * if (Math.abs(n.l2 - 1 / Math.sqrt(0.75)) > 1e-12 || n.growthBits !== 1) throw new Error("one pole");
 * ```
 */
export function outputNorms(design: FilterDesign): OutputNorms {
  requireDesign(design);
  const h = impulse(design, "Output norms");
  const n = sequenceNorms(h);
  const peakGain = peakGainOf(design);
  return {
    ...n,
    peakGain,
    length: h.length,
    growthBits: Math.max(0, Math.ceil(Math.log2(n.l1) - 1e-12)),
    headroomBits: -Math.log2(peakGain),
  };
}

/** Norms from the input to each node of one section in transposed direct form II. */
export interface SectionNodeNorms {
  /** To the section output y_k (the word passed to the next section). */
  output: SequenceNorms;
  /** To the first state s1 = b1·x − a1·y + s2. */
  state1: SequenceNorms;
  /** To the second state s2 = b2·x − a2·y. */
  state2: SequenceNorms;
}

/**
 * Norms of the impulse responses from the cascade input to every internal node
 * of each section in transposed direct form II (y = b0·x + s1;
 * s1 = b1·x − a1·y + s2; s2 = b2·x − a2·y). These size the words and
 * accumulators of a fixed-point implementation.
 *
 * Source: L. B. Jackson, Digital Filters and Signal Processing, 3rd ed., §11.4.
 *
 * @param sections A stable cascade (a0 = 1).
 * @returns One entry per section.
 * @throws {RangeError} When the cascade is not stable.
 * @example
 * ```ts
 * import { sectionNodeNorms } from "./norms.ts";
 * // One pole at 0.5: s1[n] = 0.5·y[n] = 0.5^(n+1), L1 = 1.
 * const [k] = sectionNodeNorms([{ b0: 1, b1: 0, b2: 0, a1: -0.5, a2: 0 }]);
 * if (Math.abs(k!.state1.l1 - 1) > 1e-12 || k!.state2.l1 !== 0) throw new Error("states");
 * ```
 */
export function sectionNodeNorms(sections: readonly Section[]): SectionNodeNorms[] {
  const design: FilterDesign = { kind: "sections", sections };
  requireDesign(design);
  let x = new Float64Array(impulse(design, "Section node norms").length);
  x[0] = 1;
  const out: SectionNodeNorms[] = [];
  for (const s of sections) {
    const y = new Float64Array(x.length);
    const n1 = new Float64Array(x.length);
    const n2 = new Float64Array(x.length);
    let s1 = 0;
    let s2 = 0;
    // x is the impulse response from the cascade input to this section's input.
    for (let n = 0; n < x.length; n++) {
      const xn = x[n] as number;
      const yn = s.b0 * xn + s1;
      s1 = s.b1 * xn - s.a1 * yn + s2;
      s2 = s.b2 * xn - s.a2 * yn;
      y[n] = yn;
      n1[n] = s1;
      n2[n] = s2;
    }
    out.push({ output: sequenceNorms(y), state1: sequenceNorms(n1), state2: sequenceNorms(n2) });
    x = y;
  }
  return out;
}

/**
 * Round-off noise gain: output noise variance divided by q²/12, when each
 * rounding to the data word adds white noise of variance q²/12.
 * - FIR with a full-precision accumulator: one rounding at the output, gain 1.
 * - Sections in transposed direct form II rounding each section output
 *   (which is fed back): Σ_k ‖(1/A_k)·H_{k+1}···H_K‖₂².
 * - Rational in direct form with one rounding of y: ‖1/A‖₂².
 *
 * Source: L. B. Jackson, Digital Filters and Signal Processing, 3rd ed.,
 * §11.3 (round-off noise); Oppenheim & Schafer, Discrete-Time Signal
 * Processing, 3rd ed., §6.9.
 *
 * @param design A stable design.
 * @returns The noise gain (≥ 1 for sections, since the last term includes h[0] = 1).
 * @throws {RangeError} When the design is not stable.
 * @example
 * ```ts
 * import { roundoffNoiseGain } from "./norms.ts";
 * // One pole at a = 0.9: 1/(1 − a²) = 5.263…
 * const g = roundoffNoiseGain({ kind: "sections", sections: [{ b0: 1, b1: 0, b2: 0, a1: -0.9, a2: 0 }] });
 * if (Math.abs(g - 1 / (1 - 0.81)) > 1e-9) throw new Error("1/(1 − a²)");
 * ```
 */
export function roundoffNoiseGain(design: FilterDesign): number {
  requireDesign(design);
  switch (design.kind) {
    case "fir":
      return 1;
    case "rational": {
      const h = impulse(
        {
          kind: "rational",
          numerator: [design.denominator[0] as number],
          denominator: design.denominator,
        },
        "Round-off noise gain",
      );
      // y = (Σ b·x − Σ a·y)/a0 + e gives Y = a0/A(z)·E, whose h[0] = 1.
      return sequenceNorms(h).l2 ** 2;
    }
    case "sections": {
      let total = 0;
      const all = design.sections;
      for (let k = 0; k < all.length; k++) {
        const s = all[k] as Section;
        const path: FilterDesign = {
          kind: "sections",
          sections: [{ b0: 1, b1: 0, b2: 0, a1: s.a1, a2: s.a2 }, ...all.slice(k + 1)],
        };
        total += sequenceNorms(impulse(path, "Round-off noise gain")).l2 ** 2;
      }
      return total;
    }
  }
}
