// `compare` (issue 14): side arguments, fetching a worksheet and its data/ at
// a git revision, the summary lines, and the command end to end on a small
// git repository of an invented product (the IDL-7 conveyor idler monitor):
// revision against revision, working copy against a revision, report folder
// against report folder, and the exit codes CI gates on.
import assert from "node:assert/strict";
import { join } from "node:path";
import { compareRecords } from "../../record/compare.ts";
import {
  changeLines,
  CompareInputError,
  fetchAtRevision,
  sideArgument,
  worseLines,
} from "../../runner/compare.ts";
import { runToEnd } from "../_process.ts";
import { firCost, listing, manifest, record, row } from "../record/_records.ts";
import { tapsheet } from "./_cli.ts";

/**
 * The worksheet: a Hamming windowed-sinc lowpass, its taps scaled by a gain
 * trim read from data/gain.txt, checked, drawn, listed with Q0.15 codes,
 * costed and exported. source: common practice for a Hamming design, stopband
 * about 53 dB and transition about 3.3·fs/N (so 41 taps at 4 kHz meet 40 dB
 * from 900 Hz and 15 taps do not).
 */
const worksheet = (o: { taps?: number; limit?: number; revision?: string } = {}) =>
  `---
title: Vibration lowpass for the IDL-7 conveyor idler monitor
document: IDL-7-DSP-002
revision: ${o.revision ?? "A"}
settings:
  fs: 4000
  taps: ${o.taps ?? 41}
  stopbandEdge: 900
requirements:
  - id: IDL-SRS-1
    text: Stopband attenuation
    atLeast: ${o.limit ?? 40}
    unit: dB
    check: stopbandAttenuation
    from: stopbandEdge
    to: fs/2
  - id: IDL-SRS-2
    text: Passband deviation from 0 dB
    atMost: 0.2
    unit: dB
    check: passbandDeviation
    from: 0
    to: 300
---

# Scope

The IDL-7 (an invented product) listens to conveyor idler bearings; this lowpass runs before its
decimator.

\`\`\`ts
import { sheet } from "tapsheet/sheet";
import {
  checkSpec,
  designWindowedSinc,
  formatName,
  frequencyResponse,
  implementationCost,
  magnitudeDb,
  magnitudeMask,
  qFormat,
  quantiseValues,
} from "tapsheet";

const fs = sheet.number("fs");
const length = sheet.number("taps");
// The analogue front end's gain trim, measured on the bench, kept under data/.
const gain = Number((await Deno.readTextFile("data/gain.txt")).trim());
const design = designWindowedSinc({ length, fs, cutoff: 600, window: "hamming" });
const taps = Array.from(design, (t) => t * gain);
const format = qFormat(16, 15);
const q = quantiseValues(taps, format);
const spec = sheet.spec(fs);
sheet.check(checkSpec({ kind: "fir", taps }, spec));
const grid = frequencyResponse(taps, fs, { points: 513 });
sheet.figure({
  kind: "magnitude",
  title: "Magnitude response",
  series: [{ name: "Windowed sinc", x: grid.frequencies, y: magnitudeDb(grid) }],
  mask: magnitudeMask(spec),
  yDomain: [-100, 5],
});
sheet.coefficients("Idler lowpass", taps, { codes: q.codes, format: formatName(format) });
sheet.cost("Windowed sinc", implementationCost({ kind: "fir", taps }, { fs }));
sheet.exportFile("idler_lowpass.csv", Array.from(q.codes).join("\\n") + "\\n");
\`\`\`
`;

/** git with a fixed identity and date, bounded by a deadline. */
async function git(dir: string, args: string[]): Promise<string> {
  const when = "2026-03-02T10:00:00Z";
  const r = await runToEnd("git", args, {
    cwd: dir,
    timeoutMs: 30_000,
    env: {
      GIT_AUTHOR_NAME: "T. Ester",
      GIT_AUTHOR_EMAIL: "tester@example.invalid",
      GIT_COMMITTER_NAME: "T. Ester",
      GIT_COMMITTER_EMAIL: "tester@example.invalid",
      GIT_AUTHOR_DATE: when,
      GIT_COMMITTER_DATE: when,
      GIT_CONFIG_GLOBAL: "/dev/null",
      GIT_CONFIG_NOSYSTEM: "1",
    },
  });
  assert.equal(r.code, 0, `git ${args.join(" ")}: ${r.stderr}`);
  return r.stdout;
}

