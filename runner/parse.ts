// Stage 1: worksheet text → Worksheet (identity, parameters, prose and code parts).
import { isMap, isScalar, isSeq, Lexer, LineCounter, parseDocument } from "./parsers.ts";
import type { Node as YamlNode, YAMLMap } from "yaml";
import type {
  CodePart,
  NumberOrParam,
  ParamRule,
  ParamValue,
  ProsePart,
  RequirementDeclaration,
  SignoffRole,
  SourceProblem,
  Worksheet,
  WorksheetMeta,
} from "../record/types.ts";
import { messages } from "./messages.ts";
import { declarationProblem, kindRules, requirementFields } from "./requirements.ts";

/** Thrown when a worksheet cannot be parsed; carries the file and line. */
export class WorksheetError extends Error {
  constructor(readonly problem: SourceProblem) {
    super(`${problem.path}:${problem.line}: ${problem.message}`);
    this.name = "WorksheetError";
  }
}

export type { ParamRule } from "../record/types.ts";

/** A parsed worksheet plus where each parameter is declared. */
export interface ParsedWorksheet extends Worksheet {
  /** Line of each parameter's declaration, for error messages. */
  paramLines: Record<string, number>;
}

/**
 * Parse a worksheet. Front matter is a YAML block between `---` lines at the
 * very top; code parts are top-level fenced blocks whose info string starts
 * with `ts`. Line numbers are 1-based and refer to the file as written.
 *
 * @throws {WorksheetError} On bad front matter, a bad parameter or an unclosed fence.
 */
