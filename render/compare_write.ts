// Write a comparison folder: index.html, figures/*.svg with their vega-lite
// specs, and comparison.json (the comparison without the plotted points).
// Built in a hidden folder beside it and swapped in whole, like a report.
import { basename, dirname, join } from "node:path";
import type { Comparison } from "../record/compare.ts";
import { comparisonFigures, comparisonHtml, type DrawnFigures } from "./compare_report.ts";
import { figureToVegaLite } from "./figures.ts";
import { figureSvg } from "./svg.ts";
import { slug } from "./write.ts";

/** The machine-readable file of a comparison folder; its presence marks the folder as one. */
export const comparisonFile = "comparison.json";

/** The comparison as comparison.json holds it: figures keep their largest change, not their points. */
export function comparisonJson(c: Comparison): string {
  const figures = c.figures.map((f) => ({
    ...f,
    series: f.series.map((s) => ({
      name: s.name,
      inOld: s.old !== undefined,
      inNew: s.new !== undefined,
      ...(s.largest ? { largest: s.largest } : {}),
    })),
  }));
  return JSON.stringify({ ...c, figures, gotWorse: c.worse.length > 0 }, null, 2) + "\n";
}

/**
 * Render and write the comparison into `dir` (made, or replaced whole).
 * @returns The folder written.
 */
export async function writeComparison(dir: string, c: Comparison): Promise<string> {
  const parent = dirname(dir);
  await Deno.mkdir(parent, { recursive: true });
  const stage = join(parent, `.${basename(dir)}.partial-${crypto.randomUUID().slice(0, 8)}`);
  try {
    await Deno.mkdir(join(stage, "figures"), { recursive: true });
    const drawn: DrawnFigures[] = [];
    for (const [i, f] of c.figures.entries()) {
      const { overlay, difference } = comparisonFigures(f);
      const stem = `figures/${String(i + 1).padStart(2, "0")}-${slug(f.title)}`;
      const paths = { overlay: `${stem}.svg`, difference: `${stem}-difference.svg` };
      for (
        const [exhibit, path] of [[overlay, paths.overlay], [difference, paths.difference]] as const
      ) {
        const spec = figureToVegaLite(exhibit);
        await Deno.writeTextFile(
          join(stage, path.replace(/\.svg$/, ".vl.json")),
          JSON.stringify(spec, null, 1) + "\n",
        );
        await Deno.writeTextFile(join(stage, path), await figureSvg(spec));
      }
      drawn.push(paths);
    }
    await Deno.writeTextFile(join(stage, "index.html"), comparisonHtml(c, drawn));
    await Deno.writeTextFile(join(stage, comparisonFile), comparisonJson(c));
    const old = join(parent, `.${basename(dir)}.old-${crypto.randomUUID().slice(0, 8)}`);
    const had = await Deno.stat(dir).then(() => true, () => false);
    if (had) await Deno.rename(dir, old);
    await Deno.rename(stage, dir);
    if (had) await Deno.remove(old, { recursive: true });
    return dir;
  } catch (error) {
    await Deno.remove(stage, { recursive: true }).catch(() => {});
    throw error;
  }
}
