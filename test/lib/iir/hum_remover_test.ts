import assert from "node:assert";
import { designHumRemover } from "../../../lib/iir/hum_remover.ts";
import { sectionsResponse } from "../../../lib/iir/analysis.ts";
import { assertClose } from "../../_tolerance.ts";
import { assertThrowsMatching } from "../poly/_match.ts";
import { fixture } from "./_fixture.ts";

Deno.test(`designHumRemover notch equals ${fixture.notch.reference}`, () => {
  // source: scipy.signal.iirnotch(f0, Q, fs) — a notch of −3 dB width f0/Q — Debian SciPy 1.10.1.
  for (const c of fixture.notch.cases) {
    const mains = c.frequency % 50 === 0 ? 50 : 60;
    const k = c.frequency / mains;
    const hum = designHumRemover({
      fs: c.fs,
      mainsFrequency: mains,
      harmonics: k,
      bandwidth: c.frequency / c.q,
    });
    const s = hum.sections[k - 1]!;
    assert.equal(c.a[0], 1);
    assertClose(
      [s.b0, s.b1, s.b2, s.a1, s.a2],
      [c.b[0], c.b[1], c.b[2], c.a[1], c.a[2]],
      { rel: 1e-13, abs: 1e-16 },
      `${c.frequency} Hz`,
    );
  }
});

Deno.test("designHumRemover: nulls at every harmonic, −3 dB points exactly `bandwidth` apart", () => {
  // source: Mitra, Digital Signal Processing, ch. 7 notch bandwidth relation (see hum_remover.ts).
  const fs = 1000;
  const hum = designHumRemover({ fs, mainsFrequency: 50, harmonics: 4, bandwidth: 3 });
  assert.deepEqual(hum.frequencies, [50, 100, 150, 200]);
  const mag = (s: typeof hum.sections, f: number) => {
    const h = sectionsResponse(s, [f], fs);
    return Math.hypot(h.re[0]!, h.im[0]!);
  };
  for (const f of hum.frequencies) assert.ok(mag(hum.sections, f) < 1e-12, `null at ${f}`);
  assertClose(mag(hum.sections, 0), 1, { abs: 1e-12 }, "DC");
  // −3 dB edges of the first notch alone, by bisection on each side.
  const one = [hum.sections[0]!];
  const edge = (lo: number, hi: number, rising: boolean) => {
    for (let i = 0; i < 100; i++) {
      const mid = (lo + hi) / 2;
      if ((mag(one, mid) ** 2 < 0.5) === rising) lo = mid;
      else hi = mid;
    }
    return (lo + hi) / 2;
  };
  const upper = edge(50, 100, true);
  const lower = edge(0, 50, false);
  assertClose(upper - lower, 3, { rel: 1e-9 }, "−3 dB width");
});

Deno.test("designHumRemover drops harmonics at fs/2 with a warning", () => {
  const hum = designHumRemover({ fs: 500, mainsFrequency: 60, harmonics: 10 });
  assert.deepEqual(hum.frequencies, [60, 120, 180, 240]);
  assert.equal(hum.warnings[0]?.code, "harmonics-dropped");
});

Deno.test("designHumRemover rejects bad input", () => {
  assertThrowsMatching(
    () => designHumRemover({ fs: 1000, mainsFrequency: 55 as 50 }),
    RangeError,
    /50 or 60 Hz, got 55 Hz/,
  );
  assertThrowsMatching(
    () => designHumRemover({ fs: 100, mainsFrequency: 50 }),
    RangeError,
    /below fs\/2 = 50 Hz, got 50 Hz/,
  );
  assertThrowsMatching(
    () => designHumRemover({ fs: 1000, mainsFrequency: 50, harmonics: 0 }),
    RangeError,
    /harmonics must be between 1 and 100, got 0/,
  );
  assertThrowsMatching(
    () => designHumRemover({ fs: 1000, mainsFrequency: 50, bandwidth: 0 }),
    RangeError,
    /bandwidth must be greater than 0 Hz/,
  );
  assertThrowsMatching(
    () => designHumRemover({ fs: 1000, mainsFrequency: 50, bandwidth: 60 }),
    RangeError,
    /below the mains frequency 50 Hz, got 60 Hz/,
  );
});
