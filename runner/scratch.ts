// Temporary folders named after the process that made them, so folders left
// by a process that was killed (SIGKILL cannot be caught) can be found and
// removed by the next one.
import { join } from "node:path";

const swept = new Set<string>();

/** Make a temporary folder `<prefix><pid>-…`, first removing stale ones of the same prefix. */
export async function makeScratchFolder(prefix: string): Promise<string> {
  sweepStaleFolders(prefix);
  return await Deno.makeTempDir({ prefix: `${prefix}${Deno.pid}-` });
}

/**
 * Remove folders `<prefix><pid>-…` whose process is gone, once per prefix and
 * process. Without /proc a live process cannot be told from a dead one, and
 * nothing is removed.
 */
export function sweepStaleFolders(prefix: string): void {
  if (swept.has(prefix)) return;
  swept.add(prefix);
  const tmp = Deno.env.get("TMPDIR") ?? "/tmp";
  try {
    Deno.statSync("/proc/self");
  } catch {
    return;
  }
  try {
    for (const entry of Deno.readDirSync(tmp)) {
      const m = new RegExp(`^${prefix}(\\d+)-`).exec(entry.name);
      if (!m || Number(m[1]) === Deno.pid) continue;
      try {
        Deno.statSync(`/proc/${m[1]}`);
      } catch {
        Deno.removeSync(join(tmp, entry.name), { recursive: true });
      }
    }
  } catch {
    // an unreadable temporary folder: nothing to sweep
  }
}
