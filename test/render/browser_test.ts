// A real browser opens a demo report from disk, as a reviewer would.
// Needs Debian's chromium (.ci/run installs it); without it the test is
// ignored and says so.
import assert from "node:assert/strict";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { findChromium, fromBase64, withPage } from "../../runner/chromium.ts";
import { root, tapsheet } from "../runner/_cli.ts";
const chromium = findChromium();
if (chromium === undefined) console.warn("browser test ignored: Chromium is not installed");

/** Decode an 8-bit RGB/RGBA PNG into rows of pixels (enough for screenshots). */
async function decodePng(
  png: Uint8Array,
): Promise<{ width: number; height: number; rgb: Uint8Array }> {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  let offset = 8;
  let width = 0, height = 0, channels = 0;
  const idat: Uint8Array[] = [];
  while (offset < png.length) {
    const length = view.getUint32(offset);
    const type = new TextDecoder().decode(png.subarray(offset + 4, offset + 8));
    const data = png.subarray(offset + 8, offset + 8 + length);
    if (type === "IHDR") {
      width = view.getUint32(offset + 8);
      height = view.getUint32(offset + 12);
      assert.equal(data[8], 8, "8-bit PNG");
      channels = data[9] === 6 ? 4 : data[9] === 2 ? 3 : 0;
      assert.ok(channels > 0, `colour type ${data[9]}`);
    }
    if (type === "IDAT") idat.push(data);
    offset += 12 + length;
  }
  const compressed = new Blob(idat as BlobPart[]).stream().pipeThrough(
    new DecompressionStream("deflate"),
  );
  const raw = new Uint8Array(await new Response(compressed).arrayBuffer());
  // Undo the per-row filters (PNG specification, section 9).
  const stride = width * channels;
  const out = new Uint8Array(height * stride);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)]!;
    const line = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1));
    for (let x = 0; x < stride; x++) {
      const a = x >= channels ? out[y * stride + x - channels]! : 0;
      const b = y > 0 ? out[(y - 1) * stride + x]! : 0;
      const c = x >= channels && y > 0 ? out[(y - 1) * stride + x - channels]! : 0;
      const p = a + b - c;
      const pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
      const paeth = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      const predictor = [0, a, b, (a + b) >> 1, paeth][filter]!;
      out[y * stride + x] = (line[x]! + predictor) & 0xff;
    }
  }
  const rgb = new Uint8Array(width * height * 3);
  for (let i = 0; i < width * height; i++) {
    rgb.set(out.subarray(i * channels, i * channels + 3), i * 3);
  }
  return { width, height, rgb };
}

Deno.test({
  name: "browser: the demo report opens from disk with its figures, no console errors, and prints",
  ignore: chromium === undefined,
  async fn() {
    const out = await Deno.makeTempDir();
    try {
      const cli = await tapsheet([
        "run",
        join(root, "worksheets", "pump_monitor_antialias.md"),
        "--out",
        out,
        "--pdf",
      ]);
      assert.ok(cli.code === 0 || cli.code === 1, cli.stderr);
      // run --pdf wrote the printed report beside the page.
      const printed = new TextDecoder("latin1").decode(
        await Deno.readFile(join(out, "pump_monitor_antialias", "report.pdf")),
      );
      assert.match(printed, /^%PDF-/);
      assert.ok((printed.match(/\/Type\s*\/Page[^s]/g)?.length ?? 0) >= 2);
      const url = pathToFileURL(join(out, "pump_monitor_antialias", "index.html")).href;
      await withPage(url, async (page) => {
        const figures = await page.evaluate<[string, number, number][]>(
          `[...document.querySelectorAll("figure img")].map((i) => [i.getAttribute("src"), i.naturalWidth, i.getBoundingClientRect().height])`,
        );
        assert.ok(figures.length >= 4, `figures: ${JSON.stringify(figures)}`);
        for (const [src, width, height] of figures) {
          assert.ok(width > 0 && height > 0, `${src} has size ${width}×${height}`);
        }
        const scripts = await page.evaluate<number>("document.scripts.length");
        assert.equal(scripts, 0);

        const shot = await page.send("Page.captureScreenshot", { format: "png" });
        const { width, height, rgb } = await decodePng(fromBase64(shot.data as string));
        let ink = 0;
        const colours = new Set<number>();
        for (let i = 0; i < width * height; i++) {
          const [r, g, b] = [rgb[3 * i]!, rgb[3 * i + 1]!, rgb[3 * i + 2]!];
          if (r + g + b < 600) ink++;
          colours.add((r << 16) | (g << 8) | b);
        }
        // A blank page has no ink and one colour; a report has text, rules and a verdict badge.
        assert.ok(ink / (width * height) > 0.01, `ink fraction ${ink / (width * height)}`);
        assert.ok(colours.size > 50, `${colours.size} colours`);

        const pdf = await page.send("Page.printToPDF", {
          printBackground: true,
          preferCSSPageSize: true,
        });
        const text = new TextDecoder("latin1").decode(fromBase64(pdf.data as string));
        assert.match(text, /^%PDF-/);
        const pages = text.match(/\/Type\s*\/Page[^s]/g)?.length ?? 0;
        assert.ok(pages >= 2, `${pages} pages`);
        assert.deepEqual(page.errors, []);
      });
    } finally {
      await Deno.remove(out, { recursive: true });
    }
  },
});

