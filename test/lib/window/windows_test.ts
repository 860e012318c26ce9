import assert from "node:assert/strict";
import {
  blackmanHarrisWindow,
  blackmanWindow,
  chebyshevWindow,
  exactBlackmanWindow,
  flatTopWindow,
  gaussianWindow,
  hammingWindow,
  hannWindow,
  rectangularWindow,
  tukeyWindow,
  type WindowOptions,
} from "../../../lib/window/mod.ts";
import { assertClose } from "../../_tolerance.ts";

interface WindowCase {
  window: string;
  length: number;
  options: Record<string, number>;
  symmetry: "symmetric" | "periodic";
  reference: string;
  values: number[];
}
const ref = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/analysis.json", import.meta.url)),
) as { windows: WindowCase[] };

const byName: Record<
  string,
  (n: number, o: WindowOptions & Record<string, unknown>) => Float64Array
> = {
  hann: hannWindow,
  hamming: hammingWindow,
  blackman: blackmanWindow,
  exactBlackman: exactBlackmanWindow,
  blackmanHarris: blackmanHarrisWindow,
  flatTop: flatTopWindow,
  chebyshev: chebyshevWindow,
  tukey: tukeyWindow,
  gaussian: gaussianWindow,
};

Deno.test("windows match SciPy within 1e-12", () => {
  assert.ok(ref.windows.length > 100);
  for (const c of ref.windows) {
    const make = byName[c.window];
    assert.ok(make, `no window ${c.window}`);
    const w = make(c.length, { ...c.options, symmetry: c.symmetry });
    // source: scipy.signal.windows (function and version named in each case's reference)
    assertClose(w, c.values, { abs: 1e-12 }, `${c.reference}`);
  }
});

Deno.test("symmetric windows are symmetric; periodic = symmetric N+1 without its last sample", () => {
  const makers = [hannWindow, blackmanHarrisWindow, flatTopWindow, exactBlackmanWindow];
  for (const make of makers) {
    for (const n of [9, 16]) {
      const s = make(n);
      for (let i = 0; i < n; i++) assertClose(s[i]!, s[n - 1 - i]!, { abs: 1e-15 }, make.name);
      const p = make(n, { symmetry: "periodic" });
      assertClose(p, make(n + 1).slice(0, n), { abs: 1e-15 }, `${make.name} periodic`);
    }
  }
  const c = chebyshevWindow(12, { sidelobeLevelDb: 80 });
  for (let i = 0; i < 12; i++) assertClose(c[i]!, c[11 - i]!, { abs: 1e-14 }, "chebyshev");
  assert.deepEqual([...rectangularWindow(3, { symmetry: "periodic" })], [1, 1, 1]);
});

Deno.test("Tukey window limits: α = 0 is rectangular, α = 1 is Hann (Harris 1978 §V-D)", () => {
  assert.deepEqual([...tukeyWindow(8, { taperFraction: 0 })], [...rectangularWindow(8)]);
  assertClose(tukeyWindow(33, { taperFraction: 1 }), hannWindow(33), { abs: 1e-15 }, "Hann");
});

Deno.test("bad window parameters", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => hannWindow(0), RangeError, "Window length must be at least 1, got 0"],
    [() => hannWindow(2.5), RangeError, "must be an integer"],
    [
      () => hannWindow(4, { symmetry: "even" as unknown as "periodic" }),
      TypeError,
      'symmetric" or "periodic", got "even"',
    ],
    [
      () => chebyshevWindow(8, { sidelobeLevelDb: -3 }),
      RangeError,
      "Sidelobe level must be between 1 dB and 300 dB, got -3 dB",
    ],
    [
      () => tukeyWindow(8, { taperFraction: 1.5 }),
      RangeError,
      "Taper fraction must be between 0 and 1, got 1.5",
    ],
    [
      () => gaussianWindow(8, { standardDeviation: 0 }),
      RangeError,
      "Standard deviation must be greater than 0 samples",
    ],
    [() => gaussianWindow(8, { standardDeviation: Number.NaN }), TypeError, "finite number"],
  ];
  for (const [run, kind, text] of cases) {
    assert.throws(
      run,
      (e: unknown) => e instanceof kind && (e as Error).message.includes(text),
      text,
    );
  }
});

Deno.test("cosine-sum windows follow their defining formulas", () => {
  // source: F. J. Harris, Proc. IEEE 66(1), 1978, eqs. (27a) Hann, (30) Hamming, (32) Blackman;
  // symmetric form with M = N − 1, periodic with M = N.
  const formulas: [string, (n: number, o: WindowOptions) => Float64Array, (x: number) => number][] =
    [
      ["hann", hannWindow, (x) => 0.5 - 0.5 * Math.cos(2 * Math.PI * x)],
      ["hamming", hammingWindow, (x) => 0.54 - 0.46 * Math.cos(2 * Math.PI * x)],
      [
        "blackman",
        blackmanWindow,
        (x) => 0.42 - 0.5 * Math.cos(2 * Math.PI * x) + 0.08 * Math.cos(4 * Math.PI * x),
      ],
    ];
  for (const [name, make, formula] of formulas) {
    for (const length of [2, 7, 16, 33]) {
      const symmetric = Array.from({ length }, (_, n) => formula(n / (length - 1)));
      const periodic = Array.from({ length }, (_, n) => formula(n / length));
      assertClose(make(length, {}), symmetric, { abs: 1e-15 }, `${name} symmetric ${length}`);
      assertClose(
        make(length, { symmetry: "periodic" }),
        periodic,
        { abs: 1e-15 },
        `${name} periodic ${length}`,
      );
    }
  }
  assertClose(rectangularWindow(5), [1, 1, 1, 1, 1], { abs: 0 }, "rectangular");
});
