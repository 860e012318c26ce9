// Stage 3: run the assembled module in a sandboxed child Deno process.
//
// executeWorksheet is a sequence of named steps: assemble and check the code,
// work out what the child may read, write the module, start the child,
// supervise it (time, memory, output) while a ProtocolSession accepts its
// messages, and conclude an ExecutionResult located in the worksheet.
import { dirname, join, relative, resolve, sep } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { assembleWorksheet } from "./assemble.ts";
import { checkedExhibit, ProtocolError } from "./exhibit_rules.ts";
import { decodeMessage, encodeMessage } from "./harness_protocol.ts";
import type { HarnessInput, HarnessMessage } from "./harness_protocol.ts";
import { messages } from "./messages.ts";
import { makeScratchFolder } from "./scratch.ts";
import { disagreement, RequirementError, resolveRequirements } from "./requirements.ts";
import type {
  BlockResult,
  CodePart,
  DeclaredRequirement,
  ExecutionResult,
  Exhibit,
  ParamValue,
  RunOutcome,
  RunProgress,
  SourceProblem,
  Worksheet,
} from "../record/types.ts";

/** Limits of one worksheet run. */
export interface ExecuteOptions {
  /** Wall-clock limit in seconds. @default 60 */
  timeoutSeconds?: number;
  /** Memory limit in MB: the JavaScript heap cap and, plus a margin for the runtime, the resident size. @default 1024 */
  memoryMb?: number;
  /** Cap on everything the child prints, in MB. @default 16 */
  outputMb?: number;
  /**
   * The library as one bundled file (see bundles.ts), mapped to the
   * import name "tapsheet". @default lib/mod.ts, loaded module by module
   */
  libraryModule?: string;
}

/** Root of the tapsheet project (the folder holding deno.json). */
export const projectRoot: string = resolve(dirname(fileURLToPath(import.meta.url)), "..");

/** Memory the Deno runtime itself needs on top of the worksheet's heap, in MB. */
const runtimeMarginMb = 256;

/** Prefix of every temporary run folder; the runner's process id follows. */
const runFolderPrefix = "tapsheet-run-";

interface Limits {
  timeoutSeconds: number;
  memoryMb: number;
  outputMb: number;
}

/** Sandbox children under way, with their temporary folders (see {@link stopAllRuns}). */
const activeRuns = new Map<Deno.ChildProcess, string>();

/**
 * Kill every sandbox child this process started and remove their temporary
 * folders, synchronously: for a runner that is being interrupted.
 */
export function stopAllRuns(): void {
  for (const [child, tempDir] of activeRuns) {
    try {
      child.kill("SIGKILL");
    } catch {
      // already gone
    }
    try {
      Deno.removeSync(tempDir, { recursive: true });
    } catch {
      // already removed
    }
  }
  activeRuns.clear();
}

/**
 * A sandbox child started for one worksheet before its code is ready: it
 * boots, starts its worker and loads the library while the parent parses the
 * worksheet and hashes its inputs. Hand it to {@link executeWorksheet}
 * (`options.sandbox`), or end it with {@link disposeSandbox} when the run is
 * not needed after all.
 */
export interface Sandbox {
  /** The worksheet it was started for, as an absolute path. */
  readonly path: string;
  /** The child and its folder, or why the worksheet may not run (a link out of data/). */
  readonly started: SandboxChild | { refusal: string };
}

interface SandboxChild {
  tempDir: string;
  child: Deno.ChildProcess;
  limits: Limits;
}

function limitsOf(options: ExecuteOptions): Limits {
  return {
    timeoutSeconds: options.timeoutSeconds ?? 60,
    memoryMb: options.memoryMb ?? 1024,
    outputMb: options.outputMb ?? 16,
  };
}

/**
 * Work out what the worksheet at `path` may read and start its sandbox child
 * (see {@link Sandbox}); resolves once the child is spawned. Never throws for
 * the worksheet's folder: a refusal comes back in `started`.
 */
