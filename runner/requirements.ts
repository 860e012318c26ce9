// Declared requirements: the rules of the front-matter `requirements:` list,
// resolving their parameters, turning them into the library's FilterSpec, and
// converting results between the library's units and the requirement's own.
// Pure and free of library code: the sheet API loads it inside the sandbox.
import type { LimitRelation, RequirementResult } from "../lib/verify/requirement.ts";
import type { FilterSpec, Requirement } from "../lib/verify/requirements.ts";
import type {
  DeclaredRequirement,
  NumberOrParam,
  ParamValue,
  RequirementDeclaration,
} from "../record/types.ts";

/** What a library requirement kind needs in a declaration. */
interface KindRule {
  /** Fields that must be given. */
  required: readonly string[];
  /** Fields that may be given. */
  optional: readonly string[];
  /** Relations the kind supports. */
  relations: readonly LimitRelation[];
  /** Which family of units the limit is written in. */
  units: UnitFamily;
}

type UnitFamily = "dB" | "frequency" | "delay" | "time" | "angle" | "none";

/** The library requirement kinds a declaration can name with `check:`, and their fields. */
export const kindRules: Readonly<Record<Requirement["kind"], KindRule>> = {
  passbandRipple: { required: ["from", "to"], optional: [], relations: ["atMost"], units: "dB" },
  passbandDeviation: {
    required: ["from", "to"],
    optional: ["gainDb"],
    relations: ["atMost"],
    units: "dB",
  },
  stopbandAttenuation: {
    required: ["from", "to"],
    optional: ["referenceDb"],
    relations: ["atLeast"],
    units: "dB",
  },
  maximumGain: { required: [], optional: ["from", "to"], relations: ["atMost"], units: "dB" },
  gainAt: { required: ["frequency", "gainDb"], optional: [], relations: ["atMost"], units: "dB" },
  bandEdge: {
    required: ["levelDb", "from", "to"],
    optional: [],
    relations: ["atMost", "atLeast"],
    units: "frequency",
  },
  groupDelayMaximum: {
    required: ["from", "to"],
    optional: [],
    relations: ["atMost"],
    units: "delay",
  },
  groupDelayFlatness: {
    required: ["from", "to"],
    optional: [],
    relations: ["atMost"],
    units: "delay",
  },
  linearPhase: { required: ["from", "to"], optional: [], relations: ["atMost"], units: "angle" },
  stabilityMargin: { required: [], optional: [], relations: ["atLeast"], units: "none" },
  settlingTime: {
    required: [],
    optional: ["tolerance"],
    relations: ["atMost"],
    units: "time",
  },
};

/** Every field name a declaration's library fields may use. */
export const requirementFields: readonly string[] = [
  ...new Set(Object.values(kindRules).flatMap((k) => [...k.required, ...k.optional])),
];

/** Seconds per unit of time, and hertz per unit of frequency. */
const timeUnits: Record<string, number> = { s: 1, ms: 1e-3, "µs": 1e-6, us: 1e-6 };
const frequencyUnits: Record<string, number> = { Hz: 1, kHz: 1e3 };
const angleUnits = ["°", "degrees"];

/** The units a family of requirements may be written in. */
export function unitsOf(family: UnitFamily): string[] {
  switch (family) {
    case "dB":
      return ["dB"];
    case "frequency":
      return Object.keys(frequencyUnits);
    case "delay":
      return ["samples", ...Object.keys(timeUnits)];
    case "time":
      return Object.keys(timeUnits);
    case "angle":
      return angleUnits;
    case "none":
      return [""];
  }
}

/**
 * Why a declaration does not fit its library kind (fields, relation, unit),
 * or undefined when it fits. Used when front matter is parsed.
 */
export function declarationProblem(d: RequirementDeclaration): string | undefined {
  if (d.kind === undefined) {
    const stray = Object.keys(d.fields);
    return stray.length > 0
      ? `'${stray[0]}' only means something with 'check:' naming a requirement kind`
      : undefined;
  }
  const rule = kindRules[d.kind];
  for (const f of rule.required) if (!(f in d.fields)) return `'check: ${d.kind}' needs '${f}:'`;
  for (const f of Object.keys(d.fields)) {
    if (!rule.required.includes(f) && !rule.optional.includes(f)) {
      return `'${f}' is not a field of '${d.kind}' (it takes ${
        [...rule.required, ...rule.optional].join(", ") || "no fields"
      })`;
    }
  }
  if (!rule.relations.includes(d.relation)) {
    return `'${d.kind}' is a limit of the form ${rule.relations.join(" or ")}, not ${d.relation}`;
  }
  const units = unitsOf(rule.units);
  if (!units.includes(d.unit)) {
    return `'${d.kind}' is written in ${
      units.map((u) => (u === "" ? "no unit" : u)).join(", ")
    }, not '${d.unit}'`;
  }
  return undefined;
}

