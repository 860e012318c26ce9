// The sandbox child's main thread. It starts the worker the worksheet will
// run in (a separate realm, see worksheet_host.ts; it loads the library while
// the parent is still parsing), reads one line of input from the parent,
// starts the worksheet in the worker, and relays the worker's messages to the parent as lines
// of JSON on standard output, each prefixed with the parent's nonce, which
// the worksheet never sees. It also ends the process when the parent goes
// away (standard input closes) or its own time is up, so a runaway worksheet
// cannot outlive the runner. No worksheet code ever runs on this thread.
import {
  decodeMessage,
  encodeMessage,
  type HarnessInput,
  type HarnessMessage,
  type HostStart,
} from "./harness_protocol.ts";

/** Exit codes of the child itself (the parent reads them only when no message explains the end). */
const exitCodes = { done: 0, failed: 1, parentGone: 125, timeUp: 124 } as const;

const encoder = new TextEncoder();
/** Milliseconds since this process started, at each step (for `run --timings`). */
const timings: Record<string, number> = { harnessStarted: performance.now() };
const stdin = Deno.stdin.readable.getReader();

/** The first line on standard input; whatever follows is only watched for its end. */
async function readInput(): Promise<HarnessInput> {
  const decoder = new TextDecoder();
  let text = "";
  while (!text.includes("\n")) {
    const { value, done } = await stdin.read();
    if (done) Deno.exit(exitCodes.parentGone);
    text += decoder.decode(value, { stream: true });
  }
  return decodeMessage(text.slice(0, text.indexOf("\n"))) as HarnessInput;
}

// The worker first: it boots and loads the library while the input is on its way.
const worker = new Worker(new URL("./worksheet_host.ts", import.meta.url).href, {
  type: "module",
  name: "worksheet",
});
const inputReady = readInput();

// Messages are queued and written as the parent reads them: a parent busy on
// its own thread then holds up only this writer, never the worksheet, which
// keeps computing in its worker. Nothing is written before the input (and its
// nonce) has come.
const queue: HarnessMessage[] = [];
let writing: Promise<void> | undefined;
function send(message: HarnessMessage): void {
  queue.push(message);
  writing ??= (async () => {
    const { nonce } = await inputReady;
    while (queue.length > 0) {
      // A leading newline ends any partial line the worksheet printed itself.
      const bytes = encoder.encode(`\n${nonce}${encodeMessage(queue.shift())}\n`);
      let written = 0;
      while (written < bytes.length) written += await Deno.stdout.write(bytes.subarray(written));
    }
    writing = undefined;
  })();
}

/** End the process once every queued message is written. */
async function finish(code: number): Promise<never> {
  while (writing !== undefined) await writing;
  Deno.exit(code);
}

let current = -1;
const { port1, port2 } = new MessageChannel();
port1.onmessage = (event: MessageEvent<HarnessMessage>) => {
  const message = event.data;
  if (message.kind === "block") {
    if (current < 0) timings.firstBlock = performance.now();
    current = message.index;
  }
  if (message.kind === "done") {
    timings.done = performance.now();
    send({ kind: "done", timings });
    void finish(exitCodes.done);
  } else send(message);
  if (message.kind === "error") void finish(exitCodes.failed);
};
// Messages on the worker's own channel come from worksheet code (self.postMessage): ignored.
worker.onmessage = () => {};
worker.onerror = (event) => {
  // An error the worker's own handlers did not catch.
  event.preventDefault();
  send({
    kind: "error",
    block: current,
    name: "Error",
    message: event.message,
    stack: `${event.filename}:${event.lineno}:${event.colno}`,
  });
  void finish(exitCodes.failed);
};
const input = await inputReady;
timings.inputRead = performance.now();
// The parent holds standard input open for the whole run: its end means the
// parent has gone (killed, even with SIGKILL), so this process goes too.
(async () => {
  try {
    while (!(await stdin.read()).done) { /* nothing else is sent */ }
  } catch {
    // closed
  }
  Deno.exit(exitCodes.parentGone);
})();
// Backstop behind the parent's own timeout.
setTimeout(() => Deno.exit(exitCodes.timeUp), (input.timeoutSeconds + 5) * 1000);
const start: HostStart = {
  port: port2,
  moduleUrl: input.moduleUrl,
  params: input.params,
  requirements: input.requirements,
};
worker.postMessage(start, [port2]);