export async function startSandbox(path: string, options: ExecuteOptions = {}): Promise<Sandbox> {
  const limits = limitsOf(options);
  const access = await readAccess(path);
  if ("refusal" in access) return { path: resolve(path), started: access };
  const tempDir = await makeScratchFolder(runFolderPrefix);
  try {
    await writeImportMap(tempDir, options);
    const child = startChild(tempDir, access, limits, options.libraryModule);
    activeRuns.set(child, tempDir);
    return { path: resolve(path), started: { tempDir, child, limits } };
  } catch (error) {
    await Deno.remove(tempDir, { recursive: true }).catch(() => {});
    throw error;
  }
}

/** End a sandbox that will not be used: kill its child and remove its folder. */
export async function disposeSandbox(sandbox: Sandbox): Promise<void> {
  if ("refusal" in sandbox.started) return;
  const { child, tempDir } = sandbox.started;
  try {
    child.kill("SIGKILL");
  } catch {
    // already gone
  }
  await Promise.all([
    child.stdin.close().catch(() => {}),
    child.stdout.cancel().catch(() => {}),
    child.stderr.cancel().catch(() => {}),
    child.status,
  ]);
  activeRuns.delete(child);
  await Deno.remove(tempDir, { recursive: true }).catch(() => {});
}

/**
 * Execute a worksheet with the given parameters. Never throws for problems
 * in the worksheet: they come back as the result's outcome and problem.
 * With `options.sandbox` started for this worksheet, its child runs the code;
 * else one is started here. `options.onInputSent` is called once the child
 * has its input (or could not be given it): the caller may then do other work
 * while the worksheet runs. `options.onExhibit` is told of each exhibit as it
 * is accepted, with the run so far (which it must not change).
 */
export async function executeWorksheet(
  worksheet: Worksheet,
  params: Record<string, ParamValue>,
  options: ExecuteOptions & {
    sandbox?: Sandbox;
    onInputSent?: () => void;
    onExhibit?: (exhibit: Exhibit, progress: RunProgress) => void;
  } = {},
): Promise<ExecutionResult> {
  const started = performance.now();
  const given = options.sandbox?.path === resolve(worksheet.path) ? options.sandbox : undefined;
  if (options.sandbox !== undefined && given === undefined) await disposeSandbox(options.sandbox);
  const codeParts = worksheet.parts.filter((p): p is CodePart => p.kind === "code");
  const blocks: BlockResult[] = codeParts.map((p) => ({
    index: p.index,
    status: "not run",
    exhibits: [],
  }));
  let requirements: DeclaredRequirement[] = [];
  const rejected = async (problem: SourceProblem): Promise<ExecutionResult> => {
    if (given !== undefined) await disposeSandbox(given);
    return {
      outcome: "rejected",
      requirements,
      blocks,
      problem,
      durationMs: performance.now() - started,
    };
  };
  try {
    requirements = resolveRequirements(worksheet.requirements, params);
  } catch (error) {
    if (!(error instanceof RequirementError)) throw error;
    return await rejected({ path: worksheet.path, line: 1, message: error.message });
  }

  const assembly = assembleWorksheet(worksheet);
  if (assembly.problems.length > 0) return await rejected(assembly.problems[0]!);
  const ready = (given ?? await startSandbox(worksheet.path, options)).started;
  if ("refusal" in ready) {
    return await rejected({
      path: worksheet.path,
      line: 1,
      message: ready.refusal,
      excerpt: worksheet.source.split("\n")[0],
    });
  }
  const { tempDir, child, limits } = ready;
  try {
    const moduleUrl = await writeModule(tempDir, worksheet, assembly.module);
    const session = new ProtocolSession(blocks, requirements, options.onExhibit);
    const input: HarnessInput = {
      moduleUrl,
      params,
      requirements,
      nonce: session.nonce,
      timeoutSeconds: limits.timeoutSeconds,
    };
    const ending = await superviseChild(child, input, limits, session, options.onInputSent);
    return conclude(worksheet, codeParts, moduleUrl, session, ending, limits, started);
  } finally {
    activeRuns.delete(child);
    await Deno.remove(tempDir, { recursive: true }).catch(() => {});
  }
}

