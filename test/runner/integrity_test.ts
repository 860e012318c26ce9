// A borrowed worksheet must not write, read or forge (issue 13). Each test
// reproduces an attack that once got through. source: the sandbox rules in
// DESIGN.md ("Safety and robustness") and common practice for sandboxes
// (never trust the sandboxed side's own checks; resolve links before
// granting access; children die with their parent).
import assert from "node:assert/strict";
import { join } from "node:path";
import { executeWorksheet } from "../../runner/execute.ts";
import { parseWorksheet } from "../../runner/parse.ts";
import { runWorksheet } from "../../runner/run.ts";
import { writeReport } from "../../render/write.ts";
import { tapsheet, tapsheetWatched } from "./_cli.ts";
import { runToEnd } from "../_process.ts";
import { reportContent } from "../render/_content.ts";

const hostile = (name: string) => new URL(`./hostile/${name}.md`, import.meta.url).pathname;

const worksheet = (body: string, front = "") =>
  `---\ntitle: Integrity probe\n${front}---\n\nProse.\n\n\`\`\`ts\n${body}\n\`\`\`\n`;

Deno.test("integrity: an export name that climbs out of the report is refused and nothing is written", async () => {
  const out = await Deno.makeTempDir();
  // The name climbs to /tmp itself, which exists, so a write that got through would land there.
  const target = "/tmp/tapsheet-hostile-export-pwned.txt";
  try {
    const summary = await runWorksheet(hostile("export_escape"), { outDir: out, force: true });
    assert.equal(summary.verdict, "incomplete");
    assert.match(summary.problem!.message, /not a plain file name/);
    await assert.rejects(Deno.stat(target), Deno.errors.NotFound);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("integrity: writeReport itself refuses an export name with a folder in it", async () => {
  const out = await Deno.makeTempDir();
  try {
    await assert.rejects(
      writeReport(
        out,
        "w",
        reportContent([{ type: "export", fileName: "../escape.txt", content: "x" }]),
      ),
      /not a plain file name/,
    );
    await assert.rejects(Deno.stat(join(out, "escape.txt")), Deno.errors.NotFound);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("integrity: a forged end message and forged result printed by the worksheet count for nothing", async () => {
  const out = await Deno.makeTempDir();
  try {
    const summary = await runWorksheet(hostile("forge_done"), { outDir: out, force: true });
    assert.equal(summary.verdict, "incomplete");
    assert.equal(summary.checked, 0, "the forged requirement is not in the record");
    const manifest = JSON.parse(
      await Deno.readTextFile(join(summary.reportDir, "manifest.json")),
    );
    assert.deepEqual(manifest.requirements, []);
    const html = await Deno.readTextFile(join(summary.reportDir, "index.html"));
    assert.doesNotMatch(html, /All requirements met/);
    assert.match(html, /Incomplete/);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("integrity: block markers called by the worksheet itself break the run", async () => {
  const ws = parseWorksheet(
    hostile("forge_marker"),
    await Deno.readTextFile(hostile("forge_marker")),
  );
  const r = await executeWorksheet(ws, {});
  assert.equal(r.outcome, "error");
  assert.match(r.problem!.message, /broke the sandbox protocol .*out of order/);
});

Deno.test("integrity: the worksheet may not even name the block marker", async () => {
  const ws = parseWorksheet("m.md", worksheet("__tapsheetBlock(3);"));
  const r = await executeWorksheet(ws, {});
  assert.equal(r.outcome, "rejected");
  assert.match(r.problem!.message, /may not use '__tapsheetBlock'/);
});

Deno.test("integrity: a hand-built requirement result is judged again by the runner", async () => {
  const ws = parseWorksheet(
    "c.md",
    worksheet(
      `import { sheet } from "tapsheet/sheet";
sheet.check({ name: "Attenuation", id: "A-1", achieved: 40, limit: 80, relation: "atLeast", unit: "dB", margin: 40, met: true } as never);
sheet.check({ name: "Ripple", id: "A-2", achieved: NaN, limit: 1, relation: "atMost", unit: "dB", margin: 1, met: true } as never);`,
      "requirements:\n  - { id: A-1, text: Attenuation, atLeast: 80, unit: dB }\n" +
        "  - { id: A-2, text: Ripple, atMost: 1, unit: dB }\n",
    ),
  );
  const r = await executeWorksheet(ws, {});
  assert.equal(r.outcome, "completed", JSON.stringify(r.problem));
  const checks = r.blocks[0]!.exhibits.flatMap((e) => (e.type === "check" ? [e.result] : []));
  assert.deepEqual(checks.map((c) => [c.met, c.margin]), [[false, -40], [false, NaN]]);
});

Deno.test("integrity: links under data/ that leave it refuse the run; the folder beside it is not readable", async () => {
  const dir = await Deno.makeTempDir();
  const outside = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(join(outside, "secret.txt"), "secret");
    await Deno.mkdir(join(dir, "data", "nested"), { recursive: true });
    await Deno.writeTextFile(join(dir, "data", "ok.csv"), "1\n");
    await Deno.symlink(join(dir, "data", "ok.csv"), join(dir, "data", "alias.csv"));
    const read = (path: string) =>
      worksheet(
        `import { sheet } from "tapsheet/sheet";\nsheet.choice("read", await Deno.readTextFile(${
          JSON.stringify(path)
        }), "probe");`,
      );
    const run = async (path: string) => {
      const file = join(dir, "w.md");
      await Deno.writeTextFile(file, read(path));
      return await executeWorksheet(parseWorksheet(file, await Deno.readTextFile(file)), {});
    };
    // A link that stays inside data/ is fine, and data/ is readable.
    const fine = await run("data/alias.csv");
    assert.equal(fine.outcome, "completed", JSON.stringify(fine.problem));
    // A link out of data/, however deep, refuses the run before it starts.
    await Deno.symlink(join(outside, "secret.txt"), join(dir, "data", "nested", "leak.txt"));
    const leak = await run("data/nested/leak.txt");
    assert.equal(leak.outcome, "rejected");
    assert.match(leak.problem!.message, /data\/nested\/leak\.txt is a link to .*secret\.txt/);
    assert.equal(leak.problem!.line, 1);
    await Deno.remove(join(dir, "data", "nested", "leak.txt"));
    // A link beside the worksheet (outside data/) is simply not readable.
    await Deno.symlink(join(outside, "secret.txt"), join(dir, "beside.txt"));
    const beside = await run("beside.txt");
    assert.equal(beside.outcome, "error");
    assert.match(beside.problem!.message, /Blocked by the sandbox: the worksheet tried to read/);
    // data/ itself a link to a folder elsewhere.
    await Deno.remove(join(dir, "data"), { recursive: true });
    await Deno.symlink(outside, join(dir, "data"));
    const moved = await run("data/secret.txt");
    assert.equal(moved.outcome, "rejected");
    assert.match(moved.problem!.message, /data is a link to/);
  } finally {
    await Deno.remove(dir, { recursive: true });
    await Deno.remove(outside, { recursive: true });
  }
});

Deno.test("integrity: sandbox messages name what was refused, not Deno's permission flags", async () => {
  const ws = parseWorksheet(
    "n.md",
    worksheet(`await fetch("https://example.invalid/");`),
  );
  const r = await executeWorksheet(ws, {});
  assert.equal(r.outcome, "error");
  assert.match(r.problem!.message, /tried to use the network to reach example\.invalid/);
  assert.doesNotMatch(r.problem!.message, /--allow|run again/);
});

/** Command lines of running sandbox children that mention `text`. */
async function sandboxChildren(text: string): Promise<string[]> {
  const ps = await runToEnd("ps", ["-eo", "pid=,args="], { timeoutMs: 10_000 });
  return ps.stdout.split("\n").filter((l) => l.includes(text) && /harness\.ts/.test(l));
}

async function waitUntil(test: () => Promise<boolean>, ms: number, what: string): Promise<void> {
  const deadline = Date.now() + ms;
  while (!(await test())) {
    if (Date.now() > deadline) throw new Error(`timed out: ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

for (const signal of ["SIGKILL", "SIGTERM", "SIGINT"] as const) {
  Deno.test(`integrity: the sandbox child dies with a runner stopped by ${signal}`, async () => {
    const dir = await Deno.makeTempDir();
    const file = join(dir, "spin.md");
    await Deno.writeTextFile(file, worksheet("while (true) { /* spin */ }"));
    const runner = tapsheetWatched([
      "run",
      file,
      "--out",
      join(dir, "reports"),
      "--timeout",
      "120",
    ]);
    try {
      let child = "";
      await waitUntil(
        async () => {
          child = (await sandboxChildren(`tapsheet-run-${runner.child.pid}-`))[0] ?? "";
          return child !== "";
        },
        30_000,
        "the sandbox child starts",
      );
      const temp = /--allow-read=\S*?(\/[^,\s]*tapsheet-run-[^,\s]+)/.exec(child)?.[1];
      assert.ok(temp, child);
      await runner.stop(signal);
      // Well within the 120 s timeout: the child notices its parent is gone.
      await waitUntil(
        async () => (await sandboxChildren(`tapsheet-run-${runner.child.pid}-`)).length === 0,
        10_000,
        "the child ends",
      );
      if (signal !== "SIGKILL") {
        await assert.rejects(Deno.stat(temp), Deno.errors.NotFound, "temp folder removed");
      } else {
        // SIGKILL cannot be caught: the next run removes what the killed one left.
        await tapsheet(["run", file, "--out", join(dir, "reports"), "--timeout", "1"]);
        await assert.rejects(Deno.stat(temp), Deno.errors.NotFound, "temp folder swept");
      }
    } finally {
      await runner.stop("SIGKILL").catch(() => {});
      await Deno.remove(dir, { recursive: true });
    }
  });
}
