import assert from "node:assert";
import { polynomialRoots } from "../../../lib/poly/roots.ts";
import { evaluatePolynomial, polynomialFromRoots } from "../../../lib/poly/polynomial.ts";
import { assertSameMultiset, assertThrowsMatching, complexList } from "./_match.ts";
import { assertClose } from "../../_tolerance.ts";

interface RootCase {
  name: string;
  reference: string;
  version: string;
  coefficients: number[];
  roots: number[][];
}
const fixture = JSON.parse(
  await Deno.readTextFile(new URL("../../reference/iir.json", import.meta.url)),
) as { polynomialRoots: RootCase[] };

// Tolerances: 1e-9 relative where the roots are well conditioned; the
// Wilkinson-like case has root condition numbers near 1e7, so the two
// methods (Aberth here, companion eigenvalues there) can only agree to ~1e-7.
const tolerance: Record<string, number> = {
  "Wilkinson-like degree 10 (roots 1..10)": 1e-7,
};

for (const c of fixture.polynomialRoots) {
  Deno.test(`polynomialRoots matches ${c.reference}: ${c.name}`, () => {
    // source: numpy.roots (companion-matrix eigenvalues), NumPy 1.24.2 — c.version
    const rel = tolerance[c.name] ?? 1e-9;
    assertSameMultiset(polynomialRoots(c.coefficients), complexList(c.roots), {
      rel,
      abs: 1e-14,
    }, c.name);
  });
}

Deno.test("polynomialRoots returns exact conjugate pairs and real roots with zero imaginary part", () => {
  const r = polynomialRoots(fixture.polynomialRoots[4]!.coefficients);
  let realCount = 0;
  for (const z of r) {
    if (z.im === 0) realCount++;
    else assert.ok(r.some((w) => w.re === z.re && w.im === -z.im), "conjugate present");
  }
  assert.equal((r.length - realCount) % 2, 0);
});

Deno.test("polynomialRoots: trailing zeros are exact roots at the origin, leading zeros dropped", () => {
  const r = polynomialRoots([0, 0, 1, -3, 2, 0, 0]); // x²(x − 1)(x − 2)
  assert.equal(r.length, 4);
  assert.equal(r.filter((z) => z.re === 0 && z.im === 0).length, 2);
  assertClose(r.map((z) => z.re).sort((a, b) => a - b), [0, 0, 1, 2], { abs: 1e-15 }, "roots");
});

Deno.test("polynomialRoots: residuals are at rounding level on a degree-40 polynomial", () => {
  // common practice: a backward-stable root finder leaves |p(r)| ≈ ε·Σ|c_k||r|^(n−k).
  const c = Array.from({ length: 41 }, (_, k) => Math.cos(1.3 * k * k) + (k === 0 ? 2 : 0));
  for (const z of polynomialRoots(c)) {
    const p = evaluatePolynomial(c, z);
    const m = Math.hypot(z.re, z.im);
    let bound = 0;
    for (let k = 0; k < c.length; k++) bound += Math.abs(c[k]!) * m ** (c.length - 1 - k);
    assert.ok(Math.hypot(p.re, p.im) <= 1e-12 * bound, `residual at ${z.re}+${z.im}j`);
  }
});

Deno.test("polynomialRoots round-trips through polynomialFromRoots", () => {
  const c = [2, -3, 0.5, 7, -1, 4];
  const back = polynomialFromRoots(polynomialRoots(c));
  assertClose(back, c.map((v) => v / 2), { rel: 1e-12, abs: 1e-13 }, "coefficients");
});

Deno.test("polynomialRoots: invalid input", () => {
  assertThrowsMatching(() => polynomialRoots([0, 0]), RangeError, /non-zero/);
  assertThrowsMatching(() => polynomialRoots([1, NaN]), TypeError, /finite/);
  assertThrowsMatching(() => polynomialRoots([]), RangeError, /at least 1/);
  assert.deepEqual(polynomialRoots([5]), []);
});

Deno.test("polynomialRoots finds a root near 3e15 beside roots near 1", () => {
  // (x − 3e15)(x − 1)(x + 2)(x² + 1): roots of very different sizes.
  const c = polynomialFromRoots(
    [3e15, 1, -2].map((re) => ({ re, im: 0 })).concat([
      { re: 0, im: 1 },
      { re: 0, im: -1 },
    ]),
  );
  const r = polynomialRoots(c);
  assertSameMultiset(
    r,
    [
      { re: 3e15, im: 0 },
      { re: 1, im: 0 },
      { re: -2, im: 0 },
      { re: 0, im: 1 },
      { re: 0, im: -1 },
    ],
    { rel: 1e-12, abs: 1e-14 },
    "spread roots",
  );
});

Deno.test("polynomialRoots: a 4-fold root is found to about ε^(1/4)", () => {
  // common practice (Wilkinson): an m-fold root is determined only to ~ε^(1/m) by rounded coefficients.
  const r = polynomialRoots([1, -4, 6, -4, 1]); // (x − 1)⁴
  assert.equal(r.length, 4);
  for (const z of r) assert.ok(Math.hypot(z.re - 1, z.im) < 1e-3, `${z.re}+${z.im}j`);
});
