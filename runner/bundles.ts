// Parts of tapsheet loaded as one bundled JavaScript file each, made with
// `deno bundle` once per fingerprint of what goes into them (the name carries
// it), kept in .cache/ beside deno.json and written atomically.
//
// - The library, for the worksheet's child process: loading lib/ as ~120
//   separate modules costs a run about 60 ms; one bundled file loads in under 10.
// - The runner's YAML and Markdown parsers (parsers_entry.ts): the yaml
//   package's Node build is ~75 CommonJS files, ~20 ms to load in every
//   command; its ES module build, bundled with marked, loads in ~5 ms.
import { join } from "node:path";
import { projectRoot } from "./execute.ts";
import { hashOfFiles, toolFileDigests } from "./fingerprint.ts";

const built = new Map<string, Promise<string | undefined>>();

/**
 * Path of the bundle `<name>-<fingerprint>.js` of `entry`, building it when
 * missing; undefined when it cannot be built (the caller then loads the
 * modules themselves). `inputs` are the files and folders (relative to the
 * project root) whose contents the bundle depends on.
 */
function bundle(
  name: string,
  entry: string,
  inputs: string[],
  platform: "deno" | "browser",
): Promise<string | undefined> {
  let made = built.get(name);
  if (made === undefined) {
    made = make(name, entry, inputs, platform);
    built.set(name, made);
  }
  return made;
}

async function make(
  name: string,
  entry: string,
  inputs: string[],
  platform: "deno" | "browser",
): Promise<string | undefined> {
  const hash = hashOfFiles(projectRoot, inputs, toolFileDigests).slice(0, 16);
  const dir = join(projectRoot, ".cache");
  const path = join(dir, `${name}-${hash}.js`);
  try {
    await Deno.stat(path);
    return path;
  } catch {
    // not built yet
  }
  try {
    await Deno.mkdir(dir, { recursive: true });
    const temp = join(dir, `.${name}-${hash}.${crypto.randomUUID().slice(0, 8)}.js`);
    const out = await new Deno.Command(Deno.execPath(), {
      args: [
        "bundle",
        "--quiet",
        `--platform=${platform}`,
        `--config=${join(projectRoot, "deno.json")}`,
        join(projectRoot, entry),
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
}

/**
 * Path of the bundled library (lib/mod.ts), building it when missing;
 * undefined when it cannot be built (the runner then loads lib/mod.ts as modules).
 */
export function libraryBundle(): Promise<string | undefined> {
  return bundle("lib", "lib/mod.ts", ["lib", "deno.lock"], "deno");
}

/**
 * Path of the bundled parsers (runner/parsers_entry.ts, for browsers so that
 * yaml's ES module build is taken), building it when missing; undefined when
 * it cannot be built.
 */
export function parserBundle(): Promise<string | undefined> {
  return bundle(
    "parsers",
    "runner/parsers_entry.ts",
    ["runner/parsers_entry.ts", "deno.lock"],
    "browser",
  );
}
