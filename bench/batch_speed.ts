// Batches: `run <folder>` with many worksheets, one sandboxed child per core.
//
//   deno run -A bench/batch_speed.ts [copies=50]
//
// Copies the pump-monitor demo N times into a folder and times the whole
// command (process start included) for 10, 25 and N copies, and for N copies
// with --jobs 1, against N × the time of one worksheet alone. Peak memory is
// the largest total resident size of the runner and all its children, polled
// every 20 ms from /proc. Targets (issue 15): wall time linear in the number
// of worksheets, memory flat, and the batch faster than N × one.
import { join } from "node:path";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL("../", import.meta.url));
const copies = Number(Deno.args[0] ?? 50);
const scratch = await Deno.makeTempDir({ prefix: "tapsheet-batch-" });
const demo = await Deno.readTextFile(join(root, "worksheets", "pump_monitor_antialias.md"));

async function folderOf(n: number): Promise<string> {
  const dir = join(scratch, `sheets-${n}`);
  await Deno.mkdir(dir);
  for (let i = 0; i < n; i++) {
    await Deno.writeTextFile(join(dir, `pump_${String(i).padStart(3, "0")}.md`), demo);
  }
  return dir;
}

/** Resident size (kB) of a process and every descendant, from /proc. */
function treeRssKb(rootPid: number): number {
  const parent = new Map<number, number>();
  const rss = new Map<number, number>();
  for (const entry of Deno.readDirSync("/proc")) {
    const pid = Number(entry.name);
    if (!Number.isInteger(pid)) continue;
    try {
      const status = Deno.readTextFileSync(`/proc/${pid}/status`);
      parent.set(pid, Number(/PPid:\s+(\d+)/.exec(status)?.[1] ?? 0));
      rss.set(pid, Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0));
    } catch {
      // the process ended while we looked
    }
  }
  let total = 0;
  for (const [pid, kb] of rss) {
    for (let p = pid; p > 1; p = parent.get(p) ?? 0) {
      if (p === rootPid) {
        total += kb;
        break;
      }
    }
  }
  return total;
}

async function run(args: string[]): Promise<{ ms: number; peakMb: number }> {
  const started = performance.now();
  const child = new Deno.Command(Deno.execPath(), {
    args: [
      "run",
      "-A",
      `--config=${join(root, "deno.json")}`,
      join(root, "runner", "cli.ts"),
      ...args,
    ],
    env: { NO_COLOR: "1" },
    stdout: "null",
    stderr: "piped",
  }).spawn();
  let peak = 0;
  const poll = setInterval(() => (peak = Math.max(peak, treeRssKb(child.pid))), 20);
  const out = await child.output();
  clearInterval(poll);
  const ms = performance.now() - started;
  if (out.code > 1) throw new Error(new TextDecoder().decode(out.stderr));
  return { ms, peakMb: peak / 1024 };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
let outs = 0;
const outDir = () => join(scratch, `out-${outs++}`);

const one = await folderOf(1);
await run(["run", one, "--out", outDir()]); // warm every cache
const singles: number[] = [];
let singlePeak = 0;
for (let i = 0; i < 5; i++) {
  const r = await run(["run", one, "--out", outDir()]);
  singles.push(r.ms);
  singlePeak = Math.max(singlePeak, r.peakMb);
}
const single = median(singles);
console.log(
  `one worksheet alone: median ${single.toFixed(0)} ms, peak ${singlePeak.toFixed(0)} MB`,
);

const cores = navigator.hardwareConcurrency;
for (const n of [...new Set([10, 25, copies])]) {
  const dir = await folderOf(n);
  const r = await run(["run", dir, "--out", outDir(), "--exit-zero"]);
  console.log(
    `${String(n).padStart(3)} worksheets, ${cores} at once: ${(r.ms / 1000).toFixed(2)} s ` +
      `(${(r.ms / n).toFixed(0)} ms each), ratio to ${n} × one ${
        (r.ms / (n * single)).toFixed(2)
      }, ` +
      `peak ${r.peakMb.toFixed(0)} MB`,
  );
}
const dir = join(scratch, `sheets-${copies}`);
const serial = await run(["run", dir, "--out", outDir(), "--exit-zero", "--jobs", "1"]);
console.log(
  `${copies} worksheets, one at a time: ${(serial.ms / 1000).toFixed(2)} s ` +
    `(ratio to ${copies} × one ${(serial.ms / (copies * single)).toFixed(2)}), peak ${
      serial.peakMb.toFixed(0)
    } MB`,
);
await Deno.remove(scratch, { recursive: true });
