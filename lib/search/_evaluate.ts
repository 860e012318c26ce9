// Checking one built design of a search in floating point and after quantisation (private).
import { sectionNodeNorms } from "../fixed/norms.ts";
import type { Rounding } from "../fixed/quantise.ts";
import { type QuantisedDesign, quantiseDesign } from "../fixed/quantise_design.ts";
import type { MultistageDecimatorDesign } from "../multirate/multistage.ts";
import type { DesignWarning, Section } from "../types.ts";
import type { CheckOptions } from "../verify/check.ts";
import { type FilterDesign, poleRadius } from "../verify/filter_design.ts";
import { judge, type RequirementResult } from "../verify/requirement.ts";
import type { FilterSpec } from "../verify/requirements.ts";
import { checkSpec } from "../verify/spec.ts";
import type { Arithmetic, CheckedRow } from "./types.ts";

/** A design made by one method at one size, before it is checked. */
export interface Built {
  /** The floating-point design (multistage: the equivalent FIR at the input rate). */
  design: FilterDesign;
  /** Multistage stages (floating point), when the design has them. */
  stages?: MultistageDecimatorDesign;
  /** Soft trouble from the method. */
  warnings: DesignWarning[];
}

/** A built design with its requirement rows. */
export interface Evaluation {
  size: number;
  built?: Built;
  error?: string;
  floating: RequirementResult[];
  /** Undefined while only the floating-point check was run (it already failed). */
  quantised?: RequirementResult[];
  quantisedDesign?: FilterDesign;
  quantisation?: QuantisedDesign[];
  /** The quantised stages of a multistage design. */
  quantisedStages?: MultistageDecimatorDesign;
  meets: boolean;
  worst?: CheckedRow;
  failures: CheckedRow[];
  /** Worst relative margin: −Infinity for a design that could not be built. */
  score: number;
}

/** What every check of a search shares. */
export interface EvaluationContext {
  spec: FilterSpec;
  wordLength: number;
  dataBits: number;
  accumulatorBits: number;
  rounding: Rounding;
  check: CheckOptions;
}

/** margin / |limit|, or the margin when the limit is 0. */
export function relativeMargin(r: RequirementResult): number {
  if (Number.isNaN(r.margin)) return -Infinity;
  return r.limit === 0 ? r.margin : r.margin / Math.abs(r.limit);
}

/** ⌈log2(bound + 1)⌉ + 1 bits hold every integer of magnitude ≤ bound in two's complement. */
function bitsFor(bound: number): number {
  return Math.max(2, Math.ceil(Math.log2(bound + 1) - 1e-12) + 1);
}

/** Accumulator bits a worst-case full-scale input needs, from the L1 norms of the codes or nodes. */
function accumulatorNeed(q: QuantisedDesign, dataBits: number): number {
  const fullScale = 2 ** (dataBits - 1);
  if (q.design.kind === "fir") {
    let sum = 0;
    for (const c of q.codes[0]!) sum += Math.abs(c);
    return bitsFor(sum * fullScale);
  }
  if (q.design.kind === "sections") {
    const norms = sectionNodeNorms(q.design.sections);
    let need = 2;
    norms.forEach((n, k) => {
      const l1 = Math.max(n.output.l1, n.state1.l1, n.state2.l1);
      const scale = 2 ** q.formats[k]!.fractionBits * fullScale;
      need = Math.max(need, bitsFor(l1 * scale));
    });
    return need;
  }
  // B(z)/A(z) is not built by the search; count the numerator products only.
  let sum = 0;
  for (const c of q.codes[0]!) sum += Math.abs(c);
  return bitsFor(sum * fullScale);
}

function accumulatorRow(
  quantised: QuantisedDesign[],
  ctx: EvaluationContext,
): RequirementResult {
  const name =
    `Accumulator width for a worst-case input (${ctx.dataBits}-bit data, ${ctx.wordLength}-bit coefficients)`;
  let need = 0;
  try {
    for (const q of quantised) need = Math.max(need, accumulatorNeed(q, ctx.dataBits));
  } catch {
    return notMet(name, ctx.accumulatorBits, "bits");
  }
  return judge(name, need, { atMost: ctx.accumulatorBits }, "bits");
}

function notMet(name: string, limit: number, unit: string): RequirementResult {
  return {
    name,
    achieved: Infinity,
    limit,
    relation: "atMost",
    unit,
    margin: -Infinity,
    met: false,
  };
}

function stabilityRow(design: FilterDesign): RequirementResult {
  return judge(
    "Stable after quantisation (1 − largest pole radius)",
    1 - poleRadius(design),
    { atLeast: 0 },
    "",
  );
}

