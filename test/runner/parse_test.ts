import assert from "node:assert/strict";
import { parseWorksheet, WorksheetError } from "../../runner/parse.ts";

const fixture = new URL("./fixtures/basic.md", import.meta.url);

Deno.test("parse: identity, params, sign-off and parts with line ranges", async () => {
  const text = await Deno.readTextFile(fixture);
  const ws = parseWorksheet("basic.md", text);
  assert.deepEqual(ws.meta, {
    title: "Basic fixture",
    document: "FX-1",
    revision: "2",
    signoff: [{ role: "Designer" }, { role: "Reviewer", name: "Q. Checker" }],
  });
  assert.deepEqual(ws.params, {
    fs: 48000,
    gains: [1, 2.5],
    name: "demo",
    enabled: true,
    cutoff: 1000,
  });
  assert.deepEqual(ws.paramRules, { cutoff: { min: 10, max: 20000, unit: "Hz" } });
  const summary = ws.parts.map((p) =>
    p.kind === "code"
      ? ["code", p.index, p.fenceLine, p.startLine, p.endLine, p.code]
      : ["prose", p.startLine, p.endLine]
  );
  assert.deepEqual(summary, [
    ["prose", 20, 24],
    [
      "code",
      0,
      25,
      26,
      27,
      'import { sheet } from "tapsheet/sheet";\nconst fs = sheet.number("fs");',
    ],
    ["prose", 28, 33],
    ["code", 1, 34, 35, 35, "console.log(fs / 2);"],
  ]);
  // Each code line sits on the worksheet line the parser says it does.
  const lines = text.split("\n");
  for (const p of ws.parts) {
    if (p.kind === "code") assert.equal(lines[p.startLine - 1], p.code.split("\n")[0]);
  }
});

Deno.test("parse: CRLF line endings give the same result", async () => {
  const text = await Deno.readTextFile(fixture);
  const a = parseWorksheet("x.md", text);
  const b = parseWorksheet("x.md", text.replaceAll("\n", "\r\n"));
  assert.deepEqual(b.parts, a.parts);
});

const bad: [string, string, number, RegExp][] = [
  ["no front matter", "# Title\n", 1, /must start with front matter/],
  ["unclosed front matter", "---\ntitle: x\n", 1, /no closing/],
  ["bad YAML", "---\ntitle: x\nsettings: [1,\n---\n", 3, /not valid YAML/],
  ["missing title", "---\ndocument: D\n---\n", 1, /must have 'title:'/],
  [
    "param of wrong type",
    "---\ntitle: x\nsettings:\n  fs: 8000\n  bands: [1, two]\n---\n",
    5,
    /'bands'.*list that is not all numbers/,
  ],
  ["param null", "---\ntitle: x\nsettings:\n  fs:\n---\n", 4, /'fs'.*null/],
  [
    "param declaration without value",
    "---\ntitle: x\nsettings:\n  fs: { min: 1 }\n---\n",
    4,
    /declare 'value:'/,
  ],
  ["unclosed fence", "---\ntitle: x\n---\n\ntext\n\n```ts\nconst a = 1;\n", 7, /never closed/],
];
for (const [what, text, line, message] of bad) {
  Deno.test(`parse: ${what} → error at its line`, () => {
    assert.throws(() => parseWorksheet("bad.md", text), (e: unknown) => {
      assert.ok(e instanceof WorksheetError, String(e));
      assert.equal(e.problem.path, "bad.md");
      assert.equal(e.problem.line, line, e.message);
      assert.match(e.problem.message, message);
      return true;
    });
  });
}

Deno.test("parse: marked's block level alone gives the same top-level tokens as its whole lexer", async () => {
  // source: marked 18.2.1's own Lexer.lex (block and inline), against which the
  // block-only pass parseWorksheet uses is checked, over every worksheet of the project
  // plus constructs that could make the two disagree
  const { Lexer } = await import("marked");
  const folders = ["../../worksheets/", "../../worksheets/templates/", "./fixtures/", "./hostile/"];
  const bodies: string[] = [
    "Text with `code` and *emphasis*\n\n```ts\nconst a = 1;\n```\n\n- a list\n\n  ```ts\n  nested\n  ```\n",
    "[ref]: https://example.org\n\n> quote\n> ```ts\n> inside\n> ```\n\n| a | b |\n|---|---|\n| 1 | 2 |\n",
    "<div>\n\n```ts\nhtml around\n```\n\n</div>\n\n    indented\n    ```ts\n",
    "Heading\n===\n\n~~~ts\ntilde\n~~~\n\n````ts\n```\nfour\n````\n",
  ];
  for (const folder of folders) {
    for await (const e of Deno.readDir(new URL(folder, import.meta.url))) {
      if (!e.name.endsWith(".md")) continue;
      const text = await Deno.readTextFile(new URL(folder + e.name, import.meta.url));
      bodies.push(text.replace(/\r\n?/g, "\n"));
    }
  }
  assert.ok(bodies.length > 30);
  for (const body of bodies) {
    const top = (tokens: { type: string; raw: string }[]) => tokens.map((t) => [t.type, t.raw]);
    assert.deepEqual(top(new Lexer().blockTokens(body)), top(Lexer.lex(body)));
  }
});
