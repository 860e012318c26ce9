// End to end: the command line renders worksheets into reports.
import assert from "node:assert/strict";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { root, tapsheet } from "./_cli.ts";

const demo = join(root, "worksheets", "pump_monitor_antialias.md");

async function sha256(path: string): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", await Deno.readFile(path));
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, "0")).join("");
}

Deno.test("cli: the demo worksheet renders a report with figures, requirement table and provenance", async () => {
  const out = await Deno.makeTempDir();
  try {
    const r = await tapsheet(["run", demo, "--out", out, "--date", "2026-01-15"]);
    // The demo's windowed design honestly misses its strict requirements: exit code 1.
    assert.equal(r.code, 1, r.stderr);
    assert.match(r.stdout, /not met .*pump_monitor_antialias\.md .*requirements met/);
    const dir = join(out, "pump_monitor_antialias");
    const html = await Deno.readTextFile(join(dir, "index.html"));
    const figures = [...html.matchAll(/<img src="(figures\/[^"]+\.svg)"/g)].map((m) => m[1]!);
    assert.ok(figures.length >= 4, `figures: ${figures.join(", ")}`);
    for (const f of figures) {
      const svg = await Deno.readTextFile(join(dir, f));
      assert.match(svg, /^<svg[^>]+width="\d+"[^>]+height="\d+"/);
      assert.match(svg, /Frequency \(Hz\)|Sample/);
    }
    assert.match(html, /<table class="requirements">/);
    assert.match(html, /PV40-SRS-113/);
    assert.ok(html.includes(await sha256(demo)), "report shows the worksheet's SHA-256");
    assert.match(html, /2026-01-15/);
    assert.doesNotMatch(html, /<script/i);
    const manifest = JSON.parse(await Deno.readTextFile(join(dir, "manifest.json")));
    assert.equal(manifest.verdict, "not met");
    assert.equal(manifest.requirements.length, 3);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: same worksheet and pinned date give a byte-identical report", async () => {
  const a = await Deno.makeTempDir();
  const b = await Deno.makeTempDir();
  try {
    await tapsheet(["run", demo, "--out", a], { SOURCE_DATE_EPOCH: "1767225600" });
    await tapsheet(["run", demo, "--out", b], { SOURCE_DATE_EPOCH: "1767225600" });
    const files = async (root: string) => {
      const list: string[] = [];
      const walk = async (d: string, prefix: string) => {
        for await (const e of Deno.readDir(d)) {
          if (e.isDirectory) await walk(join(d, e.name), `${prefix}${e.name}/`);
          else list.push(`${prefix}${e.name}`);
        }
      };
      await walk(root, "");
      return list.sort();
    };
    const la = await files(a);
    assert.deepEqual(la, await files(b));
    for (const f of la) assert.equal(await sha256(join(a, f)), await sha256(join(b, f)), f);
    const html = await Deno.readTextFile(join(a, "pump_monitor_antialias", "index.html"));
    assert.match(html, /2026-01-01/); // source: SOURCE_DATE_EPOCH 1767225600 is 2026-01-01T00:00:00Z
  } finally {
    await Deno.remove(a, { recursive: true });
    await Deno.remove(b, { recursive: true });
  }
});

Deno.test("cli: a failing block is reported at its worksheet line; later blocks are not run", async () => {
  const out = await Deno.makeTempDir();
  const sheet = join(out, "broken.md");
  await Deno.writeTextFile(
    sheet,
    [
      "---",
      "title: Broken on purpose",
      "---",
      "",
      "```ts",
      'import { sheet } from "tapsheet/sheet";',
      'sheet.choice("a", 1, "first block runs");',
      "```",
      "",
      "```ts",
      "const taps = [1, 2, 3];",
      'if (taps.length === 3) throw new RangeError("three taps are not enough");',
      "```",
      "",
      "```ts",
      'sheet.choice("b", 2, "never");',
      "```",
      "",
    ].join("\n"),
  );
  try {
    const r = await tapsheet(["run", sheet, "--out", join(out, "reports")]);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /broken\.md:12:\d+: RangeError: three taps are not enough/);
    assert.match(r.stderr, /12 \| if \(taps.length === 3\)/);
    const html = await Deno.readTextFile(join(out, "reports", "broken", "index.html"));
    assert.match(html, /Failed at [^<]*broken\.md:12/);
    assert.match(html, /Not run: an earlier block failed/);
    assert.match(html, /Incomplete/);
    assert.match(html, /a = <strong>1<\/strong>/);
    assert.doesNotMatch(html, /b = <strong>2<\/strong>/);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: sandbox refusals show on the command line and in the report", async () => {
  const out = await Deno.makeTempDir();
  try {
    const hostile = fileURLToPath(new URL("./hostile/write_file.md", import.meta.url));
    const r = await tapsheet(["run", hostile, "--out", out]);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /write_file\.md:13:\d+: Blocked by the sandbox/);
    const html = await Deno.readTextFile(join(out, "write_file", "index.html"));
    assert.match(html, /Blocked by the sandbox/);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

const usage: [string, string[], number, RegExp][] = [
  ["unknown command", ["frobnicate"], 2, /Unknown command 'frobnicate'/],
  ["unknown option", ["run", demo, "--colour"], 2, /Unknown option '--colour'/],
  [
    "missing worksheet",
    ["run", "no/such/file.md"],
    2,
    /No such worksheet or folder: no\/such\/file.md/,
  ],
  ["unknown parameter", ["run", demo, "--set", "fz=8000"], 2, /Unknown setting 'fz'/],
  [
    "parameter of wrong type",
    ["run", demo, "--set", "fs=fast"],
    2,
    /'fs' must be a number, got 'fast'/,
  ],
  [
    "parameter out of range",
    ["run", demo, "--set", "fs=10"],
    2,
    /'fs' must be between 1000 Hz and 192000 Hz, got 10 Hz/,
  ],
  ["bad date", ["run", demo, "--date", "yesterday"], 2, /--date needs a real calendar date/],
  // source: ISO 8601 calendar dates; month 13 and 30 February do not exist
  ["impossible date", ["run", demo, "--date", "2026-13-45"], 2, /got '2026-13-45'/],
  ["30 February", ["run", demo, "--date", "2026-02-30"], 2, /got '2026-02-30'/],
];
for (const [what, args, code, message] of usage) {
  Deno.test(`cli: ${what} → exit ${code} with a clear message`, async () => {
    const r = await tapsheet(args);
    assert.equal(r.code, code);
    assert.match(r.stderr, message);
  });
}

Deno.test("cli: --help on every command", async () => {
  for (
    const args of [
      ["--help"],
      ["run", "--help"],
      ["check", "--help"],
      ["new", "--help"],
      ["verify", "--help"],
      ["watch", "--help"],
    ]
  ) {
    const r = await tapsheet(args);
    assert.equal(r.code, 0, args.join(" "));
    assert.match(r.stdout, /tapsheet/);
  }
});

Deno.test("cli: a parameters file overrides front matter, and --set overrides the file", async () => {
  const out = await Deno.makeTempDir();
  try {
    const values = join(out, "values.yaml");
    await Deno.writeTextFile(values, "taps: 81\nstopbandEdge: 1800\n");
    const r = await tapsheet([
      "run",
      demo,
      "--out",
      out,
      "--settings",
      values,
      "--set",
      "taps=101",
      "--json",
      "-",
    ]);
    const manifest = JSON.parse(
      await Deno.readTextFile(join(out, "pump_monitor_antialias", "manifest.json")),
    );
    assert.equal(manifest.settings.taps, 101);
    assert.equal(manifest.settings.stopbandEdge, 1800);
    assert.equal(manifest.settings.fs, 8000);
    const html = await Deno.readTextFile(join(out, "pump_monitor_antialias", "index.html"));
    assert.match(html, /<td>taps<\/td><td class="num">101<\/td>.*?<td>set for this run<\/td>/);
    assert.match(html, /<td>fs<\/td><td class="num">8000<\/td>.*?<td>worksheet value<\/td>/);
    assert.match(r.stdout, /"verdict": "(met|not met)"/);
    const bad = join(out, "bad.yaml");
    await Deno.writeTextFile(bad, "taps: many\n");
    const rejected = await tapsheet(["run", demo, "--out", out, "--settings", bad]);
    assert.equal(rejected.code, 2);
    assert.match(rejected.stderr, /'taps' must be a number, got '"many"'/);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: --exit-zero keeps an unmet requirement from failing the command, not a failed worksheet", async () => {
  const out = await Deno.makeTempDir();
  try {
    const r = await tapsheet(["run", demo, "--out", out, "--exit-zero"]);
    assert.equal(r.code, 0, r.stderr);
    assert.match(r.stdout, /not met/);
    const hostile = fileURLToPath(new URL("./hostile/network.md", import.meta.url));
    const failed = await tapsheet(["run", hostile, "--out", out, "--exit-zero"]);
    assert.equal(failed.code, 2);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: a syntax error is reported at file:line:column with the line shown", async () => {
  const out = await Deno.makeTempDir();
  try {
    const sheet = join(out, "syntax.md");
    await Deno.writeTextFile(
      sheet,
      "---\ntitle: Typo\n---\n\n```ts\nconst a = 1;\nconst b = (a +;\n```\n",
    );
    const r = await tapsheet(["run", sheet, "--out", join(out, "reports")]);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /syntax\.md:7:15: SyntaxError: Expression expected/);
    assert.match(r.stderr, /7 \| const b = \(a \+;/);
    const checked = await tapsheet(["check", sheet]);
    assert.equal(checked.code, 2);
    assert.match(checked.stderr, /syntax\.md:7:15: Expression expected \(SyntaxError\)/);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: mistakes in files and folders given on the command line exit 2 with a message, no trace", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.mkdir(join(dir, "only-folders", "inner"), { recursive: true });
    await Deno.mkdir(join(dir, "empty"));
    await Deno.writeTextFile(join(dir, "a-file"), "not a folder\n");
    await Deno.writeTextFile(join(dir, "broken.yaml"), "taps: [1, 2\n");
    await Deno.writeTextFile(join(dir, "notes.txt"), "hello\n");
    const cases: [string, string[], RegExp][] = [
      [
        "missing parameters file",
        ["run", demo, "--settings", join(dir, "none.yaml")],
        /none\.yaml does not exist/,
      ],
      [
        "parameters file that is not YAML",
        ["run", demo, "--settings", join(dir, "broken.yaml")],
        /broken\.yaml is not valid YAML or JSON/,
      ],
      [
        "--out naming a file",
        ["run", demo, "--out", join(dir, "a-file")],
        /--out must name a folder .*a-file is a file/,
      ],
      [
        "a folder of subfolders only",
        ["run", join(dir, "only-folders")],
        /holds no worksheets \(\*\.md\), only 1 subfolder/,
      ],
      ["an empty folder", ["run", join(dir, "empty")], /empty\S* is empty: it holds no worksheets/],
      [
        "a file that is not Markdown",
        ["run", join(dir, "notes.txt")],
        /notes\.txt is not a worksheet/,
      ],
      [
        "unknown option names its command",
        ["verify", demo, "--fast"],
        /deno task tapsheet verify --help/,
      ],
      [
        "the old name of --settings",
        ["run", demo, "--params", "x.yaml"],
        /Option '--params' is now called '--settings'/,
      ],
    ];
    for (const [what, args, message] of cases) {
      const r = await tapsheet(args);
      assert.equal(r.code, 2, `${what}: ${r.stderr}`);
      assert.match(r.stderr, message, what);
      assert.doesNotMatch(
        r.stderr,
        /\bat .*\.ts:\d+:\d+|--allow-/,
        `${what}: no trace, no Deno flags`,
      );
    }
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("cli: misspelt front matter, unknown figure kinds and short table rows point at the worksheet's line", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const cases: [string, string, RegExp][] = [
      [
        "---\ntitle: Misspelt\ndocumnet: X-1\n---\n\nProse.\n",
        "misspelt",
        /misspelt\.md:3: Unknown front-matter key 'documnet' \(did you mean 'document'\?\)/,
      ],
      [
        '---\ntitle: Kind\n---\n\n```ts\nimport { sheet } from "tapsheet/sheet";\nsheet.figure({ kind: "bode" as never, title: "t", series: [] });\n```\n',
        "kind",
        /kind\.md:7:\d+: TypeError: Figure kind must be one of magnitude, .*got 'bode'/,
      ],
      [
        '---\ntitle: Rows\n---\n\n```ts\nimport { sheet } from "tapsheet/sheet";\nsheet.table("Taps", ["n", "h"], [[0, 0.5], [1]]);\n```\n',
        "rows",
        /rows\.md:7:\d+: RangeError: Table 'Taps' has 2 columns, but row 2 has 1 cells/,
      ],
    ];
    for (const [text, name, message] of cases) {
      const file = join(dir, `${name}.md`);
      await Deno.writeTextFile(file, text);
      const r = await tapsheet(["run", file, "--out", join(dir, "reports")]);
      assert.equal(r.code, 2, `${name}: ${r.stdout}${r.stderr}`);
      assert.match(r.stderr, message, name);
    }
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("cli: run --json - writes only JSON on standard output", async () => {
  const out = await Deno.makeTempDir();
  try {
    const r = await tapsheet(["run", demo, demo, "--out", out, "--json", "-"]);
    const parsed = JSON.parse(r.stdout);
    assert.equal(parsed.length, 2);
    assert.match(r.stderr, /pump_monitor_antialias\.md/);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: help names the command a user types", async () => {
  const r = await tapsheet(["help"]);
  assert.match(r.stdout, /deno task tapsheet run <worksheet\.md or folder>/);
  const unknown = await tapsheet(["frobnicate"]);
  assert.match(unknown.stderr, /Run 'deno task tapsheet help'/);
});

Deno.test("cli: run --timings says where the time went", async () => {
  const out = await Deno.makeTempDir();
  try {
    const r = await tapsheet(["run", demo, "--out", out, "--timings"]);
    for (
      const step of [
        /start Deno and load the command line +\d+\.\d ms/,
        /run the worksheet in its sandbox child +\d+\.\d ms/,
        /child: worksheet code +\d+\.\d ms/,
        /figure 1: drawn (while the worksheet ran )?\(magnitude\) +\d+\.\d ms/,
        /manifest and swap into place +\d+\.\d ms/,
      ]
    ) assert.match(r.stdout, step);
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});

Deno.test("cli: a batch runs worksheets side by side and gives same-named ones their own folders", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const text = await Deno.readTextFile(demo);
    for (const sub of ["a", "b", "c"]) {
      await Deno.mkdir(join(dir, sub));
      await Deno.writeTextFile(join(dir, sub, "pump.md"), text);
    }
    const out = join(dir, "reports");
    const r = await tapsheet([
      "run",
      join(dir, "a"),
      join(dir, "b"),
      join(dir, "c"),
      "--out",
      out,
      "--jobs",
      "2",
      "--exit-zero",
    ]);
    assert.equal(r.code, 0, r.stderr);
    const folders = [...Deno.readDirSync(out)].filter((e) => e.isDirectory).map((e) => e.name);
    assert.equal(folders.length, 3, folders.join(", "));
    const bad = await tapsheet(["run", demo, "--jobs", "1.5"]);
    assert.equal(bad.code, 2);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
