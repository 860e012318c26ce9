// The comparison page and its figures, from hand-built comparisons: inert
// text, no scripts, the sections in reading order, what got worse first, the
// overlay and difference figures, and the folder as written.
import assert from "node:assert/strict";
import { join } from "node:path";
import { compareRecords } from "../../record/compare.ts";
import {
  comparisonFigures,
  comparisonHtml,
  differenceDomain,
} from "../../render/compare_report.ts";
import { comparisonFile, writeComparison } from "../../render/compare_write.ts";
import { figure, firCost, listing, manifest, record, row } from "../record/_records.ts";
import { svgSize, svgTexts } from "./_svg.ts";
import { figureSize } from "../../render/theme.ts";

const attack = `<script>alert(1)</script><img src=x onerror=alert(2)>`;

const x = Array.from({ length: 41 }, (_, i) => i * 50);
const magnitude = (edge: number) => x.map((f) => (f < edge ? 0 : -((f - edge) / 10)));
const mask = [{ from: 1200, to: 2000, level: -40, bound: "upper" as const, label: "IDL-SRS-2" }];

/** An old and a new record of the invented IDL-7 lowpass: the new one misses R-2 and drops R-3. */
function comparison(title = "IDL-7 idler vibration lowpass") {
  const was = record(
    manifest({
      title,
      requirements: [
        row("IDL-SRS-1", 0.05, { relation: "atMost", limit: 0.1 }),
        row("IDL-SRS-2", 45, { limit: 40 }),
        row("IDL-SRS-3", 3),
      ],
      costs: [{ name: "equiripple", cost: firCost(41) }],
      files: [{ path: "exports/idl7.h", sha256: "a".repeat(64) }],
      settings: { fs: 4000, note: attack },
    }),
    {
      listings: [
        listing(`taps ${attack}`, [0.1, 0.2, 0.1], { codes: [3277, 6554, 3277], format: "Q1.15" }),
      ],
      figures: [
        figure(1, `Magnitude ${attack}`, [{ name: "lowpass", x, y: magnitude(900) }], { mask }),
      ],
    },
  );
  const now = record(
    manifest({
      title,
      revision: "B",
      requirements: [
        row("IDL-SRS-1", 0.08, { relation: "atMost", limit: 0.1 }),
        row("IDL-SRS-2", 38, { limit: 40 }),
      ],
      costs: [{ name: "equiripple", cost: firCost(45) }],
      files: [{ path: "exports/idl7.h", sha256: "b".repeat(64) }],
      settings: { fs: 4000, note: "plain" },
    }),
    {
      listings: [
        listing(`taps ${attack}`, [0.1, 0.21, 0.1], { codes: [3277, 6881, 3277], format: "Q1.15" }),
      ],
      figures: [
        figure(1, `Magnitude ${attack}`, [{ name: "lowpass", x, y: magnitude(1000) }], { mask }),
      ],
    },
  );
  return compareRecords(was, now, { old: `w.md@HEAD~1 ${attack}`, new: "w.md@HEAD" });
}

const drawn = [{ overlay: "figures/01-m.svg", difference: "figures/01-m-difference.svg" }];

Deno.test("comparison page: markup in every field is inert text, and there are no scripts", () => {
  const html = comparisonHtml(comparison(attack), drawn);
  assert.doesNotMatch(html, /<script/i);
  assert.doesNotMatch(html, /<img src=x/i);
  // Attribute values are quoted and escaped, so with them blanked no tag may hold an on… attribute.
  const tags = html.replace(/"[^"]*"/g, '""');
  assert.doesNotMatch(tags, /<[a-z][^>]*\son[a-z]+\s*=/i, "no event-handler attributes");
  assert.match(html, /&lt;script&gt;alert\(1\)&lt;\/script&gt;/);
  assert.match(html, /Content-Security-Policy" content="default-src 'none';/);
});

Deno.test("comparison page: what got worse leads, then the sections in reading order", () => {
  const c = comparison();
  const html = comparisonHtml(c, drawn);
  const order = ["worse", "identity", "requirements", "designs", "figures", "exports", "records"];
  const at = order.map((id) => html.indexOf(`<section id="${id}">`));
  assert.ok(at.every((p) => p > 0), JSON.stringify(at));
  assert.deepEqual([...at].sort((a, b) => a - b), at);
  assert.match(html, /class="overall worse">2 things a requirement covers got worse</);
  const worse = html.slice(at[0]!, at[1]!);
  // The verdict that flipped is listed before the requirement that was removed.
  assert.ok(worse.indexOf("IDL-SRS-2") < worse.indexOf("IDL-SRS-3"), worse);
  assert.match(worse, /IDL-SRS-2<\/span> was met and is not met now/);
  assert.match(worse, /IDL-SRS-3<\/span> is no longer declared/);
  // The verdict table puts the flipped row first.
  const verdicts = html.slice(html.indexOf('<table class="verdicts">'));
  assert.ok(verdicts.indexOf("IDL-SRS-2") < verdicts.indexOf("IDL-SRS-1"));
  // The code change of the listing, in LSBs, and the cost change.
  assert.match(html, /327 LSB at index 1 \(1 changed\)/);
  assert.match(
    html,
    /<th>Multiplies per output sample<\/th><td class="num">21<\/td><td class="num">23<\/td><td class="num">\+2<\/td>/,
  );
  assert.match(html, /exports\/idl7\.h<\/td><td>changed<\/td>/);
  assert.match(html, /<img src="figures\/01-m\.svg"/);
  assert.match(html, /<img src="figures\/01-m-difference\.svg"/);
});

