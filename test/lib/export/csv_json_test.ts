import assert from "node:assert";
import {
  coefficientDigest,
  coefficientsCsv,
  coefficientsJson,
  qFormat,
  quantiseValues,
} from "../../../lib/mod.ts";
import { referenceCase } from "../verify/_fixture.ts";

Deno.test("CSV round-trips every double exactly and holds the Q15 codes", () => {
  const c = referenceCase("fir31");
  const taps = c.design.kind === "fir" ? Array.from(c.design.taps) : [];
  const csv = coefficientsCsv(c.design, { formats: ["float", "q15"] });
  const rows = csv.trim().split("\n").map((l) => l.split(","));
  assert.deepEqual(rows[0], ["index", "value", "q15"]);
  const q15 = quantiseValues(taps, qFormat(16, 15)).codes;
  taps.forEach((v, i) => {
    assert.equal(Number(rows[i + 1]![1]), v);
    assert.equal(Number(rows[i + 1]![2]), q15[i]);
  });
  const s = coefficientsCsv(referenceCase("butter4").design);
  assert.equal(s.split("\n")[0], "section,coefficient,value");
  assert.equal(s.split("\n")[6], "2,b0,1");
});

Deno.test("JSON holds identity, exact coefficients, digest and codes", () => {
  const c = referenceCase("butter4");
  const doc = JSON.parse(
    coefficientsJson(c.design, {
      name: "ecg_lp",
      fs: 500,
      document: "NV-ECG2-FLT-007",
      revision: "C",
      formats: ["q15", qFormat(16, 13)],
    }),
  );
  assert.equal(doc.document, "NV-ECG2-FLT-007");
  assert.equal(doc.sampleRateHz, 500);
  assert.equal(doc.structure, "sections");
  assert.equal(doc.sha256, coefficientDigest(c.design));
  // source: hashlib over numpy '<f8' bytes (make_verify.py)
  assert.equal(doc.sha256, c.sha256);
  assert.deepEqual(
    doc.coefficients.sections,
    c.design.kind === "sections" ? c.design.sections : [],
  );
  const q = doc.fixedPoint[1];
  assert.equal(q.name, "q2_13");
  assert.deepEqual(q.fractionBits, [13, 13]);
  assert.equal(q.codes.sections[1].b1, 2 * 8192);
  // Q15 cannot hold b1 = 2 of section 2: saturation is counted, not hidden.
  assert.ok(doc.fixedPoint[0].saturated > 0);
});