/** What the child may read besides the library: the worksheet's data/ folder, resolved. */
interface ReadAccess {
  /** The worksheet's folder, links resolved: the child's working folder. */
  folder: string;
  /** The real path of data/ beside the worksheet, when there is one. */
  data?: string;
}

/**
 * The folders a worksheet may read: its own data/ folder and nothing else of
 * the disk. Links are resolved first, and a link under data/ that leads out
 * of it (or nowhere) refuses the run: the sandbox checks paths as written, so
 * a link would otherwise let the worksheet read what it points at.
 */
async function readAccess(path: string): Promise<ReadAccess | { refusal: string }> {
  const refuse = (refusal: string) => ({ refusal });
  const folder = await Deno.realPath(dirname(resolve(path)));
  const dataPath = join(folder, "data");
  let data: string;
  try {
    data = await Deno.realPath(dataPath);
  } catch {
    return { folder }; // no data folder (or a broken link, which reads nothing)
  }
  if (!(await Deno.stat(data)).isDirectory) return { folder };
  if (!isInside(data, folder)) {
    return refuse(messages.execute.linkLeaves("data", data));
  }
  const pending = [data];
  while (pending.length > 0) {
    const dir = pending.pop()!;
    for await (const entry of Deno.readDir(dir)) {
      const entryPath = join(dir, entry.name);
      if (entry.isSymlink) {
        const target = await Deno.realPath(entryPath).catch(() => undefined);
        if (target === undefined || !isInside(target, data)) {
          return refuse(
            messages.execute.linkLeaves(relative(folder, entryPath), target ?? "a missing file"),
          );
        }
      } else if (entry.isDirectory) {
        pending.push(entryPath);
      }
    }
  }
  return { folder, data };
}

function isInside(path: string, folder: string): boolean {
  return path === folder || path.startsWith(folder.endsWith(sep) ? folder : folder + sep);
}

/** Write the module and the runner's own import map; returns the module's URL. */
async function writeModule(tempDir: string, worksheet: Worksheet, module: string): Promise<string> {
  const name = worksheet.path.split(/[\\/]/).at(-1)!.replace(/\.md$/i, "");
  const modulePath = join(tempDir, `${name.replace(/[^A-Za-z0-9_.-]/g, "_")}.ts`);
  await Deno.writeTextFile(modulePath, module);
  return pathToFileURL(modulePath).href;
}

/**
 * The child's import map: the runner's own import names, and nothing else.
 * No deno.json is read, so a config file in the worksheet's folder cannot
 * remap them.
 */
async function writeImportMap(tempDir: string, options: ExecuteOptions): Promise<void> {
  await Deno.writeTextFile(
    join(tempDir, "imports.json"),
    JSON.stringify({
      imports: {
        "tapsheet": pathToFileURL(options.libraryModule ?? join(projectRoot, "lib", "mod.ts")).href,
        "tapsheet/sheet": pathToFileURL(join(projectRoot, "runner", "sheet.ts")).href,
        ...packageImports(),
      },
    }),
  );
}

/** Start the sandboxed child: read access as worked out, no other permission. */
function startChild(
  tempDir: string,
  access: ReadAccess,
  limits: Limits,
  libraryModule: string | undefined,
): Deno.ChildProcess {
  const readable = [
    join(projectRoot, "lib"),
    // The worker's entry point and the sheet API it loads (tapsheet's own code).
    join(projectRoot, "runner"),
    join(projectRoot, "record"),
    tempDir,
    ...(libraryModule ? [libraryModule] : []),
    ...(access.data ? [access.data] : []),
  ];
  return new Deno.Command(Deno.execPath(), {
    args: [
      "run",
      "--no-prompt",
      "--no-remote",
      "--no-config",
      `--import-map=${join(tempDir, "imports.json")}`,
      `--lock=${join(projectRoot, "deno.lock")}`,
      `--allow-read=${readable.join(",")}`,
      `--v8-flags=--max-old-space-size=${limits.memoryMb},--disallow-code-generation-from-strings`,
      join(projectRoot, "runner", "harness.ts"),
    ],
    cwd: access.folder,
    clearEnv: true,
    env: childEnvironment(),
    stdin: "piped",
    stdout: "piped",
    stderr: "piped",
  }).spawn();
}

