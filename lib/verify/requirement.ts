import { requireFinite } from "../_validate.ts";

/** Which side of the limit a requirement holds on. */
export type LimitRelation = "atMost" | "atLeast";

/** Where the worst case of a requirement lies (a frequency or a time). */
export interface WorstCase {
  /** The frequency (Hz) or time (s) of the worst case. */
  at: number;
  /** "Hz" or "s". */
  unit: string;
}

/** The outcome of checking one requirement. */
export interface RequirementResult {
  /** Plain name, e.g. "Stopband attenuation above 1 kHz". */
  name: string;
  /** The identifier in the product's own requirement list, if any (traceability). */
  id?: string;
  /** The value the design achieves. */
  achieved: number;
  /** The limit from the requirement. */
  limit: number;
  /** Whether the achieved value must be at most or at least the limit. */
  relation: LimitRelation;
  /** Unit of achieved and limit, e.g. "dB", "samples". */
  unit: string;
  /** Distance to the limit on the passing side: positive when met, negative when not. */
  margin: number;
  /** True when the requirement is met (margin ≥ 0). */
  met: boolean;
  /** Where the worst case lies, when the requirement spans a band or a time span. */
  worst?: WorstCase;
}

/** A limit as the worksheet writes it: `{ atMost: 0.5 }` or `{ atLeast: 60 }`. */
export type Limit = { atMost: number; atLeast?: never } | { atLeast: number; atMost?: never };

/**
 * Judge an achieved value against a limit. margin = limit − achieved for an
 * at-most limit and achieved − limit for an at-least limit; met when margin ≥ 0.
 *
 * @param name Plain name of the requirement.
 * @param achieved Value the design achieves (finite).
 * @param limit `{ atMost }` or `{ atLeast }`.
 * @param unit Unit shown beside both numbers.
 * @param extra Optional identifier and worst-case location.
 * @returns The requirement result.
 * @throws {TypeError} When a number is not finite or the limit names neither side.
 * @example
 * ```ts
 * import { judge } from "./requirement.ts";
 * const r = judge("Stopband attenuation", 57.5, { atLeast: 60 }, "dB");
 * if (r.met || r.margin !== -2.5) throw new Error("2.5 dB short");
 * ```
 */
export function judge(
  name: string,
  achieved: number,
  limit: Limit,
  unit: string,
  extra: { id?: string; worst?: WorstCase } = {},
): RequirementResult {
  requireFinite(`Achieved value of "${name}"`, achieved);
  let relation: LimitRelation;
  let value: number;
  if (typeof limit.atMost === "number") {
    relation = "atMost";
    value = limit.atMost;
  } else if (typeof limit.atLeast === "number") {
    relation = "atLeast";
    value = limit.atLeast;
  } else {
    throw new TypeError(`Limit of "${name}" must be { atMost: x } or { atLeast: x }`);
  }
  requireFinite(`Limit of "${name}"`, value);
  const margin = relation === "atMost" ? value - achieved : achieved - value;
  const result: RequirementResult = {
    name,
    achieved,
    limit: value,
    relation,
    unit,
    margin,
    met: margin >= 0,
  };
  if (extra.id !== undefined) result.id = extra.id;
  if (extra.worst !== undefined) result.worst = extra.worst;
  return result;
}
