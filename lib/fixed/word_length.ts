import { requireInteger } from "../_validate.ts";
import type { FilterDesign } from "../verify/filter_design.ts";
import type { RequirementResult } from "../verify/requirement.ts";
import type { FilterSpec } from "../verify/requirements.ts";
import type { CheckOptions } from "../verify/check.ts";
import { checkSpec, validateSpec } from "../verify/spec.ts";
import { type QuantisedDesign, quantiseDesign, type QuantiseOptions } from "./quantise_design.ts";

/** Options for {@link findMinimumWordLength}. */
export interface WordLengthSearchOptions extends QuantiseOptions, CheckOptions {
  /** Smallest word length tried, 2 … 32. @default 4 */
  from?: number;
  /** Largest word length tried, from … 32. @default 32 */
  to?: number;
}

/** One word length tried by the search. */
export interface WordLengthTrial {
  /** Coefficient word length tried, in bits. */
  wordLength: number;
  /** Requirements met / not met at this word length. */
  met: number;
  /** Requirements not met at this word length. */
  failed: number;
  /** Names (and ids) of the requirements not met. */
  failedNames: string[];
}

/** The outcome of {@link findMinimumWordLength}. */
export interface WordLengthSearch {
  /** The smallest coefficient word length meeting every requirement; undefined when none in range does. */
  wordLength: number | undefined;
  /** The quantised design at that word length (or at `to` when none meets the spec). */
  quantised: QuantisedDesign;
  /** The requirement rows of that quantised design. */
  results: RequirementResult[];
  /** Every word length tried, in order. */
  trials: WordLengthTrial[];
}

/**
 * Find the smallest coefficient word length whose quantised design still
 * meets every requirement of a spec. Word lengths are tried upward from
 * `from` to `to`; the first that meets all requirements is returned (the
 * verdict is not assumed monotonic in the word length, so no bisection).
 *
 * @param design The floating-point design.
 * @param spec The specification to meet.
 * @param options Range of word lengths, rounding, fixed fraction bits, grid density.
 * @returns The word length (or undefined), its quantised design and rows, and every trial.
 * @throws {RangeError} When the spec is contradictory or the word-length range is invalid.
 * @example
 * ```ts
 * import { findMinimumWordLength } from "./word_length.ts";
 * // [1, 2, 1]/4 quantises exactly from 3 bits on (0.25 = 1·2^−2 … 0.5 = 2·2^−2 in Q0.2).
 * const s = findMinimumWordLength({ kind: "fir", taps: [0.25, 0.5, 0.25] }, {
 *   fs: 1000,
 *   requirements: [{ kind: "gainAt", frequency: 0, gainDb: 0, toleranceDb: 1e-9 }],
 * }, { from: 2 });
 * if (s.wordLength !== 3) throw new Error(`3 bits, got ${s.wordLength}`);
 * ```
 */
export function findMinimumWordLength(
  design: FilterDesign,
  spec: FilterSpec,
  options: WordLengthSearchOptions = {},
): WordLengthSearch {
  validateSpec(spec);
  const from = options.from ?? 4;
  requireInteger("Smallest word length", from, 2, 32);
  const to = options.to ?? 32;
  requireInteger("Largest word length", to, from, 32);
  const quantiseOptions: QuantiseOptions = {};
  if (options.rounding !== undefined) quantiseOptions.rounding = options.rounding;
  if (options.fractionBits !== undefined) quantiseOptions.fractionBits = options.fractionBits;
  const checkOptions: CheckOptions = {};
  if (options.points !== undefined) checkOptions.points = options.points;
  const trials: WordLengthTrial[] = [];
  let quantised = quantiseDesign(design, from, quantiseOptions);
  let results: RequirementResult[] = [];
  for (let w = from; w <= to; w++) {
    quantised = quantiseDesign(design, w, quantiseOptions);
    results = checkSpec(quantised.design, spec, checkOptions);
    const failed = results.filter((r) => !r.met);
    trials.push({
      wordLength: w,
      met: results.length - failed.length,
      failed: failed.length,
      failedNames: failed.map((r) => (r.id === undefined ? r.name : `${r.id} ${r.name}`)),
    });
    if (failed.length === 0) return { wordLength: w, quantised, results, trials };
  }
  return { wordLength: undefined, quantised, results, trials };
}
