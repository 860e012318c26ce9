// Parameter overrides from the command line and parameter files, checked
// against the worksheet's declarations.
import type { ParamRule, ParamValue } from "../record/types.ts";
import { messages } from "./messages.ts";

/** A problem with a parameter setting (the CLI reports it and exits with 2). */
export class ParamError extends Error {
  override name = "ParamError";
}

/** Split "name=value" into its parts. */
export function parseSetting(text: string): [string, string] {
  const at = text.indexOf("=");
  if (at <= 0) throw new ParamError(messages.params.badSetting(text));
  return [text.slice(0, at).trim(), text.slice(at + 1).trim()];
}

/** Convert a text value to the declared parameter's type. */
function convert(name: string, declared: ParamValue, text: string): ParamValue {
  if (typeof declared === "number") {
    const v = Number(text);
    if (text === "" || !Number.isFinite(v)) {
      throw new ParamError(messages.params.wrongType(name, "a number", text));
    }
    return v;
  }
  if (typeof declared === "boolean") {
    if (text === "true") return true;
    if (text === "false") return false;
    throw new ParamError(messages.params.wrongType(name, "true or false", text));
  }
  if (Array.isArray(declared)) {
    const items = text.replace(/^\[|\]$/g, "").split(",").map((s) => s.trim()).filter(Boolean);
    const values = items.map(Number);
    if (values.some((v) => !Number.isFinite(v))) {
      throw new ParamError(messages.params.wrongType(name, "a list of numbers like 1,2,3", text));
    }
    return values;
  }
  return text;
}

/** Check a value already of the right kind against the declared type. */
function sameType(name: string, declared: ParamValue, value: unknown): ParamValue {
  const kind = (v: unknown) => (Array.isArray(v) ? "list" : typeof v);
  if (kind(declared) !== kind(value)) {
    const expected =
      { number: "a number", string: "text", boolean: "true or false", list: "a list of numbers" }[
        kind(declared) as "number"
      ];
    throw new ParamError(
      messages.params.wrongType(name, expected ?? "a value", JSON.stringify(value)),
    );
  }
  if (Array.isArray(value) && value.some((v) => typeof v !== "number" || !Number.isFinite(v))) {
    throw new ParamError(
      messages.params.wrongType(name, "a list of numbers", JSON.stringify(value)),
    );
  }
  return value as ParamValue;
}

/**
 * Apply overrides to a worksheet's parameters: first a parameters file's
 * values (already parsed), then `--set` settings. Every name must be declared;
 * values take the declared type; declared min/max are enforced on the result.
 *
 * @returns The parameters for the run and the names that were changed.
 */
export function applyOverrides(
  declared: Record<string, ParamValue>,
  rules: Record<string, ParamRule>,
  fromFile: Record<string, unknown>,
  settings: string[],
): { params: Record<string, ParamValue>; overridden: string[] } {
  const params = { ...declared };
  const overridden = new Set<string>();
  const known = Object.keys(declared);
  const set = (name: string, value: ParamValue) => {
    params[name] = value;
    // Only a real change counts as an override (a file may restate a value).
    if (JSON.stringify(value) !== JSON.stringify(declared[name])) overridden.add(name);
    else overridden.delete(name);
  };
  for (const [name, value] of Object.entries(fromFile)) {
    if (!(name in declared)) throw new ParamError(messages.params.unknown(name, known));
    set(name, sameType(name, declared[name]!, value));
  }
  for (const text of settings) {
    const [name, value] = parseSetting(text);
    if (!(name in declared)) throw new ParamError(messages.params.unknown(name, known));
    set(name, convert(name, declared[name]!, value));
  }
  for (const [name, rule] of Object.entries(rules)) {
    const value = params[name];
    const values = typeof value === "number" ? [value] : Array.isArray(value) ? value : [];
    for (const v of values) {
      if ((rule.min !== undefined && v < rule.min) || (rule.max !== undefined && v > rule.max)) {
        throw new ParamError(
          messages.params.outOfRange(name, v, rule.min, rule.max, rule.unit ? ` ${rule.unit}` : ""),
        );
      }
    }
  }
  return { params, overridden: [...overridden] };
}
