// Every template runs as shipped and meets its own requirements, and `new`
// scaffolds a worksheet from it. source: the templates' own specifications
// (invented scenarios); the numbers behind each check are tested in test/lib/.
import assert from "node:assert/strict";
import { join } from "node:path";
import { root, tapsheet } from "./_cli.ts";
import { runWorksheet } from "../../runner/run.ts";

const templates = join(root, "worksheets", "templates");
const names: string[] = [];
for await (const e of Deno.readDir(templates)) if (e.name.endsWith(".md")) names.push(e.name);
names.sort();

Deno.test("templates: at least the six kinds of job are there", () => {
  for (
    const required of [
      "antialias_decimation.md",
      "multistage_decimation.md",
      "mains_hum_removal.md",
      "audio_eq_section.md",
      "dc_blocker.md",
      "hilbert_quadrature.md",
    ]
  ) assert.ok(names.includes(required), required);
});

for (const name of names) {
  Deno.test(`templates: ${name} runs and meets its requirements`, async () => {
    const out = await Deno.makeTempDir();
    try {
      const summary = await runWorksheet(join(templates, name), {
        outDir: out,
        date: "2026-01-01",
      });
      assert.equal(summary.outcome, "completed", JSON.stringify(summary.problem));
      assert.ok(summary.checked >= 2, `${summary.checked} requirements checked`);
      assert.equal(summary.verdict, "met", `${summary.met}/${summary.checked} met`);
    } finally {
      await Deno.remove(out, { recursive: true });
    }
  });
}

Deno.test("new: scaffolds a worksheet from a template and refuses to overwrite", async () => {
  const dir = await Deno.makeTempDir();
  const run = (args: string[]) => tapsheet(args);
  try {
    const target = join(dir, "sub", "my_blocker.md");
    const made = await run(["new", "dc_blocker", target]);
    assert.equal(made.code, 0, made.stderr);
    assert.equal(
      await Deno.readTextFile(target),
      await Deno.readTextFile(join(templates, "dc_blocker.md")),
    );
    const again = await run(["new", "dc_blocker", target]);
    assert.equal(again.code, 2);
    assert.match(again.stderr, /exists already; pass --force/);
    const unknown = await run(["new", "no_such_template", join(dir, "x.md")]);
    assert.equal(unknown.code, 2);
    assert.match(
      unknown.stderr,
      /No template 'no_such_template'. Templates: .*dc_blocker/,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("every demo worksheet and template type-checks", async () => {
  const out = await tapsheet(["check", join(root, "worksheets"), templates]);
  const text = out.stdout + out.stderr;
  assert.equal(out.code, 0, text);
  assert.ok((text.match(/^ok {2}/gm) ?? []).length >= 10, text);
});