/** Thrown when a requirement names a parameter that is missing or not a number. */
export class RequirementError extends Error {
  override name = "RequirementError";
}

/** Resolve every parameter a declaration names, with the run's parameter values. */
export function resolveRequirements(
  declarations: readonly RequirementDeclaration[],
  params: Record<string, ParamValue>,
): DeclaredRequirement[] {
  const value = (d: RequirementDeclaration, what: string, v: NumberOrParam): number => {
    if (typeof v === "number") return v;
    if (v === "fs/2" && what === "to") return Number.NaN; // resolved against fs by specOf
    const p = params[v];
    if (typeof p !== "number") {
      throw new RequirementError(
        `Requirement ${d.id}: '${what}: ${v}' names no number parameter`,
      );
    }
    return p;
  };
  return declarations.map((d) => {
    const out: DeclaredRequirement = {
      id: d.id,
      text: d.text,
      relation: d.relation,
      limit: value(d, d.relation, d.limit),
      unit: d.unit,
      written: String(d.limit),
      fields: Object.fromEntries(
        Object.entries(d.fields).map(([k, v]) => [k, value(d, k, v)]),
      ),
      line: d.line,
    };
    if (d.kind !== undefined) out.kind = d.kind;
    return out;
  });
}

/** Samples per unit of a delay or time requirement, given the sample rate. */
function samplesPer(unit: string, fs: number): number {
  return unit === "samples" ? 1 : fs * (timeUnits[unit] ?? Number.NaN);
}

/** The library's unit for a kind: what checkRequirement reports. */
function libraryScale(d: DeclaredRequirement, fs: number | undefined): number {
  const family = d.kind === undefined ? "none" : kindRules[d.kind].units;
  switch (family) {
    case "frequency":
      return frequencyUnits[d.unit] ?? 1;
    case "delay":
      if (d.unit !== "samples" && fs === undefined) {
        throw new RequirementError(
          `Requirement ${d.id} is written in ${d.unit}: give the sample rate to convert samples`,
        );
      }
      return d.unit === "samples" ? 1 : samplesPer(d.unit, fs!);
    case "time":
      return timeUnits[d.unit] ?? 1;
    default:
      return 1;
  }
}

/**
 * The library requirement of a declaration that names one (`check:`), with
 * its limit converted to the library's unit (samples for delays, seconds for
 * times, Hz for frequencies).
 */
export function libraryRequirement(d: DeclaredRequirement, fs: number): Requirement {
  if (d.kind === undefined) {
    throw new RequirementError(`Requirement ${d.id} names no library check ('check:')`);
  }
  const limit = d.limit * libraryScale(d, fs);
  const f = { ...d.fields };
  if (Number.isNaN(f.to)) f.to = fs / 2;
  const label = { id: d.id, name: d.text };
  switch (d.kind) {
    case "passbandRipple":
      return { ...label, kind: d.kind, from: f.from!, to: f.to!, atMostDb: limit };
    case "passbandDeviation":
      return {
        ...label,
        kind: d.kind,
        from: f.from!,
        to: f.to!,
        atMostDb: limit,
        ...(f.gainDb === undefined ? {} : { gainDb: f.gainDb }),
      };
    case "stopbandAttenuation":
      return {
        ...label,
        kind: d.kind,
        from: f.from!,
        to: f.to!,
        atLeastDb: limit,
        ...(f.referenceDb === undefined ? {} : { referenceDb: f.referenceDb }),
      };
    case "maximumGain":
      return {
        ...label,
        kind: d.kind,
        atMostDb: limit,
        ...(f.from === undefined ? {} : { from: f.from }),
        ...(f.to === undefined ? {} : { to: f.to }),
      };
    case "gainAt":
      return {
        ...label,
        kind: d.kind,
        frequency: f.frequency!,
        gainDb: f.gainDb!,
        toleranceDb: limit,
      };
    case "bandEdge":
      return d.relation === "atMost"
        ? { ...label, kind: d.kind, levelDb: f.levelDb!, from: f.from!, to: f.to!, atMostHz: limit }
        : {
          ...label,
          kind: d.kind,
          levelDb: f.levelDb!,
          from: f.from!,
          to: f.to!,
          atLeastHz: limit,
        };
    case "groupDelayMaximum":
    case "groupDelayFlatness":
      return { ...label, kind: d.kind, from: f.from!, to: f.to!, atMostSamples: limit };
    case "linearPhase":
      return { ...label, kind: d.kind, from: f.from!, to: f.to!, atMostDegrees: limit };
    case "stabilityMargin":
      return { ...label, kind: d.kind, atLeast: limit };
    case "settlingTime":
      return {
        ...label,
        kind: d.kind,
        atMostSeconds: limit,
        ...(f.tolerance === undefined ? {} : { tolerance: f.tolerance }),
      };
  }
}

