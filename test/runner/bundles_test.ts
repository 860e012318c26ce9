import assert from "node:assert/strict";
import { join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { executeWorksheet } from "../../runner/execute.ts";
import { libraryBundle, parserBundle } from "../../runner/bundles.ts";
import * as parsers from "../../runner/parsers.ts";
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

Deno.test("parser bundle: the bundled yaml and marked give what the packages give", async () => {
  // source: the yaml 2.9.1 and marked 18.2.1 packages themselves, imported as they are
  const yaml = await import("yaml");
  const { Lexer, Marked } = await import("marked");
  const bundle = await parserBundle();
  assert.ok(bundle, "deno bundle built the parsers");
  assert.match(bundle, /\.cache\/parsers-[0-9a-f]{16}\.js$/);
  const bundled: typeof import("../../runner/parsers_entry.ts") = await import(
    pathToFileURL(bundle).href
  );
  // The module the runner uses is the bundle, not the packages.
  assert.equal(parsers.parseDocument, bundled.parseDocument);
  const front = await Deno.readTextFile(join(root, "worksheets", "pump_monitor_antialias.md"));
  const text = front.split("\n---\n")[0]!.slice(4);
  const counter = [new yaml.LineCounter(), new bundled.LineCounter()];
  const docs = [
    yaml.parseDocument(text, { lineCounter: counter[0] }),
    bundled.parseDocument(text, { lineCounter: counter[1] }),
  ];
  assert.deepEqual(docs[1]!.toJSON(), docs[0]!.toJSON());
  assert.ok(bundled.isMap(docs[1]!.contents) && yaml.isMap(docs[0]!.contents));
  const ranges = (d: typeof docs[number]) =>
    JSON.stringify(
      d.contents,
      (_k, v) => (v && typeof v === "object" && "range" in v ? v.range : v),
    );
  assert.equal(ranges(docs[1]!), ranges(docs[0]!));
  assert.deepEqual(counter[1]!.linePos(300), counter[0]!.linePos(300));
  const bad = "a: [1, 2\nb: c";
  assert.deepEqual(
    bundled.parseDocument(bad).errors.map((e) => e.message),
    yaml.parseDocument(bad).errors.map((e) => e.message),
  );
  const value = { role: "Reviewer", name: "K. Osei: QA", when: "2026-12-02", list: [1, 2.5] };
  assert.equal(bundled.stringify(value), yaml.stringify(value));
  assert.deepEqual(bundled.parse(yaml.stringify(value)), value);
  const body = front.slice(text.length + 8);
  assert.deepEqual(new bundled.Lexer().blockTokens(body), new Lexer().blockTokens(body));
  assert.deepEqual(bundled.Lexer.lex(body), Lexer.lex(body));
  assert.equal(
    new bundled.Marked({ gfm: true }).parse(body),
    new Marked({ gfm: true }).parse(body),
  );
});
