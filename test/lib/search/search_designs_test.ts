import assert from "node:assert/strict";
import { estimateEquirippleLength } from "../../../lib/fir/equiripple_length.ts";
import { quantiseDesign } from "../../../lib/fixed/quantise_design.ts";
import { runFixed } from "../../../lib/fixed/run_fixed.ts";
import { kaiserBeta } from "../../../lib/fir/kaiser_parameters.ts";
import { searchDesigns } from "../../../lib/search/search_designs.ts";
import type { SearchCandidate, SearchOptions, SearchResult } from "../../../lib/search/types.ts";
import { checkSpec } from "../../../lib/verify/spec.ts";
import type { FilterSpec, Requirement } from "../../../lib/verify/requirements.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { equirippleCaseSpec, fixture, iirCaseSpec } from "./_fixture.ts";

/** Wide words: quantisation leaves the floating-point verdicts alone, so sizes are the method's own. */
const WIDE = { wordLength: 32, accumulatorBits: 100 };
const TARGET16 = { wordLength: 16, accumulatorBits: 40 };

const ripple = (from: number, to: number, atMostDb: number): Requirement => ({
  kind: "passbandRipple",
  from,
  to,
  atMostDb,
});
const stop = (from: number, to: number, atLeastDb: number): Requirement => ({
  kind: "stopbandAttenuation",
  from,
  to,
  atLeastDb,
});

/** Invented scenarios. */
const audioLowpass: FilterSpec = {
  fs: 48000,
  requirements: [ripple(0, 15000, 0.1), stop(17000, 24000, 70)],
};
const narrowBandpass: FilterSpec = {
  fs: 8000,
  requirements: [stop(0, 800, 50), ripple(950, 1050, 1), stop(1200, 4000, 50)],
};
const decimator: FilterSpec = {
  fs: 48000,
  requirements: [ripple(0, 2400, 0.2), stop(3000, 24000, 70)],
};

function only(result: SearchResult): SearchCandidate {
  assert.equal(result.candidates.length, 1);
  return result.candidates[0]!;
}

for (const c of fixture.iirOrders) {
  Deno.test(`searchDesigns: ${c.family} minimum order equals ${c.reference}: ${c.name}`, () => {
    // source: c.reference with fs in Hz, Debian SciPy 1.10.1 (test/reference/make_search.py).
    // SciPy also widens a bandstop's passband edges to lower the order; the search does too.
    const spec = iirCaseSpec(c);
    const found = only(searchDesigns(spec, { target: WIDE, methods: [c.family] }));
    assert.equal(found.status, "meets");
    assert.equal(found.size, c.order);
    // Checked independently: the design meets every requirement of the spec.
    assert.ok(checkSpec(found.design!, spec).every((r) => r.met));
  });
}

Deno.test("searchDesigns: textbook IIR orders (Oppenheim & Schafer's worked examples)", () => {
  // source: Oppenheim & Schafer, DTSP 3rd ed., Example 7.3 (from memory): bilinear Butterworth with
  // 0.89125 ≤ |H| for ω ≤ 0.2π and |H| ≤ 0.17783 for ω ≥ 0.3π needs N = 5.305 → 6.
  const butter = searchDesigns({
    fs: 2,
    requirements: [
      ripple(0, 0.2, -20 * Math.log10(0.89125)),
      stop(0.3, 1, -20 * Math.log10(0.17783)),
    ],
  }, { target: WIDE, methods: ["butterworth"] });
  assert.equal(only(butter).size, 6);
  // source: Oppenheim & Schafer, DTSP 3rd ed., §7.3 design comparisons (from memory):
  // 0.99 ≤ |H| ≤ 1.01 for ω ≤ 0.4π, |H| ≤ 0.001 for ω ≥ 0.6π: Butterworth 14, Chebyshev I and
  // II 8, elliptic 6.
  const comparison = searchDesigns({
    fs: 2,
    requirements: [
      ripple(0, 0.4, 20 * Math.log10(1.01 / 0.99)),
      stop(0.6, 1, 20 * Math.log10(1.01 / 0.001)),
    ],
  }, { target: WIDE, methods: ["butterworth", "chebyshev1", "chebyshev2", "elliptic"] });
  const order = Object.fromEntries(comparison.candidates.map((c) => [c.method, c.size]));
  assert.deepEqual(order, { butterworth: 14, chebyshev1: 8, chebyshev2: 8, elliptic: 6 });
});

