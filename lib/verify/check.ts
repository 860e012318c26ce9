import { requireFinite, requireSampleRate, show } from "../_validate.ts";
import { unwrappedPhase } from "../response/frequency_response.ts";
import { extremeOf } from "./_search.ts";
import {
  decayLength,
  type FilterDesign,
  gainDbAt,
  groupDelayOf,
  polesOf,
  requireDesign,
  responseOf,
  stepResponseOf,
} from "./filter_design.ts";
import { bandGrid } from "./grid.ts";
import { judge, type RequirementResult } from "./requirement.ts";
import type { Requirement } from "./requirements.ts";

/** Options for {@link checkRequirement}. */
export interface CheckOptions {
  /**
   * Number of grid points per band. By default it is chosen from the design:
   * spacing at most fs/(32·N) for N taps (or 16 per section), and finer than
   * a quarter of the −3 dB width (1 − r)·fs/(2π) of the sharpest pole r; between 257 and 65537.
   * @default adaptive
   */
  points?: number;
}

const unitless = "";

/**
 * The plain name shown for a requirement: its own `name`, or one made from its
 * kind and band.
 *
 * @param requirement A requirement.
 * @returns The name.
 * @example
 * ```ts
 * import { requirementName } from "./check.ts";
 * const n = requirementName({ kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 60 });
 * if (n !== "Stopband attenuation 1500–4000 Hz") throw new Error(n);
 * ```
 */
export function requirementName(requirement: Requirement): string {
  if (requirement.name !== undefined) return requirement.name;
  const r = requirement;
  const band = "from" in r && r.from !== undefined && "to" in r && r.to !== undefined
    ? `${show(r.from)}–${show(r.to)} Hz`
    : "";
  switch (r.kind) {
    case "passbandRipple":
      return `Passband ripple ${band}`;
    case "passbandDeviation":
      return `Passband deviation from ${show(r.gainDb ?? 0)} dB, ${band}`;
    case "stopbandAttenuation":
      return `Stopband attenuation ${band}`;
    case "maximumGain":
      return band === "" ? "Maximum gain (headroom)" : `Maximum gain (headroom) ${band}`;
    case "gainAt":
      return r.frequency === 0
        ? `DC gain deviation from ${show(r.gainDb)} dB`
        : `Gain at ${show(r.frequency)} Hz, deviation from ${show(r.gainDb)} dB`;
    case "bandEdge":
      return `${show(r.levelDb)} dB band edge`;
    case "groupDelayMaximum":
      return `Group delay maximum ${band}`;
    case "groupDelayFlatness":
      return `Group delay variation ${band}`;
    case "linearPhase":
      return `Phase deviation from linear ${band}`;
    case "stabilityMargin":
      return "Stability margin (1 − largest pole radius)";
    case "settlingTime":
      return `Step response settling time to ±${show(100 * (r.tolerance ?? 0.02))} %`;
  }
}

function label(name: string, id: string | undefined): string {
  return id === undefined ? `Requirement "${name}"` : `Requirement "${name}" (${id})`;
}

/** Throw unless 0 ≤ from < to ≤ fs/2, naming the requirement. */
function requireBand(who: string, from: number, to: number, fs: number): void {
  if (!Number.isFinite(from) || !Number.isFinite(to)) {
    throw new TypeError(`${who}: band edges must be finite numbers, got ${from} and ${to}`);
  }
  if (from < 0 || to > fs / 2 || !(from < to)) {
    throw new RangeError(
      `${who}: band must satisfy 0 Hz ≤ from < to ≤ fs/2 = ${show(fs / 2)} Hz, got ${show(from)}–${
        show(to)
      } Hz`,
    );
  }
}

function requireLimit(who: string, what: string, value: number): void {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new TypeError(`${who}: ${what} must be a finite number, got ${String(value)}`);
  }
}

/** Grid points for a band: dense enough for the design's length and its sharpest pole. */
function gridPoints(design: FilterDesign, from: number, to: number, fs: number): number {
  const length = design.kind === "fir"
    ? design.taps.length
    : design.kind === "sections"
    ? 16 * design.sections.length
    : 16 * Math.max(design.numerator.length, design.denominator.length);
  let spacing = fs / (32 * Math.max(length, 8));
  if (design.kind !== "fir") {
    let r = 0;
    for (const p of polesOf(design)) r = Math.max(r, Math.hypot(p.re, p.im));
    if (r < 1) spacing = Math.min(spacing, ((1 - r) * fs) / (2 * Math.PI) / 4);
  }
  const points = Math.ceil((to - from) / spacing) + 1;
  return Math.min(65537, Math.max(257, points));
}

