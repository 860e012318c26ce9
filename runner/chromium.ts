// A small Chrome DevTools Protocol client for headless Chromium: print a
// report to PDF, and let tests inspect a rendered report like a reader would.

/** Where Chromium lives, or undefined when it is not installed. */
export function findChromium(): string | undefined {
  for (const path of ["/usr/bin/chromium", "/usr/bin/chromium-browser", "/usr/bin/google-chrome"]) {
    try {
      if (Deno.statSync(path).isFile) return path;
    } catch {
      // try the next one
    }
  }
  return undefined;
}

type Json = Record<string, unknown>;

/** How long any one step of talking to Chromium may take. */
const stepTimeoutMs = 30_000;

/** Settle with `promise`, or reject with `what` after `ms`; never waits longer. */
function withDeadline<T>(promise: Promise<T>, ms: number, what: string): Promise<T> {
  let id: ReturnType<typeof setTimeout> | undefined;
  const late = new Promise<never>((_, reject) => {
    id = setTimeout(() => reject(new Error(`${what} (no answer within ${ms / 1000} s)`)), ms);
  });
  return Promise.race([promise, late]).finally(() => clearTimeout(id));
}

/** A page in headless Chromium, driven over the DevTools protocol. */
export interface BrowserPage {
  /** Send a protocol command to the page and wait for its result. */
  send(method: string, params?: Json): Promise<Json>;
  /** Errors the page reported: console errors, exceptions, failed loads, CSP refusals. */
  errors: string[];
  /** Evaluate an expression in the page and return its value. */
  evaluate<T>(expression: string): Promise<T>;
}

/**
 * Open `url` in a fresh headless Chromium (own empty profile, no background
 * networking), wait for the load event, run `use`, then close everything.
 */
export async function withPage<T>(
  url: string,
  use: (page: BrowserPage) => Promise<T>,
  options: { width?: number; height?: number } = {},
): Promise<T> {
  const chromium = findChromium();
  if (chromium === undefined) {
    throw new Error("Chromium is not installed (apt-get install chromium)");
  }
  const profile = await Deno.makeTempDir({ prefix: "tapsheet-chromium-" });
  const child = new Deno.Command(chromium, {
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--disable-extensions",
      "--allow-file-access-from-files",
      `--user-data-dir=${profile}`,
      `--window-size=${options.width ?? 1000},${options.height ?? 1400}`,
      "--remote-debugging-port=0",
      "about:blank",
    ],
    stdout: "null",
    stderr: "piped",
  }).spawn();
  let socket: WebSocket | undefined;
  try {
    const endpoint = await devToolsEndpoint(child.stderr);
    socket = new WebSocket(endpoint);
    await withDeadline(
      new Promise((resolve, reject) => {
        socket!.onopen = resolve;
        socket!.onerror = () =>
          reject(new Error("Could not connect to Chromium's DevTools endpoint"));
      }),
      stepTimeoutMs,
      "Chromium's DevTools endpoint did not open",
    );
    const pending = new Map<number, { resolve: (v: Json) => void; reject: (e: Error) => void }>();
    const listeners: ((message: Json) => void)[] = [];
    socket.onmessage = (event) => {
      const message = JSON.parse(String(event.data)) as Json;
      const id = message.id as number | undefined;
      if (id !== undefined && pending.has(id)) {
        const p = pending.get(id)!;
        pending.delete(id);
        if (message.error) p.reject(new Error(JSON.stringify(message.error)));
        else p.resolve((message.result ?? {}) as Json);
      } else {
        for (const l of listeners) l(message);
      }
    };
    let nextId = 1;
    socket.onclose = () => {
      for (const p of pending.values()) p.reject(new Error("Chromium closed the connection"));
      pending.clear();
    };
    const call = (method: string, params: Json = {}, sessionId?: string): Promise<Json> => {
      const id = nextId++;
      socket!.send(JSON.stringify({ id, method, params, ...(sessionId ? { sessionId } : {}) }));
      return withDeadline(
        new Promise<Json>((resolve, reject) => pending.set(id, { resolve, reject })),
        stepTimeoutMs,
        `Chromium did not answer ${method}`,
      ).finally(() => pending.delete(id));
    };
    const { targetId } = await call("Target.createTarget", { url: "about:blank" });
    const { sessionId } = await call("Target.attachToTarget", { targetId, flatten: true }) as {
      sessionId: string;
    };
    const errors: string[] = [];
    let loaded: () => void = () => {};
    const loadedPromise = new Promise<void>((r) => (loaded = r));
    listeners.push((m) => {
      if (m.sessionId !== sessionId) return;
      const params = (m.params ?? {}) as Json;
      if (m.method === "Page.loadEventFired") loaded();
      if (m.method === "Runtime.exceptionThrown") {
        errors.push(JSON.stringify(params.exceptionDetails));
      }
      if (m.method === "Runtime.consoleAPICalled" && params.type === "error") {
        errors.push(JSON.stringify(params.args));
      }
      if (m.method === "Log.entryAdded") {
        const entry = params.entry as { level: string; text: string; url?: string };
        if (entry.level === "error") errors.push(`${entry.text} ${entry.url ?? ""}`);
      }
    });
    const send = (method: string, params?: Json) => call(method, params, sessionId);
    await send("Page.enable");
    await send("Runtime.enable");
    await send("Log.enable");
    await send("Page.navigate", { url });
    await withDeadline(loadedPromise, stepTimeoutMs, `Timed out loading ${url}`);
    const page: BrowserPage = {
      send,
      errors,
      async evaluate<T>(expression: string): Promise<T> {
        const r = await send("Runtime.evaluate", { expression, returnByValue: true });
        return (r.result as { value: T }).value;
      },
    };
    return await use(page);
  } finally {
    socket?.close();
    try {
      child.kill("SIGKILL");
    } catch {
      // already gone
    }
    await withDeadline(child.status, stepTimeoutMs, "Chromium did not exit").catch(() => {});
    await Deno.remove(profile, { recursive: true }).catch(() => {});
  }
}

async function devToolsEndpoint(stderr: ReadableStream<Uint8Array>): Promise<string> {
  const reader = stderr.pipeThrough(new TextDecoderStream()).getReader();
  let text = "";
  const deadline = Date.now() + stepTimeoutMs;
  while (Date.now() < deadline) {
    // Every read races the deadline: a silent Chromium cannot hang the caller.
    const next = await withDeadline(reader.read(), deadline - Date.now(), "no DevTools line")
      .catch(() => undefined);
    if (next === undefined) break;
    const { value, done } = next;
    if (done) break;
    text += value;
    const m = /DevTools listening on (ws:\/\/\S+)/.exec(text);
    if (m) {
      // Keep draining Chromium's log so it never blocks on a full pipe.
      (async () => {
        try {
          while (!(await reader.read()).done) { /* discard */ }
        } catch {
          // closed
        }
      })();
      return m[1]!;
    }
  }
  reader.cancel().catch(() => {});
  throw new Error(`Chromium did not start its DevTools endpoint:\n${text.slice(0, 2000)}`);
}

/** Decode base64 protocol data. */
export function fromBase64(data: string): Uint8Array {
  return Uint8Array.from(atob(data), (c) => c.charCodeAt(0));
}

/** Print a page to PDF (A4 unless the page's CSS says otherwise). */
export async function printToPdf(url: string): Promise<Uint8Array> {
  return await withPage(url, async (page) => {
    const r = await page.send("Page.printToPDF", {
      printBackground: true,
      preferCSSPageSize: true,
      paperWidth: 8.27,
      paperHeight: 11.69,
    });
    return fromBase64(r.data as string);
  });
}
