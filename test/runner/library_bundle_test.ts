import assert from "node:assert/strict";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { executeWorksheet } from "../../runner/execute.ts";
import { libraryBundle } from "../../runner/library_bundle.ts";
import { parseWorksheet } from "../../runner/parse.ts";

const root = fileURLToPath(new URL("../../", import.meta.url));

Deno.test("library bundle: the same worksheet gives the same exhibits from the bundle as from lib/", async () => {
  const bundle = await libraryBundle();
  assert.ok(bundle, "deno bundle built the library");
  assert.match(bundle, /\.cache\/lib-[0-9a-f]{16}\.js$/);
  const path = join(root, "worksheets", "pump_monitor_antialias.md");
  const ws = parseWorksheet(path, await Deno.readTextFile(path));
  const fromModules = await executeWorksheet(ws, ws.params);
  const fromBundle = await executeWorksheet(ws, ws.params, { libraryModule: bundle });
  assert.equal(fromBundle.outcome, "completed", JSON.stringify(fromBundle.problem));
  assert.deepEqual(fromBundle.blocks, fromModules.blocks);
});

Deno.test("library bundle: an error thrown inside the library is still reported at the worksheet line", async () => {
  const bundle = await libraryBundle();
  const ws = parseWorksheet(
    "w.md",
    '---\ntitle: t\n---\n\n```ts\nimport { designWindowedSinc } from "tapsheet";\n\ndesignWindowedSinc({ length: 31, fs: 8000, cutoff: 5000 });\n```\n',
  );
  const r = await executeWorksheet(ws, {}, { libraryModule: bundle! });
  assert.equal(r.outcome, "error");
  assert.equal(r.problem?.line, 8);
  assert.match(r.problem!.message, /RangeError: Cutoff must be below fs\/2 = 4000 Hz, got 5000 Hz/);
});