for (const k of fixture.kaiser) {
  Deno.test(`searchDesigns: Kaiser window length starts at ${k.reference} (A = ${k.attenuationDb} dB, width ${k.transitionWidth} Hz at ${k.fs} Hz)`, () => {
    const fc = k.fs / 4;
    const w = k.transitionWidth;
    const spec: FilterSpec = {
      fs: k.fs,
      // A loose passband: the window's common δ is set by the stopband.
      requirements: [ripple(0, fc - w / 2, 1), stop(fc + w / 2, k.fs / 2, k.attenuationDb)],
    };
    const found = only(searchDesigns(spec, { target: WIDE, methods: ["kaiser"] }));
    // source: scipy.signal.kaiserord, Debian SciPy 1.10.1 (Kaiser 1974: N = (A − 7.95)/(14.36 Δf) + 1).
    assert.equal(found.estimate, k.length);
    // source: Oppenheim & Schafer, DTSP 3rd ed., §7.6 (from memory): the formula predicts the
    // order within ±2 over a wide range of specs.
    assert.ok(Math.abs(found.size - k.length) <= 2, `${found.size} taps vs ${k.length}`);
    assert.equal(found.status, "meets");
    // β at the estimated length is Kaiser's β for the required attenuation (1e-6 absolute).
    assertClose(kaiserBeta(k.attenuationDb), k.beta, { abs: 1e-6 }, "β");
  });
}

for (const e of fixture.equiripple) {
  Deno.test(`searchDesigns: smallest equiripple length equals ${e.reference}: ${e.name}`, () => {
    // source: scipy.signal.remez at every length upward, judged on scipy.signal.freqz grids,
    // Debian SciPy 1.10.1 (test/reference/make_search.py).
    const spec = equirippleCaseSpec(e);
    const result = searchDesigns(spec, { target: WIDE, methods: ["equiripple"] });
    const found = only(result);
    assert.equal(found.size, e.length);
    // The search bisects from the Herrmann–Rabiner–Chan estimate instead of crawling.
    assert.ok(result.trials.length <= 7, `${result.trials.length} designs`);
    assert.equal(result.trials[0]!.size % 2 === 1 || e.kinds[e.kinds.length - 1] === "stop", true);
    if (e.kinds.length === 2 && e.kinds[0] === "pass") {
      const hrc = estimateEquirippleLength({
        fs: e.fs,
        passbandEdge: e.bands[0]![1],
        stopbandEdge: e.bands[1]![0],
        passbandRippleDb: e.rippleDb,
        stopbandAttenuationDb: e.attenuationDb,
      }).length;
      assert.equal(found.estimate, hrc);
      // source: Oppenheim & Schafer, DTSP 3rd ed., §7.7 (from memory): for δp = 0.01, δs = 0.001,
      // 0.4π/0.6π the formula gives M = 26 and M = 27 is needed; lowpass estimates are within 2 taps.
      assert.ok(found.size - hrc >= 0 && found.size - hrc <= 2, `${found.size} vs HRC ${hrc}`);
    }
  });
}