function dbOf(re: number, im: number): number {
  return Math.max(20 * Math.log10(Math.hypot(re, im)), -400);
}

/** Magnitude in dB on a grid, with its refinable single-point function. */
function magnitudeOnGrid(
  design: FilterDesign,
  grid: Float64Array,
  fs: number,
): { values: Float64Array; at: (f: number) => number } {
  const h = responseOf(design, grid, fs);
  const values = new Float64Array(grid.length);
  for (let i = 0; i < grid.length; i++) values[i] = dbOf(h.re[i] as number, h.im[i] as number);
  const lo = grid[0] as number;
  const hi = grid[grid.length - 1] as number;
  return { values, at: (f) => gainDbAt(design, Math.min(hi, Math.max(lo, f)), fs) };
}

function delayOnGrid(
  who: string,
  design: FilterDesign,
  grid: Float64Array,
  fs: number,
): { values: Float64Array; at: (f: number) => number } {
  const values = groupDelayOf(design, grid, fs);
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i] as number)) {
      throw new RangeError(
        `${who}: group delay is undefined at ${
          show(grid[i] as number)
        } Hz (a zero on the unit circle); keep the band clear of it`,
      );
    }
  }
  const lo = grid[0] as number;
  const hi = grid[grid.length - 1] as number;
  return {
    values,
    at: (f) => {
      const v = groupDelayOf(design, [Math.min(hi, Math.max(lo, f))], fs)[0] as number;
      return Number.isFinite(v) ? v : 0;
    },
  };
}

/**
 * Check a design against one requirement of the vocabulary and return the
 * requirement-table row: limit, achieved value, margin, verdict, the worst-case
 * location (Hz, or s for the settling time) and the requirement's id.
 *
 * Band requirements are evaluated on a dense grid that holds both band edges
 * exactly; the extreme found on the grid is then refined by golden-section
 * search between its grid neighbours. A design that is not stable, or whose
 * step response is still outside the settling band at the end of the
 * simulated window (2^20 samples at most), gets an infinite settling time (not met).
 *
 * Source: the tolerance scheme of T. W. Parks and C. S. Burrus, Digital Filter
 * Design (Wiley, 1987), §1.3 (passband ripple, stopband attenuation, band edges);
 * group delay and linear phase after Oppenheim & Schafer, Discrete-Time Signal
 * Processing, 3rd ed., §5.1 and §5.7.
 *
 * @param design The filter: FIR taps, sections or rational.
 * @param fs Sample rate in Hz, > 0.
 * @param requirement One requirement (`kind` selects which).
 * @param options Grid density.
 * @returns The requirement result.
 * @throws {RangeError} When a band lies outside [0, fs/2] or is empty, or a limit or tolerance is out of range; the message names the requirement.
 * @throws {TypeError} When the design or the requirement is malformed.
 * @example
 * ```ts
 * import { checkRequirement } from "./check.ts";
 * // Two-tap average: |H| = cos(πf/fs) is −3.01 dB at fs/4, so 0–2000 Hz ripple is 3.01 dB.
 * const r = checkRequirement({ kind: "fir", taps: [0.5, 0.5] }, 8000,
 *   { kind: "passbandRipple", from: 0, to: 2000, atMostDb: 3, id: "R-1" });
 * if (r.met || Math.abs(r.achieved - 3.0103) > 1e-4 || r.worst?.at !== 2000) throw new Error("3.01 dB at 2 kHz");
 * ```
 */
