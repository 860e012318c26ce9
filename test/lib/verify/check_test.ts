import assert from "node:assert";
import {
  bandGrid,
  checkRequirement,
  type FilterDesign,
  type Requirement,
} from "../../../lib/mod.ts";
import { assertClose } from "../../_tolerance.ts";
import { fixture, referenceCase } from "./_fixture.ts";

const fs = 8000;
const average: FilterDesign = { kind: "fir", taps: [0.5, 0.5] };
const check = (d: FilterDesign, r: Requirement) => checkRequirement(d, fs, r);

Deno.test("bandGrid holds both band edges exactly", () => {
  const f = bandGrid(1234.567, 3999.999, 1001);
  assert.equal(f[0], 1234.567);
  assert.equal(f[1000], 3999.999);
  for (let i = 1; i < f.length; i++) assert.ok(f[i]! > f[i - 1]!);
});

// Two-tap average: |H(f)| = cos(πf/fs), group delay 1/2 sample, step 0.5, 1, 1, …
// source: textbook identity, Oppenheim & Schafer, Discrete-Time Signal Processing §5.1 (moving average)
Deno.test("two-tap average: magnitude requirements from |H| = cos(πf/fs)", () => {
  const ripple = check(average, {
    kind: "passbandRipple",
    from: 0,
    to: 2000,
    atMostDb: 3.1,
    id: "P1",
  });
  assertClose(ripple.achieved, -20 * Math.log10(Math.cos(Math.PI / 4)), { abs: 1e-12 }, "ripple");
  assert.equal(ripple.met, true);
  assert.equal(ripple.id, "P1");
  assert.deepEqual(ripple.worst, { at: 2000, unit: "Hz" });
  assertClose(ripple.margin, 3.1 - ripple.achieved, { abs: 1e-15 }, "margin");

  const dev = check(average, { kind: "passbandDeviation", from: 0, to: 1000, atMostDb: 0.5 });
  assertClose(dev.achieved, -20 * Math.log10(Math.cos(Math.PI / 8)), { abs: 1e-12 }, "deviation");
  assert.equal(dev.met, false);

  const stop = check(average, {
    kind: "stopbandAttenuation",
    from: 3000,
    to: 4000,
    atLeastDb: 10,
  });
  assertClose(stop.achieved, -20 * Math.log10(Math.cos((3 * Math.PI) / 8)), { abs: 1e-9 }, "att");
  assert.equal(stop.worst?.at, 3000);
  assert.equal(stop.met, false);
  assertClose(stop.margin, stop.achieved - 10, { abs: 1e-15 }, "margin");

  const peak = check(average, { kind: "maximumGain", atMostDb: 0.01 });
  assertClose(peak.achieved, 0, { abs: 1e-12 }, "peak gain");
  assert.equal(peak.worst?.at, 0);

  const dc = check(average, { kind: "gainAt", frequency: 0, gainDb: 0, toleranceDb: 0.001 });
  assert.equal(dc.achieved, 0);
  const mid = check(average, { kind: "gainAt", frequency: 2000, gainDb: -3, toleranceDb: 0.02 });
  assertClose(mid.achieved, 0.0103, { abs: 1e-4 }, "−3.0103 vs −3 dB");

  const edge = check(average, {
    kind: "bandEdge",
    levelDb: -6,
    from: 100,
    to: 3900,
    atLeastHz: 2600,
  });
  // cos(πf/fs) = 10^(−6/20)  ⇒  f = fs·acos(10^(−0.3))/π
  assertClose(edge.achieved, (fs * Math.acos(10 ** -0.3)) / Math.PI, { abs: 1e-6 }, "−6 dB edge");
  assert.equal(edge.met, true);
});

Deno.test("two-tap average: delay, phase, stability and settling", () => {
  const dmax = check(average, { kind: "groupDelayMaximum", from: 0, to: 3000, atMostSamples: 0.6 });
  assertClose(dmax.achieved, 0.5, { abs: 1e-12 }, "delay 1/2 sample");
  const flat = check(average, {
    kind: "groupDelayFlatness",
    from: 0,
    to: 3000,
    atMostSamples: 1e-9,
  });
  assert.ok(flat.met && flat.achieved < 1e-12);
  const lin = check(average, { kind: "linearPhase", from: 0, to: 3000, atMostDegrees: 1e-6 });
  assert.ok(lin.met, `phase deviation ${lin.achieved}°`);
  const margin = check(average, { kind: "stabilityMargin", atLeast: 0.5 });
  assert.equal(margin.achieved, 1);
  assert.equal(margin.worst, undefined);
  const settle = check(average, { kind: "settlingTime", atMostSeconds: 1 / fs });
  assertClose(settle.achieved, 1 / fs, { rel: 1e-15 }, "settles after one sample");
  assert.equal(settle.unit, "s");
  assert.ok(settle.met);
});

