import assert from "node:assert/strict";
import {
  blackmanHarrisWindow,
  blackmanWindow,
  chebyshevWindow,
  exactBlackmanWindow,
  flatTopWindow,
  hammingWindow,
  hannWindow,
  rectangularWindow,
  windowMetrics,
} from "../../../lib/window/mod.ts";
import { assertClose } from "../../_tolerance.ts";

// source: F. J. Harris, "On the use of windows for harmonic analysis with the discrete
// Fourier transform", Proc. IEEE 66(1), 1978, Table I — values recalled from memory
// (not looked up), periodic ("DFT-even") windows. The table rounds to 0.01 (gains,
// bandwidths, losses) and 1 dB (sidelobes), so tolerances are half a unit of the last
// digit plus a little. Table entries recalled as Hamming scalloping loss 1.78 dB and
// Blackman 3/6 dB widths 1.68/2.35, Blackman–Harris 6 dB width 2.72 disagree with the
// values the definitions give (1.75, 1.64/2.30, 2.66); they are not asserted here.
const N = 1024;
const periodic = { symmetry: "periodic" } as const;
const table = [
  {
    name: "rectangular",
    w: rectangularWindow(N),
    cg: 1.0,
    enbw: 1.0,
    sl: 3.92,
    hsl: -13,
    bw3: 0.89,
    bw6: 1.21,
  },
  {
    name: "Hann",
    w: hannWindow(N, periodic),
    cg: 0.5,
    enbw: 1.5,
    sl: 1.42,
    hsl: -32,
    bw3: 1.44,
    bw6: 2.0,
  },
  {
    name: "Hamming",
    w: hammingWindow(N, periodic),
    cg: 0.54,
    enbw: 1.36,
    hsl: -43,
    bw3: 1.3,
    bw6: 1.81,
  },
  { name: "Blackman", w: blackmanWindow(N, periodic), cg: 0.42, enbw: 1.73, sl: 1.1, hsl: -58 },
  {
    name: "Blackman-Harris 4-term",
    w: blackmanHarrisWindow(N, periodic),
    cg: 0.36,
    enbw: 2.0,
    sl: 0.83,
    hsl: -92,
    bw3: 1.9,
  },
];

Deno.test("window metrics agree with Harris 1978, Table I", () => {
  for (const row of table) {
    const m = windowMetrics(row.w);
    assertClose(m.coherentGain, row.cg, { abs: 0.006 }, `${row.name} coherent gain`);
    assertClose(m.equivalentNoiseBandwidth, row.enbw, { abs: 0.006 }, `${row.name} ENBW`);
    if (row.sl !== undefined) {
      assertClose(m.scallopingLossDb, row.sl, { abs: 0.006 }, `${row.name} scalloping`);
    }
    assertClose(m.highestSidelobeDb, row.hsl, { abs: 0.55 }, `${row.name} sidelobe`);
    if (row.bw3 !== undefined) {
      assertClose(m.bandwidth3Db, row.bw3, { abs: 0.006 }, `${row.name} 3 dB width`);
    }
    if (row.bw6 !== undefined) {
      assertClose(m.bandwidth6Db, row.bw6, { abs: 0.006 }, `${row.name} 6 dB width`);
    }
  }
});

Deno.test("window metrics match closed forms (facts of the trade)", () => {
  // Rectangular: |W(ν)| = |sin(πν)/(N sin(πν/N))|, so the scalloping loss is
  // −20·log10(1/(N sin(π/(2N)))) → 3.9224 dB and the first sidelobe −13.26 dB (common practice).
  const r = windowMetrics(rectangularWindow(N));
  assertClose(r.scallopingLossDb, -20 * Math.log10(1 / (N * Math.sin(Math.PI / (2 * N)))), {
    abs: 1e-9,
  }, "rect scalloping");
  assertClose(r.highestSidelobeDb, -13.26, { abs: 0.01 }, "rect sidelobe");
  // Hann periodic: ENBW = 1.5 bins exactly (Σw² / (Σw)²·N = (3N/8)/(N²/4)·N).
  assertClose(
    windowMetrics(hannWindow(64, periodic)).equivalentNoiseBandwidth,
    1.5,
    { rel: 1e-13 },
    "Hann ENBW",
  );
  // Dolph–Chebyshev: every sidelobe at the design level (Harris 1978 §V-H).
  assertClose(windowMetrics(chebyshevWindow(63, { sidelobeLevelDb: 60 })).highestSidelobeDb, -60, {
    abs: 1e-6,
  }, "Chebyshev 60");
  assertClose(windowMetrics(chebyshevWindow(64, { sidelobeLevelDb: 90 })).highestSidelobeDb, -90, {
    abs: 1e-6,
  }, "Chebyshev 90");
  // Exact Blackman −68 dB (Harris 1978 §V-E); flat top: scalloping loss about 0.01 dB (from memory).
  assertClose(
    windowMetrics(exactBlackmanWindow(N, periodic)).highestSidelobeDb,
    -68,
    { abs: 0.5 },
    "exact Blackman",
  );
  assert.ok(
    windowMetrics(flatTopWindow(N, periodic)).scallopingLossDb < 0.02,
    "flat top scalloping",
  );
});

Deno.test("window metrics reject unusable windows", () => {
  assert.throws(
    () => windowMetrics([1]),
    (e: unknown) => e instanceof RangeError && e.message.includes("at least 2"),
  );
  assert.throws(
    () => windowMetrics([1, -1]),
    (e: unknown) => e instanceof RangeError && e.message.includes("non-zero sum"),
  );
  assert.throws(() => windowMetrics([1, Number.POSITIVE_INFINITY]), TypeError);
});
