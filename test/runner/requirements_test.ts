// Requirements have one source: the worksheet declares each once in front
// matter, and the requirement table, every check and every mask come from it
// (issue 12). source: common practice for requirement traceability (a
// verdict follows from the requirement as written; one id, one statement).
import assert from "node:assert/strict";
import { executeWorksheet } from "../../runner/execute.ts";
import { parseWorksheet, WorksheetError } from "../../runner/parse.ts";
import {
  inDeclaredUnit,
  libraryRequirement,
  resolveRequirements,
} from "../../runner/requirements.ts";
import { figureContext } from "../../render/write.ts";
import { judge } from "../../lib/verify/requirement.ts";
import type { ExecutionResult, FigureExhibit } from "../../record/types.ts";

const front = `settings:
  fs: 8000
  edge: 1000
  maxDelay: { value: 2, unit: ms }
requirements:
  - id: R-1
    text: Passband deviation
    atMost: 0.5
    unit: dB
    check: passbandDeviation
    from: 0
    to: edge
  - id: R-2
    text: Latency in the passband
    atMost: maxDelay
    unit: ms
    check: groupDelayMaximum
    from: 0
    to: edge
  - id: R-3
    text: Residual hum
    atMost: 5
    unit: µV
`;

const sheet = (body: string, head = front) =>
  `---\ntitle: Requirement probe\n${head}---\n\nProse.\n\n\`\`\`ts\nimport { sheet } from "tapsheet/sheet";\nimport { checkSpec, judge } from "tapsheet";\n${body}\n\`\`\`\n`;

async function run(body: string, head = front) {
  const ws = parseWorksheet("r.md", sheet(body, head));
  return await executeWorksheet(ws, ws.params);
}

const lineOf = (text: string, needle: string) =>
  text.split("\n").findIndex((l) => l.includes(needle)) + 1;

Deno.test("requirements: a check's limit must agree with the declaration, at the worksheet's line", async () => {
  const body = `sheet.check(judge("Residual hum", 33, { atMost: 40 }, "µV", { id: "R-3" }));`;
  const r = await run(body);
  assert.equal(r.outcome, "error");
  assert.equal(r.problem!.line, lineOf(sheet(body), "sheet.check(judge"));
  assert.match(
    r.problem!.message,
    /R-3: the check's limit, at most 40 µV, disagrees with requirement R-3 as declared in front matter \(line \d+\): at most 5 µV/,
  );
});

Deno.test("requirements: checks of undeclared ids, and a second check of one design, are errors", async () => {
  const undeclared = await run(`sheet.check(judge("Gain", 1, { atMost: 2 }, "", { id: "R-9" }));`);
  assert.equal(undeclared.outcome, "error");
  assert.match(
    undeclared.problem!.message,
    /'R-9' is not declared in front matter \(declared: R-1, R-2, R-3\)/,
  );
  const noId = await run(`sheet.check(judge("Gain", 1, { atMost: 2 }, ""));`);
  assert.match(noId.problem!.message, /has no id/);
  const twice = await run(`sheet.check("R-3", 1);\nsheet.check("R-3", 2);`);
  assert.match(twice.problem!.message, /R-3 is already checked for design 'design'/);
  // Once per design is fine: floating point and quantised are two rows.
  const both = await run(
    `sheet.check("R-3", 1, { design: "floating point" });\nsheet.check("R-3", 2, { design: "Q15" });`,
  );
  assert.equal(both.outcome, "completed", JSON.stringify(both.problem));
});

Deno.test("requirements: the parent refuses a disagreeing limit even when the sheet API's check is tampered with", async () => {
  // Math.abs and Math.max decide whether limits agree inside the sandbox; the parent decides again.
  const r = await run(
    `Math.abs = () => 0;\nMath.max = () => 1;\nsheet.check(judge("Residual hum", 33, { atMost: 40 }, "µV", { id: "R-3" }));`,
  );
  assert.equal(r.outcome, "error");
  assert.match(r.problem!.message, /broke the sandbox protocol .*disagrees with requirement R-3/);
});

Deno.test("requirements: the spec comes from the declarations; ms stay ms with samples beside them", async () => {
  const r = await run(
    `const spec = sheet.spec(8000);
sheet.check(checkSpec({ kind: "fir", taps: [0.25, 0.5, 0.25] }, spec));
sheet.check("R-3", 4.5);`,
  );
  assert.equal(r.outcome, "completed", JSON.stringify(r.problem));
  const checks = r.blocks[0]!.exhibits.flatMap((e) => (e.type === "check" ? [e] : []));
  assert.deepEqual(checks.map((c) => c.result.id), ["R-1", "R-2", "R-3"]);
  const delay = checks[1]!;
  // source: a 3-tap symmetric FIR delays by (N − 1)/2 = 1 sample = 0.125 ms at 8 kHz (common practice)
  assert.equal(delay.result.unit, "ms");
  assert.ok(Math.abs(delay.result.achieved - 0.125) < 1e-9, String(delay.result.achieved));
  assert.equal(delay.result.limit, 2);
  assert.deepEqual(delay.equivalent?.unit, "samples");
  assert.ok(Math.abs(delay.equivalent!.value - 1) < 1e-9);
  assert.equal(delay.result.name, "Latency in the passband", "named by the declaration");
});

