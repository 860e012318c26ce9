import { requireFrequency, requireInteger, requirePositive, show } from "../_validate.ts";
import { requireRounding } from "../fixed/_rounding.ts";
import type { DesignWarning } from "../types.ts";
import type { CheckOptions } from "../verify/check.ts";
import type { FilterSpec } from "../verify/requirements.ts";
import { type BandLayout, inferBandLayout } from "./band_layout.ts";
import {
  completeEvaluation,
  evaluate,
  type Evaluation,
  type EvaluationContext,
  failedBuild,
} from "./_evaluate.ts";
import { METHOD_ORDER, type MethodPlan, planMethod } from "./_methods.ts";
import { LIMIT_REACHED, predictedLength, searchSize } from "./_size_search.ts";
import { type CostedDesign, implementationCost } from "./implementation_cost.ts";
import type {
  SearchCandidate,
  SearchCost,
  SearchLimits,
  SearchMethod,
  SearchOptions,
  SearchResult,
  SearchTarget,
  SearchTrial,
} from "./types.ts";

/** Every method a search knows, in the order it tries them by default. */
export const SEARCH_METHODS: readonly SearchMethod[] = METHOD_ORDER;

const COSTS: readonly SearchCost[] = ["multiplies", "latency", "memory"];

function requireTarget(target: SearchTarget): Required<SearchTarget> {
  if (target === null || typeof target !== "object") {
    throw new TypeError(
      `Target must be an object { wordLength, accumulatorBits, … }, got ${String(target)}`,
    );
  }
  requireInteger("Coefficient word length", target.wordLength, 2, 32);
  requireInteger("Accumulator bits", target.accumulatorBits, 2, 128);
  const dataBits = target.dataBits ?? target.wordLength;
  requireInteger("Data word length", dataBits, 2, 32);
  const rounding = target.rounding ?? "nearest";
  requireRounding(rounding);
  const decimation = target.decimation ?? 1;
  requireInteger("Decimation factor", decimation, 1, 1e6);
  return {
    wordLength: target.wordLength,
    accumulatorBits: target.accumulatorBits,
    dataBits,
    rounding,
    decimation,
  };
}

function defaultLatencyFrequency(layout: BandLayout): number {
  switch (layout.response) {
    case "lowpass":
    case "bandstop":
      return 0;
    case "highpass":
      return layout.fs / 2;
    case "bandpass": {
      const [a, b] = layout.passband as [number, number];
      return (a + b) / 2;
    }
  }
}

function rankValueOf(candidate: SearchCandidate, rankBy: SearchCost): number | undefined {
  const c = candidate.cost;
  if (c === undefined) return undefined;
  return rankBy === "multiplies"
    ? c.multipliesPerOutput
    : rankBy === "latency"
    ? c.latencySeconds
    : c.memoryWords;
}

function describeShortfall(candidate: SearchCandidate): string {
  const f = candidate.failures[0] ?? candidate.worst;
  if (f === undefined) return candidate.reason ?? "it could not be designed";
  const r = f.result;
  const by = Number.isFinite(r.margin)
    ? `${show(Math.abs(r.margin))}${r.unit === "" ? "" : ` ${r.unit}`}`
    : "an unbounded amount";
  const others = new Set(candidate.failures.map((x) => x.result.name));
  others.delete(r.name);
  return `misses "${r.name}"${r.id === undefined ? "" : ` (${r.id})`} by ${by} (${f.arithmetic})${
    others.size > 0 ? ` and ${others.size} other requirement${others.size === 1 ? "" : "s"}` : ""
  }`;
}

