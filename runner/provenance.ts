// Versions and dates recorded in every report.
import { basename, dirname, join, relative, sep } from "node:path";
import { projectRoot } from "./execute.ts";

/** tapsheet's own version, from deno.json. */
export function tapsheetVersion(): string {
  const config = JSON.parse(Deno.readTextFileSync(join(projectRoot, "deno.json")));
  return String(config.version ?? "unknown");
}

/** The npm packages tapsheet depends on directly, with the versions the lock file pins. */
export function packageVersions(): { name: string; version: string }[] {
  const config = JSON.parse(Deno.readTextFileSync(join(projectRoot, "deno.json")));
  let lock: { specifiers?: Record<string, string> } = {};
  try {
    lock = JSON.parse(Deno.readTextFileSync(join(projectRoot, "deno.lock")));
  } catch {
    // no lock file: fall back to the versions written in deno.json
  }
  const out: { name: string; version: string }[] = [];
  for (const target of Object.values(config.imports as Record<string, string>)) {
    const m = /^npm:((?:@[^/]+\/)?[^@]+)@(.+)$/.exec(target);
    if (!m) continue;
    const pinned = lock.specifiers?.[target];
    out.push({ name: m[1]!, version: (pinned ?? m[2]!).split("_")[0]! });
  }
  // In code-unit order (npm names are lower case): no locale collator, the same on every machine.
  return out.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
}

/**
 * The run date, YYYY-MM-DD (UTC): the given date, else SOURCE_DATE_EPOCH (the
 * reproducible-builds convention, seconds since 1970), else today.
 */
export function runDate(given?: string): string {
  if (given !== undefined) return given;
  const epoch = Deno.env.get("SOURCE_DATE_EPOCH");
  if (epoch !== undefined && /^\d+$/.test(epoch)) {
    return new Date(Number(epoch) * 1000).toISOString().slice(0, 10);
  }
  return new Date().toISOString().slice(0, 10);
}

/** How a report names its worksheet, whatever path spelling the command line used. */
export interface WorksheetName {
  /** Shown in the report: the path from the repository's top folder, else the file name. */
  display: string;
  /** Tells worksheets apart: the display path inside a repository, else the real absolute path. */
  identity: string;
}

/**
 * Name a worksheet independently of how its path was spelt (relative,
 * absolute, from another folder, through a link): resolve the real path, then
 * take it relative to the nearest folder holding `.git`.
 */
export function worksheetName(path: string): WorksheetName {
  const real = Deno.realPathSync(path);
  for (let dir = dirname(real);; dir = dirname(dir)) {
    try {
      Deno.statSync(join(dir, ".git"));
      const display = relative(dir, real).split(sep).join("/");
      return { display, identity: display };
    } catch {
      // not the repository's top folder
    }
    if (dirname(dir) === dir) break;
  }
  return { display: basename(real), identity: real };
}
