// The child's messages: encodeMessage/decodeMessage take the fast plain JSON
// path only when it gives exactly what the replacer and reviver give.
// source: ECMA-262 JSON.stringify/JSON.parse (a string holding U+0000 is
// written with the escape \u0000, JSON having no raw control characters), and
// RFC 8259 section 7 (any character may be written as a \uXXXX escape).
import assert from "node:assert/strict";
import {
  decodeMessage,
  decodeNumbers,
  encodeMessage,
  encodeNumbers,
  nonFiniteMark,
} from "../../runner/harness_protocol.ts";

/** A random message-like value: nested objects and arrays of numbers, text and flags. */
function randomValue(next: () => number, depth: number): unknown {
  const r = next();
  if (depth > 3 || r < 0.3) {
    const pick = next();
    if (pick < 0.05) return Infinity;
    if (pick < 0.08) return -Infinity;
    if (pick < 0.1) return NaN;
    if (pick < 0.6) return (next() - 0.5) * 1e6;
    if (pick < 0.8) return ["fs", "Hz", "\u0000", `${nonFiniteMark}x`, ""][Math.floor(next() * 5)];
    return pick < 0.9 ? next() < 0.5 : null;
  }
  if (r < 0.6) {
    return Array.from({ length: Math.floor(next() * 6) }, () => randomValue(next, depth + 1));
  }
  const out: Record<string, unknown> = {};
  for (let i = 0; i < Math.floor(next() * 5); i++) out[`k${i}`] = randomValue(next, depth + 1);
  return out;
}

Deno.test("harness protocol: encodeMessage writes what JSON.stringify with encodeNumbers writes", () => {
  let seed = 12345;
  const next = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
  let marked = 0;
  for (let i = 0; i < 2000; i++) {
    const value = randomValue(next, 0);
    const expected = JSON.stringify(value, encodeNumbers);
    if (expected?.includes(nonFiniteMark.replace("\u0000", "\\u0000"))) marked++;
    assert.equal(encodeMessage(value), expected);
  }
  assert.ok(marked > 100, "the sample holds non-finite numbers");
  const series = { x: Float64Array.from([0, 1, Infinity]), y: new Float32Array([NaN, 2]) };
  assert.equal(encodeMessage(series), JSON.stringify(series, encodeNumbers));
  assert.equal(encodeMessage({ x: [1, 2, 3] }), '{"x":[1,2,3]}');
  const cyclic: Record<string, unknown> = { a: 1 };
  cyclic.self = cyclic;
  assert.throws(() => encodeMessage(cyclic), TypeError);
});

Deno.test("harness protocol: decodeMessage reads what JSON.parse with decodeNumbers reads, escapes included", () => {
  const texts = [
    '{"y":[1,2,3],"name":"plain"}',
    JSON.stringify({ y: [1, Infinity, NaN, -Infinity] }, encodeNumbers),
    // The mark written with other escapes: still one string holding U+0000.
    '{"v":"\\u0000\\u006eumber:Infinity"}',
    '{"v":"\\u0000number:-Infinity","w":"\\u0000"}',
    '{"v":"\\\\u0000number:Infinity"}', // a backslash, then text: no U+0000 at all
    '{"v":"number:NaN"}',
  ];
  for (const text of texts) {
    assert.deepEqual(decodeMessage(text), JSON.parse(text, decodeNumbers), text);
  }
  assert.deepEqual(decodeMessage(texts[2]!), { v: Infinity });
  assert.throws(() => decodeMessage("{"), SyntaxError);
});
