// Entry checks for multiband specifications (private to lib/fir).
import { requireFinite, requireSampleRate, show } from "../_validate.ts";
import type { DesignBand } from "./types.ts";

/** A band after validation, weight filled in. */
export interface CheckedBand {
  from: number;
  to: number;
  gain: number;
  endGain: number;
  weight: number;
}

/**
 * Check a band list: an array of at least one band, edges inside [0, fs/2] and
 * strictly increasing across the list, finite gains, weights > 0.
 */
export function checkBands(bands: readonly DesignBand[], fs: number): CheckedBand[] {
  requireSampleRate(fs);
  if (!Array.isArray(bands) || bands.length === 0) {
    throw new TypeError(
      `Bands must be a non-empty array of { from, to, gain }, got ${
        Array.isArray(bands) ? "an empty array" : typeof bands
      }`,
    );
  }
  const nyquist = fs / 2;
  const out: CheckedBand[] = [];
  let previous = -Infinity;
  bands.forEach((band, i) => {
    if (band === null || typeof band !== "object") {
      throw new TypeError(`Band ${i + 1} must be an object { from, to, gain }, got ${typeof band}`);
    }
    const name = `Band ${i + 1}`;
    requireFinite(`${name} lower edge`, band.from);
    requireFinite(`${name} upper edge`, band.to);
    requireFinite(`${name} gain`, band.gain);
    if (band.from < 0 || band.to > nyquist) {
      throw new RangeError(
        `${name} must lie between 0 Hz and fs/2 = ${show(nyquist)} Hz, got ${show(band.from)}–${
          show(band.to)
        } Hz`,
      );
    }
    if (!(band.to > band.from)) {
      throw new RangeError(
        `Band edges must increase: ${name} runs from ${show(band.from)} Hz to ${show(band.to)} Hz`,
      );
    }
    if (!(band.from > previous)) {
      throw new RangeError(
        `Band edges must increase: ${name} starts at ${
          show(band.from)
        } Hz, not above the previous band's upper edge ${show(previous)} Hz`,
      );
    }
    previous = band.to;
    const weight = band.weight ?? 1;
    requireFinite(`${name} weight`, weight);
    if (weight <= 0) {
      throw new RangeError(`${name} weight must be greater than 0, got ${show(weight)}`);
    }
    const endGain = band.endGain ?? band.gain;
    requireFinite(`${name} end gain`, endGain);
    out.push({ from: band.from, to: band.to, gain: band.gain, endGain, weight });
  });
  return out;
}
