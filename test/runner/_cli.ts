// Starting the command line from tests, always with a deadline (test/_process.ts).
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { type ProcessOptions, runToEnd, spawnLines, type WatchedProcess } from "../_process.ts";

/** The project folder (holds deno.json). */
export const root: string = fileURLToPath(new URL("../../", import.meta.url));

/** Arguments that start `tapsheet` with the project's configuration. */
export const cliArgs: string[] = [
  "run",
  "-A",
  `--config=${join(root, "deno.json")}`,
  join(root, "runner", "cli.ts"),
];

/** Run `tapsheet <args>` to the end (killed and failed after 3 minutes); colour off. */
export async function tapsheet(
  args: string[],
  env: Record<string, string> = {},
  options: Omit<ProcessOptions, "env"> = {},
): Promise<{ code: number; stdout: string; stderr: string }> {
  const r = await runToEnd(Deno.execPath(), [...cliArgs, ...args], { ...options, env });
  return { code: r.code, stdout: r.stdout, stderr: r.stderr };
}

/** Start a long-running `tapsheet <args>` (such as watch) and watch its output. */
export function tapsheetWatched(
  args: string[],
  options: ProcessOptions = {},
): WatchedProcess {
  return spawnLines(Deno.execPath(), [...cliArgs, ...args], options);
}