Deno.test("searchDesigns: the chosen design meets every requirement when checked independently", () => {
  // common practice: re-check the chosen design outside the search, quantise it again, and run
  // the worst-case input through the exact integer simulation at the reported accumulator width.
  for (
    const [spec, decimation] of [[audioLowpass, 1], [narrowBandpass, 1], [decimator, 8]] as const
  ) {
    const result = searchDesigns(spec, { target: { ...TARGET16, decimation } });
    const chosen = result.chosen;
    assert.ok(chosen !== undefined, result.summary);
    assert.ok(checkSpec(chosen.design!, spec).every((r) => r.met), "floating point");
    assert.ok(checkSpec(chosen.quantisedDesign!, spec).every((r) => r.met), "quantised");
    if (chosen.stages === undefined) {
      const again = quantiseDesign(chosen.design!, 16);
      assert.deepEqual(again.design, chosen.quantisedDesign);
    }
    // Ranked cheapest first among those that meet.
    const meeting = result.candidates.filter((c) => c.status === "meets");
    for (let i = 1; i < meeting.length; i++) {
      assert.ok(meeting[i - 1]!.rankValue! <= meeting[i]!.rankValue!);
    }
    assert.equal(meeting[0], chosen);
  }
});

Deno.test("searchDesigns: the reported accumulator width holds a worst-case input in the integer simulation", () => {
  // source: L. B. Jackson, Digital Filters and Signal Processing, 3rd ed., §11.4: the largest
  // accumulator value is Σ|h|·full scale, reached by the input x[n − k] = sign(h[k]).
  const result = searchDesigns(audioLowpass, { target: TARGET16, methods: ["equiripple"] });
  const c = only(result);
  const row = c.quantisedResults.find((r) => r.name.startsWith("Accumulator width"))!;
  const q = c.quantisation![0]!;
  const codes = q.codes[0]!;
  const worst = Array.from(codes, (_, n) => (codes[codes.length - 1 - n]! >= 0 ? 1 : -1));
  const run = (bits: number) => runFixed(q, worst, { accumulatorBits: bits }).accumulatorOverflows;
  assert.equal(run(row.achieved), 0);
  assert.ok(run(row.achieved - 2) > 0, "two bits fewer overflow");
});

Deno.test("searchDesigns: the ranking follows the cost asked for", () => {
  // common practice: a multistage decimator needs the fewest multiplies, an IIR filter the
  // least delay and memory (decimate by 8, invented spec).
  const byMultiplies = searchDesigns(decimator, { target: { ...TARGET16, decimation: 8 } });
  assert.equal(byMultiplies.chosen?.method, "multistage");
  const stages = byMultiplies.chosen!.stages!.stages;
  assert.equal(stages.reduce((p, s) => p * s.factor, 1), 8);
  const methods: SearchOptions["methods"] = ["multistage", "equiripple", "elliptic"];
  for (const rankBy of ["latency", "memory"] as const) {
    const r = searchDesigns(decimator, { target: { ...TARGET16, decimation: 8 }, rankBy, methods });
    assert.equal(r.chosen?.method, "elliptic", rankBy);
    const values = r.candidates.filter((c) => c.status === "meets").map((c) => c.rankValue!);
    assert.deepEqual(values, [...values].sort((a, b) => a - b));
    const expected = rankBy === "latency"
      ? r.chosen!.cost!.latencySeconds
      : r.chosen!.cost!.memoryWords;
    assert.equal(r.chosen!.rankValue, expected);
  }
});

Deno.test("searchDesigns: a spec no method can meet names the nearest candidate and what it misses", () => {
  // common practice: a linear phase rules out IIR, and 10 samples of delay rule out an FIR long
  // enough for the attenuation.
  const spec: FilterSpec = {
    fs: 8000,
    requirements: [
      ripple(0, 1000, 0.5),
      stop(1500, 4000, 60),
      { kind: "groupDelayMaximum", from: 0, to: 1000, atMostSamples: 10, id: "D-1" },
      { kind: "linearPhase", from: 0, to: 1000, atMostDegrees: 5 },
    ],
  };
  const result = searchDesigns(spec, { target: TARGET16 });
  assert.equal(result.chosen, undefined);
  const nearest = result.nearest!;
  assert.ok(nearest !== undefined && nearest.status === "fails");
  const worst = nearest.failures[0]!;
  assert.ok(worst.result.margin < 0);
  assert.match(
    result.summary,
    new RegExp(`Nearest: ${nearest.label}.*misses "${worst.result.name}"`),
  );
  // Nearest means the largest worst relative margin among those that fail.
  for (const c of result.candidates.filter((x) => x.status === "fails")) {
    assert.ok(c.worst!.relativeMargin <= nearest.worst!.relativeMargin);
    assert.ok(c.failures.length > 0);
  }
  // Each IIR family fails the linear-phase or delay requirement, and none ran without bound.
  for (
    const c of result.candidates.filter((x) =>
      x.method === "elliptic" || x.method === "butterworth"
    )
  ) {
    assert.ok(c.failures.some((f) => /linear|Group delay/.test(f.result.name)));
    assert.match(c.reason ?? "", /stopped/);
  }
  assert.ok(result.limits.designsTried <= 200);
});

