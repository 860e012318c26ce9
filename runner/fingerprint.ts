// SHA-256 fingerprints of files and folders, for change detection.
import { createHash } from "node:crypto";
import { join, relative } from "node:path";

/**
 * One SHA-256 (hex) over the given files and folders (folders walked
 * recursively, in name order), each file entered as its path relative to
 * `root` and the SHA-256 of its bytes. Missing entries count as empty.
 */
export function hashOfFiles(root: string, entries: string[]): string {
  const all = createHash("sha256");
  const visit = (path: string) => {
    let info: Deno.FileInfo;
    try {
      info = Deno.statSync(path);
    } catch {
      return;
    }
    if (info.isFile) {
      const own = createHash("sha256").update(Deno.readFileSync(path)).digest("hex");
      all.update(`${relative(root, path)} ${own}\n`);
    } else if (info.isDirectory) {
      const names = [...Deno.readDirSync(path)].map((e) => e.name).sort();
      for (const name of names) visit(join(path, name));
    }
  };
  for (const entry of entries) visit(join(root, entry));
  return all.digest("hex");
}
