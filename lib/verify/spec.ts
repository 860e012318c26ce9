import { requireSampleRate, show } from "../_validate.ts";
import { type CheckOptions, checkRequirement, requirementName } from "./check.ts";
import type { FilterDesign } from "./filter_design.ts";
import type { RequirementResult } from "./requirement.ts";
import type { FilterSpec, Requirement } from "./requirements.ts";

type Banded = Requirement & { from: number; to: number };

function who(r: Requirement): string {
  const name = requirementName(r);
  return r.id === undefined ? `"${name}"` : `"${name}" (${r.id})`;
}

/**
 * Check a specification for contradictions before any design is judged:
 * a passband requirement (ripple, deviation) whose band overlaps or touches a
 * stopband requirement's band cannot be met and is an error naming both.
 * Each band must lie within [0, fs/2] with from < to.
 *
 * @param spec The specification.
 * @throws {RangeError} When bands overlap or a band is outside [0, fs/2]; the message names the requirements.
 * @throws {TypeError} When the spec is malformed.
 * @example
 * ```ts
 * import { validateSpec } from "./spec.ts";
 * let message = "";
 * try {
 *   validateSpec({ fs: 8000, requirements: [
 *     { kind: "passbandRipple", from: 0, to: 1200, atMostDb: 0.5, id: "P1" },
 *     { kind: "stopbandAttenuation", from: 1000, to: 4000, atLeastDb: 60, id: "S1" },
 *   ] });
 * } catch (e) { message = (e as Error).message; }
 * if (!message.includes("P1") || !message.includes("S1")) throw new Error(message);
 * ```
 */
export function validateSpec(spec: FilterSpec): void {
  if (spec === null || typeof spec !== "object" || !Array.isArray(spec.requirements)) {
    throw new TypeError("Spec must be an object { fs, requirements: [...] }");
  }
  requireSampleRate(spec.fs);
  const nyquist = spec.fs / 2;
  const pass: Banded[] = [];
  const stop: Banded[] = [];
  for (const r of spec.requirements) {
    if (r === null || typeof r !== "object") {
      throw new TypeError(`Each requirement must be an object, got ${String(r)}`);
    }
    if ("from" in r && "to" in r && typeof r.from === "number" && typeof r.to === "number") {
      const { from, to } = r;
      if (!(from >= 0 && to <= nyquist && from < to)) {
        throw new RangeError(
          `Requirement ${who(r)}: band must satisfy 0 Hz ≤ from < to ≤ fs/2 = ${
            show(nyquist)
          } Hz, got ${show(from)}–${show(to)} Hz`,
        );
      }
      if (r.kind === "passbandRipple" || r.kind === "passbandDeviation") pass.push(r as Banded);
      if (r.kind === "stopbandAttenuation") stop.push(r as Banded);
    }
  }
  for (const p of pass) {
    for (const s of stop) {
      if (p.from <= s.to && s.from <= p.to) {
        throw new RangeError(
          `Requirement ${who(p)} (${show(p.from)}–${show(p.to)} Hz) overlaps requirement ${
            who(s)
          } (${show(s.from)}–${
            show(s.to)
          } Hz): a passband and a stopband need a transition band between them`,
        );
      }
    }
  }
}

/**
 * Check a design against a whole specification: validate the spec, then one
 * requirement-table row per requirement, in the spec's order.
 *
 * @param design The filter: FIR taps, sections or rational.
 * @param spec Sample rate and requirements.
 * @param options Grid density.
 * @returns One RequirementResult per requirement.
 * @throws {RangeError} When the spec is contradictory or a band is outside [0, fs/2].
 * @example
 * ```ts
 * import { checkSpec } from "./spec.ts";
 * const rows = checkSpec({ kind: "fir", taps: [0.25, 0.5, 0.25] }, {
 *   fs: 1000,
 *   requirements: [
 *     { kind: "gainAt", frequency: 0, gainDb: 0, toleranceDb: 0.01, id: "G1" },
 *     { kind: "groupDelayMaximum", from: 0, to: 400, atMostSamples: 1.001, id: "D1" },
 *   ],
 * });
 * // [1, 2, 1]/4 has unit DC gain and a constant delay of 1 sample.
 * if (!rows.every((r) => r.met) || rows[1]!.id !== "D1") throw new Error("both met");
 * ```
 */
export function checkSpec(
  design: FilterDesign,
  spec: FilterSpec,
  options: CheckOptions = {},
): RequirementResult[] {
  validateSpec(spec);
  return spec.requirements.map((r) => checkRequirement(design, spec.fs, r, options));
}
