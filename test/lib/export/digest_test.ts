import assert from "node:assert";
import { coefficientDigest, coefficientList } from "../../../lib/mod.ts";
import { sha256Hex } from "../../../lib/export/_sha256.ts";
import { referenceCase } from "../verify/_fixture.ts";

const text = (s: string) => new TextEncoder().encode(s);

Deno.test("SHA-256 matches the FIPS 180-4 examples", () => {
  // source: NIST FIPS 180-4 / CSRC example values for SHA-256
  assert.equal(
    sha256Hex(text("abc")),
    "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
  );
  assert.equal(
    sha256Hex(text("")),
    "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855",
  );
  assert.equal(
    sha256Hex(text("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq")),
    "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1",
  );
});

Deno.test("SHA-256 agrees with Web Crypto across block-padding boundaries", async () => {
  for (const n of [1, 55, 56, 57, 63, 64, 65, 119, 120, 128, 1000]) {
    const data = new Uint8Array(n);
    for (let i = 0; i < n; i++) data[i] = (i * 131 + 7) & 0xff;
    // source: Deno's Web Crypto crypto.subtle.digest("SHA-256") as the outside reference
    const ref = new Uint8Array(await crypto.subtle.digest("SHA-256", data));
    const hex = Array.from(ref, (b) => b.toString(16).padStart(2, "0")).join("");
    assert.equal(sha256Hex(data), hex, `${n} bytes`);
  }
});

Deno.test("coefficient digest equals Python hashlib over numpy '<f8' bytes", () => {
  for (const name of ["fir31", "butter4"]) {
    const c = referenceCase(name);
    // source: hashlib.sha256(numpy.asarray(c, "<f8").tobytes()) in test/reference/make_verify.py
    assert.equal(coefficientDigest(c.design), c.sha256, name);
  }
  const list = coefficientList({ kind: "rational", numerator: [1, 2], denominator: [1, -0.5] });
  assert.deepEqual(Array.from(list), [1, 2, 1, -0.5]);
});
