// SHA-256 fingerprints of files and folders, for change detection.
import { join, relative } from "node:path";
import { sha256Hex } from "../render/write.ts";

/**
 * One SHA-256 over the given files and folders (folders walked recursively,
 * in name order), each file entered as its path relative to `root` and its
 * own SHA-256. Missing entries count as empty.
 */
export async function hashOfFiles(root: string, entries: string[]): Promise<string> {
  const parts: string[] = [];
  const visit = async (path: string) => {
    let info: Deno.FileInfo;
    try {
      info = await Deno.stat(path);
    } catch {
      return;
    }
    if (info.isFile) {
      parts.push(`${relative(root, path)} ${await sha256Hex(await Deno.readFile(path))}`);
    } else if (info.isDirectory) {
      const names: string[] = [];
      for await (const e of Deno.readDir(path)) names.push(e.name);
      for (const name of names.sort()) await visit(join(path, name));
    }
  };
  for (const entry of entries) await visit(join(root, entry));
  return sha256Hex(parts.join("\n"));
}
