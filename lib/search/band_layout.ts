import { show } from "../_validate.ts";
import type { BandShape, DesignBand } from "../fir/types.ts";
import { requirementName } from "../verify/check.ts";
import type { FilterSpec, Requirement } from "../verify/requirements.ts";
import { validateSpec } from "../verify/spec.ts";

/**
 * The band shape a specification describes, with the edges, ripple and
 * attenuation a design method needs. Derived by {@link inferBandLayout}.
 */
export interface BandLayout {
  /** The band shape formed by the passband and stopband requirements. */
  response: BandShape;
  /** Sample rate in Hz. */
  fs: number;
  /**
   * Passband edge(s) next to the transition bands, in Hz: the upper edge of a
   * lowpass, the lower edge of a highpass, [low, high] of a bandpass, and for a
   * bandstop the upper edge of the lower passband and the lower edge of the upper one.
   */
  passband: number | [number, number];
  /**
   * Stopband edge(s) next to the transition bands, in Hz: the lower edge of a
   * lowpass's stopband, the upper edge of a highpass's, for a bandpass the upper
   * edge of the lower stopband and the lower edge of the upper one, [low, high] of a bandstop.
   */
  stopband: number | [number, number];
  /**
   * Bands for the FIR design methods, 0 Hz to fs/2 with the transition bands
   * left out: gain 1 (pass) or 0 (stop), stopband weights δp/δs.
   */
  bands: DesignBand[];
  /**
   * Allowed passband variation in dB: the smallest ripple limit and deviation
   * limit (a response that stays within [g − r, g] dB meets both).
   */
  passbandRippleDb: number;
  /**
   * Allowed passband deviation δp (linear, about the nominal gain): the smallest of
   * (10^(r/20) − 1)/(10^(r/20) + 1) for each ripple limit r and 1 − 10^(−d/20) for each deviation limit d.
   */
  passbandDeviation: number;
  /** Required stopband attenuation in dB below the nominal gain: the largest of all stopband requirements. */
  stopbandAttenuationDb: number;
  /** Allowed stopband gain δs = 10^(−A/20) (linear, relative to the nominal gain) for that attenuation. */
  stopbandDeviation: number;
  /** Nominal passband gain in dB (of the first passband-deviation requirement; 0 without one). */
  gainDb: number;
  /** The narrowest transition band in Hz. */
  transitionWidth: number;
}

interface Band {
  kind: "pass" | "stop";
  from: number;
  to: number;
  requirements: Requirement[];
}

const dbToRippleDeviation = (r: number): number => {
  const g = 10 ** (r / 20);
  return (g - 1) / (g + 1);
};

/**
 * Infer the band shape of a specification from its passband requirements
 * (passband ripple, passband deviation) and stopband requirements (stopband
 * attenuation): their bands, sorted and merged by kind, must read
 * pass–stop (lowpass), stop–pass (highpass), stop–pass–stop (bandpass) or
 * pass–stop–pass (bandstop). The other requirement kinds are checked on the
 * designs but do not shape them.
 *
 * Targets: a ripple limit r (peak to peak) allows δp = (10^(r/20) − 1)/(10^(r/20) + 1);
 * a deviation limit d about the nominal gain allows δp = 1 − 10^(−d/20); a stopband
 * requirement of A dB below its reference level R, with nominal gain g, needs
 * A + g − R dB below the nominal gain, δs = 10^(−(A + g − R)/20).
 *
 * Source: the tolerance scheme of T. W. Parks and C. S. Burrus, Digital Filter
 * Design (Wiley, 1987), §1.3; common practice for the dB-to-deviation conversions.
 *
 * @param spec Sample rate and requirements (validated as by validateSpec).
 * @returns Shape, edges, FIR design bands, ripple and attenuation targets.
 * @throws {RangeError} When the spec is contradictory, lacks a passband or a stopband
 *   requirement, or its bands form no lowpass, highpass, bandpass or bandstop shape.
 * @throws {TypeError} When the spec is malformed.
 * @example
 * ```ts
 * import { inferBandLayout } from "./band_layout.ts";
 * const layout = inferBandLayout({ fs: 8000, requirements: [
 *   { kind: "stopbandAttenuation", from: 0, to: 800, atLeastDb: 50 },
 *   { kind: "passbandRipple", from: 1000, to: 1200, atMostDb: 1 },
 *   { kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 60 },
 * ] });
 * if (layout.response !== "bandpass" || layout.transitionWidth !== 200) throw new Error("bandpass");
 * if (layout.stopbandAttenuationDb !== 60 || layout.bands.length !== 3) throw new Error("60 dB, 3 bands");
 * ```
 */