Deno.test("searchDesigns: IIR orders start at the order formula and only grow", () => {
  // source: Parks & Burrus, Digital Filter Design (1987): the formulas give the smallest order
  // meeting the band limits, so no lower order is tried.
  const result = searchDesigns(audioLowpass, { target: TARGET16 });
  for (
    const c of result.candidates.filter((x) => x.estimate !== undefined && x.method !== "kaiser")
  ) {
    const trials = result.trials.filter((t) => t.method === c.method);
    if (["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel"].includes(c.method)) {
      assert.equal(trials[0]!.size, c.estimate);
      assert.ok(trials.every((t) => t.size >= c.estimate!));
    }
    // Never a linear crawl: at most a few designs per method.
    assert.ok(trials.length <= 10, `${c.method}: ${trials.length} designs`);
  }
});

Deno.test("searchDesigns: a half-band filter where fs/4 lies in the transition band, lowpass or highpass", () => {
  // source: Vaidyanathan & Nguyen, IEEE Trans. CAS 34(3), 1987: a half-band filter has every
  // second tap zero, so it needs fewer multiplies than an equiripple filter of similar length.
  const fs = 48000;
  const low: FilterSpec = { fs, requirements: [ripple(0, 9000, 0.1), stop(15000, 24000, 70)] };
  const high: FilterSpec = { fs, requirements: [stop(0, 9000, 70), ripple(15000, 24000, 0.1)] };
  for (const spec of [low, high]) {
    const r = searchDesigns(spec, {
      target: { wordLength: 18, accumulatorBits: 48 },
      methods: ["halfband", "equiripple"],
    });
    const half = r.candidates.find((c) => c.method === "halfband")!;
    const equi = r.candidates.find((c) => c.method === "equiripple")!;
    assert.equal(half.status, "meets");
    const taps = (half.design as { kind: "fir"; taps: Float64Array }).taps;
    const centre = (taps.length - 1) / 2;
    assertClose(taps[centre]!, 0.5, { abs: 1e-12 }, "centre tap ½");
    for (let n = 2; n <= centre; n += 2) assert.equal(taps[centre + n], 0);
    assert.ok(half.cost!.multipliesPerOutput < equi.cost!.multipliesPerOutput);
    assert.equal(r.chosen, half);
    assert.ok(checkSpec(half.quantisedDesign!, spec).every((x) => x.met));
  }
  const notHalf = searchDesigns(audioLowpass, { target: TARGET16, methods: ["halfband"] });
  assert.equal(only(notHalf).status, "not applicable");
  assert.match(only(notHalf).reason!, /fs\/4 = 12000 Hz/);
});

Deno.test("searchDesigns: a nominal gain and a reference level carry into every design", () => {
  // common practice: a +6 dB passband and attenuation measured from that reference.
  const spec: FilterSpec = {
    fs: 8000,
    requirements: [
      { kind: "passbandDeviation", from: 0, to: 1000, atMostDb: 0.5, gainDb: 6 },
      { kind: "stopbandAttenuation", from: 1500, to: 4000, atLeastDb: 50, referenceDb: 6 },
    ],
  };
  const r = searchDesigns(spec, {
    target: TARGET16,
    methods: ["equiripple", "elliptic", "kaiser"],
  });
  for (const c of r.candidates) {
    assert.equal(c.status, "meets", c.label);
    assert.ok(checkSpec(c.quantisedDesign!, spec).every((x) => x.met));
  }
});