/**
 * A repository with three commits of sensors/w.md: HEAD~2 as designed; HEAD~1
 * with a new gain trim in data/ only; HEAD with 15 taps instead of 41 and
 * revision B. The working copy is left as HEAD.
 */
async function withRepository(test: (repo: string, file: string) => Promise<void>) {
  const repo = await Deno.makeTempDir({ prefix: "tapsheet-compare-test-" });
  try {
    const folder = join(repo, "sensors");
    await Deno.mkdir(join(folder, "data"), { recursive: true });
    const file = join(folder, "w.md");
    await git(repo, ["init", "-q"]);
    await Deno.writeTextFile(file, worksheet());
    await Deno.writeTextFile(join(folder, "data", "gain.txt"), "1\n");
    await git(repo, ["add", "-A"]);
    await git(repo, ["commit", "-q", "-m", "IDL-7 lowpass, 41 taps"]);
    await Deno.writeTextFile(join(folder, "data", "gain.txt"), "0.99\n");
    await git(repo, ["commit", "-q", "-am", "Gain trim from the bench"]);
    await Deno.writeTextFile(file, worksheet({ taps: 15, revision: "B" }));
    await git(repo, ["commit", "-q", "-am", "Fewer taps"]);
    await test(repo, file);
  } finally {
    await Deno.remove(repo, { recursive: true });
  }
}