/** The FilterSpec of every declared requirement that names a library check (or of `ids`). */
export function specOf(
  declared: readonly DeclaredRequirement[],
  fs: number,
  ids?: readonly string[],
): FilterSpec {
  const chosen = declared.filter((d) =>
    d.kind !== undefined && (ids === undefined || ids.includes(d.id))
  );
  return { fs, requirements: chosen.map((d) => libraryRequirement(d, fs)) };
}

/** A check in the requirement's own unit, with the library's value beside it when it differs. */
export interface ConvertedCheck {
  result: RequirementResult;
  equivalent?: { value: number; unit: string };
}

/** The unit checkRequirement reports for each family. */
const libraryUnits: Record<UnitFamily, string> = {
  dB: "dB",
  frequency: "Hz",
  delay: "samples",
  time: "s",
  angle: "°",
  none: "",
};

/**
 * Turn a result into the declared requirement's terms: its text as the name,
 * its unit, achieved value and limit converted when the result is in the
 * library's unit (delays from samples to ms, with the samples kept beside
 * them), and the verdict recomputed. A result already in the declared unit is
 * taken as it is. Whether the limit then agrees is {@link disagreement}'s job.
 */
export function inDeclaredUnit(
  result: RequirementResult,
  d: DeclaredRequirement,
  fs: number | undefined,
): ConvertedCheck {
  let scale = 1;
  if (result.unit !== d.unit) {
    const family = d.kind === undefined ? undefined : kindRules[d.kind].units;
    if (family === undefined || result.unit !== libraryUnits[family]) {
      throw new RequirementError(
        `A check of ${d.id} is in '${result.unit}', but the requirement is declared in '${d.unit}'`,
      );
    }
    scale = 1 / libraryScale(d, fs);
  }
  const achieved = result.achieved * scale;
  const limit = result.limit * scale;
  const margin = result.relation === "atMost" ? limit - achieved : achieved - limit;
  const converted: RequirementResult = {
    name: d.text,
    id: d.id,
    achieved,
    limit,
    relation: result.relation,
    unit: d.unit,
    margin,
    met: margin >= 0,
  };
  if (result.worst !== undefined) converted.worst = result.worst;
  const out: ConvertedCheck = { result: converted };
  if (scale !== 1 && result.unit === "samples") {
    out.equivalent = { value: result.achieved, unit: "samples" };
  }
  return out;
}

/**
 * Why a check disagrees with its declaration (relation, limit, unit), or
 * undefined when it agrees. Limits agree to 1e-9 relative (unit conversions
 * round).
 */
export function disagreement(
  result: RequirementResult,
  d: DeclaredRequirement,
): string | undefined {
  const written = (r: LimitRelation, limit: number, unit: string) =>
    `${r === "atMost" ? "at most" : "at least"} ${limit}${unit ? ` ${unit}` : ""}`;
  const same = Math.abs(result.limit - d.limit) <= 1e-9 * Math.max(1, Math.abs(d.limit));
  if (result.relation !== d.relation || !same || result.unit !== d.unit) {
    return `the check's limit, ${
      written(result.relation, result.limit, result.unit)
    }, disagrees with requirement ${d.id} as declared in front matter (line ${d.line}): ${
      written(d.relation, d.limit, d.unit)
    }`;
  }
  return undefined;
}