Deno.test("searchDesigns: decimation warns of aliasing into the passband", () => {
  // common practice: after decimation by M, fs/M − f aliases onto f.
  const spec: FilterSpec = {
    fs: 48000,
    requirements: [ripple(0, 2400, 0.2), stop(4000, 24000, 60)],
  };
  const r = searchDesigns(spec, {
    target: { ...TARGET16, decimation: 8 },
    methods: ["equiripple"],
  });
  assert.ok(r.warnings.some((w) => w.code === "aliasing-into-passband" && /3600/.test(w.message)));
  assert.equal(only(r).cost!.decimation, 8);
  const multistage = searchDesigns(spec, {
    target: { ...TARGET16, decimation: 16 },
    methods: ["multistage"],
  });
  assert.equal(only(multistage).status, "not applicable");
  assert.match(only(multistage).reason!, /passband edge 2400 Hz must lie below.*1500 Hz/);
});

Deno.test("searchDesigns: the design and time limits stop the search and say so", () => {
  const few = searchDesigns(audioLowpass, { target: TARGET16, maxDesigns: 3 });
  assert.equal(few.limits.designsTried, 3);
  assert.equal(few.limits.stoppedBy, "designs");
  assert.ok(
    few.candidates.some((c) => c.status === "skipped" && /number of designs/.test(c.reason!)),
  );
  assert.ok(few.warnings.some((w) => w.code === "search-limit"));
  const perMethod = searchDesigns(audioLowpass, {
    target: TARGET16,
    methods: ["equiripple"],
    maxDesignsPerMethod: 1,
  });
  assert.equal(only(perMethod).status, "fails");
  assert.match(only(perMethod).reason!, /limit of designs per method \(1\) was reached/);
  // A clock that advances one second per reading: the limit of 2.5 s allows two designs.
  let t = 0;
  const slow = searchDesigns(audioLowpass, {
    target: TARGET16,
    timeLimitMs: 2500,
    now: () => (t += 1000),
  });
  assert.equal(slow.limits.stoppedBy, "time");
  assert.ok(slow.limits.designsTried <= 2);
  assert.ok(slow.candidates.every((c) => c.status !== "meets" || c.design !== undefined));
});

Deno.test("searchDesigns: invalid options are refused with the rule", () => {
  const table: [SearchOptions, new (...a: never[]) => Error, RegExp][] = [
    [
      { target: { wordLength: 1, accumulatorBits: 40 } },
      RangeError,
      /Coefficient word length must be between 2 and 32, got 1/,
    ],
    [
      { target: { wordLength: 16, accumulatorBits: 200 } },
      RangeError,
      /Accumulator bits must be between 2 and 128/,
    ],
    [{ target: { ...TARGET16, decimation: 0 } }, RangeError, /Decimation factor/],
    [{ target: { ...TARGET16, dataBits: 40 } }, RangeError, /Data word length/],
    [
      { target: TARGET16, rankBy: "speed" as "latency" },
      TypeError,
      /rankBy must be one of multiplies, latency, memory/,
    ],
    [{ target: TARGET16, methods: ["remez" as "equiripple"] }, TypeError, /Method must be one of/],
    [{ target: TARGET16, methods: [] }, TypeError, /non-empty/],
    [{ target: TARGET16, maxDesigns: 0 }, RangeError, /Largest number of designs/],
    [{ target: TARGET16, timeLimitMs: 0 }, RangeError, /Time limit must be greater than 0 ms/],
    [{ target: TARGET16, latencyFrequency: 30000 }, RangeError, /fs\/2 = 24000 Hz/],
    [{ target: TARGET16, maxTaps: 2 }, RangeError, /Largest FIR length/],
    [{} as SearchOptions, TypeError, /Target must be an object/],
  ];
  for (const [options, kind, pattern] of table) {
    assertThrowsMatching(() => searchDesigns(audioLowpass, options), kind, pattern);
  }
});
