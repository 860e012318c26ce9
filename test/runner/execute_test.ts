import assert from "node:assert/strict";
import { executeWorksheet } from "../../runner/execute.ts";
import { parseWorksheet } from "../../runner/parse.ts";

const run = (code: string, params: Record<string, number> = {}, front = "") => {
  const text = `---\ntitle: t\n${front}---\n\n\`\`\`ts\n${code}\n\`\`\`\n`;
  const ws = parseWorksheet("t.md", text);
  return executeWorksheet(ws, params);
};

Deno.test("execute: non-finite numbers survive the trip from the child", async () => {
  const r = await run(
    `import { sheet } from "tapsheet/sheet";
sheet.check({ name: "Settling time", id: "S-1", achieved: Infinity, limit: 0.1, relation: "atMost", unit: "s", margin: -Infinity, met: false });
sheet.table("t", ["x"], [[NaN], [-Infinity]]);`,
    {},
    "requirements:\n  - id: S-1\n    text: Settling time\n    atMost: 0.1\n    unit: s\n",
  );
  assert.equal(r.outcome, "completed", JSON.stringify(r.problem));
  const [check, table] = r.blocks[0]!.exhibits;
  assert.ok(check?.type === "check" && table?.type === "table");
  assert.equal(check.result.achieved, Infinity);
  assert.equal(check.result.margin, -Infinity);
  assert.ok(Number.isNaN(table.rows[0]![0]));
  assert.equal(table.rows[1]![0], -Infinity);
});

Deno.test("execute: parameters reach the worksheet; printed output is kept per block", async () => {
  const r = await run(
    `import { sheet } from "tapsheet/sheet";\nconsole.log("fs is", sheet.number("fs"));\nconsole.log({ a: 1 });`,
    { fs: 44100 },
  );
  assert.equal(r.outcome, "completed");
  const outputs = r.blocks[0]!.exhibits.filter((e) => e.type === "output").map((e) =>
    e.type === "output" ? e.text : ""
  );
  assert.deepEqual(outputs, ["fs is 44100", "{ a: 1 }"]);
});

Deno.test("execute: a missing parameter is an error at its line", async () => {
  const r = await run(`import { sheet } from "tapsheet/sheet";\nconst x = sheet.number("nope");`);
  assert.equal(r.outcome, "error");
  assert.equal(r.problem?.line, 7);
  assert.match(r.problem!.message, /Setting 'nope' is not declared/);
});

Deno.test("execute: the old name sheet.params says what it is called now", async () => {
  const r = await run(`import { sheet } from "tapsheet/sheet";\nconsole.log(sheet.params);`);
  assert.equal(r.outcome, "error");
  assert.match(r.problem!.message, /sheet\.params is now called sheet\.settings/);
});
