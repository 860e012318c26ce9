// Command to finished report, side by side: tapsheet rendering the demo
// worksheet versus a hand-written SciPy + matplotlib script that designs the
// same filter and writes six comparable SVG figures and an HTML page.
//
//   deno run -A bench/report_speed.ts [runs]
//
// Both sides are timed as whole commands (process start included), warm:
// one untimed run first so every cache (Deno's modules, Python's bytecode,
// matplotlib's font cache) is filled. tapsheet writes into a new folder each
// time, so every figure is rendered, not reused.
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("../", import.meta.url));
const runs = Number(Deno.args[0] ?? 5);

async function time(
  cmd: string,
  args: string[],
  env: Record<string, string> = {},
): Promise<number> {
  const started = performance.now();
  const out = await new Deno.Command(cmd, { args, env, stdout: "null", stderr: "piped" }).output();
  const elapsed = performance.now() - started;
  if (out.code > 1) throw new Error(`${cmd} failed: ${new TextDecoder().decode(out.stderr)}`);
  return elapsed;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const scratch = await Deno.makeTempDir({ prefix: "tapsheet-bench-" });
const ours = (i: number) =>
  time(Deno.execPath(), [
    "run",
    "-A",
    `--config=${join(root, "deno.json")}`,
    join(root, "runner", "cli.ts"),
    "run",
    join(root, "worksheets", "pump_monitor_antialias.md"),
    "--out",
    join(scratch, `t${i}`),
  ], { NO_COLOR: "1" });
const theirs = (i: number) =>
  time("/usr/bin/python3", [
    join(root, "bench", "report_speed_reference.py"),
    join(scratch, `p${i}`),
  ], {
    MPLCONFIGDIR: join(scratch, "mpl"),
  });

await ours(-1);
await theirs(-1);
const a: number[] = [];
const b: number[] = [];
for (let i = 0; i < runs; i++) {
  a.push(await ours(i));
  b.push(await theirs(i));
}

// The edit loop in watch mode.
const sheet = join(scratch, "demo.md");
const source = await Deno.readTextFile(join(root, "worksheets", "pump_monitor_antialias.md"));
await Deno.writeTextFile(sheet, source);
const watcher = new Deno.Command(Deno.execPath(), {
  args: [
    "run",
    "-A",
    `--config=${join(root, "deno.json")}`,
    join(root, "runner", "cli.ts"),
    "watch",
    sheet,
    "--out",
    join(scratch, "watch"),
  ],
  env: { NO_COLOR: "1" },
  stdout: "piped",
  stderr: "null",
}).spawn();
const reader = watcher.stdout.pipeThrough(new TextDecoderStream()).getReader();
let seen = "";
const until = async (done: () => boolean) => {
  while (!done()) {
    const { value, done: ended } = await reader.read();
    if (ended) throw new Error(`tapsheet watch stopped early; it printed:\n${seen}`);
    seen += value;
  }
};
await until(() => seen.includes("Watching"));
const w: number[] = [];
for (let i = 0; i < runs + 1; i++) {
  const lines = (seen.match(/requirements met/g) ?? []).length;
  const started = performance.now();
  const taps = i % 2 === 0 ? 43 : 41;
  await Deno.writeTextFile(sheet, source.replace(/(taps:\n\s+value: )41/, `$1${taps}`));
  await until(() => (seen.match(/requirements met/g) ?? []).length > lines);
  if (i > 0) w.push(performance.now() - started); // the first edit warms the watcher
}
watcher.kill();
await watcher.status;
await Deno.remove(scratch, { recursive: true });

const ratio = median(b) / median(a);
const loop = median(b) / median(w);
console.log(`SciPy + matplotlib script (6 figures):          median ${median(b).toFixed(0)} ms`);
console.log(
  `tapsheet run, whole command (demo, 6 figures):  median ${median(a).toFixed(0)} ms → ${
    ratio.toFixed(2)
  }×`,
);
console.log(
  `tapsheet watch, save → report (6 new figures):  median ${median(w).toFixed(0)} ms → ${
    loop.toFixed(2)
  }×`,
);
// Issue 15's target: the whole command in at most 0.25 of the script's time (4× faster).
console.log(
  `our time ÷ theirs: whole command ${(1 / ratio).toFixed(2)}, edit loop ${
    (1 / loop).toFixed(2)
  }; target ≤ 0.25 for the whole command: ${1 / ratio <= 0.25 ? "met" : "not met"}`,
);