Deno.test("sideArgument: folder, working copy, worksheet at a revision, or a mistake", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const file = join(dir, "w.md");
    await Deno.writeTextFile(file, "---\ntitle: x\n---\n");
    assert.deepEqual(await sideArgument(dir), { kind: "folder", path: dir });
    assert.deepEqual(await sideArgument(file), { kind: "worksheet", path: file });
    assert.deepEqual(await sideArgument(`${file}@HEAD~1`), {
      kind: "revision",
      path: file,
      revision: "HEAD~1",
    });
    // The first ".md@" splits: a revision may hold "@" itself.
    assert.deepEqual(await sideArgument("sheets/w.md@HEAD@{2}"), {
      kind: "revision",
      path: "sheets/w.md",
      revision: "HEAD@{2}",
    });
    await assert.rejects(
      () => sideArgument("w.md@--output=/tmp/x"),
      (e: Error) => e instanceof CompareInputError && /no revision '--output/.test(e.message),
    );
    for (const bad of [join(dir, "missing.md"), join(dir, "notes.txt"), "w.md@"]) {
      await assert.rejects(
        () => sideArgument(bad),
        (e: Error) => e instanceof CompareInputError && /neither a report folder/.test(e.message),
        bad,
      );
    }
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("fetchAtRevision: the worksheet and its data/ as git has them, in the same layout", async () => {
  await withRepository(async (repo, file) => {
    const into = await Deno.makeTempDir();
    try {
      const f = await fetchAtRevision(file, "HEAD~2", into);
      assert.equal(f.repositoryPath, "sensors/w.md");
      assert.equal(f.path, join(into, "sensors", "w.md"));
      assert.equal(await Deno.readTextFile(f.path), worksheet());
      assert.equal(await Deno.readTextFile(join(into, "sensors", "data", "gain.txt")), "1\n");
      assert.equal(f.date, "2026-03-02", "the commit's date");
      assert.equal(f.commit, (await git(repo, ["rev-parse", "HEAD~2"])).trim());
      const g = await fetchAtRevision(file, "HEAD~1", join(into, "next"));
      assert.equal(
        await Deno.readTextFile(join(into, "next", "sensors", "data", "gain.txt")),
        "0.99\n",
      );
      assert.equal(await Deno.readTextFile(g.path), worksheet());
    } finally {
      await Deno.remove(into, { recursive: true });
    }
  });
});

Deno.test("fetchAtRevision: unknown revision, missing worksheet, outside a repository, a link in data/", async () => {
  await withRepository(async (repo, file) => {
    const into = await Deno.makeTempDir();
    const outside = await Deno.makeTempDir();
    try {
      const refused = (message: RegExp) => (e: Error) =>
        e instanceof CompareInputError && message.test(e.message);
      await assert.rejects(
        () => fetchAtRevision(file, "no-such-tag", into),
        refused(/no revision 'no-such-tag'/),
      );
      await assert.rejects(
        () => fetchAtRevision(join(repo, "sensors", "other.md"), "HEAD", into),
        refused(/sensors\/other\.md does not exist at revision HEAD/),
      );
      await assert.rejects(
        () => fetchAtRevision(join(outside, "w.md"), "HEAD", into),
        refused(/not inside a git repository/),
      );
      await Deno.symlink("gain.txt", join(repo, "sensors", "data", "alias.txt"));
      await git(repo, ["add", "-A"]);
      await git(repo, ["commit", "-q", "-m", "a link"]);
      await assert.rejects(
        () => fetchAtRevision(file, "HEAD", into),
        refused(/alias\.txt is a symbolic link/),
      );
    } finally {
      await Deno.remove(into, { recursive: true });
      await Deno.remove(outside, { recursive: true });
    }
  });
});

Deno.test("summary lines: each change once, in words, with the values it changed between", () => {
  const was = record(
    manifest({
      requirements: [
        row("R-1", 52, { limit: 50 }),
        row("R-2", 0.1, { relation: "atMost", limit: 0.5 }),
      ],
      costs: [{ name: "equiripple", cost: firCost(41) }],
      files: [{ path: "exports/a.h", sha256: "a".repeat(64) }],
      settings: { fs: 4000, taps: 41 },
    }),
    { listings: [listing("taps", [0.25, 0.5], { codes: [8192, 16384], format: "Q0.15" })] },
  );
  const now = record(
    manifest({
      revision: "B",
      requirements: [row("R-1", 52, { limit: 55 }), row("R-3", 1)],
      costs: [{ name: "equiripple", cost: firCost(45) }],
      files: [{ path: "exports/a.h", sha256: "b".repeat(64) }],
      settings: { fs: 4000, taps: 45 },
    }),
    {
      listings: [
        listing("taps", [0.25, 0.5 + 3 / 32768], { codes: [8192, 16387], format: "Q0.15" }),
      ],
    },
  );
  const c = compareRecords(was, now, { old: "a", new: "b" });
  const lines = changeLines(c);
  const expect = [
    "revision: A → B",
    "setting taps: 41 → 45",
    "requirement R-1 limit: ≥ 50 dB → ≥ 55 dB (stricter)",
    "requirement R-3 added",
    "requirement R-2 removed: Requirement R-2, ≤ 0.5 dB",
    "R-1: met → not met (margin +2 → −3 dB)",
    `listing "taps": largest change of a code 3 LSBs of Q0.15 at index 1 (1 code changed)`,
    `cost "equiripple": structure ${firCost(41).structure} → ${firCost(45).structure}, `,
    `multiplies per output ${firCost(41).multipliesPerOutput} → ${
      firCost(45).multipliesPerOutput
    },`,
    "export exports/a.h changed",
  ];
  for (const e of expect) {
    assert.ok(lines.some((l) => l.includes(e)), `${e}\nin\n${lines.join("\n")}`);
  }
  assert.deepEqual(worseLines(c.worse), [
    "got worse: R-1 was met and is not met now",
    "got worse: R-2 is no longer declared",
  ]);
});

/** Read a comparison page and assert it is static. */
async function staticPage(dir: string): Promise<string> {
  const html = await Deno.readTextFile(join(dir, "index.html"));
  assert.doesNotMatch(html, /<script/i);
  assert.match(html, /Content-Security-Policy" content="default-src 'none';/);
  for (const m of html.matchAll(/<img src="([^"]+)"/g)) {
    assert.match(await Deno.readTextFile(join(dir, m[1]!)), /^<svg/, m[1]);
  }
  return html;
}

