// Smallest size meeting a verdict, by galloping from an estimate and then bisecting (private).
import type { Evaluation } from "./_evaluate.ts";
import type { MethodPlan } from "./_methods.ts";
import type { FilterSpec } from "../verify/requirements.ts";

/** The outcome of a size search for one method. */
export interface SizeSearch {
  /** The smallest size found that meets everything. */
  best?: Evaluation;
  /** Every evaluation made, in order. */
  evaluations: Evaluation[];
  /** Why the search stopped without a meeting size. */
  stopped?: string;
}

/** The `stopped` reason when `evaluateAt` refused a design (a limit was reached). */
export const LIMIT_REACHED = "a search limit was reached";

/** Probes without improvement of the worst margin before a growing search gives up. */
const PATIENCE = 3;

/**
 * The size an FIR design needs, predicted from its margins with Kaiser's
 * model A − 8 ∝ N − 1 (A the attenuation in dB, −20·log10 δ for a passband
 * deviation δ): N' = 1 + (N − 1)·max over bands of (A_wanted − 8)/(A_achieved − 8),
 * each band taken at the worse of its floating-point and quantised values.
 */
export function predictedLength(
  evaluation: Evaluation,
  spec: FilterSpec,
  gainDb: number,
): number | undefined {
  const n = evaluation.size;
  const dev = (db: number) => (10 ** (db / 20) - 1) / (10 ** (db / 20) + 1);
  let ratio = 0;
  spec.requirements.forEach((r, i) => {
    const rows = [evaluation.floating[i], evaluation.quantised?.[i]];
    for (const row of rows) {
      if (row === undefined) continue;
      let wanted: number;
      let achieved: number;
      if (r.kind === "passbandRipple") {
        wanted = -20 * Math.log10(dev(row.limit));
        achieved = -20 * Math.log10(dev(row.achieved));
      } else if (r.kind === "passbandDeviation") {
        wanted = -20 * Math.log10(1 - 10 ** (-row.limit / 20));
        achieved = -20 * Math.log10(Math.abs(1 - 10 ** (-row.achieved / 20)));
      } else if (r.kind === "stopbandAttenuation") {
        const shift = gainDb - (r.referenceDb ?? 0);
        wanted = row.limit + shift;
        achieved = row.achieved + shift;
      } else continue;
      if (!(Number.isFinite(wanted) && Number.isFinite(achieved)) || achieved <= 8) continue;
      ratio = Math.max(ratio, (wanted - 8) / (achieved - 8));
    }
  });
  if (!(ratio > 0) || !Number.isFinite(ratio)) return undefined;
  return 1 + Math.ceil((n - 1) * ratio);
}

/**
 * Find the smallest index whose evaluation meets everything: evaluate the
 * start index; gallop down (if it meets) or up (if it fails) with steps 1, 2,
 * 4, … — going at least that far, and farther when the predicted size lies
 * beyond — until the verdict changes; then bisect the bracket, every other
 * step at the predicted size when it lies inside. The verdict is assumed
 * monotonic in the size. Growing stops when the worst margin has not improved
 * for three probes in a row, at the largest size, or when `evaluateAt`
 * returns undefined (a limit was reached).
 */
export function searchSize(
  plan: MethodPlan,
  evaluateAt: (size: number) => Evaluation | undefined,
  predict: (evaluation: Evaluation) => number | undefined,
): SizeSearch {
  const evaluations: Evaluation[] = [];
  const cache = new Map<number, Evaluation>();
  let limited = false;
  const at = (index: number): Evaluation | undefined => {
    const known = cache.get(index);
    if (known !== undefined) return known;
    const e = evaluateAt(plan.sizeOf(index));
    if (e === undefined) {
      limited = true;
      return undefined;
    }
    cache.set(index, e);
    evaluations.push(e);
    return e;
  };
  const predictedIndex = (e: Evaluation): number | undefined => {
    const size = predict(e);
    return size === undefined ? undefined : plan.indexOf(size);
  };
  const stop = (reason: string): SizeSearch => ({ evaluations, stopped: reason });
  const start = Math.min(plan.maxIndex, Math.max(plan.minIndex, plan.startIndex));
  const first = at(start);
  if (first === undefined) return stop(LIMIT_REACHED);
  let lo: number; // largest index known to fail
  let hi: number; // smallest index known to meet
  let last = first;
  let step = 1;
  if (first.meets) {
    hi = start;
    for (;;) {
      if (hi === plan.minIndex) return { best: cache.get(hi)!, evaluations };
      const guess = predictedIndex(last);
      const probe = Math.max(plan.minIndex, Math.min(hi - step, guess ?? Infinity));
      step *= 2;
      const e = at(probe);
      if (e === undefined) return { best: cache.get(hi)!, evaluations, stopped: LIMIT_REACHED };
      last = e;
      if (!e.meets) {
        lo = probe;
        break;
      }
      hi = probe;
    }
  } else {
    lo = start;
    let bestScore = first.score;
    let stale = 0;
    for (;;) {
      if (lo === plan.maxIndex) {
        return stop(`the largest size, ${plan.sizeLabel(plan.sizeOf(lo))}, still fails`);
      }
      const guess = predictedIndex(last);
      const probe = Math.min(plan.maxIndex, Math.max(lo + step, guess ?? -Infinity));
      step *= 2;
      const e = at(probe);
      if (e === undefined) return stop(LIMIT_REACHED);
      last = e;
      if (e.meets) {
        hi = probe;
        break;
      }
      lo = probe;
      if (e.score > bestScore + 1e-9 * Math.max(1, Math.abs(bestScore))) {
        bestScore = e.score;
        stale = 0;
      } else if (++stale >= PATIENCE) {
        return stop(
          `the worst margin stopped improving (${PATIENCE} larger sizes, up to ${
            plan.sizeLabel(plan.sizeOf(lo))
          }, were no nearer)`,
        );
      }
    }
  }
  let guessed = false;
  while (hi - lo > 1) {
    const guess: number | undefined = predictedIndex(last);
    const useGuess: boolean = !guessed && guess !== undefined && guess > lo && guess < hi;
    const probe: number = useGuess && guess !== undefined ? guess : Math.floor((lo + hi) / 2);
    guessed = useGuess;
    const e = at(probe);
    if (e === undefined) break;
    last = e;
    if (e.meets) hi = probe;
    else lo = probe;
  }
  const best = cache.get(hi)!;
  return limited ? { best, evaluations, stopped: LIMIT_REACHED } : { best, evaluations };
}
