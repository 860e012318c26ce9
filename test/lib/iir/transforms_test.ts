import {
  bilinearTransform,
  lowpassToBandpass,
  lowpassToBandstop,
  lowpassToHighpass,
  lowpassToLowpass,
} from "../../../lib/iir/transforms.ts";
import { chebyshev1Prototype } from "../../../lib/iir/prototypes.ts";
import type { ZerosPolesGain } from "../../../lib/types.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";

/** |H(jω)| of an analog zpk. */
function analog(zpk: ZerosPolesGain, w: number): number {
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(z.re, w - z.im);
  for (const p of zpk.poles) m /= Math.hypot(p.re, w - p.im);
  return m;
}

/** |H(e^jω)| of a digital zpk. */
function digital(zpk: ZerosPolesGain, w: number): number {
  const [c, s] = [Math.cos(w), Math.sin(w)];
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(c - z.re, s - z.im);
  for (const p of zpk.poles) m /= Math.hypot(c - p.re, s - p.im);
  return m;
}

// source for the mappings: Parks & Burrus, Digital Filter Design (from memory) — the prototype's response
// at λ reappears at Ω with λ = Ω/w0 (lowpass), w0/Ω (highpass), (Ω² − w0²)/(bw·Ω) (bandpass),
// bw·Ω/(w0² − Ω²) (bandstop); bilinear: Ω = 2fs·tan(ω/2) (Oppenheim & Schafer, 3rd ed., ch. 7).
const proto = chebyshev1Prototype(4, 1);

Deno.test("frequency transformations carry the prototype response to the mapped frequencies", () => {
  const [w0, bw] = [30, 8];
  for (const w of [3, 17, 29, 31, 44, 90]) {
    assertClose(
      analog(lowpassToLowpass(proto, w0), w),
      analog(proto, w / w0),
      { rel: 1e-12 },
      `lowpass ${w}`,
    );
    assertClose(
      analog(lowpassToHighpass(proto, w0), w),
      analog(proto, w0 / w),
      { rel: 1e-12 },
      `highpass ${w}`,
    );
    const lb = Math.abs((w * w - w0 * w0) / (bw * w));
    assertClose(
      analog(lowpassToBandpass(proto, w0, bw), w),
      analog(proto, lb),
      { rel: 1e-11 },
      `bandpass ${w}`,
    );
    const ls = Math.abs((bw * w) / (w0 * w0 - w * w));
    assertClose(
      analog(lowpassToBandstop(proto, w0, bw), w),
      analog(proto, ls),
      { rel: 1e-11 },
      `bandstop ${w}`,
    );
  }
});

Deno.test("bilinear transform maps Ω = 2fs·tan(ω/2) onto ω", () => {
  const fs = 1000;
  const a = lowpassToLowpass(proto, 900);
  const d = bilinearTransform(a, fs);
  for (const w of [0.1, 0.5, 1.2, 2.8]) {
    assertClose(digital(d, w), analog(a, 2 * fs * Math.tan(w / 2)), { rel: 1e-12 }, `ω = ${w}`);
  }
});

Deno.test("transforms reject bad input", () => {
  assertThrowsMatching(
    () => lowpassToLowpass(proto, 0),
    RangeError,
    /Cutoff w0 must be greater than 0 rad\/s, got 0/,
  );
  assertThrowsMatching(
    () => lowpassToBandpass(proto, 1, -2),
    RangeError,
    /Bandwidth must be greater than 0/,
  );
  assertThrowsMatching(() => bilinearTransform(proto, 0), RangeError, /Sample rate/);
  assertThrowsMatching(
    () =>
      lowpassToHighpass({
        zeros: [{ re: -1, im: 0 }, { re: -2, im: 0 }],
        poles: [{ re: -1, im: 0 }],
        gain: 1,
      }, 1),
    RangeError,
    /no more zeros than poles, got 2 zeros and 1 poles/,
  );
  assertThrowsMatching(
    () => lowpassToBandstop({ zeros: [], poles: [{ re: 0, im: 0 }], gain: 1 }, 1, 1),
    RangeError,
    /no pole at s = 0/,
  );
  assertThrowsMatching(
    () => lowpassToLowpass({ zeros: [], poles: [{ re: NaN, im: 0 }], gain: 1 }, 1),
    TypeError,
    /Pole \[0\] must be a finite complex number/,
  );
});