export function checkRequirement(
  design: FilterDesign,
  fs: number,
  requirement: Requirement,
  options: CheckOptions = {},
): RequirementResult {
  requireDesign(design);
  requireSampleRate(fs);
  if (requirement === null || typeof requirement !== "object") {
    throw new TypeError(`Requirement must be an object, got ${String(requirement)}`);
  }
  const r = requirement;
  const name = requirementName(r);
  const who = label(name, r.id);
  const id = r.id;
  const grid = (from: number, to: number): Float64Array => {
    requireBand(who, from, to, fs);
    return bandGrid(from, to, options.points ?? gridPoints(design, from, to, fs));
  };
  const hz = (at: number) => ({ at, unit: "Hz" });
  switch (r.kind) {
    case "passbandRipple":
    case "passbandDeviation": {
      requireLimit(who, "the dB limit", r.atMostDb);
      const f = grid(r.from, r.to);
      const m = magnitudeOnGrid(design, f, fs);
      const hi = extremeOf(m.at, f, m.values, "max");
      const lo = extremeOf(m.at, f, m.values, "min");
      // Deviation: from the nominal gain. Ripple: the worst case is the extreme farther from 0 dB.
      const gain = r.kind === "passbandDeviation" ? r.gainDb ?? 0 : 0;
      requireLimit(who, "the nominal gain", gain);
      const worst = Math.abs(hi.value - gain) >= Math.abs(lo.value - gain) ? hi : lo;
      const achieved = r.kind === "passbandRipple"
        ? hi.value - lo.value
        : Math.max(Math.abs(hi.value - gain), Math.abs(lo.value - gain));
      return judge(name, achieved, { atMost: r.atMostDb }, "dB", { id, worst: hz(worst.at) });
    }
    case "stopbandAttenuation": {
      requireLimit(who, "the attenuation limit", r.atLeastDb);
      const reference = r.referenceDb ?? 0;
      requireLimit(who, "the reference level", reference);
      const f = grid(r.from, r.to);
      const m = magnitudeOnGrid(design, f, fs);
      const peak = extremeOf(m.at, f, m.values, "max");
      return judge(name, reference - peak.value, { atLeast: r.atLeastDb }, "dB", {
        id,
        worst: hz(peak.at),
      });
    }
    case "maximumGain": {
      requireLimit(who, "the gain limit", r.atMostDb);
      const f = grid(r.from ?? 0, r.to ?? fs / 2);
      const m = magnitudeOnGrid(design, f, fs);
      const peak = extremeOf(m.at, f, m.values, "max");
      return judge(name, peak.value, { atMost: r.atMostDb }, "dB", { id, worst: hz(peak.at) });
    }
    case "gainAt": {
      requireLimit(who, "the frequency", r.frequency);
      requireLimit(who, "the nominal gain", r.gainDb);
      requireLimit(who, "the tolerance", r.toleranceDb);
      if (r.frequency < 0 || r.frequency > fs / 2) {
        throw new RangeError(
          `${who}: frequency must be between 0 Hz and fs/2 = ${show(fs / 2)} Hz, got ${
            show(r.frequency)
          } Hz`,
        );
      }
      const g = gainDbAt(design, r.frequency, fs);
      return judge(name, Math.abs(g - r.gainDb), { atMost: r.toleranceDb }, "dB", {
        id,
        worst: hz(r.frequency),
      });
    }
    case "bandEdge": {
      requireLimit(who, "the level", r.levelDb);
      const limit = typeof r.atLeastHz === "number"
        ? { atLeast: r.atLeastHz }
        : typeof r.atMostHz === "number"
        ? { atMost: r.atMostHz }
        : undefined;
      if (limit === undefined) {
        throw new TypeError(`${who}: give atLeastHz or atMostHz`);
      }
      const f = grid(r.from, r.to);
      const m = magnitudeOnGrid(design, f, fs);
      const d0 = (m.values[0] as number) - r.levelDb;
      let edge = d0 === 0 ? r.from : NaN;
      for (let i = 1; i < f.length && Number.isNaN(edge); i++) {
        const d = (m.values[i] as number) - r.levelDb;
        if (d === 0) edge = f[i] as number;
        else if (Math.sign(d) !== Math.sign(d0)) {
          let lo = f[i - 1] as number;
          let hi = f[i] as number;
          for (let k = 0; k < 80 && hi - lo > 1e-12 * hi; k++) {
            const mid = (lo + hi) / 2;
            if (Math.sign(m.at(mid) - r.levelDb) === Math.sign(d0)) lo = mid;
            else hi = mid;
          }
          edge = (lo + hi) / 2;
        }
      }
      if (Number.isNaN(edge)) {
        throw new RangeError(
          `${who}: the magnitude does not pass through ${show(r.levelDb)} dB between ${
            show(r.from)
          } and ${show(r.to)} Hz; widen the search band`,
        );
      }
      return judge(name, edge, limit, "Hz", { id, worst: hz(edge) });
    }
    case "groupDelayMaximum":
    case "groupDelayFlatness": {
      requireLimit(who, "the delay limit", r.atMostSamples);
      const f = grid(r.from, r.to);
      const d = delayOnGrid(who, design, f, fs);
      const hi = extremeOf(d.at, f, d.values, "max");
      if (r.kind === "groupDelayMaximum") {
        return judge(name, hi.value, { atMost: r.atMostSamples }, "samples", {
          id,
          worst: hz(hi.at),
        });
      }
      const lo = extremeOf(d.at, f, d.values, "min");
      const mean = (hi.value + lo.value) / 2;
      const worst = Math.abs(hi.value - mean) >= Math.abs(lo.value - mean) ? hi : lo;
      return judge(name, hi.value - lo.value, { atMost: r.atMostSamples }, "samples", {
        id,
        worst: hz(worst.at),
      });
    }
    case "linearPhase": {
      requireLimit(who, "the phase limit", r.atMostDegrees);
      const f = grid(r.from, r.to);
      const phase = unwrappedPhase(responseOf(design, f, fs));
      // Least-squares line phase ≈ c + s·f.
      const n = f.length;
      let sf = 0;
      let sp = 0;
      for (let i = 0; i < n; i++) {
        sf += f[i] as number;
        sp += phase[i] as number;
      }
      const mf = sf / n;
      const mp = sp / n;
      let sxy = 0;
      let sxx = 0;
      for (let i = 0; i < n; i++) {
        const dx = (f[i] as number) - mf;
        sxy += dx * ((phase[i] as number) - mp);
        sxx += dx * dx;
      }
      const slope = sxy / sxx;
      let worst = 0;
      let at = f[0] as number;
      for (let i = 0; i < n; i++) {
        const e = Math.abs((phase[i] as number) - (mp + slope * ((f[i] as number) - mf)));
        if (e > worst) {
          worst = e;
          at = f[i] as number;
        }
      }
      return judge(name, (worst * 180) / Math.PI, { atMost: r.atMostDegrees }, "°", {
        id,
        worst: hz(at),
      });
    }
    case "stabilityMargin": {
      requireLimit(who, "the margin limit", r.atLeast);
      let radius = 0;
      let angle = 0;
      for (const p of polesOf(design)) {
        const m = Math.hypot(p.re, p.im);
        if (m > radius) {
          radius = m;
          angle = Math.abs(Math.atan2(p.im, p.re));
        }
      }
      const extra: Parameters<typeof judge>[4] = { id };
      if (radius > 0) extra.worst = hz((angle * fs) / (2 * Math.PI));
      return judge(name, 1 - radius, { atLeast: r.atLeast }, unitless, extra);
    }
    case "settlingTime": {
      requireLimit(who, "the time limit", r.atMostSeconds);
      const tolerance = r.tolerance ?? 0.02;
      requireFinite(`${who}: tolerance`, tolerance);
      if (!(tolerance > 0 && tolerance < 1)) {
        throw new RangeError(`${who}: tolerance must be between 0 and 1, got ${show(tolerance)}`);
      }
      const length = decayLength(design, tolerance * 1e-3);
      const notSettled = (): RequirementResult => ({
        name,
        ...(id === undefined ? {} : { id }),
        achieved: Infinity,
        limit: r.atMostSeconds,
        relation: "atMost",
        unit: "s",
        margin: -Infinity,
        met: false,
      });
      if (!Number.isFinite(length)) return notSettled();
      const s = stepResponseOf(design, length + 1);
      const dc = responseOf(design, [0], fs).re[0] as number;
      let scale = Math.abs(dc);
      if (scale < 1e-12) { for (const v of s) scale = Math.max(scale, Math.abs(v)); }
      const band = tolerance * scale;
      let last = -1;
      for (let n = 0; n < s.length; n++) if (Math.abs((s[n] as number) - dc) > band) last = n;
      // Still outside the band at the end of the (capped) window: it has not settled.
      if (last === s.length - 1) return notSettled();
      const extra: Parameters<typeof judge>[4] = { id };
      if (last >= 0) extra.worst = { at: last / fs, unit: "s" };
      return judge(name, (last + 1) / fs, { atMost: r.atMostSeconds }, "s", extra);
    }
    default:
      throw new TypeError(
        `Requirement kind is not one of the vocabulary, got ${
          String((r as { kind?: unknown }).kind)
        }`,
      );
  }
}
