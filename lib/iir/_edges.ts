// Band-edge checks and pre-warping shared by the IIR design functions (private).
import { requireBandEdge, requireSampleRate, show } from "../_validate.ts";

/** The four classic band shapes. */
export type BandShape = "lowpass" | "highpass" | "bandpass" | "bandstop";

const SHAPES: readonly string[] = ["lowpass", "highpass", "bandpass", "bandstop"];

export function requireShape(shape: string): void {
  if (!SHAPES.includes(shape)) {
    throw new TypeError(`Response must be one of ${SHAPES.join(", ")}, got ${String(shape)}`);
  }
}

/** Validate edges for a shape and return them as an array of 1 or 2 values in Hz. */
export function requireEdges(
  name: string,
  edges: number | readonly number[],
  shape: BandShape,
  fs: number,
): number[] {
  requireSampleRate(fs);
  const single = shape === "lowpass" || shape === "highpass";
  const list = typeof edges === "number" ? [edges] : Array.isArray(edges) ? [...edges] : null;
  if (list === null || list.length !== (single ? 1 : 2)) {
    throw new TypeError(
      `${name} of a ${shape} design must be ${
        single ? "one frequency" : "two frequencies [low, high]"
      } in Hz, got ${JSON.stringify(edges)}`,
    );
  }
  list.forEach((f, i) => requireBandEdge(single ? name : `${name} [${i}]`, f as number, fs));
  if (!single && !(list[0]! < list[1]!)) {
    throw new RangeError(
      `${name} must be increasing (low < high), got [${show(list[0]!)}, ${show(list[1]!)}] Hz`,
    );
  }
  return list as number[];
}

/** Analog frequency (rad/s) that the bilinear transform at fs maps to f Hz. */
export function prewarp(f: number, fs: number): number {
  return 2 * fs * Math.tan((Math.PI * f) / fs);
}

/** Inverse of {@link prewarp}: the digital frequency in Hz for Ω rad/s. */
export function unwarp(omega: number, fs: number): number {
  return (fs / Math.PI) * Math.atan(omega / (2 * fs));
}
