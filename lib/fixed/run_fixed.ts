import { requireInteger, requireSamples } from "../_validate.ts";
import { formatRange, type QFormat, qFormat, requireQFormat } from "./q_format.ts";
import { quantiseValue, type Rounding } from "./quantise.ts";
import { requireRounding } from "./_rounding.ts";
import type { QuantisedDesign } from "./quantise_design.ts";
import { shiftRound } from "./_shift.ts";

/** Options for {@link runFixed}. */
export interface FixedRunOptions {
  /** Format of the input and of every data word between sections. @default Q15 (16 bits, 15 fraction bits) */
  dataFormat?: QFormat;
  /** Accumulator width in bits (products and TDF-II states are held at this width), 2 … 128. @default 40 */
  accumulatorBits?: number;
  /** Rounding when the input is quantised and when a sum is shifted back to a data word. @default "nearest" */
  rounding?: Rounding;
  /** What an accumulator does beyond its range: clamp to the limit, or wrap as two's complement. @default "saturate" */
  overflow?: "saturate" | "wrap";
}

/** The result of a fixed-point run. */
export interface FixedRunResult {
  /** Output values (codes·2^−n of the data format). */
  output: Float64Array;
  /** Output codes of the data format. */
  outputCodes: Int32Array;
  /** The input as quantised to the data format (values). */
  input: Float64Array;
  /** Times a sum left the accumulator range (each sum counts once). */
  accumulatorOverflows: number;
  /** Times a data word (a section output or the filter output) saturated. */
  outputOverflows: number;
  /** Q format of input, section and output words. */
  dataFormat: QFormat;
  /** Accumulator width in bits. */
  accumulatorBits: number;
}

/**
 * Run a quantised FIR or section cascade in exact integer arithmetic (BigInt)
 * as a fixed-point target would, and count overflow events.
 *
 * - FIR: acc = Σ h_k·x[n−k] at 2^−(n_h + n_x), each partial sum checked
 *   against the accumulator range; y = acc shifted right by n_h with the
 *   rounding mode, saturated to the data word.
 * - Sections, transposed direct form II, per section with coefficient format n_c:
 *   acc = B0·X + S1; Y = round(acc·2^−n_c) saturated to the data word;
 *   S1 = B1·X − A1·Y + S2; S2 = B2·X − A2·Y, states held at the accumulator width.
 *   Y feeds the next section.
 *
 * Source: Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * §6.5 (transposed direct form II) and §6.7–6.9 (finite-precision effects).
 *
 * @param quantised A quantised FIR or sections design (from quantiseDesign).
 * @param input Input values; quantised to the data format (saturating) first.
 * @param options Data format, accumulator width, rounding, overflow behaviour.
 * @returns Output values and codes, the quantised input and the overflow counts.
 * @throws {TypeError} When the design is rational (use sections) or the input is not finite.
 * @throws {RangeError} When the accumulator width is out of range.
 * @example
 * ```ts
 * import { quantiseDesign } from "./quantise_design.ts";
 * import { runFixed } from "./run_fixed.ts";
 * const q = quantiseDesign({ kind: "fir", taps: [0.5, 0.5] }, 16);
 * const r = runFixed(q, [0.5, 0.25, 0]);
 * if (r.output.join() !== "0.25,0.375,0.125") throw new Error("exact halves");
 * ```
 */
export function runFixed(
  quantised: QuantisedDesign,
  input: ArrayLike<number>,
  options: FixedRunOptions = {},
): FixedRunResult {
  requireSamples("Input", input, 0);
  const dataFormat = options.dataFormat ?? qFormat(16, 15);
  requireQFormat(dataFormat);
  const accumulatorBits = options.accumulatorBits ?? 40;
  requireInteger("Accumulator bits", accumulatorBits, 2, 128);
  const rounding = options.rounding ?? "nearest";
  requireRounding(rounding);
  const overflow = options.overflow ?? "saturate";
  if (overflow !== "saturate" && overflow !== "wrap") {
    throw new TypeError(`Overflow must be "saturate" or "wrap", got ${String(overflow)}`);
  }
  const design = quantised.design;
  if (design.kind === "rational") {
    throw new TypeError("Fixed-point runs take FIR taps or sections, got a rational design");
  }
  const range = formatRange(dataFormat);
  const dataMin = BigInt(range.minCode);
  const dataMax = BigInt(range.maxCode);
  const accMax = (1n << BigInt(accumulatorBits - 1)) - 1n;
  const accMin = -(1n << BigInt(accumulatorBits - 1));
  let accumulatorOverflows = 0;
  let outputOverflows = 0;
  const fitAcc = (v: bigint): bigint => {
    if (v <= accMax && v >= accMin) return v;
    accumulatorOverflows++;
    if (overflow === "wrap") return BigInt.asIntN(accumulatorBits, v);
    return v > accMax ? accMax : accMin;
  };
  const toData = (v: bigint): bigint => {
    if (v > dataMax) {
      outputOverflows++;
      return dataMax;
    }
    if (v < dataMin) {
      outputOverflows++;
      return dataMin;
    }
    return v;
  };
  const n = input.length;
  const inputValues = new Float64Array(n);
  let x: bigint[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const q = quantiseValue(input[i] as number, dataFormat, rounding);
    inputValues[i] = q.value;
    x[i] = BigInt(q.code);
  }
  if (design.kind === "fir") {
    const h = Array.from(quantised.codes[0] as Int32Array, (c) => BigInt(c));
    const shift = (quantised.formats[0] as QFormat).fractionBits;
    const y: bigint[] = new Array(n);
    for (let i = 0; i < n; i++) {
      let acc = 0n;
      const kMax = Math.min(h.length - 1, i);
      for (let k = 0; k <= kMax; k++) acc = fitAcc(acc + (h[k] as bigint) * (x[i - k] as bigint));
      y[i] = toData(shiftRound(acc, shift, rounding));
    }
    x = y;
  } else {
    for (let s = 0; s < quantised.codes.length; s++) {
      const [b0, b1, b2, a1, a2] = Array.from(
        quantised.codes[s] as Int32Array,
        (c) => BigInt(c),
      ) as [
        bigint,
        bigint,
        bigint,
        bigint,
        bigint,
      ];
      const shift = (quantised.formats[s] as QFormat).fractionBits;
      const y: bigint[] = new Array(n);
      let s1 = 0n;
      let s2 = 0n;
      for (let i = 0; i < n; i++) {
        const xi = x[i] as bigint;
        const acc = fitAcc(b0 * xi + s1);
        const yi = toData(shiftRound(acc, shift, rounding));
        s1 = fitAcc(b1 * xi - a1 * yi + s2);
        s2 = fitAcc(b2 * xi - a2 * yi);
        y[i] = yi;
      }
      x = y;
    }
  }
  const outputCodes = new Int32Array(n);
  const output = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    outputCodes[i] = Number(x[i]);
    output[i] = (outputCodes[i] as number) * range.step;
  }
  return {
    output,
    outputCodes,
    input: inputValues,
    accumulatorOverflows,
    outputOverflows,
    dataFormat: { ...dataFormat },
    accumulatorBits,
  };
}