/**
 * Search the library's design methods for the cheapest filter that meets a
 * specification on a fixed-point target.
 *
 * The band shape (lowpass, highpass, bandpass, bandstop) and its edges,
 * ripple and attenuation come from the spec's passband and stopband
 * requirements ({@link inferBandLayout}). Each method that can fit the shape
 * is tried: equiripple FIR, Kaiser-window FIR, weighted least-squares FIR,
 * half-band FIR (when fs/4 lies in the transition band), Butterworth,
 * Chebyshev I and II, elliptic and Bessel IIR, and the multistage decimator
 * plan when the target decimates a lowpass. For each method the search finds
 * its smallest size meeting every requirement: it starts from the method's
 * published estimate (Herrmann–Rabiner–Chan, Kaiser's formula, the IIR order
 * formulas, which are exact lower bounds, so IIR orders only grow), gallops
 * away from it in steps 1, 2, 4, … (or straight to the length the margins
 * predict, for FIR) and bisects the bracket — no linear crawl.
 *
 * Every design is checked against every requirement in floating point and,
 * when that passes, with its coefficients quantised to the target word length
 * (phase, group delay and settling included), plus two checks of the target:
 * the accumulator width a worst-case full-scale input needs (from the L1 norms
 * of the codes, or of every node of each section), and, for IIR designs,
 * stability after quantisation. IIR designs are made at each order with the
 * slack shared between passband and stopband (power ratios tightened by the
 * geometric middle of the admissible factor), so that rounding has room.
 *
 * Each method's best design gets an implementation cost
 * ({@link implementationCost}) at the target's decimation. Candidates that
 * meet are ranked by the chosen cost, and the cheapest is chosen; the others
 * say which requirement failed and by how much. A spec no method meets gives
 * a result whose `nearest` candidate names the requirement it misses; only
 * malformed input throws. The search stops at `maxDesigns` designs or
 * `timeLimitMs`, whichever comes first, and says so in `limits`.
 *
 * Sources: the estimates of the methods searched (Herrmann, Rabiner and Chan,
 * Bell Syst. Tech. J. 52(6), 1973; J. F. Kaiser, Proc. IEEE ISCAS 1974;
 * T. W. Parks and C. S. Burrus, Digital Filter Design, Wiley 1987;
 * R. E. Crochiere and L. R. Rabiner, IEEE Trans. ASSP 23(5), 1975);
 * L. B. Jackson, Digital Filters and Signal Processing, 3rd ed., §11.4 (L1 bounds).
 *
 * @param spec Sample rate and requirements; needs at least one passband and one stopband requirement.
 * @param options Target (word lengths, accumulator, decimation), ranking cost, methods and limits.
 * @returns Ranked candidates, the chosen one (or the nearest), every trial and the limits used.
 * @throws {RangeError} For a contradictory spec, a spec without a band shape, or an option out of range.
 * @throws {TypeError} For a malformed spec, target or option.
 * @example
 * ```ts
 * import { searchDesigns } from "./search_designs.ts";
 * import { checkSpec } from "../verify/spec.ts";
 * const spec = { fs: 8000, requirements: [
 *   { kind: "passbandRipple" as const, from: 0, to: 1000, atMostDb: 1 },
 *   { kind: "stopbandAttenuation" as const, from: 1500, to: 4000, atLeastDb: 40 },
 * ] };
 * const result = searchDesigns(spec, {
 *   target: { wordLength: 16, accumulatorBits: 40 },
 *   methods: ["equiripple", "elliptic"],
 * });
 * // An elliptic filter needs far fewer multiplies than an equiripple FIR here.
 * if (result.chosen?.method !== "elliptic") throw new Error(result.summary);
 * if (!checkSpec(result.chosen.quantisedDesign!, spec).every((r) => r.met)) throw new Error("meets");
 * ```
 */
