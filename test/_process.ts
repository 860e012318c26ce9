// Child processes in tests, always with a deadline. Every read of a child's
// output races a timer; at the deadline the child is killed and the test
// fails with what the child had printed so far, so a silent child can never
// hang the suite.

/** What a finished command printed, and how it ended. */
export interface Finished {
  code: number;
  signal: Deno.Signal | null;
  stdout: string;
  stderr: string;
}

/** Options for {@link runToEnd} and {@link spawnLines}. */
export interface ProcessOptions {
  /** Environment variables added to the child's (colour is always off). @default {} */
  env?: Record<string, string>;
  cwd?: string;
  /** Kill the child and fail after this long. @default 180_000 */
  timeoutMs?: number;
  /**
   * At the deadline, kill the child and return what it printed instead of
   * failing (for tests that interrupt a run on purpose). @default false
   */
  killAtDeadline?: boolean;
}

/** Thrown when a child misses its deadline; the message holds what it printed. */
export class DeadlineError extends Error {
  override name = "DeadlineError";
}

const defaultTimeoutMs = 180_000;

function kill(child: Deno.ChildProcess): void {
  try {
    child.kill("SIGKILL");
  } catch {
    // already gone
  }
}

/** Collect a stream as text into `into.text`, chunk by chunk (so a partial read is kept). */
async function drain(stream: ReadableStream<Uint8Array>, into: { text: string }): Promise<void> {
  const decoder = new TextDecoder();
  try {
    for await (const chunk of stream) into.text += decoder.decode(chunk, { stream: true });
  } catch {
    // the stream was cancelled
  }
}

/** A promise that settles after `ms` with `value`, and a way to cancel it. */
function timer<T>(ms: number, value: T): { done: Promise<T>; cancel: () => void } {
  let id: ReturnType<typeof setTimeout> | undefined;
  const done = new Promise<T>((resolve) => (id = setTimeout(() => resolve(value), ms)));
  return { done, cancel: () => clearTimeout(id) };
}

/** Wait for `promise`, but at most `ms` (a grandchild could keep the pipes open). */
async function atMost(promise: Promise<unknown>, ms = 5_000): Promise<void> {
  const grace = timer(ms, undefined);
  await Promise.race([promise, grace.done]);
  grace.cancel();
}

/** Start `command` with piped output, and collect both streams as they arrive. */
function start(command: string, args: string[], options: ProcessOptions) {
  const child = new Deno.Command(command, {
    args,
    env: { NO_COLOR: "1", ...options.env },
    ...(options.cwd ? { cwd: options.cwd } : {}),
    stdin: "null",
    stdout: "piped",
    stderr: "piped",
  }).spawn();
  const out = { text: "" };
  const err = { text: "" };
  const reading = Promise.all([drain(child.stdout, out), drain(child.stderr, err)]);
  return { child, out, err, reading };
}

/**
 * Run a command to its end and return what it printed. The child is killed,
 * and a {@link DeadlineError} thrown, when it runs past `timeoutMs`.
 */
export async function runToEnd(
  command: string,
  args: string[],
  options: ProcessOptions = {},
): Promise<Finished> {
  const timeoutMs = options.timeoutMs ?? defaultTimeoutMs;
  const { child, out, err, reading } = start(command, args, options);
  const deadline = timer(timeoutMs, "deadline" as const);
  const ended = await Promise.race([child.status, deadline.done]);
  deadline.cancel();
  if (ended === "deadline") {
    kill(child);
    const status = await child.status;
    if (options.killAtDeadline) {
      await atMost(reading);
      return { code: status.code, signal: status.signal, stdout: out.text, stderr: err.text };
    }
    throw new DeadlineError(
      `${command} ${args.join(" ")} did not finish within ${timeoutMs / 1000} s; ` +
        `it printed:\n${out.text}\n--- standard error ---\n${err.text}`,
    );
  }
  // A grandchild could keep the pipes open after the child ended: wait briefly, not forever.
  await atMost(reading);
  return { code: ended.code, signal: ended.signal, stdout: out.text, stderr: err.text };
}

/** A running command whose standard output is watched line by line. */
export interface WatchedProcess {
  child: Deno.ChildProcess;
  /** Everything printed on standard output so far. */
  readonly seen: string;
  /**
   * Wait until `pattern` matches the output printed after position `from`
   * (default: all of it). Kills the child and throws a {@link DeadlineError}
   * holding the output when `timeoutMs` passes first or the output ends.
   * @returns The end of the match, to pass as `from` next time.
   */
  waitFor(pattern: RegExp, options?: { from?: number; timeoutMs?: number }): Promise<number>;
  /** Send a signal and wait (bounded) for the process to end. */
  stop(signal?: Deno.Signal): Promise<Deno.CommandStatus>;
}

/** Start a long-running command (such as `tapsheet watch`) and watch its output. */
export function spawnLines(
  command: string,
  args: string[],
  options: ProcessOptions = {},
): WatchedProcess {
  const started = start(command, args, options);
  const { child, out, err } = started;
  let ended = false;
  const reading = started.reading.then(() => {
    ended = true;
  });
  const printed = () => `${out.text}\n--- standard error ---\n${err.text}`;
  return {
    child,
    get seen() {
      return out.text;
    },
    async waitFor(pattern, { from = 0, timeoutMs = options.timeoutMs ?? 60_000 } = {}) {
      const deadline = Date.now() + timeoutMs;
      const flags = pattern.flags.includes("g") ? pattern.flags : pattern.flags + "g";
      while (true) {
        const re = new RegExp(pattern.source, flags);
        re.lastIndex = from;
        const m = re.exec(out.text);
        if (m) return m.index + m[0].length;
        const left = deadline - Date.now();
        if (ended || left <= 0) {
          kill(child);
          throw new DeadlineError(
            `${ended ? "output ended" : `no match within ${timeoutMs / 1000} s`} ` +
              `waiting for ${pattern}; it printed:\n${printed()}`,
          );
        }
        // Poll: the drains append as chunks arrive; a short sleep bounds every wait.
        const tick = timer(Math.min(left, 25), undefined);
        await Promise.race([reading, tick.done]);
        tick.cancel();
      }
    },
    async stop(signal: Deno.Signal = "SIGTERM") {
      try {
        child.kill(signal);
      } catch {
        // already gone
      }
      const deadline = timer(15_000, "deadline" as const);
      const status = await Promise.race([child.status, deadline.done]);
      deadline.cancel();
      if (status === "deadline") {
        kill(child);
        await child.status;
        await atMost(reading);
        throw new DeadlineError(`the process did not end on ${signal}; it printed:\n${printed()}`);
      }
      await atMost(reading);
      return status;
    },
  };
}
