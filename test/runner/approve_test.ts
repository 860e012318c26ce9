// Approvals are bound to the report's fingerprint; any change to the record
// voids them, and verify says so (issue 14). source: common practice for
// signed design records (a signature names exactly one version of a document);
// Ed25519 from RFC 8032 through node:crypto.
import assert from "node:assert/strict";
import { generateKeyPairSync } from "node:crypto";
import { join } from "node:path";
import { parse as parseYaml } from "yaml";
import { tapsheet } from "./_cli.ts";

const sheet = (limit = 3, revision = "A") =>
  `---\ntitle: Approved sheet\ndocument: T-14\nrevision: ${revision}\nsettings:\n  gain: 2\n` +
  `requirements:\n  - id: R-1\n    text: Gain\n    atMost: ${limit}\n---\n\nProse.\n\n` +
  "```ts\n" +
  `import { sheet } from "tapsheet/sheet";\nsheet.check("R-1", sheet.number("gain"));\n` +
  "```\n";

interface Setup {
  dir: string;
  file: string;
  out: string;
  report: string;
}

async function withReport(test: (s: Setup) => Promise<void>): Promise<void> {
  const dir = await Deno.makeTempDir();
  const file = join(dir, "a.md");
  const out = join(dir, "reports");
  try {
    await Deno.writeTextFile(file, sheet());
    const r = await tapsheet(["run", file, "--out", out, "--date", "2026-04-01"]);
    assert.equal(r.code, 0, r.stderr);
    await test({ dir, file, out, report: join(out, "a") });
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
}

const fingerprintOf = async (report: string) =>
  JSON.parse(await Deno.readTextFile(join(report, "manifest.json"))).fingerprint as string;

const approve = (s: Setup, ...extra: string[]) =>
  tapsheet([
    "approve",
    s.file,
    "--out",
    s.out,
    "--role",
    "Reviewer",
    "--name",
    "Q. Checker",
    "--date",
    "2026-04-02",
    ...extra,
  ]);

Deno.test("approve: records the fingerprint beside the worksheet, shows it in the page, and verify says it holds", async () => {
  await withReport(async (s) => {
    const before = await fingerprintOf(s.report);
    const r = await approve(s);
    assert.equal(r.code, 0, r.stderr);
    assert.match(
      r.stdout,
      new RegExp(`approved .* by Q\\. Checker \\(Reviewer\\), fingerprint ${before}`),
    );
    const recorded = parseYaml(await Deno.readTextFile(join(s.dir, "a.approvals.yaml")));
    assert.deepEqual(recorded.approvals, [{
      role: "Reviewer",
      name: "Q. Checker",
      date: "2026-04-02",
      document: "T-14",
      revision: "A",
      fingerprint: before,
    }]);
    // Approving does not change the record approved.
    assert.equal(await fingerprintOf(s.report), before);
    const page = await Deno.readTextFile(join(s.report, "index.html"));
    assert.match(page, /<tr class="approval holds"><td>Reviewer<\/td><td>Q\. Checker<\/td>/);
    const v = await tapsheet(["verify", s.file, "--out", s.out]);
    assert.equal(v.code, 0, v.stdout);
    assert.match(v.stdout, /approval {2}Q\. Checker \(Reviewer, 2026-04-02\): holds/);
    // A later run with the same inputs keeps the report and shows the approval.
    const again = await tapsheet(["run", s.file, "--out", s.out, "--date", "2026-04-01"]);
    assert.match(again.stdout, /unchanged/);
  });
});

Deno.test("approve: a change to the record voids the approval, in the page and loudly in verify", async () => {
  await withReport(async (s) => {
    assert.equal((await approve(s)).code, 0);
    await Deno.writeTextFile(s.file, sheet(2.5));
    const v = await tapsheet(["verify", s.file, "--out", s.out]);
    assert.equal(v.code, 1);
    assert.match(
      v.stdout,
      /approval {2}Q\. Checker \(Reviewer, 2026-04-02\): VOID — approved the report with fingerprint/,
    );
    assert.match(v.stdout, /VOID {2}1 approval no longer holds/);
    const rerun = await tapsheet(["run", s.file, "--out", s.out, "--date", "2026-04-01"]);
    assert.equal(rerun.code, 0, rerun.stderr);
    const page = await Deno.readTextFile(join(s.report, "index.html"));
    assert.match(page, /<tr class="approval void">/);
  });
});

Deno.test("approve: an approval of an earlier revision is superseded, not void", async () => {
  await withReport(async (s) => {
    assert.equal((await approve(s)).code, 0);
    await Deno.writeTextFile(s.file, sheet(2.5, "B"));
    await tapsheet(["run", s.file, "--out", s.out, "--date", "2026-04-01"]);
    const v = await tapsheet(["verify", s.file, "--out", s.out]);
    assert.equal(v.code, 0, v.stdout);
    assert.match(v.stdout, /SUPERSEDED — approved revision A, this is revision B/);
  });
});

Deno.test("approve: refuses an altered report, or one made from an older worksheet", async () => {
  await withReport(async (s) => {
    const page = join(s.report, "index.html");
    await Deno.writeTextFile(page, (await Deno.readTextFile(page)).replace("Gain", "Gian"));
    const altered = await approve(s);
    assert.equal(altered.code, 2);
    assert.match(altered.stderr, /was altered after it was written/);
    await tapsheet(["run", s.file, "--out", s.out, "--date", "2026-04-01"]);
    await Deno.writeTextFile(s.file, sheet(2.5));
    const stale = await approve(s);
    assert.equal(stale.code, 2);
    assert.match(stale.stderr, /has changed since the report was made/);
    await assert.rejects(Deno.stat(join(s.dir, "a.approvals.yaml")), Deno.errors.NotFound);
    const missing = await tapsheet(["approve", s.file, "--role", "Reviewer"]);
    assert.equal(missing.code, 2);
    assert.match(missing.stderr, /approve needs a worksheet, --role and --name/);
  });
});

Deno.test("approve: an Ed25519-signed approval verifies, and an edited one does not", async () => {
  await withReport(async (s) => {
    const { privateKey } = generateKeyPairSync("ed25519");
    const keyFile = join(s.dir, "reviewer.pem");
    await Deno.writeTextFile(
      keyFile,
      privateKey.export({ type: "pkcs8", format: "pem" }) as string,
    );
    const r = await approve(s, "--key", keyFile);
    assert.equal(r.code, 0, r.stderr);
    assert.match(r.stdout, /signed \(Ed25519\)/);
    const file = join(s.dir, "a.approvals.yaml");
    const recorded = parseYaml(await Deno.readTextFile(file));
    assert.match(recorded.approvals[0].publicKey, /^[A-Za-z0-9+/=]{40,}$/);
    assert.match(recorded.approvals[0].signature, /^[A-Za-z0-9+/=]{80,}$/);
    const good = await tapsheet(["verify", s.file, "--out", s.out]);
    assert.equal(good.code, 0, good.stdout);
    // Someone puts another name on the signed approval.
    await Deno.writeTextFile(
      file,
      (await Deno.readTextFile(file)).replace("Q. Checker", "A. Nother"),
    );
    const bad = await tapsheet(["verify", s.file, "--out", s.out]);
    assert.equal(bad.code, 1);
    assert.match(
      bad.stdout,
      /A\. Nother \(Reviewer, 2026-04-02\): BAD SIGNATURE — the signature does not verify/,
    );
  });
});
