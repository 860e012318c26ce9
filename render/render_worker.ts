// A worker that draws figures: vega and vega-lite load here, off the runner's
// main thread, and each message { id, spec } is answered with { id, svg } or
// { id, error }. Started by render/svg.ts.
import { renderInThisThread, warmRenderer } from "./svg.ts";

const scope = self as unknown as {
  onmessage: ((event: MessageEvent) => void) | null;
  postMessage: (message: unknown) => void;
};

/** The warm-up figure sent first, if any, is drawn and thrown away. */
scope.onmessage = async (
  event: MessageEvent<{ id: number; spec: Record<string, unknown>; warm?: boolean }>,
) => {
  const { id, spec, warm } = event.data;
  try {
    if (warm) {
      await warmRenderer(spec);
      scope.postMessage({ id, svg: "" });
    } else {
      scope.postMessage({ id, svg: await renderInThisThread(spec) });
    }
  } catch (error) {
    scope.postMessage({ id, error: error instanceof Error ? error.message : String(error) });
  }
};