Deno.test("one-pole lowpass: settling time and stability margin in closed form", () => {
  const a = 0.9;
  const onePole: FilterDesign = { kind: "rational", numerator: [1 - a], denominator: [1, -a] };
  // Step 1 − a^(n+1) stays within 2 % once a^(n+1) ≤ 0.02: settled at n = ⌈ln 0.02 / ln a⌉ − 1.
  // source: common practice (geometric decay of a one-pole step response)
  const n = Math.ceil(Math.log(0.02) / Math.log(a)) - 1;
  const settle = check(onePole, { kind: "settlingTime", atMostSeconds: 0.01, tolerance: 0.02 });
  assertClose(settle.achieved, n / fs, { rel: 1e-12 }, "settling time");
  assertClose(settle.worst!.at, (n - 1) / fs, { rel: 1e-12 }, "last sample outside");
  const m = check(onePole, { kind: "stabilityMargin", atLeast: 0.05, id: "S-9" });
  assertClose(m.achieved, 0.1, { abs: 1e-15 }, "1 − 0.9");
  assert.deepEqual(m.worst, { at: 0, unit: "Hz" });
  assert.equal(m.id, "S-9");
  // A pole outside the unit circle never settles.
  const unstable = check({ kind: "rational", numerator: [1], denominator: [1, -1.1] }, {
    kind: "settlingTime",
    atMostSeconds: 1,
  });
  assert.equal(unstable.met, false);
  assert.equal(unstable.achieved, Infinity);
  // A pole so close to 1 that it settles only after ~3.9 million samples (beyond the 2^20-sample
  // window) is reported as not settled rather than given a settling time it never reaches.
  const slow = 1 - 1e-6;
  const crawl = check({ kind: "rational", numerator: [1 - slow], denominator: [1, -slow] }, {
    kind: "settlingTime",
    atMostSeconds: 1e4,
  });
  assert.equal(crawl.achieved, Infinity);
  const neg = check({ kind: "rational", numerator: [1], denominator: [1, -1.1] }, {
    kind: "stabilityMargin",
    atLeast: 0,
  });
  assertClose(neg.achieved, -0.1, { abs: 1e-15 }, "negative margin");
  assert.equal(neg.met, false);
});

Deno.test("band requirements agree with SciPy on dense grids (firwin, butter, ellip)", () => {
  for (const name of ["fir31", "butter4", "ellip6"]) {
    const c = referenceCase(name);
    const p = c.passband;
    const s = c.stopband;
    const ripple = checkRequirement(c.design, fixture.fs, {
      kind: "passbandRipple",
      from: p.from,
      to: p.to,
      atMostDb: 1,
    });
    // source: scipy.signal.freqz / sosfreqz on 200001 points per band (SciPy 1.10.1), verify.json
    assertClose(ripple.achieved, p.maxDb - p.minDb, { abs: 1e-7 }, `${name} ripple`);
    const att = checkRequirement(c.design, fixture.fs, {
      kind: "stopbandAttenuation",
      from: s.from,
      to: s.to,
      atLeastDb: 40,
    });
    assertClose(att.achieved, -s.maxDb, { abs: 1e-7 }, `${name} attenuation`);
    assertClose(att.worst!.at, s.maxAt, { abs: 0.5 }, `${name} worst stopband frequency`);
  }
});

Deno.test("elliptic design meets its 0.5 dB ripple and 60 dB attenuation (SciPy ellip)", () => {
  const c = referenceCase("ellip6");
  const ripple = checkRequirement(c.design, fixture.fs, {
    kind: "passbandRipple",
    from: 0,
    to: 1000,
    atMostDb: 0.5 + 1e-6,
  });
  // source: scipy.signal.ellip(6, 0.5, 60, …) is designed for exactly 0.5 dB ripple and 60 dB
  assertClose(ripple.achieved, 0.5, { abs: 1e-6 }, "0.5 dB");
  const att = checkRequirement(c.design, fixture.fs, {
    kind: "stopbandAttenuation",
    from: c.stopband.from,
    to: 4000,
    atLeastDb: 60 - 1e-6,
  });
  assertClose(att.achieved, 60, { abs: 1e-6 }, "60 dB");
  assert.ok(ripple.met && att.met);
});

