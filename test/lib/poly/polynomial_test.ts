import assert from "node:assert";
import {
  evaluatePolynomial,
  multiplyPolynomials,
  polynomialFromRoots,
} from "../../../lib/poly/polynomial.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "./_match.ts";

Deno.test("polynomialFromRoots expands (x − 1)(x − 2)(x − 3) = x³ − 6x² + 11x − 6", () => {
  // source: elementary algebra (Vieta's formulas)
  const c = polynomialFromRoots([1, 2, 3].map((re) => ({ re, im: 0 })));
  assert.deepEqual([...c], [1, -6, 11, -6]);
});

Deno.test("polynomialFromRoots rejects roots without their conjugates", () => {
  assertThrowsMatching(() => polynomialFromRoots([{ re: 0, im: 1 }]), TypeError, /conjugate/);
  assertThrowsMatching(() => polynomialFromRoots([{ re: NaN, im: 0 }]), TypeError, /finite/);
});

Deno.test("multiplyPolynomials and evaluatePolynomial agree", () => {
  const a = [1, -2, 3];
  const b = [0.5, 4];
  const p = multiplyPolynomials(a, b);
  const x = { re: 0.3, im: -1.2 };
  const pa = evaluatePolynomial(a, x);
  const pb = evaluatePolynomial(b, x);
  const pp = evaluatePolynomial(p, x);
  assertClose(pp.re, pa.re * pb.re - pa.im * pb.im, { rel: 1e-14 }, "re");
  assertClose(pp.im, pa.re * pb.im + pa.im * pb.re, { rel: 1e-14 }, "im");
});