export function searchDesigns(spec: FilterSpec, options: SearchOptions): SearchResult {
  if (options === null || typeof options !== "object") {
    throw new TypeError(`Search options must be an object { target, … }, got ${String(options)}`);
  }
  const layout = inferBandLayout(spec);
  const target = requireTarget(options.target);
  const rankBy = options.rankBy ?? "multiplies";
  if (!COSTS.includes(rankBy)) {
    throw new TypeError(`rankBy must be one of ${COSTS.join(", ")}, got ${String(rankBy)}`);
  }
  const methods = options.methods ?? SEARCH_METHODS;
  if (!Array.isArray(methods) || methods.length === 0) {
    throw new TypeError("methods must be a non-empty array of method names");
  }
  for (const m of methods) {
    if (!SEARCH_METHODS.includes(m)) {
      throw new TypeError(`Method must be one of ${SEARCH_METHODS.join(", ")}, got ${String(m)}`);
    }
  }
  const maxDesigns = options.maxDesigns ?? 200;
  requireInteger("Largest number of designs", maxDesigns, 1, 10000);
  const maxDesignsPerMethod = options.maxDesignsPerMethod ?? 24;
  requireInteger("Largest number of designs per method", maxDesignsPerMethod, 1, 1000);
  const timeLimitMs = options.timeLimitMs ?? 5000;
  requirePositive("Time limit", timeLimitMs, " ms");
  const maxTaps = options.maxTaps ?? 4096;
  requireInteger("Largest FIR length", maxTaps, 3, 4096);
  const latencyFrequency = options.latencyFrequency ?? defaultLatencyFrequency(layout);
  requireFrequency("Latency frequency", latencyFrequency, spec.fs);
  const check: CheckOptions = {};
  if (options.points !== undefined) {
    requireInteger("Grid points", options.points, 2, 1 << 20);
    check.points = options.points;
  }
  const now = options.now ?? (() => performance.now());
  if (typeof now !== "function") throw new TypeError("now must be a function returning ms");
  const started = now();
  const ctx: EvaluationContext = {
    spec,
    wordLength: target.wordLength,
    dataBits: target.dataBits,
    accumulatorBits: target.accumulatorBits,
    rounding: target.rounding,
    check,
  };
  const warnings: DesignWarning[] = [];
  const trials: SearchTrial[] = [];
  let designsTried = 0;
  let stoppedBy: SearchLimits["stoppedBy"];
  if (target.decimation > 1) aliasWarning(layout, target.decimation, warnings);

  const candidates: SearchCandidate[] = [];
  for (const method of methods) {
    const plan = planMethod(method, {
      layout,
      decimation: target.decimation,
      maxTaps,
    });
    if (plan.notApplicable !== undefined) {
      candidates.push(emptyCandidate(plan, "not applicable", plan.notApplicable));
      continue;
    }
    if (stoppedBy !== undefined) {
      candidates.push(emptyCandidate(plan, "skipped", `not tried: the ${limitName(stoppedBy)}`));
      continue;
    }
    let used = 0;
    const evaluateAt = (size: number): Evaluation | undefined => {
      if (designsTried >= maxDesigns) {
        stoppedBy = "designs";
        return undefined;
      }
      if (now() - started >= timeLimitMs) {
        stoppedBy = "time";
        return undefined;
      }
      if (used >= maxDesignsPerMethod) return undefined;
      used++;
      designsTried++;
      let e: Evaluation;
      try {
        e = evaluate(size, plan.build(size), ctx, false);
      } catch (error) {
        e = failedBuild(size, error);
      }
      const trial: SearchTrial = { method, size, meets: e.meets };
      if (e.worst !== undefined) trial.worst = e.worst;
      if (e.error !== undefined) trial.error = e.error;
      trials.push(trial);
      return e;
    };
    const predict = plan.linearInSize
      ? (
        e: Evaluation,
      ) => (e.error === undefined ? predictedLength(e, spec, layout.gainDb) : undefined)
      : () => undefined;
    const found = searchSize(plan, evaluateAt, predict);
    candidates.push(
      candidateOf(plan, found.best, found.evaluations, found.stopped, {
        maxDesignsPerMethod,
        ctx,
        fs: spec.fs,
        decimation: target.decimation,
        latencyFrequency,
        stoppedBy,
      }),
    );
  }
  for (const c of candidates) {
    const v = rankValueOf(c, rankBy);
    if (v !== undefined) c.rankValue = v;
  }
  const order = (m: SearchMethod) => methods.indexOf(m);
  const meeting = candidates.filter((c) => c.status === "meets").sort((a, b) =>
    a.rankValue! - b.rankValue! ||
    a.cost!.multipliesPerOutput - b.cost!.multipliesPerOutput ||
    a.cost!.memoryWords - b.cost!.memoryWords ||
    a.cost!.latencySeconds - b.cost!.latencySeconds ||
    order(a.method) - order(b.method)
  );
  const failing = candidates.filter((c) => c.status === "fails").sort((a, b) =>
    (b.worst?.relativeMargin ?? -Infinity) - (a.worst?.relativeMargin ?? -Infinity) ||
    order(a.method) - order(b.method)
  );
  const rest = candidates.filter((c) => c.status !== "meets" && c.status !== "fails");
  const ranked = [...meeting, ...failing, ...rest];
  const chosen = meeting[0];
  const nearest = chosen === undefined ? failing.find((c) => c.design !== undefined) : undefined;
  const elapsedMs = now() - started;
  const limits: SearchLimits = {
    maxDesigns,
    maxDesignsPerMethod,
    timeLimitMs,
    designsTried,
    elapsedMs,
  };
  if (stoppedBy !== undefined) {
    limits.stoppedBy = stoppedBy;
    warnings.push({
      code: "search-limit",
      message: `The search stopped at its ${limitName(stoppedBy)} after ${designsTried} designs; ${
        rest.filter((c) => c.status === "skipped").length
      } methods were not tried and the last one may not have reached its smallest size.`,
    });
  }
  let summary: string;
  if (chosen !== undefined) {
    const c = chosen.cost!;
    summary =
      `${chosen.label}, ${chosen.sizeLabel}, meets all ${chosen.floatingResults.length} requirements in floating point and quantised to ${target.wordLength}-bit coefficients, at ${
        show(c.multipliesPerOutput)
      } multiplies per output sample, ${show(c.memoryWords)} words of memory and ${
        show(c.latencySamples)
      } samples of latency; cheapest by ${rankBy} of ${meeting.length} that meet.`;
  } else if (nearest !== undefined) {
    summary = `No method met every requirement. Nearest: ${nearest.label}, ${nearest.sizeLabel}, ${
      describeShortfall(nearest)
    }.`;
  } else {
    summary = "No method could make a design for this spec: " +
      candidates.map((c) => `${c.label}: ${c.reason ?? c.status}`).join("; ") + ".";
  }
  const result: SearchResult = {
    spec,
    layout,
    target,
    rankBy,
    candidates: ranked,
    summary,
    trials,
    limits,
    warnings,
  };
  if (chosen !== undefined) result.chosen = chosen;
  if (nearest !== undefined) result.nearest = nearest;
  return result;
}

