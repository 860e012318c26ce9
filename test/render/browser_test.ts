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