export function parseWorksheet(path: string, text: string): ParsedWorksheet {
  const source = text.replace(/\r\n?/g, "\n");
  const lines = source.split("\n");
  const fail = (line: number, message: string, column?: number): never => {
    const problem: SourceProblem = { path, line, message };
    if (column !== undefined) problem.column = column;
    const excerpt = lines[line - 1];
    if (excerpt !== undefined) problem.excerpt = excerpt;
    throw new WorksheetError(problem);
  };

  // Front matter.
  if (lines[0]?.trim() !== "---") fail(1, messages.parse.noFrontMatter);
  let close = -1;
  for (let i = 1; i < lines.length; i++) {
    const t = lines[i]!.trim();
    if (t === "---" || t === "...") {
      close = i;
      break;
    }
  }
  if (close < 0) fail(1, messages.parse.unclosedFrontMatter);
  const yamlText = lines.slice(1, close).join("\n");
  const counter = new LineCounter();
  const doc = parseDocument(yamlText, { lineCounter: counter, prettyErrors: true });
  const yamlLine = (offset: number | undefined): number =>
    offset === undefined ? 1 : counter.linePos(offset).line + 1;
  const firstError = doc.errors[0];
  if (firstError) {
    const pos = firstError.linePos?.[0];
    fail(pos ? pos.line + 1 : 2, messages.parse.badYaml(firstError.message.split("\n")[0]!));
  }
  const root = doc.contents;
  if (!isMap(root)) fail(2, messages.parse.frontMatterNotMapping);
  const lineOf = (node: unknown): number => yamlLine((node as YamlNode | null)?.range?.[0]);

  for (const pair of (root as YAMLMap).items) {
    const key = String((pair.key as { value?: unknown } | null)?.value ?? pair.key);
    if (key in renamedKeys) {
      fail(lineOf(pair.key), messages.parse.renamedKey(key, renamedKeys[key]!));
    }
    if (!frontMatterKeys.includes(key)) {
      fail(lineOf(pair.key), messages.parse.unknownKey(key, closest(key, frontMatterKeys)));
    }
  }
  const field = (key: string): unknown => (root as YAMLMap).get(key, true);
  const textField = (key: string, required: boolean): string => {
    const node = field(key) as YamlNode | undefined;
    if (node === undefined) {
      if (required) fail(1, messages.parse.missingField(key));
      return "";
    }
    const value = isScalar(node) ? node.value : undefined;
    if (typeof value !== "string" && typeof value !== "number") {
      fail(lineOf(node), messages.parse.fieldNotText(key));
    }
    return String(value);
  };
  const meta: WorksheetMeta = {
    title: textField("title", true),
    document: textField("document", false),
    revision: textField("revision", false),
    signoff: [],
  };

  const signoffNode = field("signoff") as YamlNode | undefined;
  if (signoffNode !== undefined) {
    if (!isSeq(signoffNode)) fail(lineOf(signoffNode), messages.parse.signoffShape);
    for (const item of (signoffNode as { items: unknown[] }).items) {
      const value = (item as { toJSON(): unknown }).toJSON();
      if (typeof value === "string") {
        meta.signoff.push({ role: value });
      } else if (
        value && typeof value === "object" && typeof (value as SignoffRole).role === "string"
      ) {
        const v = value as SignoffRole;
        meta.signoff.push(
          v.name === undefined ? { role: v.role } : { role: v.role, name: String(v.name) },
        );
      } else {
        fail(lineOf(item), messages.parse.signoffShape);
      }
    }
  }

  const params: Record<string, ParamValue> = {};
  const paramRules: Record<string, ParamRule> = {};
  const paramLines: Record<string, number> = {};
  const paramsNode = field("settings") as YamlNode | undefined;
  if (paramsNode !== undefined) {
    if (!isMap(paramsNode)) fail(lineOf(paramsNode), messages.parse.paramsShape);
    for (const pair of (paramsNode as { items: { key: unknown; value: unknown }[] }).items) {
      const name = String((pair.key as { value?: unknown }).value ?? pair.key);
      const line = lineOf(pair.key);
      paramLines[name] = line;
      if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) fail(line, messages.parse.paramName(name));
      const raw = (pair.value as { toJSON?: () => unknown } | null)?.toJSON?.() ?? null;
      let value: unknown = raw;
      if (raw !== null && typeof raw === "object" && !Array.isArray(raw)) {
        const declared = raw as Record<string, unknown>;
        if (!("value" in declared)) fail(line, messages.parse.paramDeclaration(name));
        value = declared.value;
        const rule: ParamRule = {};
        for (const key of ["min", "max"] as const) {
          if (declared[key] !== undefined) {
            if (typeof declared[key] !== "number") fail(line, messages.parse.paramRule(name, key));
            rule[key] = declared[key] as number;
          }
        }
        if (declared.unit !== undefined) rule.unit = String(declared.unit);
        if (declared.description !== undefined) rule.description = String(declared.description);
        paramRules[name] = rule;
      }
      if (!isParamValue(value)) fail(line, messages.parse.paramType(name, describe(value)));
      params[name] = value as ParamValue;
    }
  }
  const requirements = parseRequirements(
    field("requirements") as YamlNode | undefined,
    params,
    lineOf,
    fail,
  );

  // Body: walk marked's top-level tokens, whose raw strings add up to the source. Only the
  // block level is lexed: what is inside a paragraph or a heading does not matter here.
  const bodyStart = close + 1; // 0-based index of the first body line
  const body = lines.slice(bodyStart).join("\n");
  const tokens = new Lexer().blockTokens(body);
  const parts: (ProsePart | CodePart)[] = [];
  let line = bodyStart + 1; // 1-based line of the current token's first character
  let prose: string[] = [];
  let proseStart = line;
  const flushProse = (endLine: number) => {
    const markdown = prose.join("");
    if (markdown.trim() !== "") {
      parts.push({ kind: "prose", markdown, startLine: proseStart, endLine });
    }
    prose = [];
  };
  let codeIndex = 0;
  for (const token of tokens) {
    const raw = token.raw;
    const tokenLines = raw.split("\n").length - 1;
    const isCode = token.type === "code" && /^\s{0,3}(```|~~~)/.test(raw) &&
      /^ts\b/.test(((token as { lang?: string }).lang ?? "").trim());
    if (isCode) {
      const rawLines = raw.replace(/\n+$/, "").split("\n");
      const fence = /^\s{0,3}(`{3,}|~{3,})/.exec(rawLines[0]!)![1]!;
      const last = rawLines[rawLines.length - 1]!.trim();
      const closed = rawLines.length > 1 && last.startsWith(fence) &&
        last.replace(/[`~]/g, "") === "" && last[0] === fence[0];
      if (!closed) fail(line, messages.parse.unclosedFence);
      flushProse(line - 1);
      const codeLines = rawLines.slice(1, -1);
      parts.push({
        kind: "code",
        index: codeIndex++,
        code: codeLines.join("\n"),
        fenceLine: line,
        startLine: line + 1,
        endLine: line + codeLines.length,
      });
      proseStart = line + tokenLines;
    } else {
      if (prose.length === 0) proseStart = line;
      prose.push(raw);
    }
    line += tokenLines;
  }
  flushProse(line);
  return { path, source, meta, params, paramRules, paramLines, requirements, parts };
}

const requirementKeys = ["id", "text", "atMost", "atLeast", "unit", "check", ...requirementFields];

/**
 * The `requirements:` list: each item declares one requirement once, with an
 * id, the text as written, one limit (`atMost:` or `atLeast:`, a number or the
 * name of a number parameter), its unit, and optionally `check:` naming the
 * library requirement kind that checks it, with that kind's band fields.
 */
function parseRequirements(
  node: YamlNode | undefined,
  params: Record<string, ParamValue>,
  lineOf: (node: unknown) => number,
  fail: (line: number, message: string) => never,
): RequirementDeclaration[] {
  if (node === undefined) return [];
  if (!isSeq(node)) fail(lineOf(node), messages.parse.requirementsShape);
  const out: RequirementDeclaration[] = [];
  const seen = new Map<string, number>();
  for (const item of (node as { items: unknown[] }).items) {
    const line = lineOf(item);
    if (!isMap(item)) fail(line, messages.parse.requirementsShape);
    const entry = new Map<string, { value: unknown; line: number }>();
    for (const pair of (item as YAMLMap).items) {
      const key = String((pair.key as { value?: unknown } | null)?.value ?? pair.key);
      const keyLine = lineOf(pair.key);
      if (!requirementKeys.includes(key)) {
        fail(keyLine, messages.parse.requirementKey(key, closest(key, requirementKeys)));
      }
      const value = (pair.value as { toJSON?: () => unknown } | null)?.toJSON?.() ?? null;
      entry.set(key, { value, line: keyLine });
    }
    const text = (key: string): string => {
      const v = entry.get(key)?.value;
      if (typeof v !== "string" && typeof v !== "number") {
        fail(entry.get(key)?.line ?? line, messages.parse.requirementText(key));
      }
      return String(v);
    };
    const id = text("id");
    if (seen.has(id)) {
      fail(entry.get("id")!.line, messages.parse.duplicateRequirement(id, seen.get(id)!));
    }
    seen.set(id, entry.get("id")!.line);
    const numberOrParam = (key: string, allowHalfRate = false): NumberOrParam => {
      const { value, line: at } = entry.get(key)!;
      if (typeof value === "number" && Number.isFinite(value)) return value;
      if (allowHalfRate && value === "fs/2") return value;
      if (typeof value === "string" && typeof params[value] === "number") return value;
      return fail(at, messages.parse.requirementNumber(id, key, String(value)));
    };
    const limits = ["atMost", "atLeast"].filter((k) => entry.has(k));
    if (limits.length !== 1) fail(line, messages.parse.requirementLimit(id));
    const relation = limits[0] as "atMost" | "atLeast";
    const declaration: RequirementDeclaration = {
      id,
      text: text("text"),
      relation,
      limit: numberOrParam(relation),
      unit: entry.has("unit") ? text("unit") : "",
      fields: {},
      line,
    };
    if (entry.has("check")) {
      const kind = text("check");
      if (!(kind in kindRules)) {
        fail(
          entry.get("check")!.line,
          messages.parse.requirementKind(kind, closest(kind, Object.keys(kindRules))),
        );
      }
      declaration.kind = kind as keyof typeof kindRules;
    }
    for (const f of requirementFields) {
      if (entry.has(f)) declaration.fields[f] = numberOrParam(f, f === "to");
    }
    const problem = declarationProblem(declaration);
    if (problem !== undefined) fail(line, messages.parse.requirementRule(id, problem));
    out.push(declaration);
  }
  return out;
}

/** The keys front matter may hold; anything else is a mistake worth stopping for. */
export const frontMatterKeys: readonly string[] = [
  "title",
  "document",
  "revision",
  "settings",
  "requirements",
  "signoff",
];

/** Keys an earlier version used, with the name they have now. */
const renamedKeys: Record<string, string> = { params: "settings" };

/** The known word nearest to a misspelt one (at most two edits away), if any. */
export function closest(word: string, known: readonly string[]): string | undefined {
  const distance = (a: string, b: string) => {
    let row = Array.from({ length: b.length + 1 }, (_, j) => j);
    for (let i = 1; i <= a.length; i++) {
      const next = [i];
      for (let j = 1; j <= b.length; j++) {
        const cost = a[i - 1] === b[j - 1] ? 0 : 1;
        next[j] = Math.min(row[j]! + 1, next[j - 1]! + 1, row[j - 1]! + cost);
      }
      row = next;
    }
    return row[b.length]!;
  };
  let best: string | undefined;
  let bestDistance = 3;
  for (const k of known) {
    const d = distance(word.toLowerCase(), k.toLowerCase());
    if (d < bestDistance) [best, bestDistance] = [k, d];
  }
  return best;
}

function isParamValue(value: unknown): value is ParamValue {
  if (typeof value === "number") return Number.isFinite(value);
  if (typeof value === "string" || typeof value === "boolean") return true;
  return Array.isArray(value) && value.every((v) => typeof v === "number" && Number.isFinite(v));
}

function describe(value: unknown): string {
  if (value === null) return "nothing (null)";
  if (Array.isArray(value)) return "a list that is not all numbers";
  if (typeof value === "object") return "a mapping";
  return `${typeof value} ${JSON.stringify(value)}`;
}