Deno.test("Butterworth: −3.01 dB edge at the design cutoff; delay and settling vs SciPy", () => {
  const c = referenceCase("butter4");
  const edge = checkRequirement(c.design, fixture.fs, {
    kind: "bandEdge",
    levelDb: 10 * Math.log10(0.5),
    from: 500,
    to: 1500,
    atLeastHz: 990,
  });
  // source: a Butterworth filter's cutoff is its half-power point (textbook; scipy.signal.butter Wn)
  assertClose(edge.achieved, 1000, { abs: 1e-6 }, "half-power frequency");
  const g = c.groupDelay!;
  const dmax = checkRequirement(c.design, fixture.fs, {
    kind: "groupDelayMaximum",
    from: g.from,
    to: g.to,
    atMostSamples: 6,
  });
  // source: scipy.signal.group_delay (SciPy 1.10.1)
  assertClose(dmax.achieved, g.max, { rel: 1e-9 }, "max delay");
  const flat = checkRequirement(c.design, fixture.fs, {
    kind: "groupDelayFlatness",
    from: g.from,
    to: g.to,
    atMostSamples: 1,
  });
  assertClose(flat.achieved, g.max - g.min, { rel: 1e-9 }, "delay variation");
  assert.equal(flat.met, false);
  const settle = checkRequirement(c.design, fixture.fs, {
    kind: "settlingTime",
    atMostSeconds: 0.01,
  });
  // source: scipy.signal.sosfilt step response, last sample outside ±2 % (SciPy 1.10.1)
  assertClose(settle.achieved, c.settlingSamples2pct! / fixture.fs, { rel: 1e-12 }, "settling");
  const margin = checkRequirement(c.design, fixture.fs, { kind: "stabilityMargin", atLeast: 0.1 });
  assertClose(margin.achieved, 1 - c.poleRadius!, { rel: 1e-10 }, "stability margin");
  // A minimum-phase IIR is far from linear phase over its passband.
  const lin = checkRequirement(c.design, fixture.fs, {
    kind: "linearPhase",
    from: 0,
    to: 800,
    atMostDegrees: 1,
  });
  assert.equal(lin.met, false);
  // The linear-phase FIR is linear to rounding.
  const fir = referenceCase("fir31");
  const firLin = checkRequirement(fir.design, fixture.fs, {
    kind: "linearPhase",
    from: 0,
    to: 900,
    atMostDegrees: 1e-6,
  });
  assert.ok(firLin.met, `${firLin.achieved}°`);
});

Deno.test("bad requirements are refused with an error naming the requirement", () => {
  const cases: [Requirement, ErrorConstructor, string[]][] = [
    [
      { kind: "stopbandAttenuation", from: 3000, to: 5000, atLeastDb: 40, id: "SR-7" },
      RangeError,
      ["SR-7", "fs/2 = 4000 Hz", "3000–5000"],
    ],
    [
      { kind: "passbandRipple", from: -10, to: 1000, atMostDb: 1, name: "Audio band flatness" },
      RangeError,
      ["Audio band flatness", "0 Hz"],
    ],
    [
      { kind: "groupDelayMaximum", from: 2000, to: 1000, atMostSamples: 1, id: "D2" },
      RangeError,
      ["D2", "from < to"],
    ],
    [
      { kind: "gainAt", frequency: 4100, gainDb: 0, toleranceDb: 1, id: "G3" },
      RangeError,
      ["G3", "4100"],
    ],
    [
      { kind: "settlingTime", atMostSeconds: 1, tolerance: 1.5, id: "T1" },
      RangeError,
      ["T1", "tolerance"],
    ],
    [
      { kind: "bandEdge", levelDb: -40, from: 100, to: 1000, atLeastHz: 500, id: "E1" },
      RangeError,
      ["E1", "does not pass through -40 dB"],
    ],
    [
      { kind: "bandEdge", levelDb: -3, from: 100, to: 3000, id: "E2" } as unknown as Requirement,
      TypeError,
      ["E2", "atLeastHz or atMostHz"],
    ],
    [
      { kind: "passbandRipple", from: 0, to: 100, atMostDb: NaN, id: "P9" },
      TypeError,
      ["P9", "finite"],
    ],
    [{ kind: "flatness", from: 0, to: 1 } as unknown as Requirement, TypeError, ["flatness"]],
  ];
  for (const [r, kind, parts] of cases) {
    assert.throws(
      () => check(average, r),
      (e: Error) => e instanceof kind && parts.every((p) => e.message.includes(p)),
      parts.join(" / "),
    );
  }
});
