// The sandbox child started before its worksheet is parsed (startSandbox):
// it runs the worksheet it was started for, and one that is not used is
// ended with nothing left behind. source: the sandbox rules in DESIGN.md
// ("Safety and robustness": no process or temporary folder outlives a run).
import assert from "node:assert/strict";
import { join } from "node:path";
import { disposeSandbox, executeWorksheet, startSandbox } from "../../runner/execute.ts";
import { parseWorksheet } from "../../runner/parse.ts";
import { runWorksheet } from "../../runner/run.ts";
import { runToEnd } from "../_process.ts";

const basic = "test/runner/fixtures/basic.md";

/** This process's run folders under the temporary directory. */
async function runFolders(): Promise<string[]> {
  const tmp = Deno.env.get("TMPDIR") ?? "/tmp";
  const out: string[] = [];
  for await (const e of Deno.readDir(tmp)) {
    if (e.name.startsWith(`tapsheet-run-${Deno.pid}-`)) out.push(join(tmp, e.name));
  }
  return out;
}

const alive = (pid: number) => {
  try {
    return !/^State:\s+Z/m.test(Deno.readTextFileSync(`/proc/${pid}/status`));
  } catch {
    return false;
  }
};

Deno.test("early sandbox: a child started before the parse runs that worksheet", async () => {
  const before = await runFolders();
  const sandbox = await startSandbox(basic);
  assert.ok(!("refusal" in sandbox.started));
  const worksheet = parseWorksheet(basic, await Deno.readTextFile(basic));
  const result = await executeWorksheet(worksheet, worksheet.params, { sandbox });
  assert.equal(result.outcome, "completed", JSON.stringify(result.problem));
  assert.deepEqual(await runFolders(), before, "its folder is removed");
});

Deno.test("early sandbox: one not used is killed and its folder removed", async () => {
  const before = await runFolders();
  const sandbox = await startSandbox(basic);
  assert.ok(!("refusal" in sandbox.started));
  const { child, tempDir } = sandbox.started;
  assert.ok(alive(child.pid), "the child is waiting for its input");
  await disposeSandbox(sandbox);
  assert.ok(!alive(child.pid), "the child is gone");
  await assert.rejects(Deno.stat(tempDir));
  assert.deepEqual(await runFolders(), before);
});

Deno.test("early sandbox: one started for another worksheet is not used for this one", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const other = join(dir, "other.md");
    await Deno.copyFile(basic, other);
    const sandbox = await startSandbox(other);
    assert.ok(!("refusal" in sandbox.started));
    const worksheet = parseWorksheet(basic, await Deno.readTextFile(basic));
    const result = await executeWorksheet(worksheet, worksheet.params, { sandbox });
    assert.equal(result.outcome, "completed");
    assert.ok(!alive(sandbox.started.child.pid), "the other worksheet's child was ended");
    await assert.rejects(Deno.stat(sandbox.started.tempDir));
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("early sandbox: a worksheet that does not parse, or a report that is up to date, leaves no child", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const broken = join(dir, "broken.md");
    await Deno.writeTextFile(broken, "---\ntitle: [unclosed\n---\n\n# Broken\n");
    const before = await runFolders();
    const r = await runWorksheet(broken, { outDir: join(dir, "reports") });
    assert.equal(r.outcome, "rejected");
    assert.deepEqual(await runFolders(), before);

    const sheet = join(dir, "basic.md");
    await Deno.copyFile(basic, sheet);
    await runWorksheet(sheet, { outDir: join(dir, "reports") });
    // The same text again: the report is up to date and no child is started.
    const again = await runWorksheet(sheet, { outDir: join(dir, "reports") });
    assert.equal(again.skipped, true);
    // Changed data only: a child is started once the inputs are known to differ.
    await Deno.mkdir(join(dir, "data"));
    await Deno.writeTextFile(join(dir, "data", "x.csv"), "1\n");
    const rerun = await runWorksheet(sheet, { outDir: join(dir, "reports") });
    assert.notEqual(rerun.skipped, true);
    assert.deepEqual(await runFolders(), before);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("early sandbox: a run that fails while its child computes ends the child and leaves nothing", async () => {
  // The child gets its input before the inputs are hashed and the approvals read: an error
  // there (here a damaged approvals file) must still end it.
  const dir = await Deno.makeTempDir();
  try {
    const sheet = join(dir, "basic.md");
    await Deno.copyFile(basic, sheet);
    await Deno.writeTextFile(join(dir, "basic.approvals.yaml"), "approvals: [unclosed\n");
    const before = await runFolders();
    await assert.rejects(runWorksheet(sheet, { outDir: join(dir, "reports") }), /approvals/i);
    assert.deepEqual(await runFolders(), before);
    const listed = (await runToEnd("pgrep", ["-P", String(Deno.pid)])).stdout.trim();
    assert.equal(
      listed.split("\n").filter((pid) => pid !== "" && alive(Number(pid))).length,
      0,
      `children of the test process: ${listed}`,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
