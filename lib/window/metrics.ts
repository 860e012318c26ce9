import { requireSamples } from "../_validate.ts";
import { realFft } from "../fft/real_fft.ts";

/** Figures of merit of a window for spectral analysis (Harris 1978, Table I). */
export interface WindowMetrics {
  /** Coherent gain Σw / N (linear; 1 for the rectangular window). */
  coherentGain: number;
  /** Equivalent noise bandwidth N·Σw² / (Σw)², in bins. */
  equivalentNoiseBandwidth: number;
  /** Scalloping loss −20·log10(|W(½ bin)| / |W(0)|), in dB (a positive number). */
  scallopingLossDb: number;
  /**
   * Highest sidelobe level 20·log10(max sidelobe / |W(0)|), in dB (negative);
   * −Infinity when the spectrum has no sidelobe (e.g. a window of one sample).
   */
  highestSidelobeDb: number;
  /** Full width of the main lobe where it is 3.0 dB below its peak, in bins. */
  bandwidth3Db: number;
  /** Full width of the main lobe where it is 6.0 dB below its peak, in bins. */
  bandwidth6Db: number;
}

/** |W(ν)| at ν bins (ν/N cycles per sample), by Horner's rule in z = e^(−j2πν/N). */
function magnitudeAt(w: Float64Array, bins: number): number {
  const n = w.length;
  const zr = Math.cos((2 * Math.PI * bins) / n);
  const zi = -Math.sin((2 * Math.PI * bins) / n);
  let re = 0;
  let im = 0;
  for (let i = n - 1; i >= 0; i--) {
    const r = re * zr - im * zi + w[i]!;
    im = re * zi + im * zr;
    re = r;
  }
  return Math.hypot(re, im);
}

/** Golden-section search for the maximum of |W| on [a, b]. */
function refinePeak(w: Float64Array, a: number, b: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = magnitudeAt(w, c);
  let fd = magnitudeAt(w, d);
  for (let i = 0; i < 60 && b - a > 1e-10; i++) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = magnitudeAt(w, c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = magnitudeAt(w, d);
    }
  }
  return Math.max(fc, fd);
}

/** Bisection for |W(ν)| = target on [a, b], |W(a)| > target ≥ |W(b)|. */
function crossing(w: Float64Array, target: number, a: number, b: number): number {
  for (let i = 0; i < 80 && b - a > 1e-13; i++) {
    const m = (a + b) / 2;
    if (magnitudeAt(w, m) > target) a = m;
    else b = m;
  }
  return (a + b) / 2;
}

/**
 * Figures of merit of any window, for choosing one for spectral analysis:
 * coherent gain Σw/N, equivalent noise bandwidth ENBW = N·Σw²/(Σw)² bins,
 * scalloping loss at half a bin, highest sidelobe level, and the 3 dB and
 * 6 dB main-lobe widths. One bin is fs/N for a window of N samples.
 *
 * The spectrum is scanned on a zero-padded FFT grid (64 points per bin, at
 * least 8 for windows over 16384 samples), then the highest sidelobe and the
 * band edges are refined by direct evaluation of W(ν) = Σ w[n] e^(−j2πνn/N)
 * (golden section and bisection).
 * The definitions are Harris's; his table uses the periodic ("DFT-even") forms.
 *
 * Source: F. J. Harris, "On the use of windows for harmonic analysis with the
 * discrete Fourier transform", Proc. IEEE 66(1), 1978, §IV and Table I.
 *
 * @param window Window samples, at least 2, with a non-zero sum.
 * @returns The metrics; widths in bins, levels in dB.
 * @throws {RangeError} When the window has fewer than 2 samples or sums to 0.
 * @throws {TypeError} When a sample is not finite.
 * @example
 * ```ts
 * import { windowMetrics } from "./metrics.ts";
 * import { hannWindow } from "./windows.ts";
 * const m = windowMetrics(hannWindow(256, { symmetry: "periodic" }));
 * // Harris 1978, Table I (Hann): ENBW 1.50 bins, scalloping loss 1.42 dB, 6 dB width 2.00 bins.
 * if (Math.abs(m.equivalentNoiseBandwidth - 1.5) > 1e-12) throw new Error("ENBW 1.5");
 * if (Math.abs(m.scallopingLossDb - 1.42) > 0.005) throw new Error("scalloping 1.42 dB");
 * ```
 */
export function windowMetrics(window: ArrayLike<number>): WindowMetrics {
  requireSamples("Window", window, 2);
  const w = Float64Array.from(window);
  const n = w.length;
  let sum = 0;
  let sumSquares = 0;
  for (let i = 0; i < n; i++) {
    sum += w[i]!;
    sumSquares += w[i]! * w[i]!;
  }
  if (sum === 0) throw new RangeError("Window must have a non-zero sum, got 0");
  const peak = Math.abs(sum);
  const coherentGain = sum / n;
  const equivalentNoiseBandwidth = (n * sumSquares) / (sum * sum);
  const scallopingLossDb = -20 * Math.log10(magnitudeAt(w, 0.5) / peak);

  // Scan |W| on a dense grid: `density` points per bin (64, or down to 8 for
  // windows longer than 16384 samples to bound the work), up to fs/2 (N/2 bins).
  let size = 1;
  while (size < Math.max(8 * n, Math.min(64 * n, 1 << 20))) size *= 2;
  const density = size / n;
  const { re, im } = realFft(w, { size });
  const mag = new Float64Array(re.length);
  for (let k = 0; k < mag.length; k++) mag[k] = Math.hypot(re[k]!, im[k]!);

  // Main-lobe edges at −3 dB and −6 dB, then the first null (first local minimum).
  const edge = (levelDb: number): number => {
    const target = peak * 10 ** (-levelDb / 20);
    for (let k = 1; k < mag.length; k++) {
      if (mag[k]! <= target) return 2 * crossing(w, target, (k - 1) / density, k / density);
    }
    return Number.NaN;
  };
  // The main lobe ends at the first local minimum after |W| has fallen to half
  // its peak (a flat-top window's lobe rises a little before it falls).
  let null_ = 1;
  while (null_ < mag.length - 1 && mag[null_]! > peak / 2) null_++;
  while (null_ < mag.length - 1 && mag[null_ + 1]! < mag[null_]!) null_++;
  let highestSidelobeDb = Number.NEGATIVE_INFINITY;
  if (null_ < mag.length - 1) {
    let best = null_;
    for (let k = null_; k < mag.length; k++) if (mag[k]! > mag[best]!) best = k;
    const lo = Math.max(null_, best - 1) / density;
    const hi = Math.min(mag.length - 1, best + 1) / density;
    const level = Math.max(refinePeak(w, lo, hi), mag[best]!);
    highestSidelobeDb = 20 * Math.log10(level / peak);
  }
  return {
    coherentGain,
    equivalentNoiseBandwidth,
    scallopingLossDb,
    highestSidelobeDb,
    bandwidth3Db: edge(3),
    bandwidth6Db: edge(6),
  };
}