/**
 * Accepts the child's messages in the only order a real run produces: block
 * markers 0, 1, 2 … each once, exhibits for the block under way (rebuilt by
 * the parent's own rules), then one error or, after the last block, done.
 * Anything else (a forged, repeated or out-of-order message) is a violation
 * and the run fails.
 */
class ProtocolSession {
  readonly nonce = `\u0001${crypto.randomUUID()}\u0002`;
  current = -1;
  done = false;
  timings: Record<string, number> | undefined;
  error: Extract<HarnessMessage, { kind: "error" }> | undefined;
  violation: string | undefined;
  /** Requirement id and design of every check so far. */
  private checked = new Set<string>();

  constructor(
    readonly blocks: BlockResult[],
    readonly requirements: DeclaredRequirement[],
    /** Told of each exhibit once accepted, with the run so far. */
    private readonly onExhibit: (exhibit: Exhibit, progress: RunProgress) => void = () => {},
  ) {}

  line(line: string): void {
    if (!line.startsWith(this.nonce)) {
      // Printed by the worksheet itself (not through the sheet API): shown as output.
      if (line.trim() !== "") this.attach({ type: "output", text: line });
      return;
    }
    if (this.violation !== undefined) return;
    try {
      this.accept(decodeMessage(line.slice(this.nonce.length)) as HarnessMessage);
    } catch (error) {
      this.violation = error instanceof Error ? error.message : String(error);
    }
  }

  private attach(exhibit: Exhibit): void {
    const block = this.blocks[Math.max(0, this.current)];
    if (block) block.exhibits.push(exhibit);
  }

  /**
   * A check stands only for a declared requirement, with its limit as
   * declared, once per design; it is named by the declaration's text.
   */
  private judge(exhibit: Extract<Exhibit, { type: "check" }>): void {
    const d = this.requirements.find((r) => r.id === exhibit.result.id);
    if (d === undefined) {
      throw new ProtocolError(`a check of '${exhibit.result.id}', which is not declared`);
    }
    const problem = disagreement(exhibit.result, d);
    if (problem !== undefined) throw new ProtocolError(problem);
    const key = `${d.id}\u0000${exhibit.design}`;
    if (this.checked.has(key)) throw new ProtocolError(`${d.id} checked twice for one design`);
    this.checked.add(key);
    exhibit.result.name = d.text;
  }

  private accept(message: HarnessMessage): void {
    if (this.done || this.error) throw new ProtocolError("a message after the end of the run");
    switch (message?.kind) {
      case "block":
        if (message.index !== this.current + 1 || message.index >= this.blocks.length) {
          throw new ProtocolError(
            `block ${message.index} reported after block ${this.current} (markers out of order)`,
          );
        }
        this.current = message.index;
        this.blocks[this.current]!.status = "ok";
        return;
      case "exhibit": {
        if (this.current < 0) throw new ProtocolError("an exhibit before the first block");
        const exhibit = checkedExhibit(message.exhibit);
        if (exhibit.type === "check") this.judge(exhibit);
        this.attach(exhibit);
        this.onExhibit(exhibit, this);
        return;
      }
      case "error":
        this.error = {
          kind: "error",
          block: this.current,
          name: String(message.name),
          message: String(message.message),
          stack: String(message.stack),
        };
        return;
      case "done":
        if (this.current !== this.blocks.length - 1) {
          throw new ProtocolError(
            `the run claimed to end after ${this.current + 1} of ${this.blocks.length} blocks`,
          );
        }
        this.done = true;
        if (message.timings && typeof message.timings === "object") {
          this.timings = Object.fromEntries(
            Object.entries(message.timings).filter(([, v]) => typeof v === "number"),
          );
        }
        return;
      default:
        throw new ProtocolError("a message of no known kind");
    }
  }
}

/** How the child ended, as seen by its supervisor. */
interface Ending {
  status: Deno.CommandStatus;
  /** Set when the supervisor stopped the child. */
  stopped?: RunOutcome;
  stderr: string[];
}

/**
 * Hand the child its input and watch it: wall-clock timeout, resident memory,
 * output size. Standard input stays open until the child ends, so the child
 * can tell when this process has gone.
 */
