// The child process's entry point: connects the sheet API, imports the
// assembled worksheet module, and streams exhibits to the parent as lines of
// JSON on standard output. Runs inside the sandbox (see execute.ts).
import { connectSheet } from "./sheet.ts";
import { type HarnessInput, type HarnessMessage, nonFiniteMark } from "./harness_protocol.ts";
import { blockMarker } from "./assemble.ts";

const encoder = new TextEncoder();
const stringify = JSON.stringify;
const writeSync = Deno.stdout.writeSync.bind(Deno.stdout);
const exit = Deno.exit;

const input = JSON.parse(await new Response(Deno.stdin.readable).text()) as HarnessInput;
let current = -1;

/** JSON has no Infinity or NaN; carry them as marked strings (see decodeNumbers). */
const keepNonFinite = (_key: string, value: unknown) =>
  typeof value === "number" && !Number.isFinite(value) ? `${nonFiniteMark}${value}` : value;

function send(message: HarnessMessage): void {
  const bytes = encoder.encode(`${input.nonce}${stringify(message, keepNonFinite)}\n`);
  let written = 0;
  while (written < bytes.length) written += writeSync(bytes.subarray(written));
}

function fail(error: unknown): void {
  const e = error instanceof Error ? error : new Error(String(error));
  send({
    kind: "error",
    block: current,
    name: e.name,
    message: e.message,
    stack: String(e.stack ?? ""),
  });
}

connectSheet((exhibit) => send({ kind: "exhibit", block: current, exhibit }), input.params);

const format = (args: unknown[]) =>
  args.map((a) => (typeof a === "string" ? a : Deno.inspect(a, { depth: 4 }))).join(" ");
for (const method of ["log", "info", "warn", "error", "debug"] as const) {
  console[method] = (...args: unknown[]) =>
    send({ kind: "exhibit", block: current, exhibit: { type: "output", text: format(args) } });
}

Object.defineProperty(globalThis, blockMarker, {
  value: (index: number) => {
    current = index;
    send({ kind: "block", index });
  },
  writable: false,
  configurable: false,
});
// Workers could load modules from anywhere; worksheets have no use for them.
for (const name of ["Worker", "SharedWorker"]) {
  Object.defineProperty(globalThis, name, {
    value: undefined,
    writable: false,
    configurable: false,
  });
}

globalThis.addEventListener("error", (event) => {
  event.preventDefault();
  fail(event.error ?? event.message);
  exit(1);
});
globalThis.addEventListener("unhandledrejection", (event) => {
  event.preventDefault();
  fail(event.reason);
  exit(1);
});

try {
  await import(input.moduleUrl);
  send({ kind: "done" });
  exit(0);
} catch (error) {
  fail(error);
  exit(1);
}
