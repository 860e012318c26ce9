// `tapsheet watch`: no save is lost, bursts make one run, editors that save by
// rename and data/ changes are seen, and Ctrl-C leaves no sandbox child.
// source: common practice for file-watching build tools (debounce, queue one
// more run for a change during a run); the behaviour itself is ours.
// Every wait has a deadline (test/_process.ts): a lost event fails, never hangs.
import assert from "node:assert/strict";
import { join } from "node:path";
import { tapsheetWatched } from "./_cli.ts";
import { runToEnd } from "../_process.ts";

/** A worksheet with `checks` requirements (all met) that busy-waits `spinMs` first. */
function sheet(checks: number, spinMs = 0): string {
  const declared = Array.from(
    { length: checks },
    (_, i) => `  - id: G-${i}\n    text: Gain ${i}\n    atMost: 3\n`,
  ).join("");
  return `---
title: Watched sheet
settings:
  spin: ${spinMs}
requirements:
${declared}---

Prose.

\`\`\`ts
import { sheet } from "tapsheet/sheet";
const until = Date.now() + sheet.number("spin");
while (Date.now() < until) { /* a slow design step */ }
for (let i = 0; i < ${checks}; i++) sheet.check("G-" + i, 1);
\`\`\`
`;
}

/** Number of finished runs whose line says `n/n requirements met`. */
const finished = (seen: string, n: number) =>
  seen.split("\n").filter((l) => new RegExp(` ${n}/${n} requirements met`).test(l)).length;

const runsStarted = (seen: string) => seen.split("\n").filter((l) => /running .*…$/.test(l)).length;

async function withWatch(
  test: (w: ReturnType<typeof tapsheetWatched>, file: string, dir: string) => Promise<void>,
  first = sheet(1),
): Promise<void> {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "w.md");
  await Deno.writeTextFile(file, first);
  const w = tapsheetWatched(["watch", file, "--out", join(dir, "reports")]);
  try {
    await w.waitFor(/Watching/);
    await test(w, file, dir);
  } finally {
    await w.stop("SIGTERM").catch(() => {});
    await Deno.remove(dir, { recursive: true });
  }
}

Deno.test("watch: the first run comes before 'Watching', and a save right after it re-runs", async () => {
  await withWatch(async (w, file) => {
    assert.equal(finished(w.seen, 1), 1, w.seen);
    // Written the instant the line appears: the watcher was registered before it.
    await Deno.writeTextFile(file, sheet(2));
    await w.waitFor(/ 2\/2 requirements met/);
  });
});

Deno.test("watch: a save during a run queues exactly one more run with the new text", async () => {
  await withWatch(async (w, file) => {
    await Deno.writeTextFile(file, sheet(2, 2500));
    // Wait until the slow run has started, then save again while it runs.
    let at = await w.waitFor(/running .*…\n/, { from: w.seen.lastIndexOf("Watching") });
    await Deno.writeTextFile(file, sheet(3));
    at = await w.waitFor(/ 2\/2 requirements met/, { from: at });
    await w.waitFor(/ 3\/3 requirements met/, { from: at });
    // Nothing else was queued: no further run starts.
    await new Promise((r) => setTimeout(r, 1000));
    assert.equal(runsStarted(w.seen), 3, w.seen);
  });
});

Deno.test("watch: a burst of saves within the debounce time makes one run", async () => {
  await withWatch(async (w, file) => {
    for (let k = 2; k <= 6; k++) {
      await Deno.writeTextFile(file, sheet(k));
      await new Promise((r) => setTimeout(r, 10));
    }
    await w.waitFor(/ 6\/6 requirements met/);
    await new Promise((r) => setTimeout(r, 1000));
    assert.equal(runsStarted(w.seen), 2, w.seen);
    for (let k = 2; k <= 5; k++) assert.equal(finished(w.seen, k), 0, `no run of version ${k}`);
  });
});

Deno.test("watch: a file deleted and re-created, or saved by rename, is run again", async () => {
  await withWatch(async (w, file) => {
    await Deno.remove(file);
    let at = await w.waitFor(/is gone; waiting for it to come back/);
    await Deno.writeTextFile(file, sheet(2));
    at = await w.waitFor(/ 2\/2 requirements met/, { from: at });
    // An editor that writes a temporary file and renames it over the worksheet.
    await Deno.writeTextFile(`${file}.tmp`, sheet(3));
    await Deno.rename(`${file}.tmp`, file);
    await w.waitFor(/ 3\/3 requirements met/, { from: at });
  });
});

Deno.test("watch: a change under data/ re-runs the worksheet; other files do not", async () => {
  await withWatch(async (w, _file, folder) => {
    await Deno.mkdir(join(folder, "data"));
    let at = w.seen.length;
    await Deno.writeTextFile(join(folder, "data", "gains.csv"), "1\n");
    at = await w.waitFor(/ 1\/1 requirements met +\d/, { from: at });
    // A note beside the worksheet is not its data: no run.
    await Deno.writeTextFile(join(folder, "notes.txt"), "not data\n");
    await new Promise((r) => setTimeout(r, 1000));
    assert.equal(runsStarted(w.seen.slice(at)), 0, w.seen);
  });
});

/** Command lines of running processes that mention `text`. */
async function processesMentioning(text: string): Promise<string[]> {
  const ps = await runToEnd("ps", ["-eo", "pid=,args="], { timeoutMs: 10_000 });
  return ps.stdout.split("\n").filter((l) => l.includes(text) && !l.includes(" ps "));
}

Deno.test("watch: Ctrl-C during a run leaves no sandbox child and no temporary folder", async () => {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "w.md");
  await Deno.writeTextFile(file, sheet(1, 60_000));
  const w = tapsheetWatched(["watch", file, "--out", join(dir, "reports")]);
  try {
    await w.waitFor(/running .*…/);
    // Wait for the sandbox child (its temporary folder carries the runner's pid) to be up.
    const mark = `tapsheet-run-${w.child.pid}-`;
    let children: string[] = [];
    const deadline = Date.now() + 30_000;
    while (children.length === 0 && Date.now() < deadline) {
      children = (await processesMentioning(mark)).filter((l) => /harness/.test(l));
      if (children.length === 0) await new Promise((r) => setTimeout(r, 100));
    }
    assert.equal(children.length, 1, "one sandbox child is running");
    const temp = /--allow-read=\S*?(\/[^,\s]*tapsheet-run-[^,\s]+)/.exec(children[0]!)?.[1];
    assert.ok(temp, children[0]);
    const status = await w.stop("SIGINT");
    assert.equal(status.code, 130);
    assert.deepEqual((await processesMentioning(mark)).filter((l) => /harness/.test(l)), []);
    await assert.rejects(Deno.stat(temp), Deno.errors.NotFound);
  } finally {
    await w.stop("SIGKILL").catch(() => {});
    await Deno.remove(dir, { recursive: true });
  }
});
