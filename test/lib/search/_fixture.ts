// Loads test/reference/search.json (made by test/reference/make_search.py with Debian SciPy 1.10.1).
import type { FilterSpec, Requirement } from "../../../lib/verify/requirements.ts";

export interface IirOrderCase {
  name: string;
  reference: string;
  family: "butterworth" | "chebyshev1" | "chebyshev2" | "elliptic";
  response: "lowpass" | "highpass" | "bandpass" | "bandstop";
  fs: number;
  passband: number | [number, number];
  stopband: number | [number, number];
  passbandRippleDb: number;
  stopbandAttenuationDb: number;
  order: number;
}

export interface KaiserCase {
  reference: string;
  attenuationDb: number;
  transitionWidth: number;
  fs: number;
  length: number;
  beta: number;
}

export interface EquirippleCase {
  name: string;
  reference: string;
  fs: number;
  bands: [number, number][];
  kinds: ("pass" | "stop")[];
  rippleDb: number;
  attenuationDb: number;
  length: number;
}

export const fixture: {
  versions: string;
  iirOrders: IirOrderCase[];
  kaiser: KaiserCase[];
  equiripple: EquirippleCase[];
} = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/search.json", import.meta.url)),
);

/** The spec an IIR order case describes: ripple over the passband(s), attenuation over the stopband(s). */
export function iirCaseSpec(c: IirOrderCase): FilterSpec {
  const nyquist = c.fs / 2;
  const r: Requirement[] = [];
  const pass = (from: number, to: number) =>
    r.push({ kind: "passbandRipple", from, to, atMostDb: c.passbandRippleDb });
  const stop = (from: number, to: number) =>
    r.push({ kind: "stopbandAttenuation", from, to, atLeastDb: c.stopbandAttenuationDb });
  const [p0, p1] = typeof c.passband === "number" ? [c.passband, 0] : c.passband;
  const [s0, s1] = typeof c.stopband === "number" ? [c.stopband, 0] : c.stopband;
  if (c.response === "lowpass") {
    pass(0, p0);
    stop(s0, nyquist);
  } else if (c.response === "highpass") {
    stop(0, s0);
    pass(p0, nyquist);
  } else if (c.response === "bandpass") {
    stop(0, s0);
    pass(p0, p1);
    stop(s1, nyquist);
  } else {
    pass(0, p0);
    stop(s0, s1);
    pass(p1, nyquist);
  }
  return { fs: c.fs, requirements: r };
}

/** The spec an equiripple case describes. */
export function equirippleCaseSpec(c: EquirippleCase): FilterSpec {
  return {
    fs: c.fs,
    requirements: c.bands.map(([from, to], i): Requirement =>
      c.kinds[i] === "pass"
        ? { kind: "passbandRipple", from, to, atMostDb: c.rippleDb }
        : { kind: "stopbandAttenuation", from, to, atLeastDb: c.attenuationDb }
    ),
  };
}
