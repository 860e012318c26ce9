// `verify` proves the record, `run` notices an altered report, and the path
// spelling does not change the report (issue 13). source: common practice for
// signed build records (hash every file, compare a fresh build byte for byte).
import assert from "node:assert/strict";
import { join, relative } from "node:path";
import { root, tapsheet } from "./_cli.ts";
import { sha256Hex } from "../../record/manifest.ts";

const sheet = (limit = 3) =>
  `---\ntitle: Verified sheet\ndocument: T-12\nrevision: A\nsettings:\n  gain: 2\n` +
  `requirements:\n  - id: R-1\n    text: Gain\n    atMost: ${limit}\n---\n\nProse.\n\n` +
  "```ts\n" +
  `import { sheet } from "tapsheet/sheet";
const gain = sheet.number("gain");
sheet.check("R-1", gain);
sheet.figure({ kind: "line", title: "A line", series: [{ name: "y", x: [0, 1, 2], y: [0, gain, 0] }] });
sheet.exportFile("taps.csv", "index,value\\n0," + gain + "\\n");
` + "```\n";

interface Setup {
  dir: string;
  file: string;
  out: string;
  report: string;
}

async function withReport(test: (s: Setup) => Promise<void>): Promise<void> {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "v.md");
  const out = join(dir, "reports");
  try {
    await Deno.writeTextFile(file, sheet());
    const r = await tapsheet(["run", file, "--out", out, "--date", "2026-03-01"]);
    assert.equal(r.code, 0, r.stderr);
    await test({ dir, file, out, report: join(out, "v") });
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
}

const figure = (report: string) =>
  [...Deno.readDirSync(join(report, "figures"))].map((e) => e.name).find((n) =>
    n.endsWith(".svg")
  )!;

/** Rewrite the manifest as a careful forger would: new hashes, new fingerprint, new digest. */
async function forgeManifest(report: string): Promise<void> {
  const path = join(report, "manifest.json");
  const m = JSON.parse(await Deno.readTextFile(path));
  for (const f of m.files) f.sha256 = sha256Hex(await Deno.readFile(join(report, f.path)));
  m.fingerprint = sha256Hex(
    m.files.map((f: { path: string; sha256: string }) => `${f.path} ${f.sha256}\n`).join(""),
  );
  m.digest = "";
  m.digest = sha256Hex(JSON.stringify(m, null, 2));
  await Deno.writeTextFile(path, JSON.stringify(m, null, 2) + "\n");
}

const tamperings: [string, (s: Setup) => Promise<void>, RegExp][] = [
  [
    "an edited page",
    async ({ report }) => {
      const p = join(report, "index.html");
      await Deno.writeTextFile(p, (await Deno.readTextFile(p)).replace("Gain", "Gian"));
    },
    /index\.html {2}changed/,
  ],
  [
    "an edited figure",
    async ({ report }) => {
      const p = join(report, "figures", await figure(report));
      await Deno.writeTextFile(p, (await Deno.readTextFile(p)).replace("A line", "A lie"));
    },
    /figures\/.*\.svg {2}changed/,
  ],
  [
    "an edited export",
    async ({ report }) => {
      await Deno.writeTextFile(join(report, "exports", "taps.csv"), "index,value\n0,1\n");
    },
    /exports\/taps\.csv {2}changed/,
  ],
  [
    "a deleted figure",
    async ({ report }) => {
      await Deno.remove(join(report, "figures", await figure(report)));
    },
    /figures\/.*\.svg {2}missing/,
  ],
  [
    "an added file",
    async ({ report }) => {
      await Deno.writeTextFile(join(report, "exports", "extra.h"), "#define GAIN 9\n");
    },
    /exports\/extra\.h {2}added/,
  ],
  [
    "a verdict edited in the manifest",
    async ({ report }) => {
      const p = join(report, "manifest.json");
      await Deno.writeTextFile(p, (await Deno.readTextFile(p)).replace('"met"', '"not met"'));
    },
    /manifest\.json {2}edited/,
  ],
  [
    "an edit with every hash in the manifest forged to match",
    async ({ report }) => {
      await Deno.writeTextFile(join(report, "exports", "taps.csv"), "index,value\n0,1\n");
      await forgeManifest(report);
    },
    /exports\/taps\.csv {2}differs from what the worksheet produces now/,
  ],
  [
    "a changed worksheet",
    async ({ file }) => {
      await Deno.writeTextFile(file, sheet(2.5));
    },
    /index\.html {2}differs from what the worksheet produces now/,
  ],
  [
    "an edited plot specification",
    async ({ report }) => {
      const name = (await figure(report)).replace(/\.svg$/, ".vl.json");
      const p = join(report, "figures", name);
      await Deno.writeTextFile(p, (await Deno.readTextFile(p)).replace("A line", "A lie"));
    },
    /\.vl\.json {2}changed/,
  ],
];