Deno.test("compare end to end: revisions of a worksheet in git, and the working copy", async () => {
  await withRepository(async (repo) => {
    const out = join(repo, "comparisons");
    const cwd = join(repo, "sensors");
    // Only the gain trim under data/ changed: every value and code moved, nothing got worse.
    const trim = await tapsheet(
      ["compare", "w.md@HEAD~2", "w.md@HEAD~1", "--out", join(out, "trim")],
      {},
      { cwd },
    );
    assert.equal(trim.code, 0, trim.stdout + trim.stderr);
    const [head, ...lines] = trim.stdout.trimEnd().split("\n");
    assert.match(
      head!,
      /^changed {2}w\.md@HEAD~2 \([0-9a-f]{7,}\) → w\.md@HEAD~1 \([0-9a-f]{7,}\) {2}\d+ changes {2}→ /,
    );
    assert.ok(
      lines.some((l) =>
        /listing "Idler lowpass": largest change of a value \S+ at index \d+ \(41 of 41 changed\)/
          .test(l)
      ),
      trim.stdout,
    );
    assert.ok(
      lines.some((l) =>
        /listing "Idler lowpass": largest change of a code \d+ LSBs? of Q0\.15/.test(l)
      ),
      trim.stdout,
    );
    assert.ok(
      lines.some((l) => l.trim() === "export exports/idler_lowpass.csv changed"),
      trim.stdout,
    );
    assert.ok(
      lines.some((l) =>
        /figure "Magnitude response": largest change -?[\d.]+ dB at [\d.]+ Hz/.test(l)
      ),
      trim.stdout,
    );
    assert.ok(!lines.some((l) => /setting|requirement|got worse/.test(l)), trim.stdout);
    await staticPage(join(out, "trim"));

    // 41 → 15 taps: both requirements go from met to not met, so compare exits with 1.
    const fewer = await tapsheet(
      ["compare", "w.md@HEAD~1", "w.md@HEAD", "--out", join(out, "fewer")],
      {},
      { cwd },
    );
    assert.equal(fewer.code, 1, fewer.stdout + fewer.stderr);
    assert.match(fewer.stdout, /^worse {2}.* {2}2 got worse, \d+ changes/);
    for (
      const e of [
        "got worse: IDL-SRS-1 was met and is not met now",
        "got worse: IDL-SRS-2 was met and is not met now",
        "revision: A → B",
        "setting taps: 41 → 15",
        `listing "Idler lowpass": 41 → 15 values`,
        `cost "Windowed sinc": structure`,
      ]
    ) assert.ok(fewer.stdout.includes(e), `${e}\nin\n${fewer.stdout}`);
    assert.match(fewer.stdout, /IDL-SRS-1: met → not met \(margin \+[\d.]+ → −[\d.]+ dB\)/);
    assert.match(fewer.stdout, /multiplies per output 21 → 8/);
    const html = await staticPage(join(out, "fewer"));
    assert.match(html, /2 things a requirement covers got worse/);
    const json = JSON.parse(await Deno.readTextFile(join(out, "fewer", "comparison.json")));
    assert.equal(json.gotWorse, true);
    assert.equal(json.old.dir, undefined, "a side run in a temporary folder names no folder");

    // The working copy is HEAD: a fresh run of it is the same record.
    const same = await tapsheet(["compare", "w.md@HEAD", "w.md", "--out", join(out, "same")], {}, {
      cwd,
    });
    assert.equal(same.code, 0, same.stdout + same.stderr);
    assert.match(same.stdout, /^unchanged {2}w\.md@HEAD \([0-9a-f]+\) → w\.md {2}0 changes/);
    assert.equal(same.stdout.trimEnd().split("\n").length, 1, same.stdout);

    // Loosen the limit in the working copy: the requirement now says less, which got worse.
    await Deno.writeTextFile(join(cwd, "w.md"), worksheet({ taps: 15, revision: "B", limit: 20 }));
    const looser = await tapsheet(
      ["compare", "w.md@HEAD", "w.md", "--out", join(out, "same")],
      {},
      { cwd },
    );
    assert.equal(looser.code, 1, looser.stdout + looser.stderr);
    assert.ok(looser.stdout.includes("got worse: IDL-SRS-1 has a looser limit"), looser.stdout);
    assert.ok(
      looser.stdout.includes("requirement IDL-SRS-1 limit: ≥ 40 dB → ≥ 20 dB (looser)"),
      looser.stdout,
    );
    assert.ok(looser.stdout.includes("IDL-SRS-1: not met → met"), looser.stdout);

    // No scratch folder of these runs is left behind.
    const tmp = Deno.env.get("TMPDIR") ?? "/tmp";
    const left = [...Deno.readDirSync(tmp)].filter((e) =>
      e.name.startsWith("tapsheet-compare-") && !repo.endsWith(e.name)
    );
    assert.deepEqual(
      left.filter((e) => /^tapsheet-compare-\d+-/.test(e.name)).map((e) => e.name),
      [],
    );
  });
});

