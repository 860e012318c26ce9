import { completeEllipticIntegral, jacobiElliptic } from "../../../lib/iir/elliptic_functions.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { fixture } from "./_fixture.ts";

Deno.test(`completeEllipticIntegral matches ${fixture.ellipticK.reference}`, () => {
  // source: scipy.special.ellipk, Debian SciPy 1.10.1 (make_iir.py); 1e-14 relative (full precision
  // except right at m → 1, where the argument 1 − m itself carries the rounding).
  const { m, K } = fixture.ellipticK;
  m.forEach((mi: number, i: number) => {
    const rel = mi > 0.9999 ? 1e-9 : 2e-15;
    assertClose(completeEllipticIntegral(mi), K[i], { rel }, `K(${mi})`);
  });
});

Deno.test(`jacobiElliptic matches ${fixture.jacobi.reference}`, () => {
  // source: scipy.special.ellipj, Debian SciPy 1.10.1 (make_iir.py); 1e-13 absolute.
  for (const c of fixture.jacobi.cases) {
    const v = jacobiElliptic(c.u, c.m);
    assertClose(v.sn, c.sn, { abs: 1e-13 }, `sn(${c.u}|${c.m})`);
    assertClose(v.cn, c.cn, { abs: 1e-13 }, `cn(${c.u}|${c.m})`);
    assertClose(v.dn, c.dn, { abs: 1e-13 }, `dn(${c.u}|${c.m})`);
  }
});

Deno.test("Jacobi identities sn² + cn² = 1 and dn² + m·sn² = 1", () => {
  // source: Abramowitz & Stegun 16.9.1
  for (const m of [0.05, 0.5, 0.95, 0.999999]) {
    for (const u of [0.1, 0.9, 2.2, 7.5]) {
      const v = jacobiElliptic(u, m);
      assertClose(v.sn ** 2 + v.cn ** 2, 1, { abs: 1e-15 }, "sn² + cn²");
      assertClose(v.dn ** 2 + m * v.sn ** 2, 1, { abs: 1e-14 }, "dn² + m sn²");
    }
  }
});

Deno.test("K(0) = π/2 and K(1/2) from the lemniscate constant", () => {
  // source: Abramowitz & Stegun 17.3.11 and Table 17.1: K(1/2) = Γ(1/4)²/(4√π) = 1.854074677301372
  assertClose(completeEllipticIntegral(0), Math.PI / 2, { rel: 1e-16 }, "K(0)");
  assertClose(completeEllipticIntegral(0.5), 1.854074677301372, { rel: 1e-15 }, "K(1/2)");
});

Deno.test("elliptic functions reject bad parameters", () => {
  assertThrowsMatching(() => completeEllipticIntegral(1), RangeError, /\[0, 1\), got 1/);
  assertThrowsMatching(() => completeEllipticIntegral(-0.1), RangeError, /got -0.1/);
  assertThrowsMatching(() => jacobiElliptic(1, 1.5), RangeError, /between 0 and 1, got 1.5/);
  assertThrowsMatching(() => jacobiElliptic(NaN, 0.5), TypeError, /finite/);
});
