// Starting the command line from tests.
import { join } from "node:path";
import { fileURLToPath } from "node:url";

/** The project folder (holds deno.json). */
export const root: string = fileURLToPath(new URL("../../", import.meta.url));

/** Arguments that start `tapsheet` with the project's configuration. */
export const cliArgs: string[] = [
  "run",
  "-A",
  `--config=${join(root, "deno.json")}`,
  join(root, "runner", "cli.ts"),
];

/** Run `tapsheet <args>` to the end; colour off. */
export async function tapsheet(
  args: string[],
  env: Record<string, string> = {},
): Promise<{ code: number; stdout: string; stderr: string }> {
  const out = await new Deno.Command(Deno.execPath(), {
    args: [...cliArgs, ...args],
    env: { NO_COLOR: "1", ...env },
    stdout: "piped",
    stderr: "piped",
  }).output();
  const decode = (b: Uint8Array) => new TextDecoder().decode(b);
  return { code: out.code, stdout: decode(out.stdout), stderr: decode(out.stderr) };
}