async function superviseChild(
  child: Deno.ChildProcess,
  input: HarnessInput,
  limits: Limits,
  session: ProtocolSession,
  onInputSent: () => void = () => {},
): Promise<Ending> {
  let stopped: RunOutcome | undefined;
  const stop = (why: RunOutcome) => {
    if (stopped !== undefined) return;
    stopped = why;
    try {
      child.kill("SIGKILL");
    } catch {
      // already gone
    }
  };
  const timer = setTimeout(() => stop("timeout"), limits.timeoutSeconds * 1000);
  let polling = false;
  const watchdog = setInterval(async () => {
    if (polling) return;
    polling = true;
    if ((await residentMb(child.pid)) > limits.memoryMb + runtimeMarginMb) stop("memory limit");
    polling = false;
  }, 50);

  const outputLimit = limits.outputMb * 1024 * 1024;
  let printed = 0;
  const readLines = async (stream: ReadableStream<Uint8Array>, handle: (l: string) => void) => {
    const decoder = new TextDecoder();
    let pending = "";
    for await (const chunk of stream) {
      printed += chunk.length;
      if (printed > outputLimit) {
        stop("output limit");
        continue;
      }
      pending += decoder.decode(chunk, { stream: true });
      const lines = pending.split("\n");
      pending = lines.pop()!;
      for (const l of lines) handle(l);
    }
    if (pending !== "") handle(pending);
  };
  const stderr: string[] = [];
  const writer = child.stdin.getWriter();
  // The input first: the child waits for it.
  const sending = writer.write(
    new TextEncoder().encode(encodeMessage(input) + "\n"),
  ).catch(() => {}).then(onInputSent);
  const [status] = await Promise.all([
    child.status,
    readLines(child.stdout, (l) => session.line(l)),
    readLines(child.stderr, (l) => {
      if (stderr.length < 200) stderr.push(l);
    }),
    sending,
  ]);
  clearTimeout(timer);
  clearInterval(watchdog);
  await writer.close().catch(() => {});
  const ending: Ending = { status, stderr };
  if (stopped !== undefined) ending.stopped = stopped;
  return ending;
}

/** Turn how the child ended into the run's outcome, its problem, and block statuses. */
function conclude(
  worksheet: Worksheet,
  codeParts: CodePart[],
  moduleUrl: string,
  session: ProtocolSession,
  ending: Ending,
  limits: Limits,
  started: number,
): ExecutionResult {
  const { blocks, current, error } = session;
  const locate = (text: string, blockIndex: number): SourceProblem =>
    locateProblem(worksheet, codeParts, moduleUrl, text, blockIndex);
  const stderr = ending.stderr.join("\n");
  let outcome: RunOutcome;
  let problem: SourceProblem | undefined;
  if (ending.stopped !== undefined) {
    outcome = ending.stopped;
    const message = ending.stopped === "timeout"
      ? messages.execute.timeout(limits.timeoutSeconds)
      : ending.stopped === "memory limit"
      ? messages.execute.memory(limits.memoryMb)
      : messages.execute.output(limits.outputMb);
    problem = { ...locate("", current), message };
  } else if (session.violation !== undefined) {
    outcome = "error";
    problem = { ...locate("", current), message: messages.execute.protocol(session.violation) };
  } else if (error !== undefined) {
    outcome = "error";
    const where = locate(`${error.message}\n${error.stack}`, error.block);
    const text = error.name === "NotCapable"
      ? messages.execute.notCapable(error.message)
      : errorSummary(error.name, error.message);
    problem = { ...where, message: text };
  } else if (ending.status.code === 133 || /heap out of memory|Fatal JavaScript/i.test(stderr)) {
    outcome = "memory limit";
    problem = { ...locate("", current), message: messages.execute.heap(limits.memoryMb) };
  } else if (!session.done) {
    outcome = "error";
    const detail = stderr.replaceAll(moduleUrl, worksheet.path).trim();
    problem = {
      ...locate(detail, current),
      message: detail
        ? detail.split("\n").slice(0, 6).join("\n")
        : messages.execute.crashed(ending.status.code),
    };
  } else {
    outcome = "completed";
  }
  if (problem !== undefined) {
    const failing = codeParts.find((p) =>
      p.startLine <= problem.line && problem.line <= p.endLine
    ) ??
      codeParts[Math.max(0, current)];
    for (const b of blocks) {
      if (failing && b.index === failing.index) b.status = "failed";
      else if (failing && b.index > failing.index) b.status = "not run";
    }
  }
  const result: ExecutionResult = {
    outcome,
    requirements: session.requirements,
    blocks,
    durationMs: performance.now() - started,
  };
  if (session.timings) result.timings = session.timings;
  if (problem !== undefined) result.problem = problem;
  return result;
}

