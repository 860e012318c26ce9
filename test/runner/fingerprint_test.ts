import assert from "node:assert/strict";
import { join } from "node:path";
import { hashOfFiles } from "../../runner/fingerprint.ts";
import { runToEnd } from "../_process.ts";

/** SHA-256 of a file by the system's sha256sum (GNU coreutils), outside this project. */
async function sha256sum(path: string): Promise<string> {
  return (await runToEnd("sha256sum", [path])).stdout.split(" ")[0]!;
}

Deno.test("hashOfFiles: one SHA-256 over each file's relative path and digest, folders in name order, links followed", async () => {
  const root = await Deno.makeTempDir({ prefix: "tapsheet-fp-" });
  try {
    await Deno.mkdir(join(root, "a", "Z"), { recursive: true });
    await Deno.writeTextFile(join(root, "a", "b.txt"), "fs = 8000\n");
    await Deno.writeTextFile(join(root, "a", "Z", "c.csv"), "0.25,0.5,0.25\n");
    await Deno.writeTextFile(join(root, "a", "_d.bin"), "\u0000\u0001");
    await Deno.writeTextFile(join(root, "elsewhere.txt"), "taps = 41\n");
    await Deno.symlink(join(root, "elsewhere.txt"), join(root, "a", "link.txt"));
    // source: common practice (the listing a hash of a folder is taken over), each file's
    // digest by sha256sum and the whole by Python's hashlib, both outside this project
    const names = ["a/Z/c.csv", "a/_d.bin", "a/b.txt", "a/link.txt"]; // code-unit order
    const listing = (
      await Promise.all(names.map(async (n) => `${n} ${await sha256sum(join(root, n))}\n`))
    ).join("");
    const py = await runToEnd("/usr/bin/python3", [
      "-c",
      "import hashlib,sys; print(hashlib.sha256(sys.argv[1].encode()).hexdigest())",
      listing,
    ]);
    const expected = py.stdout.trim();
    assert.equal(hashOfFiles(root, ["a", "missing"]), expected);

    // Digests kept in `known` give the same hash, and are used in place of the files.
    const known = new Map<string, string>();
    assert.equal(hashOfFiles(root, ["a"], known), expected);
    assert.equal(known.size, 4);
    await Deno.writeTextFile(join(root, "a", "b.txt"), "fs = 16000\n");
    assert.equal(hashOfFiles(root, ["a"], known), expected);
    assert.notEqual(hashOfFiles(root, ["a"]), expected);
  } finally {
    await Deno.remove(root, { recursive: true });
  }
});