export function inferBandLayout(spec: FilterSpec): BandLayout {
  validateSpec(spec);
  const { fs } = spec;
  const nyquist = fs / 2;
  const bands: Band[] = [];
  for (const r of spec.requirements) {
    if (r.kind === "passbandRipple" || r.kind === "passbandDeviation") {
      bands.push({ kind: "pass", from: r.from, to: r.to, requirements: [r] });
    } else if (r.kind === "stopbandAttenuation") {
      bands.push({ kind: "stop", from: r.from, to: r.to, requirements: [r] });
    }
  }
  if (!bands.some((b) => b.kind === "pass") || !bands.some((b) => b.kind === "stop")) {
    throw new RangeError(
      `A design search needs at least one passband requirement (passbandRipple or passbandDeviation) and one stopband requirement (stopbandAttenuation), got ${
        bands.filter((b) => b.kind === "pass").length
      } and ${bands.filter((b) => b.kind === "stop").length}`,
    );
  }
  bands.sort((a, b) => a.from - b.from || a.to - b.to);
  const groups: Band[] = [];
  for (const b of bands) {
    const last = groups[groups.length - 1];
    if (last !== undefined && last.kind === b.kind) {
      last.to = Math.max(last.to, b.to);
      last.requirements.push(...b.requirements);
    } else groups.push({ ...b, requirements: [...b.requirements] });
  }
  const pattern = groups.map((g) => (g.kind === "pass" ? "P" : "S")).join("");
  const shapes: Record<string, BandShape> = {
    PS: "lowpass",
    SP: "highpass",
    SPS: "bandpass",
    PSP: "bandstop",
  };
  const response = shapes[pattern];
  if (response === undefined) {
    throw new RangeError(
      `The passband and stopband requirements must form a lowpass, highpass, bandpass or bandstop shape, got bands in the order ${
        groups.map((g) => `${g.kind} ${show(g.from)}–${show(g.to)} Hz`).join(", ")
      }`,
    );
  }
  const passGroups = groups.filter((g) => g.kind === "pass");
  const passRequirements = passGroups.flatMap((g) => g.requirements);
  const firstDeviation = passRequirements.find((r) => r.kind === "passbandDeviation");
  const gainDb = firstDeviation?.kind === "passbandDeviation" ? firstDeviation.gainDb ?? 0 : 0;
  let passbandRippleDb = Infinity;
  let passbandDeviation = Infinity;
  for (const r of passRequirements) {
    if (r.kind !== "passbandRipple" && r.kind !== "passbandDeviation") continue;
    if (!(r.atMostDb > 0)) {
      throw new RangeError(
        `Requirement "${requirementName(r)}": a passband limit must be above 0 dB, got ${
          show(r.atMostDb)
        } dB`,
      );
    }
    passbandRippleDb = Math.min(passbandRippleDb, r.atMostDb);
    passbandDeviation = Math.min(
      passbandDeviation,
      r.kind === "passbandRipple" ? dbToRippleDeviation(r.atMostDb) : 1 - 10 ** (-r.atMostDb / 20),
    );
  }
  const stopDeviationOf = (g: Band): number => {
    let attenuation = 0;
    for (const r of g.requirements) {
      if (r.kind !== "stopbandAttenuation") continue;
      attenuation = Math.max(attenuation, r.atLeastDb + gainDb - (r.referenceDb ?? 0));
    }
    if (!(attenuation > 0)) {
      throw new RangeError(
        `The stopband ${show(g.from)}–${
          show(g.to)
        } Hz must be attenuated below the nominal passband gain ${
          show(gainDb)
        } dB, got a requirement of ${show(attenuation)} dB below it`,
      );
    }
    return attenuation;
  };
  const designBands: DesignBand[] = [];
  let stopbandAttenuationDb = 0;
  for (let i = 0; i < groups.length; i++) {
    const g = groups[i]!;
    const from = i === 0 ? 0 : g.from;
    const to = i === groups.length - 1 ? nyquist : g.to;
    if (g.kind === "pass") designBands.push({ from, to, gain: 1, weight: 1 });
    else {
      const attenuation = stopDeviationOf(g);
      stopbandAttenuationDb = Math.max(stopbandAttenuationDb, attenuation);
      designBands.push({
        from,
        to,
        gain: 0,
        weight: passbandDeviation / 10 ** (-attenuation / 20),
      });
    }
  }
  let transitionWidth = Infinity;
  for (let i = 1; i < groups.length; i++) {
    transitionWidth = Math.min(transitionWidth, groups[i]!.from - groups[i - 1]!.to);
  }
  const [a, b, c] = groups;
  let passband: number | [number, number];
  let stopband: number | [number, number];
  switch (response) {
    case "lowpass":
      passband = a!.to;
      stopband = b!.from;
      break;
    case "highpass":
      passband = b!.from;
      stopband = a!.to;
      break;
    case "bandpass":
      passband = [b!.from, b!.to];
      stopband = [a!.to, c!.from];
      break;
    case "bandstop":
      passband = [a!.to, c!.from];
      stopband = [b!.from, b!.to];
      break;
  }
  return {
    response,
    fs,
    passband,
    stopband,
    bands: designBands,
    passbandRippleDb,
    passbandDeviation,
    stopbandAttenuationDb,
    stopbandDeviation: 10 ** (-stopbandAttenuationDb / 20),
    gainDb,
    transitionWidth,
  };
}
