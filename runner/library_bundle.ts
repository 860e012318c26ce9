// The library as one JavaScript file for the worksheet's child process.
//
// Loading lib/ as ~120 separate modules costs a worksheet run about 60 ms;
// one bundled file loads in under 10 ms. The bundle is made once per version
// of lib/ and the lock file (its name carries their fingerprint) with
// `deno bundle`, kept in .cache/ beside deno.json, and written atomically.
import { join } from "node:path";
import { projectRoot } from "./execute.ts";
import { hashOfFiles } from "./fingerprint.ts";

let bundle: Promise<string | undefined> | undefined;

/**
 * Path of the bundled library, building it when missing; undefined when it
 * cannot be built (the runner then loads lib/mod.ts as modules).
 */
export function libraryBundle(): Promise<string | undefined> {
  bundle ??= (async () => {
    const hash = hashOfFiles(projectRoot, ["lib", "deno.lock"]).slice(0, 16);
    const dir = join(projectRoot, ".cache");
    const path = join(dir, `lib-${hash}.js`);
    try {
      await Deno.stat(path);
      return path;
    } catch {
      // not built yet
    }
    try {
      await Deno.mkdir(dir, { recursive: true });
      const temp = join(dir, `.lib-${hash}.${crypto.randomUUID().slice(0, 8)}.js`);
      const out = await new Deno.Command(Deno.execPath(), {
        args: [
          "bundle",
          "--quiet",
          `--config=${join(projectRoot, "deno.json")}`,
          join(projectRoot, "lib", "mod.ts"),
          "-o",
          temp,
        ],
        env: { NO_COLOR: "1", RUST_BACKTRACE: "0" },
        stdout: "null",
        stderr: "null",
      }).output();
      if (!out.success) {
        await Deno.remove(temp).catch(() => {});
        return undefined;
      }
      await Deno.rename(temp, path);
      return path;
    } catch {
      return undefined;
    }
  })();
  return bundle;
}