function limitName(stoppedBy: "designs" | "time"): string {
  return stoppedBy === "time" ? "time limit" : "limit on the number of designs";
}

function aliasWarning(layout: BandLayout, m: number, warnings: DesignWarning[]): void {
  if (layout.response !== "lowpass") {
    warnings.push({
      code: "decimating-non-lowpass",
      message:
        `Decimating a ${layout.response} by ${m} folds its bands onto each other; the requirements are judged on the filter before decimation.`,
    });
    return;
  }
  const fs = layout.fs;
  const p = layout.passband as number;
  const s = layout.stopband as number;
  const safe = fs / m - p;
  if (s > safe) {
    warnings.push({
      code: "aliasing-into-passband",
      message: `The stopband starts at ${show(s)} Hz, above fs/M − passband edge = ${
        show(safe)
      } Hz: after decimation by ${m}, signals between ${show(safe)} and ${
        show(s)
      } Hz alias into the passband.`,
    });
  }
}

function emptyCandidate(
  plan: MethodPlan,
  status: "not applicable" | "skipped",
  reason: string,
): SearchCandidate {
  return {
    method: plan.method,
    label: plan.label,
    status,
    reason,
    size: 0,
    sizeLabel: "—",
    floatingResults: [],
    quantisedResults: [],
    failures: [],
    warnings: [],
  };
}

function candidateOf(
  plan: MethodPlan,
  best: Evaluation | undefined,
  evaluations: Evaluation[],
  stopped: string | undefined,
  env: {
    maxDesignsPerMethod: number;
    ctx: EvaluationContext;
    fs: number;
    decimation: number;
    latencyFrequency: number;
    stoppedBy: SearchLimits["stoppedBy"];
  },
): SearchCandidate {
  let pick = best;
  if (pick === undefined) {
    for (const e of evaluations) {
      if (e.built !== undefined && (pick === undefined || e.score > pick.score)) pick = e;
    }
  }
  if (pick === undefined) {
    const error = evaluations.find((e) => e.error !== undefined)?.error;
    if (evaluations.length === 0) {
      return emptyCandidate(
        plan,
        "skipped",
        `not tried: the ${limitName(env.stoppedBy ?? "designs")}`,
      );
    }
    const c = emptyCandidate(plan, "skipped", "");
    c.status = "fails";
    c.reason = `no design could be made and checked: ${error ?? "unknown error"}`;
    c.size = evaluations[evaluations.length - 1]!.size;
    c.sizeLabel = plan.sizeLabel(c.size);
    return c;
  }
  let unchecked: string | undefined;
  try {
    pick = completeEvaluation(pick, env.ctx);
  } catch (error) {
    unchecked = `the quantised design could not be checked: ${(error as Error).message}`;
  }
  const built = pick.built!;
  const candidate: SearchCandidate = {
    method: plan.method,
    label: plan.label,
    status: pick.meets ? "meets" : "fails",
    size: pick.size,
    sizeLabel: plan.sizeLabel(pick.size, built),
    design: built.design,
    floatingResults: pick.floating,
    quantisedResults: pick.quantised ?? [],
    failures: pick.failures,
    warnings: built.warnings,
  };
  if (plan.estimate !== undefined) candidate.estimate = plan.estimate;
  if (plan.estimateSource !== undefined) candidate.estimateSource = plan.estimateSource;
  if (built.stages !== undefined) candidate.stages = built.stages;
  if (pick.quantisedDesign !== undefined) candidate.quantisedDesign = pick.quantisedDesign;
  if (pick.quantisation !== undefined) candidate.quantisation = pick.quantisation;
  if (pick.worst !== undefined) candidate.worst = pick.worst;
  const why = stopped !== LIMIT_REACHED
    ? stopped
    : env.stoppedBy !== undefined
    ? `the ${limitName(env.stoppedBy)} was reached`
    : `the limit of designs per method (${env.maxDesignsPerMethod}) was reached`;
  if (unchecked !== undefined) candidate.reason = unchecked;
  else if (why !== undefined) {
    candidate.reason = pick.meets
      ? `stopped early (${why}): a smaller size may also meet`
      : `stopped: ${why}`;
  }
  const costed: CostedDesign = pick.quantisedStages ?? pick.quantisedDesign ?? built.design;
  candidate.cost = "stages" in costed
    ? implementationCost(costed, { fs: env.fs, latencyFrequency: env.latencyFrequency })
    : implementationCost(costed, {
      fs: env.fs,
      decimation: env.decimation,
      latencyFrequency: env.latencyFrequency,
    });
  return candidate;
}
