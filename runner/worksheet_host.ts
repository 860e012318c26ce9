// The worker the worksheet runs in (started by harness.ts). Before any
// worksheet code runs it captures what it needs to reach the main thread,
// connects the sheet API to a private port, and takes away what a worksheet
// must not use: ending the process, closing the worker, nested workers,
// storage that outlives the run (the Cache API), and Deno's internals.
// It loads the library as soon as it starts; given the worksheet, it imports
// the assembled module and reports the end.
import { connectSheet } from "./sheet.ts";
import { blockMarker, type HarnessMessage, type HostStart } from "./harness_protocol.ts";
import type { Exhibit } from "../record/types.ts";

// Captured now, while only tapsheet's code has run: later changes to these
// by a worksheet cannot reach the port.
const post = MessagePort.prototype.postMessage;
const apply = Reflect.apply;
const define = Object.defineProperty;
const inspect = Deno.inspect;
const decoder = new TextDecoder();
const decode = TextDecoder.prototype.decode;
const internal = (Deno as unknown as { internal?: symbol }).internal;
const scope = globalThis as unknown as Record<string | symbol, unknown> & {
  onmessage: ((event: MessageEvent<HostStart>) => void) | null;
};

/** Replace a property for good: the worksheet can neither restore nor redefine it. */
function seal(target: object, name: string | symbol, value: unknown): void {
  try {
    define(target, name, { value, writable: false, enumerable: false, configurable: false });
  } catch {
    // already sealed (not configurable): it cannot be changed by the worksheet either
  }
}

// The library loads now, before the worksheet is known, while the parent is still parsing it;
// the worksheet's own import of "tapsheet" then finds it loaded. Only tapsheet's code runs.
const library = import("tapsheet").catch(() => undefined);

const refuse = (what: string) => () => {
  throw new Error(`${what} is not available to a worksheet`);
};

scope.onmessage = (event: MessageEvent<HostStart>) => {
  scope.onmessage = null;
  const { port, moduleUrl, params, requirements } = event.data;
  let current = -1;
  const send = (message: HarnessMessage) => void apply(post, port, [message]);
  const emit = (exhibit: Exhibit) => send({ kind: "exhibit", block: current, exhibit });
  const fail = (error: unknown) => {
    let name = "Error", message = "", stack = "";
    try {
      const e = error instanceof Error ? error : new Error(String(error));
      [name, message, stack] = [String(e.name), String(e.message), String(e.stack ?? "")];
    } catch {
      message = "The worksheet threw something that cannot be shown";
    }
    send({ kind: "error", block: current, name, message, stack });
  };

  connectSheet(emit, params, requirements);
  const print = (...args: unknown[]) =>
    emit({
      type: "output",
      text: args.map((a) => (typeof a === "string" ? a : inspect(a, { depth: 4 }))).join(" "),
    });
  for (const method of ["log", "info", "warn", "error", "debug"] as const) {
    seal(console, method, print);
  }
  // Direct writes to standard output or error become output too, so they
  // never interleave with the main thread's messages.
  const stream = (label: string) => ({
    writeSync(bytes: Uint8Array): number {
      print(apply(decode, decoder, [bytes]).replace(/\n$/, ""));
      return bytes.length;
    },
    write(bytes: Uint8Array): Promise<number> {
      return Promise.resolve(this.writeSync(bytes));
    },
    isTerminal: () => false,
    close: refuse(`Closing ${label}`),
    get writable(): WritableStream<Uint8Array> {
      return new WritableStream({ write: (chunk) => void this.writeSync(chunk) });
    },
  });
  seal(Deno, "stdout", stream("standard output"));
  seal(Deno, "stderr", stream("standard error"));
  seal(Deno, "exit", refuse("Deno.exit"));
  seal(scope, "close", refuse("close()"));
  seal(scope, "postMessage", refuse("postMessage()"));
  for (const name of ["Worker", "SharedWorker", "caches", "CacheStorage", "Cache"]) {
    seal(scope, name, undefined);
  }
  if (internal !== undefined) {
    try {
      delete (Deno as unknown as Record<symbol, unknown>)[internal];
    } catch {
      // not deletable in this Deno version
    }
  }
  seal(scope, blockMarker, (index: number) => {
    current = index;
    send({ kind: "block", index });
  });

  globalThis.addEventListener("error", (event) => {
    event.preventDefault();
    fail(event.error ?? event.message);
  });
  globalThis.addEventListener("unhandledrejection", (event) => {
    event.preventDefault();
    fail(event.reason);
  });
  library.then(() => import(moduleUrl)).then(() => send({ kind: "done" }), fail);
};
