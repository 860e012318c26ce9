import assert from "node:assert/strict";
import { assembleWorksheet, blankStringsAndComments } from "../../runner/assemble.ts";
import { parseWorksheet } from "../../runner/parse.ts";

const sheetWith = (code: string) =>
  parseWorksheet("w.md", `---\ntitle: t\n---\n\nProse.\n\n\`\`\`ts\n${code}\n\`\`\`\n`);

Deno.test("assemble: every module line is the worksheet line of the same number", async () => {
  const text = await Deno.readTextFile(new URL("./fixtures/basic.md", import.meta.url));
  const ws = parseWorksheet("basic.md", text);
  const { module, problems } = assembleWorksheet(ws);
  assert.deepEqual(problems, []);
  const moduleLines = module.split("\n");
  const sourceLines = text.split("\n");
  for (const part of ws.parts) {
    if (part.kind !== "code") continue;
    for (let line = part.startLine; line <= part.endLine; line++) {
      assert.equal(moduleLines[line - 1], sourceLines[line - 1], `line ${line}`);
    }
    assert.equal(moduleLines[part.fenceLine - 1], `__tapsheetBlock(${part.index});`);
  }
  // Prose and the non-ts block are blank in the module.
  assert.equal(moduleLines[22], ""); // "Some prose."
  assert.equal(moduleLines[30], ""); // python block body
});

const rejected: [string, string, RegExp, number][] = [
  ["a relative import", 'import x from "../secret.ts";', /not "..\/secret.ts"/, 8],
  [
    "a JSON import",
    'import data from "/etc/x.json" with { type: "json" };',
    /not "\/etc\/x.json"/,
    8,
  ],
  ["a remote import", 'import "https://example.invalid/mod.ts";', /not "https:/, 8],
  ["an npm import", 'export { default } from "npm:left-pad";', /not "npm:left-pad"/, 8],
  ["dynamic import()", 'const m = await import("tapsheet");', /may not use import\(\)/, 8],
  ["import() on a later line", 'const a = 1;\nconst m = await import ("x");', /import\(\)/, 9],
  ["require", 'const fs = require("node:fs");', /'require'/, 8],
  ["a Worker", 'new Worker("file:///x.ts", { type: "module" });', /'Worker'/, 8],
];
for (const [what, code, message, line] of rejected) {
  Deno.test(`assemble: rejects ${what} at its worksheet line`, () => {
    const { problems } = assembleWorksheet(sheetWith(code));
    assert.ok(problems.length >= 1, "expected a problem");
    assert.match(problems[0]!.message, message);
    assert.equal(problems[0]!.line, line);
  });
}

const accepted: [string, string][] = [
  [
    "the two runner names",
    'import { sheet } from "tapsheet/sheet";\nimport * as t from "tapsheet";',
  ],
  ["type-only imports", 'import type { Section } from "tapsheet";'],
  ["import( inside a string", 'const s = "call import(x) here";'],
  ["import( inside a comment", "// import(x)\n/* require('x') */ const a = 1;"],
  ["import( inside a template", "const s = `import(${1 + 1})`;"],
  ["Array.from with a string", 'const a = Array.from("abc");'],
  ["a property named import", "const o = { import: 1 }; o.import;"],
];
for (const [what, code] of accepted) {
  Deno.test(`assemble: accepts ${what}`, () => {
    assert.deepEqual(assembleWorksheet(sheetWith(code)).problems, []);
  });
}

Deno.test("blankStringsAndComments keeps offsets and newlines", () => {
  const source = 'a("x\\"y") // c\n`t${b + "s"}u` /* d\ne */ f';
  const { code, strings } = blankStringsAndComments(source);
  assert.equal(code.length, source.length);
  assert.equal(code.split("\n").length, source.split("\n").length);
  assert.deepEqual(strings.map((s) => s.value), ['x"y', "s"]);
  assert.ok(code.includes("b +"));
  assert.ok(!code.includes("c"));
});
