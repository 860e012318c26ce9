// vega-lite specification → SVG text, with no browser.
//
// vega and vega-lite take a few hundred milliseconds to load, so they are
// loaded on first use, and `preloadRenderer` lets the command line start that
// load while the worksheet's child process runs on the other core.

type Vega = typeof import("vega");
type VegaLite = typeof import("vega-lite");

let loading: Promise<[Vega, VegaLite]> | undefined;

/** Start loading vega and vega-lite in the background (idempotent). */
export function preloadRenderer(): Promise<[Vega, VegaLite]> {
  loading ??= Promise.all([import("vega"), import("vega-lite")]);
  return loading;
}

let rendered = 0;

/** How many figures this process has rendered (unchanged figures are reused, not rendered). */
export function renderCount(): number {
  return rendered;
}

/**
 * Render a specification once and throw the result away: the first figure a
 * process draws costs several times a later one (V8 compiles vega's paths as
 * they run), so drawing a small one while the worksheet's child works
 * elsewhere takes that cost off the report's critical path.
 */
export async function warmRenderer(spec: Record<string, unknown>): Promise<void> {
  const [vega, vegaLite] = await preloadRenderer();
  const view = new vega.View(vega.parse(vegaLite.compile(spec as never).spec), {
    renderer: "none",
  });
  await view.toSVG();
  view.finalize();
}

/**
 * vega numbers clip paths (and gradients) with counters that run on for the
 * whole process, so the same figure drawn second comes out with other ids.
 * Number them afresh from 1 in each SVG, so a figure's bytes depend only on
 * its specification (a report made in a batch or in watch mode is then the
 * same as one made alone).
 */
export function renumberIds(svg: string): string {
  const map = new Map<string, string>();
  const counts = new Map<string, number>();
  for (const m of svg.matchAll(/\bid="([A-Za-z_-]+)(\d+)"/g)) {
    const [id, prefix] = [`${m[1]}${m[2]}`, m[1]!];
    if (map.has(id)) continue;
    const n = (counts.get(prefix) ?? 0) + 1;
    counts.set(prefix, n);
    map.set(id, `${prefix}${n}`);
  }
  if (map.size === 0) return svg;
  return svg.replace(
    /\b(id="|url\(#|href="#)([A-Za-z_-]+\d+)\b/g,
    (whole, lead: string, id: string) => (map.has(id) ? `${lead}${map.get(id)}` : whole),
  );
}

/** Render a vega-lite specification to SVG markup on the calling thread. */
export async function renderInThisThread(spec: Record<string, unknown>): Promise<string> {
  const [vega, vegaLite] = await preloadRenderer();
  const compiled = vegaLite.compile(spec as never).spec;
  const view = new vega.View(vega.parse(compiled), { renderer: "none" });
  const svg = await view.toSVG();
  view.finalize();
  return renumberIds(svg);
}

interface PoolWorker {
  worker: Worker;
  busy: number;
  pending: Map<number, { resolve: (svg: string) => void; reject: (e: Error) => void }>;
}

let pool: PoolWorker[] | undefined;
let nextId = 1;

/**
 * Start the drawing workers (one per processor core, at most `size`), each
 * loading vega and drawing `warmUp` once. Idempotent. Figures are then drawn
 * in parallel, off the main thread, which stays free to talk to the sandbox.
 */
export function startRenderWorkers(warmUp: Record<string, unknown>, size = 2): void {
  if (pool !== undefined) return;
  const count = Math.max(1, Math.min(size, navigator.hardwareConcurrency));
  pool = Array.from({ length: count }, () => {
    const worker = new Worker(new URL("./render_worker.ts", import.meta.url).href, {
      type: "module",
      name: "figures",
    });
    const entry: PoolWorker = { worker, busy: 0, pending: new Map() };
    worker.onmessage = (event: MessageEvent<{ id: number; svg?: string; error?: string }>) => {
      const job = entry.pending.get(event.data.id);
      if (!job) return;
      entry.pending.delete(event.data.id);
      entry.busy--;
      if (event.data.error !== undefined) job.reject(new Error(event.data.error));
      else job.resolve(event.data.svg ?? "");
    };
    post(entry, warmUp, true).catch(() => {});
    return entry;
  });
}

function post(entry: PoolWorker, spec: Record<string, unknown>, warm = false): Promise<string> {
  const id = nextId++;
  entry.busy++;
  return new Promise((resolve, reject) => {
    entry.pending.set(id, { resolve, reject });
    entry.worker.postMessage({ id, spec, warm });
  });
}

/** Stop the drawing workers (the command line does this before it exits). */
export function stopRenderWorkers(): void {
  for (const entry of pool ?? []) entry.worker.terminate();
  pool = undefined;
}

/**
 * Render a vega-lite specification to SVG markup: on the least busy drawing
 * worker when they are started, else on this thread.
 */
export async function vegaLiteToSvg(spec: Record<string, unknown>): Promise<string> {
  rendered++;
  if (pool === undefined) return await renderInThisThread(spec);
  const entry = pool.reduce((a, b) => (b.busy < a.busy ? b : a));
  return await post(entry, spec);
}