Deno.test("comparison page: nothing worse says so; the page is a pure function of its input", () => {
  const c = comparison();
  const same = compareRecords(
    { dir: "a", manifest: manifest(), listings: [], figures: [], unreadable: [] },
    { dir: "b", manifest: manifest(), listings: [], figures: [], unreadable: [] },
    { old: "a", new: "b" },
  );
  assert.match(
    comparisonHtml(same, []),
    /class="overall held">Nothing a requirement covers got worse</,
  );
  assert.equal(comparisonHtml(c, drawn), comparisonHtml(comparison(), drawn));
});

Deno.test("comparisonFigures: new series then old over the new mask; new − old beneath", () => {
  const c = comparison();
  const f = c.figures[0]!;
  const { overlay, difference } = comparisonFigures(f);
  assert.deepEqual(overlay.series.map((s) => s.name), ["lowpass (new)", "lowpass (old)"]);
  assert.deepEqual(overlay.series[0]!.y, f.series[0]!.new!.y);
  assert.deepEqual(overlay.series[1]!.y, f.series[0]!.old!.y);
  assert.deepEqual(overlay.mask, mask);
  assert.deepEqual(difference.series[0]!.y, f.series[0]!.difference!.y);
  assert.equal(difference.yLabel, "Difference, new − old (dB)");
  // The new edge is 100 Hz higher: new − old is 10 dB at and beyond it, 0 in the passband.
  const d = f.series[0]!.difference!;
  d.x.forEach((at, i) => {
    const expected = magnitude(1000)[x.indexOf(at)]! - magnitude(900)[x.indexOf(at)]!;
    assert.equal(d.y[i], expected, `at ${at} Hz`);
  });
});

Deno.test("differenceDomain always spans zero, and a flat zero difference gets a visible range", () => {
  // Rounding noise around −2 does not set the range: zero and −2 do.
  const [lo, hi] = differenceDomain([-2, -2 + 1e-13, -2 - 1e-13]);
  assert.ok(lo < -2 && lo > -2.2 && hi > 0 && hi < 0.2, `${lo} … ${hi}`);
  assert.deepEqual(differenceDomain([0, 0, NaN]), [-1, 1]);
  const [a, b] = differenceDomain([1, 3]);
  assert.ok(a < 0 && b > 3);
});

Deno.test("writeComparison: page, drawn figures and comparison.json; an earlier comparison replaced", async () => {
  const dir = await Deno.makeTempDir();
  try {
    const out = join(dir, "cmp");
    const c = comparison();
    await writeComparison(out, c);
    const page = await Deno.readTextFile(join(out, "index.html"));
    for (const m of page.matchAll(/<img src="([^"]+)"/g)) {
      const svg = await Deno.readTextFile(join(out, m[1]!));
      assert.deepEqual(svgSize(svg), { width: figureSize.width, height: figureSize.height }, m[1]);
      assert.doesNotMatch(svg, /<script/i);
      if (m[1]!.endsWith("-difference.svg")) {
        assert.ok(svgTexts(svg).some((t) => t.includes("new − old")), "difference axis title");
      } else assert.ok(svgTexts(svg).includes("IDL-SRS-2"), "the mask's requirement id");
    }
    const json = JSON.parse(await Deno.readTextFile(join(out, comparisonFile)));
    assert.equal(json.gotWorse, true);
    assert.equal(json.worse.length, c.worse.length);
    assert.equal(json.figures[0].series[0].x, undefined, "points are not repeated in the JSON");
    assert.deepEqual(json.figures[0].series[0].largest, c.figures[0]!.series[0]!.largest);

    await Deno.writeTextFile(join(out, "stale.txt"), "from before");
    await writeComparison(out, c);
    await assert.rejects(() => Deno.stat(join(out, "stale.txt")), Deno.errors.NotFound);
    const left = [...Deno.readDirSync(dir)].map((e) => e.name);
    assert.deepEqual(left, ["cmp"], "no staging folder left behind");
  } finally {
    await Deno.remove(dir, { recursive: true });
  }
});