/**
 * One line for a thrown error: its name and the first line of its message.
 * Module-load failures arrive as "TypeError: SyntaxError: …" followed by a
 * code frame; the report shows the worksheet line itself, so keep the cause.
 */
function errorSummary(name: string, message: string): string {
  const first = message.split("\n")[0]!.trim();
  const inner = /^(\w*Error): (.*)$/.exec(first);
  return inner ? `${inner[1]}: ${inner[2]}` : `${name}: ${first}`;
}

/** The npm packages of tapsheet's import map (the library's own dependencies). */
function packageImports(): Record<string, string> {
  const config = JSON.parse(Deno.readTextFileSync(join(projectRoot, "deno.json")));
  return Object.fromEntries(
    Object.entries(config.imports as Record<string, string>).filter(([, t]) =>
      t.startsWith("npm:")
    ),
  );
}

/** The few variables the child needs to find Deno's cache; nothing else passes. */
function childEnvironment(): Record<string, string> {
  const env: Record<string, string> = { NO_COLOR: "1" };
  for (const name of ["HOME", "DENO_DIR", "XDG_CACHE_HOME", "PATH"]) {
    const value = Deno.env.get(name);
    if (value !== undefined) env[name] = value;
  }
  return env;
}

/**
 * Resident set size of a process in MB. Reads /proc/PID/status, which Deno
 * allows only with --allow-all; without it, asks `ps` instead. Returns 0
 * (and warns once) when neither works, so the caller can say so.
 */
async function residentMb(pid: number): Promise<number> {
  if (rssSource === "proc") {
    try {
      const status = Deno.readTextFileSync(`/proc/${pid}/status`);
      const m = /VmRSS:\s+(\d+)\s+kB/.exec(status);
      return m ? Number(m[1]) / 1024 : 0;
    } catch (error) {
      if (!(error instanceof Deno.errors.NotCapable)) return 0; // the process has just ended
      rssSource = "ps";
    }
  }
  if (rssSource === "ps") {
    try {
      const out = await new Deno.Command("ps", {
        args: ["-o", "rss=", "-p", String(pid)],
        stdout: "piped",
        stderr: "null",
      })
        .output();
      const kb = Number(new TextDecoder().decode(out.stdout).trim());
      return Number.isFinite(kb) ? kb / 1024 : 0;
    } catch {
      rssSource = "none";
      console.error(messages.execute.noWatchdog);
    }
  }
  return 0;
}

let rssSource: "proc" | "ps" | "none" = "proc";

/**
 * Find the worksheet line of a failure: the first `module:line:col` in the
 * text, else the fence of the block that was running.
 */
function locateProblem(
  worksheet: Worksheet,
  codeParts: CodePart[],
  moduleUrl: string,
  text: string,
  blockIndex: number,
): SourceProblem {
  const lines = worksheet.source.split("\n");
  const escaped = moduleUrl.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
  const m = new RegExp(`${escaped}:(\\d+):(\\d+)`).exec(text);
  if (m) {
    const line = Number(m[1]);
    return {
      path: worksheet.path,
      line,
      column: Number(m[2]),
      message: "",
      excerpt: lines[line - 1] ?? "",
    };
  }
  const part = codeParts[blockIndex] ?? codeParts[0];
  const line = part ? part.fenceLine : 1;
  return { path: worksheet.path, line, message: "", excerpt: lines[line - 1] ?? "" };
}
