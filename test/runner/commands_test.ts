// The commands around `run`: check, verify, watch, skipping unchanged work,
// the reports index, and atomic report writing.
import assert from "node:assert/strict";
import { join } from "node:path";
import { cliArgs, tapsheet } from "./_cli.ts";
import { runToEnd } from "../_process.ts";

const cli = cliArgs;

const sheet = (body: string, title = "Small sheet", limit = 3) =>
  `---\ntitle: ${title}\ndocument: T-9\nrevision: A\nsettings:\n  gain: 2\nrequirements:\n  - id: R-1\n    text: Gain\n    atMost: ${limit}\n---\n\nProse.\n\n\`\`\`ts\n${body}\n\`\`\`\n`;

const passing = `import { sheet } from "tapsheet/sheet";
const gain = sheet.number("gain");
sheet.check("R-1", gain);
sheet.figure({ kind: "line", title: "A line", series: [{ name: "y", x: [0, 1, 2], y: [0, gain, 0] }] });`;

Deno.test("check: reports type errors at worksheet lines without running anything", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(join(dir, "good.md"), sheet(passing));
    await Deno.writeTextFile(
      join(dir, "typo.md"),
      sheet(
        'import { sheet } from "tapsheet/sheet";\nconst n: number = sheet.text("gain");\nDeno.writeTextFileSync("x", "y");',
      ),
    );
    const good = await tapsheet(["check", join(dir, "good.md")]);
    assert.equal(good.code, 0, good.stderr);
    const bad = await tapsheet(["check", join(dir, "typo.md")]);
    assert.equal(bad.code, 2);
    assert.match(
      bad.stderr,
      /typo\.md:17:7: Type 'string' is not assignable to type 'number'\. \(TS2322\)/,
    );
    assert.match(bad.stderr, /17 \| const n: number = sheet\.text\("gain"\);/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("run: unchanged inputs are not re-run; --force and a changed parameter re-run", async () => {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "small.md");
  const out = join(dir, "reports");
  try {
    await Deno.writeTextFile(file, sheet(passing));
    const first = await tapsheet(["run", file, "--out", out]);
    assert.equal(first.code, 0, first.stderr);
    assert.doesNotMatch(first.stdout, /unchanged/);
    const second = await tapsheet(["run", file, "--out", out]);
    assert.match(second.stdout, /unchanged, not re-run/);
    const forced = await tapsheet(["run", file, "--out", out, "--force"]);
    assert.doesNotMatch(forced.stdout, /unchanged/);
    const changed = await tapsheet(["run", file, "--out", out, "--set", "gain=4"]);
    assert.equal(changed.code, 1, "gain 4 breaks the at-most-3 requirement");
    assert.doesNotMatch(changed.stdout, /unchanged/);
    // The reports index lists the report with its verdict.
    const index = await Deno.readTextFile(join(out, "index.html"));
    assert.match(index, /<a href="small\/index.html">Small sheet<\/a>/);
    assert.match(index, /Not met/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("verify: matches an untouched report and catches a changed one", async () => {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "small.md");
  const out = join(dir, "reports");
  try {
    await Deno.writeTextFile(file, sheet(passing));
    await tapsheet(["run", file, "--out", out, "--date", "2026-03-01"]);
    const same = await tapsheet(["verify", file, "--out", out]);
    assert.equal(same.code, 0, same.stdout + same.stderr);
    assert.match(same.stdout, /matches/);
    await Deno.writeTextFile(file, sheet(passing, "Small sheet", 2.5));
    const differs = await tapsheet(["verify", file, "--out", out]);
    assert.equal(differs.code, 1);
    assert.match(differs.stdout, /differs/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("run --json writes machine-readable results with durations", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(join(dir, "a.md"), sheet(passing, "Sheet A"));
    await Deno.writeTextFile(
      join(dir, "b.md"),
      sheet(passing, "Sheet B", 1),
    );
    const r = await tapsheet([
      "run",
      dir,
      "--out",
      join(dir, "out"),
      "--json",
      join(dir, "results.json"),
    ]);
    assert.equal(r.code, 1);
    assert.match(r.stdout, /Worksheet\s+Verdict\s+Met\s+Time/);
    const results = JSON.parse(await Deno.readTextFile(join(dir, "results.json")));
    assert.deepEqual(results.map((x: { verdict: string }) => x.verdict), ["met", "not met"]);
    assert.ok(results.every((x: { durationMs: number }) => x.durationMs > 0));
    assert.equal(results[1].requirementsMet, 0);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("run: killing a run at any moment leaves the previous report whole", async () => {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "k.md");
  const out = join(dir, "reports");
  try {
    await Deno.writeTextFile(file, sheet(passing));
    await tapsheet(["run", file, "--out", out]);
    const original = await Deno.readTextFile(join(out, "k", "index.html"));
    for (const delayMs of [100, 300, 500, 700, 900, 1100]) {
      // Bounded: the run ends by itself or is killed at delayMs.
      await runToEnd(
        Deno.execPath(),
        [...cli, "run", file, "--out", out, "--force", "--set", "gain=2.5"],
        { timeoutMs: delayMs, killAtDeadline: true },
      );
      const now = await Deno.readTextFile(join(out, "k", "index.html"));
      // Either the old report or a complete new one, never a mixture.
      assert.ok(now === original || /<\/html>\n$/.test(now), `after ${delayMs} ms`);
      const manifest = JSON.parse(await Deno.readTextFile(join(out, "k", "manifest.json")));
      assert.ok(manifest.fingerprint);
    }
    // A later run cleans up whatever a killed run left behind.
    await tapsheet(["run", file, "--out", out, "--force"]);
    const leftovers = [];
    for await (const e of Deno.readDir(out)) if (e.name.startsWith(".")) leftovers.push(e.name);
    assert.deepEqual(leftovers, []);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