Deno.test("requirements: settings override limits and bands in one place", () => {
  const ws = parseWorksheet("r.md", sheet("1;"));
  const declared = resolveRequirements(ws.requirements, { ...ws.params, maxDelay: 3, edge: 1200 });
  assert.equal(declared[1]!.limit, 3);
  assert.equal(declared[1]!.written, "maxDelay");
  const lib = libraryRequirement(declared[1]!, 8000);
  assert.deepEqual(lib, {
    id: "R-2",
    name: "Latency in the passband",
    kind: "groupDelayMaximum",
    from: 0,
    to: 1200,
    atMostSamples: 24, // source: 3 ms at 8000 Hz is 24 samples (common practice)
  });
  const converted = inDeclaredUnit(
    { ...judge("x", 16, { atMost: 24 }, "samples"), id: "R-2" },
    declared[1]!,
    8000,
  );
  assert.equal(converted.result.achieved, 2);
  assert.equal(converted.result.margin, 1);
});

Deno.test("requirements: declaration mistakes point at their front-matter line", () => {
  const cases: [string, string, RegExp][] = [
    [
      "duplicate id",
      "requirements:\n  - { id: A, text: One, atMost: 1 }\n  - { id: A, text: Two, atMost: 2 }\n",
      /r\.md:5: Requirement id 'A' is declared twice \(first on line 4\)/,
    ],
    [
      "no limit",
      "requirements:\n  - { id: A, text: One, unit: dB }\n",
      /r\.md:4: Requirement A needs exactly one limit/,
    ],
    [
      "two limits",
      "requirements:\n  - { id: A, text: One, atMost: 1, atLeast: 0 }\n",
      /Requirement A needs exactly one limit/,
    ],
    [
      "misspelt field",
      "requirements:\n  - { id: A, text: One, atMots: 1 }\n",
      /r\.md:4: Unknown requirement field 'atMots' \(did you mean 'atMost'\?\)/,
    ],
    [
      "unknown check",
      "requirements:\n  - { id: A, text: One, atMost: 1, unit: dB, check: ripple }\n",
      /Unknown requirement check 'ripple'/,
    ],
    [
      "wrong unit for the check",
      "requirements:\n  - { id: A, text: One, atMost: 1, unit: dB, check: groupDelayMaximum, from: 0, to: 100 }\n",
      /'groupDelayMaximum' is written in samples, s, ms, µs, us, not 'dB'/,
    ],
    [
      "missing band",
      "requirements:\n  - { id: A, text: One, atMost: 1, unit: dB, check: passbandRipple, from: 0 }\n",
      /'check: passbandRipple' needs 'to:'/,
    ],
    [
      "unknown setting as a limit",
      "requirements:\n  - { id: A, text: One, atMost: maxRipple, unit: dB }\n",
      /Requirement A: 'atMost' must be a number or the name of a number setting, got 'maxRipple'/,
    ],
    [
      "the old name of settings",
      "params:\n  fs: 8000\n",
      /r\.md:3: Front matter 'params:' is now called 'settings:'/,
    ],
  ];
  for (const [what, head, message] of cases) {
    assert.throws(
      () => parseWorksheet("r.md", `---\ntitle: t\n${head}---\n\nProse.\n`),
      (e: unknown) => e instanceof WorksheetError && message.test(e.message),
      what,
    );
  }
});

Deno.test("requirements: a figure marks the worst point of each requirement its mask carries", () => {
  const figure: FigureExhibit = {
    type: "figure",
    kind: "magnitude",
    title: "m",
    series: [{ name: "h", x: [0, 4000], y: [0, -80] }],
    mask: [{ from: 1000, to: 4000, level: -60, bound: "upper", label: "S-1" }],
  };
  const execution: ExecutionResult = {
    outcome: "completed",
    durationMs: 1,
    requirements: [{
      id: "S-1",
      text: "Stopband",
      relation: "atLeast",
      limit: 60,
      unit: "dB",
      written: "60",
      fields: {},
      line: 4,
    }],
    blocks: [{
      index: 0,
      status: "ok",
      exhibits: [
        {
          type: "check",
          design: "floating point",
          result: {
            ...judge("Stopband", 61, { atLeast: 60 }, "dB", { worst: { at: 1234, unit: "Hz" } }),
            id: "S-1",
          },
        },
        {
          type: "check",
          design: "Q15",
          result: {
            ...judge("Stopband", 59, { atLeast: 60 }, "dB", { worst: { at: 2345, unit: "Hz" } }),
            id: "S-1",
          },
        },
      ],
    }],
  };
  assert.deepEqual(figureContext(figure, execution), {
    worst: [
      { id: "S-1 (floating point)", at: 1234, met: true },
      { id: "S-1 (Q15)", at: 2345, met: false },
    ],
  });
  assert.deepEqual(figureContext({ ...figure, kind: "impulse" }, execution), {});
});
