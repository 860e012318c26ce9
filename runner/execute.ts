// Stage 3: run the assembled module in a sandboxed child Deno process.
import { basename, dirname, join, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { assembleWorksheet } from "./assemble.ts";
import { decodeNumbers } from "./harness_protocol.ts";
import type { HarnessInput, HarnessMessage } from "./harness_protocol.ts";
import { messages } from "./messages.ts";
import type {
  BlockResult,
  CodePart,
  ExecutionResult,
  Exhibit,
  ParamValue,
  RunOutcome,
  SourceProblem,
  Worksheet,
} from "./types.ts";

/** Limits of one worksheet run. */
export interface ExecuteOptions {
  /** Wall-clock limit in seconds. @default 60 */
  timeoutSeconds?: number;
  /** Memory limit in MB: the JavaScript heap cap and, plus a margin for the runtime, the resident size. @default 1024 */
  memoryMb?: number;
  /** Cap on everything the child prints, in MB. @default 16 */
  outputMb?: number;
  /**
   * The library as one bundled file (see library_bundle.ts), mapped to the
   * import name "tapsheet". @default lib/mod.ts, loaded module by module
   */
  libraryModule?: string;
}

/** Root of the tapsheet project (the folder holding deno.json). */
export const projectRoot: string = resolve(dirname(fileURLToPath(import.meta.url)), "..");

/** Memory the Deno runtime itself needs on top of the worksheet's heap, in MB. */
const runtimeMarginMb = 256;

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
 * Execute a worksheet with the given parameters. Never throws for problems
 * in the worksheet: they come back as the result's outcome and problem.
 */
export async function executeWorksheet(
  worksheet: Worksheet,
  params: Record<string, ParamValue>,
  options: ExecuteOptions = {},
): Promise<ExecutionResult> {
  const timeoutSeconds = options.timeoutSeconds ?? 60;
  const memoryMb = options.memoryMb ?? 1024;
  const outputLimit = (options.outputMb ?? 16) * 1024 * 1024;
  const codeParts = worksheet.parts.filter((p): p is CodePart => p.kind === "code");
  const blocks: BlockResult[] = codeParts.map((p) => ({
    index: p.index,
    status: "not run",
    exhibits: [],
  }));
  const started = performance.now();

  const assembly = assembleWorksheet(worksheet);
  if (assembly.problems.length > 0) {
    return {
      outcome: "rejected",
      blocks,
      problem: assembly.problems[0]!,
      durationMs: performance.now() - started,
    };
  }

  const worksheetPath = resolve(worksheet.path);
  const tempDir = await Deno.makeTempDir({ prefix: "tapsheet-" });
  const modulePath = join(tempDir, basename(worksheetPath).replace(/\.md$/i, "") + ".ts");
  const moduleUrl = pathToFileURL(modulePath).href;
  try {
    await Deno.writeTextFile(modulePath, assembly.module);
    // The runner's own import names, and nothing else: no deno.json is read,
    // so a config file in the worksheet's folder cannot remap them.
    const importMap = join(tempDir, "imports.json");
    await Deno.writeTextFile(
      importMap,
      JSON.stringify({
        imports: {
          "tapsheet":
            pathToFileURL(options.libraryModule ?? join(projectRoot, "lib", "mod.ts")).href,
          "tapsheet/sheet": pathToFileURL(join(projectRoot, "runner", "sheet.ts")).href,
          ...packageImports(),
        },
      }),
    );
    const child = new Deno.Command(Deno.execPath(), {
      args: [
        "run",
        "--no-prompt",
        "--no-remote",
        "--no-config",
        `--import-map=${importMap}`,
        `--lock=${join(projectRoot, "deno.lock")}`,
        `--allow-read=${
          [
            join(projectRoot, "lib"),
            dirname(worksheetPath),
            tempDir,
            ...(options.libraryModule ? [options.libraryModule] : []),
          ].join(",")
        }`,
        `--v8-flags=--max-old-space-size=${memoryMb},--disallow-code-generation-from-strings`,
        join(projectRoot, "runner", "harness.ts"),
      ],
      cwd: dirname(worksheetPath),
      clearEnv: true,
      env: childEnvironment(),
      stdin: "piped",
      stdout: "piped",
      stderr: "piped",
    }).spawn();
    activeRuns.set(child, tempDir);

    const nonce = `\u0001${crypto.randomUUID()}\u0002`;
    const input: HarnessInput = { moduleUrl, params, nonce };
    const writer = child.stdin.getWriter();
    await writer.write(new TextEncoder().encode(JSON.stringify(input)));
    await writer.close();

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
    const timer = setTimeout(() => stop("timeout"), timeoutSeconds * 1000);
    let polling = false;
    const watchdog = setInterval(async () => {
      if (polling) return;
      polling = true;
      if ((await residentMb(child.pid)) > memoryMb + runtimeMarginMb) stop("memory limit");
      polling = false;
    }, 50);

    let printed = 0;
    let current = -1;
    let error: Extract<HarnessMessage, { kind: "error" }> | undefined;
    let done = false;
    const blockAt = (index: number) => blocks[index];
    const addExhibit = (index: number, exhibit: Exhibit) => {
      const block = blockAt(index) ?? blockAt(0);
      if (block) block.exhibits.push(exhibit);
    };
    const onLine = (line: string) => {
      if (!line.startsWith(nonce)) {
        if (line.trim() !== "") addExhibit(current, { type: "output", text: line });
        return;
      }
      const message = JSON.parse(line.slice(nonce.length), decodeNumbers) as HarnessMessage;
      switch (message.kind) {
        case "block":
          current = message.index;
          if (blockAt(current)) blockAt(current)!.status = "ok";
          break;
        case "exhibit":
          addExhibit(message.block, message.exhibit);
          break;
        case "error":
          error = message;
          break;
        case "done":
          done = true;
          break;
      }
    };
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
    const stderrLines: string[] = [];
    const [status] = await Promise.all([
      child.status,
      readLines(child.stdout, onLine),
      readLines(child.stderr, (l) => {
        if (stderrLines.length < 200) stderrLines.push(l);
      }),
    ]);
    clearTimeout(timer);
    clearInterval(watchdog);
    activeRuns.delete(child);

    const durationMs = performance.now() - started;
    const locate = (text: string, blockIndex: number): SourceProblem =>
      locateProblem(worksheet, codeParts, moduleUrl, text, blockIndex);
    let outcome: RunOutcome;
    let problem: SourceProblem | undefined;
    if (stopped !== undefined) {
      outcome = stopped;
      const message = stopped === "timeout"
        ? messages.execute.timeout(timeoutSeconds)
        : stopped === "memory limit"
        ? messages.execute.memory(memoryMb)
        : messages.execute.output(options.outputMb ?? 16);
      problem = { ...locate("", current), message };
    } else if (error !== undefined) {
      outcome = "error";
      const where = locate(`${error.message}\n${error.stack}`, error.block);
      const text = error.name === "NotCapable"
        ? messages.execute.notCapable(error.message)
        : errorSummary(error.name, error.message);
      problem = { ...where, message: text };
    } else if (
      status.code === 133 || /heap out of memory|Fatal JavaScript/i.test(stderrLines.join("\n"))
    ) {
      outcome = "memory limit";
      problem = { ...locate("", current), message: messages.execute.heap(memoryMb) };
    } else if (!done) {
      outcome = "error";
      const detail = stderrLines.join("\n").replaceAll(moduleUrl, worksheet.path).trim();
      problem = {
        ...locate(detail, current),
        message: detail
          ? detail.split("\n").slice(0, 6).join("\n")
          : messages.execute.crashed(status.code),
      };
    } else {
      outcome = "completed";
    }
    if (problem !== undefined) {
      const failing = codeParts.find((p) =>
        p.startLine <= problem!.line && problem!.line <= p.endLine
      ) ??
        codeParts[Math.max(0, current)];
      for (const b of blocks) {
        if (failing && b.index === failing.index) b.status = "failed";
        else if (failing && b.index > failing.index) {
          b.status = "not run";
        }
      }
    }
    const result: ExecutionResult = { outcome, blocks, durationMs };
    if (problem !== undefined) result.problem = problem;
    return result;
  } finally {
    await Deno.remove(tempDir, { recursive: true }).catch(() => {});
  }
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