/** Where screenshots and printed copies of the demo reports go, for a reader to look at. */
const shots = Deno.env.get("TAPSHEET_SCREENSHOTS");

/** Layout facts of the page at the current viewport, measured in the page. */
interface Layout {
  viewport: number;
  pageWidth: number;
  /** Elements sticking out past the right edge (tag, class, right edge). */
  overflowing: string[];
  /** Figures whose caption is not visible, or does not start "Figure N." */
  untitled: string[];
  figures: number;
  requirementsBottom: number;
}

const measure = `(() => {
  const vw = window.innerWidth;
  const overflowing = [];
  for (const el of document.querySelectorAll("body *")) {
    // Inside a scrolling box, a wide table scrolls; the box itself must fit.
    if (el.closest(".table-scroll") && !el.classList.contains("table-scroll")) continue;
    const r = el.getBoundingClientRect();
    if (r.width > 0 && r.right > vw + 1) overflowing.push(el.tagName + "." + el.className + " " + Math.round(r.right));
  }
  const untitled = [];
  const figures = [...document.querySelectorAll("figure.figure")];
  for (const f of figures) {
    const c = f.querySelector("figcaption");
    const r = c ? c.getBoundingClientRect() : null;
    const ok = c && r.width > 0 && r.height > 0 && /^Figure \\d+\\./.test(c.textContent.trim()) &&
      f.querySelector("img").naturalHeight > 0;
    if (!ok) untitled.push(f.id);
  }
  const req = document.querySelector("#requirements").getBoundingClientRect();
  return { viewport: vw, pageWidth: document.documentElement.scrollWidth, overflowing: overflowing.slice(0, 10), untitled, figures: figures.length, requirementsBottom: req.bottom + window.scrollY };
})()`;

Deno.test({
  name:
    "browser: every demo report fits 1280 and 760 px, titles every figure, and prints its requirement table on page 1",
  ignore: chromium === undefined,
  async fn() {
    const out = await Deno.makeTempDir();
    try {
      const cli = await tapsheet(["run", join(root, "worksheets"), "--out", out, "--exit-zero"]);
      assert.equal(cli.code, 0, cli.stderr);
      const demos = [...Deno.readDirSync(join(root, "worksheets"))]
        .filter((e) => e.isFile && e.name.endsWith(".md")).map((e) => e.name.replace(/\.md$/, ""))
        .sort();
      assert.ok(demos.length >= 4, demos.join(", "));
      for (const demo of demos) {
        const url = pathToFileURL(join(out, demo, "index.html")).href;
        await withPage(url, async (page) => {
          for (const width of [1280, 760]) {
            await page.send("Emulation.setDeviceMetricsOverride", {
              width,
              height: 1000,
              deviceScaleFactor: 1,
              mobile: false,
            });
            const layout = await page.evaluate<Layout>(measure);
            assert.ok(layout.figures >= 1, `${demo}: figures`);
            assert.ok(
              layout.pageWidth <= width,
              `${demo} at ${width} px: page ${layout.pageWidth} px wide`,
            );
            assert.deepEqual(layout.overflowing, [], `${demo} at ${width} px`);
            assert.deepEqual(
              layout.untitled,
              [],
              `${demo} at ${width} px: figures without a title`,
            );
            if (shots) {
              const shot = await page.send("Page.captureScreenshot", {
                format: "png",
                captureBeyondViewport: true,
                clip: { x: 0, y: 0, width, height: 2400, scale: 1 },
              });
              await Deno.writeFile(
                join(shots, `${demo}-${width}.png`),
                fromBase64(shot.data as string),
              );
            }
          }
          // Print: A4 with the report's own margins (16 mm each side, 18 mm top, 20 mm bottom):
          // the text column is 178 mm wide and 259 mm tall, 673 × 979 CSS pixels.
          // source: CSS 2.1 (96 CSS px per inch, 25.4 mm per inch); ISO 216 (A4 210 × 297 mm)
          await page.send("Emulation.setEmulatedMedia", { media: "print" });
          await page.send("Emulation.setDeviceMetricsOverride", {
            width: 673,
            height: 979,
            deviceScaleFactor: 1,
            mobile: false,
          });
          const printed = await page.evaluate<Layout>(measure);
          assert.ok(
            printed.requirementsBottom <= 979,
            `${demo}: the requirement table ends ${printed.requirementsBottom} px down, past the first page`,
          );
          assert.deepEqual(printed.overflowing, [], `${demo} in print`);
          await page.send("Emulation.setEmulatedMedia", { media: "" });
          await page.send("Emulation.clearDeviceMetricsOverride");
          const pdf = await page.send("Page.printToPDF", {
            printBackground: true,
            preferCSSPageSize: true,
            paperWidth: 8.27, // source: ISO 216, A4 is 210 × 297 mm = 8.27 × 11.69 in
            paperHeight: 11.69,
          });
          const bytes = fromBase64(pdf.data as string);
          const pages = new TextDecoder("latin1").decode(bytes).match(/\/Type\s*\/Page[^s]/g)
            ?.length ?? 0;
          assert.ok(pages >= 2, `${demo}: ${pages} printed pages`);
          if (shots) await Deno.writeFile(join(shots, `${demo}.pdf`), bytes);
          assert.deepEqual(page.errors, [], `${demo}: page errors`);
        }, { width: 1280, height: 1000 });
      }
    } finally {
      await Deno.remove(out, { recursive: true });
    }
  },
});
