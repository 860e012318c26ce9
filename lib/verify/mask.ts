import type { MaskSegment } from "../types.ts";
import type { FilterSpec } from "./requirements.ts";
import { validateSpec } from "./spec.ts";

/**
 * Requirement mask for a magnitude (dB) figure: for each passband deviation
 * requirement an upper line at gain + limit and a lower line at gain − limit;
 * for each stopband requirement an upper line at reference − attenuation; for
 * a maximum-gain requirement an upper line at the limit. Ripple (peak to peak)
 * has no fixed level and draws nothing. Segments carry the requirement id as label.
 *
 * @param spec The specification (validated first).
 * @returns Mask segments in Hz and dB.
 * @throws {RangeError} When the spec is contradictory.
 * @example
 * ```ts
 * import { magnitudeMask } from "./mask.ts";
 * const m = magnitudeMask({ fs: 8000, requirements: [
 *   { kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 60, id: "S1" },
 * ] });
 * if (m.length !== 1 || m[0]!.level !== -60 || m[0]!.bound !== "upper" || m[0]!.label !== "S1") throw new Error("one upper line");
 * ```
 */
export function magnitudeMask(spec: FilterSpec): MaskSegment[] {
  validateSpec(spec);
  const out: MaskSegment[] = [];
  const withLabel = (s: MaskSegment, id: string | undefined): MaskSegment =>
    id === undefined ? s : { ...s, label: id };
  for (const r of spec.requirements) {
    switch (r.kind) {
      case "passbandDeviation": {
        const g = r.gainDb ?? 0;
        out.push(
          withLabel({ from: r.from, to: r.to, level: g + r.atMostDb, bound: "upper" }, r.id),
        );
        out.push(
          withLabel({ from: r.from, to: r.to, level: g - r.atMostDb, bound: "lower" }, r.id),
        );
        break;
      }
      case "stopbandAttenuation":
        out.push(
          withLabel({
            from: r.from,
            to: r.to,
            level: (r.referenceDb ?? 0) - r.atLeastDb,
            bound: "upper",
          }, r.id),
        );
        break;
      case "maximumGain":
        out.push(
          withLabel({
            from: r.from ?? 0,
            to: r.to ?? spec.fs / 2,
            level: r.atMostDb,
            bound: "upper",
          }, r.id),
        );
        break;
      default:
        break;
    }
  }
  return out;
}

/**
 * Requirement mask for a group-delay figure (samples): an upper line at the
 * limit of each group-delay maximum requirement. Flatness (peak to peak) has
 * no fixed level and draws nothing.
 *
 * @param spec The specification (validated first).
 * @param fs Optional: give the sample rate to get the levels in seconds instead of samples.
 * @returns Mask segments in Hz and samples (or seconds).
 * @throws {RangeError} When the spec is contradictory.
 * @example
 * ```ts
 * import { groupDelayMask } from "./mask.ts";
 * const m = groupDelayMask({ fs: 8000, requirements: [
 *   { kind: "groupDelayMaximum", from: 0, to: 1000, atMostSamples: 20, id: "D1" },
 * ] });
 * if (m[0]!.level !== 20 || m[0]!.to !== 1000) throw new Error("20 samples to 1 kHz");
 * ```
 */
export function groupDelayMask(spec: FilterSpec, fs?: number): MaskSegment[] {
  validateSpec(spec);
  const scale = fs === undefined ? 1 : 1 / fs;
  const out: MaskSegment[] = [];
  for (const r of spec.requirements) {
    if (r.kind === "groupDelayMaximum") {
      const s: MaskSegment = {
        from: r.from,
        to: r.to,
        level: r.atMostSamples * scale,
        bound: "upper",
      };
      if (r.id !== undefined) s.label = r.id;
      out.push(s);
    }
  }
  return out;
}