Deno.test("compare end to end: report folder against report folder; an altered folder is named", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.mkdir(join(dir, "data"));
    await Deno.writeTextFile(join(dir, "data", "gain.txt"), "1\n");
    const file = join(dir, "w.md");
    await Deno.writeTextFile(file, worksheet());
    for (const taps of [41, 15]) {
      const r = await tapsheet([
        "run",
        file,
        "--out",
        join(dir, `r${taps}`),
        "--set",
        `taps=${taps}`,
        "--date",
        "2026-03-01",
      ]);
      assert.ok(r.code === 0 || r.code === 1, r.stderr);
    }
    const [a, b] = [join(dir, "r41", "w"), join(dir, "r15", "w")];
    const worse = await tapsheet(["compare", a, b, "--out", join(dir, "cmp")]);
    assert.equal(worse.code, 1, worse.stdout + worse.stderr);
    assert.ok(worse.stdout.includes("setting taps: 41 → 15"), worse.stdout);
    assert.ok(
      worse.stdout.includes("got worse: IDL-SRS-1 was met and is not met now"),
      worse.stdout,
    );
    await staticPage(join(dir, "cmp"));
    // The other way round, everything got better: exit code 0.
    const better = await tapsheet(["compare", b, a, "--out", join(dir, "cmp")]);
    assert.equal(better.code, 0, better.stdout + better.stderr);
    assert.ok(better.stdout.includes("IDL-SRS-1: not met → met"), better.stdout);
    // A report whose files no longer match its manifest is compared as it is, and said so.
    await Deno.writeTextFile(join(a, "exports", "idler_lowpass.csv"), "0\n");
    const altered = await tapsheet(["compare", a, b, "--out", join(dir, "cmp")]);
    assert.equal(altered.code, 1);
    assert.match(
      altered.stderr,
      /the old report .* is not as its manifest lists \(exports\/idler_lowpass\.csv\)/,
    );
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});

Deno.test("compare: command-line mistakes exit with 2 and say what to type", async () => {
  const dir = await Deno.makeTempDir();
  try {
    await Deno.writeTextFile(join(dir, "w.md"), worksheet());
    await Deno.mkdir(join(dir, "plain"));
    await Deno.writeTextFile(join(dir, "plain", "keep.txt"), "mine");
    const cases: [string[], RegExp][] = [
      [["compare", join(dir, "w.md")], /deno task tapsheet compare <old> <new>/],
      [["compare", join(dir, "plain"), join(dir, "w.md")], /plain is a folder but not a report/],
      [
        ["compare", join(dir, "nothing"), join(dir, "w.md")],
        /neither a report folder nor a worksheet/,
      ],
      [["compare", `${join(dir, "w.md")}@HEAD`, join(dir, "w.md")], /not inside a git repository/],
      [
        ["compare", join(dir, "w.md"), join(dir, "w.md"), "--out", join(dir, "plain")],
        /holds files but no comparison\.json/,
      ],
      [
        ["compare", join(dir, "w.md"), join(dir, "w.md"), "--bogus"],
        /Unknown option '--bogus'.*tapsheet compare --help/,
      ],
    ];
    for (const [args, message] of cases) {
      const r = await tapsheet(args);
      assert.equal(r.code, 2, `${args.join(" ")}\n${r.stdout}${r.stderr}`);
      assert.match(r.stdout + r.stderr, message, args.join(" "));
    }
    assert.equal(
      await Deno.readTextFile(join(dir, "plain", "keep.txt")),
      "mine",
      "--out left alone",
    );
    const help = await tapsheet(["compare", "--help"]);
    assert.equal(help.code, 0);
    assert.match(help.stdout, /Got worse, for the exit code, means/);
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
