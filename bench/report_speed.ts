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
await Deno.remove(scratch, { recursive: true });
const ratio = median(b) / median(a);
console.log(`tapsheet run (demo worksheet, 6 figures): median ${median(a).toFixed(0)} ms`);
console.log(`SciPy + matplotlib script (6 figures):     median ${median(b).toFixed(0)} ms`);
console.log(
  `speed-up: ${ratio.toFixed(2)}× (target: at least 3×) — ${ratio >= 3 ? "met" : "not met"}`,
);