Deno.test("verify: an untouched report matches, with every check named", async () => {
  await withReport(async ({ file, out }) => {
    const r = await tapsheet(["verify", file, "--out", out]);
    assert.equal(r.code, 0, r.stdout + r.stderr);
    assert.match(r.stdout, /matches .*every file of .* is as its manifest lists, and a fresh run/);
  });
});

for (const [what, tamper, named] of tamperings) {
  Deno.test(`verify: catches ${what}`, async () => {
    await withReport(async (s) => {
      await tamper(s);
      const r = await tapsheet(["verify", s.file, "--out", s.out]);
      assert.equal(r.code, 1, r.stdout + r.stderr);
      assert.match(r.stdout, /differs/);
      assert.match(r.stdout, named);
    });
  });
}

Deno.test("verify: a printed copy beside the report is named as not checked, not as tampering", async () => {
  await withReport(async ({ file, out, report }) => {
    await Deno.writeFile(join(report, "report.pdf"), new TextEncoder().encode("%PDF-1.4\n"));
    const r = await tapsheet(["verify", file, "--out", out]);
    assert.equal(r.code, 0, r.stdout);
    assert.match(r.stdout, /report\.pdf {2}not checked/);
  });
});

Deno.test("verify: no report is a clear error (exit 2)", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(join(dir, "v.md"), sheet());
    const r = await tapsheet(["verify", join(dir, "v.md"), "--out", join(dir, "none")]);
    assert.equal(r.code, 2);
    assert.match(r.stderr, /No report to verify/);
    assert.doesNotMatch(r.stderr, /at .*\.ts:\d+/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("run: an altered or incomplete report is run again without --force", async () => {
  await withReport(async ({ file, out, report }) => {
    const again = await tapsheet(["run", file, "--out", out, "--date", "2026-03-01"]);
    assert.match(again.stdout, /unchanged, not re-run/);
    const page = join(report, "index.html");
    const original = await Deno.readTextFile(page);
    await Deno.writeTextFile(page, original.replace("Gain", "Gian"));
    const tampered = await tapsheet(["run", file, "--out", out, "--date", "2026-03-01"]);
    assert.doesNotMatch(tampered.stdout, /unchanged/);
    assert.match(tampered.stderr, /re-run: the existing report was altered .*index\.html/);
    assert.equal(await Deno.readTextFile(page), original);
    await Deno.remove(join(report, "figures", await figure(report)));
    const incomplete = await tapsheet(["run", file, "--out", out, "--date", "2026-03-01"]);
    assert.doesNotMatch(incomplete.stdout, /unchanged/);
    const back = await tapsheet(["verify", file, "--out", out]);
    assert.equal(back.code, 0, back.stdout);
  });
});

Deno.test("run: relative, absolute and other-folder spellings give the same report and fingerprint", async () => {
  await withReport(async ({ dir, file, out, report }) => {
    const first = await Deno.readTextFile(join(report, "index.html"));
    const fingerprint = JSON.parse(await Deno.readTextFile(join(report, "manifest.json")))
      .fingerprint;
    // From the worksheet's own folder, by a relative path: unchanged, nothing re-runs.
    const fromDir = await tapsheet(
      ["run", "v.md", "--out", "reports", "--date", "2026-03-01"],
      {},
      { cwd: dir },
    );
    assert.match(fromDir.stdout, /unchanged, not re-run/, fromDir.stdout + fromDir.stderr);
    // Forced, from another folder, through "..": the same bytes.
    const other = await Deno.makeTempDir();
    try {
      const spelt = join(relative(other, dir), ".", "..", relative(join(dir, ".."), dir), "v.md");
      const forced = await tapsheet(
        ["run", spelt, "--out", out, "--date", "2026-03-01", "--force"],
        {},
        { cwd: other },
      );
      assert.equal(forced.code, 0, forced.stderr);
    } finally {
      await Deno.remove(other, { recursive: true });
    }
    assert.equal(await Deno.readTextFile(join(report, "index.html")), first);
    const again = JSON.parse(await Deno.readTextFile(join(report, "manifest.json")));
    assert.equal(again.fingerprint, fingerprint);
    assert.match(first, /<td>v\.md<\/td>/, "outside a repository the report names the file only");
    assert.ok(file.endsWith("v.md"));
  });
});

Deno.test("run: same-named worksheets from two folders keep two reports", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.mkdir(join(dir, "a"));
    await Deno.mkdir(join(dir, "b"));
    await Deno.writeTextFile(join(dir, "a", "x.md"), sheet().replace("Verified sheet", "Sheet A"));
    await Deno.writeTextFile(join(dir, "b", "x.md"), sheet().replace("Verified sheet", "Sheet B"));
    const out = join(dir, "reports");
    const r = await tapsheet(["run", join(dir, "a", "x.md"), join(dir, "b", "x.md"), "--out", out]);
    assert.equal(r.code, 0, r.stderr);
    const folders = [...Deno.readDirSync(out)].filter((e) => e.isDirectory).map((e) => e.name)
      .sort();
    assert.equal(folders.length, 2, folders.join(", "));
    const titles = folders.map((f) =>
      JSON.parse(Deno.readTextFileSync(join(out, f, "manifest.json"))).title
    ).sort();
    assert.deepEqual(titles, ["Sheet A", "Sheet B"]);
    // Running each again finds its own report: both unchanged.
    const again = await tapsheet([
      "run",
      join(dir, "b", "x.md"),
      join(dir, "a", "x.md"),
      "--out",
      out,
    ]);
    assert.equal(
      again.stdout.match(/unchanged, not re-run/g)?.length,
      2,
      again.stdout + again.stderr + again.code,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("verify: a report made in a batch, after other figures, verifies on its own", async () => {
  const dir = await Deno.makeTempDir();
  try {
    for (const name of ["a", "b", "c"]) await Deno.writeTextFile(join(dir, `${name}.md`), sheet());
    const out = join(dir, "reports");
    const r = await tapsheet(["run", dir, "--out", out, "--date", "2026-03-01"]);
    assert.equal(r.code, 0, r.stderr);
    for (const name of ["a", "b", "c"]) {
      const v = await tapsheet(["verify", join(dir, `${name}.md`), "--out", out]);
      assert.equal(v.code, 0, `${name}: ${v.stdout}`);
    }
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("verify: every demo worksheet's report is reproduced byte for byte by a fresh run", async () => {
  // A worksheet that records something of the run itself (a time taken) can never verify;
  // the demos are the templates users start from, so each must.
  const out = await Deno.makeTempDir();
  try {
    const demos = [...Deno.readDirSync(join(root, "worksheets"))]
      .filter((e) => e.isFile && e.name.endsWith(".md")).map((e) =>
        join(root, "worksheets", e.name)
      );
    assert.ok(demos.length >= 4);
    const r = await tapsheet(["run", ...demos, "--out", out, "--exit-zero"]);
    assert.equal(r.code, 0, r.stderr);
    for (const demo of demos) {
      const v = await tapsheet(["verify", demo, "--out", out]);
      assert.equal(v.code, 0, `${demo}: ${v.stdout}`);
    }
  } finally {
    await Deno.remove(out, { recursive: true });
  }
});