/** The equivalent single-rate FIR of a cascade of decimating FIR stages: h₁ ∗ h₂↑M₁ ∗ h₃↑M₁M₂ ∗ … */
export function equivalentTaps(stages: readonly { factor: number; taps: ArrayLike<number> }[]) {
  let h = Float64Array.of(1);
  let spread = 1;
  for (const s of stages) {
    const g = s.taps;
    const out = new Float64Array(h.length + (g.length - 1) * spread);
    for (let i = 0; i < h.length; i++) {
      const a = h[i]!;
      if (a === 0) continue;
      for (let k = 0; k < g.length; k++) {
        const j = i + k * spread;
        out[j] = out[j]! + a * (g[k] as number);
      }
    }
    h = out;
    spread *= s.factor;
  }
  return h;
}

function rowsOf(results: RequirementResult[], arithmetic: Arithmetic): CheckedRow[] {
  return results.map((result) => ({ result, arithmetic, relativeMargin: relativeMargin(result) }));
}

/** A trial whose design could not be made. */
export function failedBuild(size: number, error: unknown): Evaluation {
  return {
    size,
    error: error instanceof Error ? error.message : String(error),
    floating: [],
    meets: false,
    failures: [],
    score: -Infinity,
  };
}

/**
 * Check a built design: floating point first; the quantised design only when
 * the floating-point one meets everything, or always when `full` is set.
 */
export function evaluate(
  size: number,
  built: Built,
  ctx: EvaluationContext,
  full: boolean,
): Evaluation {
  const floating = checkSpec(built.design, ctx.spec, ctx.check);
  const evaluation: Evaluation = {
    size,
    built,
    floating,
    meets: false,
    failures: [],
    score: -Infinity,
  };
  if (full || floating.every((r) => r.met)) addQuantised(evaluation, ctx);
  return summarise(evaluation);
}

/** Add the quantised rows to an evaluation that has only the floating-point ones. */
export function completeEvaluation(evaluation: Evaluation, ctx: EvaluationContext): Evaluation {
  if (evaluation.built === undefined || evaluation.quantised !== undefined) return evaluation;
  addQuantised(evaluation, ctx);
  return summarise(evaluation);
}

function addQuantised(evaluation: Evaluation, ctx: EvaluationContext): void {
  const built = evaluation.built!;
  const options = { rounding: ctx.rounding };
  let quantisation: QuantisedDesign[];
  let quantisedDesign: FilterDesign;
  if (built.stages !== undefined) {
    quantisation = built.stages.stages.map((s) =>
      quantiseDesign({ kind: "fir", taps: s.taps }, ctx.wordLength, options)
    );
    const stages = built.stages.stages.map((s, i) => ({
      ...s,
      taps: Float64Array.from(
        (quantisation[i]!.design as { kind: "fir"; taps: ArrayLike<number> }).taps,
      ),
    }));
    evaluation.quantisedStages = { stages, warnings: [] };
    quantisedDesign = { kind: "fir", taps: equivalentTaps(stages) };
  } else {
    const q = quantiseDesign(built.design, ctx.wordLength, options);
    quantisation = [q];
    quantisedDesign = q.design;
  }
  const rows = checkSpec(quantisedDesign, ctx.spec, ctx.check);
  rows.push(accumulatorRow(quantisation, ctx));
  if (quantisedDesign.kind !== "fir") rows.push(stabilityRow(quantisedDesign));
  evaluation.quantised = rows;
  evaluation.quantisedDesign = quantisedDesign;
  evaluation.quantisation = quantisation;
}

function summarise(evaluation: Evaluation): Evaluation {
  const rows = [
    ...rowsOf(evaluation.floating, "floating point"),
    ...rowsOf(evaluation.quantised ?? [], "quantised"),
  ];
  let worst: CheckedRow | undefined;
  for (const row of rows) {
    if (worst === undefined || row.relativeMargin < worst.relativeMargin) worst = row;
  }
  evaluation.failures = rows.filter((r) => !r.result.met)
    .sort((a, b) => a.relativeMargin - b.relativeMargin);
  evaluation.meets = evaluation.quantised !== undefined && evaluation.failures.length === 0;
  if (worst !== undefined) evaluation.worst = worst;
  evaluation.score = worst?.relativeMargin ?? -Infinity;
  return evaluation;
}

/** Sections with their numerators scaled by a linear gain in the last section. */
export function withGain(sections: readonly Section[], gain: number): Section[] {
  const out = sections.map((s) => ({ ...s }));
  if (gain !== 1) {
    const last = out[out.length - 1]!;
    last.b0 *= gain;
    last.b1 *= gain;
    last.b2 *= gain;
  }
  return out;
}
