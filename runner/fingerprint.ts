// SHA-256 fingerprints of files and folders, for change detection.
import { createHash } from "node:crypto";
import { join, relative } from "node:path";

/**
 * Digests of tapsheet's own files, read once per process: the library
 * bundle's name and the tool hash both cover lib/ and deno.lock.
 */
export const toolFileDigests: Map<string, string> = new Map();

/**
 * One SHA-256 (hex) over the given files and folders (folders walked
 * recursively, in name order), each file entered as its path relative to
 * `root` and the SHA-256 of its bytes. Missing entries count as empty.
 * With `known`, a file's digest is taken from it when present and stored in
 * it when computed (pass it only for files that do not change while the
 * process runs).
 */
export function hashOfFiles(root: string, entries: string[], known?: Map<string, string>): string {
  const all = createHash("sha256");
  const file = (path: string) => {
    let own = known?.get(path);
    if (own === undefined) {
      own = createHash("sha256").update(Deno.readFileSync(path)).digest("hex");
      known?.set(path, own);
    }
    all.update(`${relative(root, path)} ${own}\n`);
  };
  const folder = (path: string) => {
    const found = [...Deno.readDirSync(path)].sort((a, b) =>
      a.name < b.name ? -1 : a.name > b.name ? 1 : 0
    );
    for (const e of found) {
      const child = join(path, e.name);
      if (e.isFile) file(child);
      else if (e.isDirectory) folder(child);
      else visit(child); // a link: what it leads to
    }
  };
  const visit = (path: string) => {
    let info: Deno.FileInfo;
    try {
      info = Deno.statSync(path);
    } catch {
      return;
    }
    if (info.isFile) file(path);
    else if (info.isDirectory) folder(path);
  };
  for (const entry of entries) visit(join(root, entry));
  return all.digest("hex");
}
