// Stage 2: Worksheet → one TypeScript module whose line N is the worksheet's line N.
import type { CodePart, SourceProblem, Worksheet } from "../record/types.ts";
import { messages } from "./messages.ts";
import { blockMarker } from "./harness_protocol.ts";

/** Import names a worksheet may use; the runner's import map resolves them. */
export const allowedImports: readonly string[] = ["tapsheet", "tapsheet/sheet"];

export { blockMarker };

/** The assembled module and any sandbox-rule violations found in the code. */
export interface Assembly {
  /** Module text; line N is worksheet line N (prose and fences are blank or markers). */
  module: string;
  problems: SourceProblem[];
}

/**
 * Build the module: every Markdown line becomes one module line, blank except
 * inside `ts` blocks, and each block's fence line calls the block marker so
 * the harness knows which block is running. Also checks each block against
 * the sandbox's import rules.
 */
export function assembleWorksheet(worksheet: Worksheet): Assembly {
  const lineCount = worksheet.source.split("\n").length;
  const out = new Array<string>(lineCount).fill("");
  const problems: SourceProblem[] = [];
  for (const part of worksheet.parts) {
    if (part.kind !== "code") continue;
    out[part.fenceLine - 1] = `${blockMarker}(${part.index});`;
    const codeLines = part.code.split("\n");
    for (let i = 0; i < codeLines.length && part.startLine + i <= part.endLine; i++) {
      out[part.startLine - 1 + i] = codeLines[i]!;
    }
    problems.push(...checkImports(worksheet.path, part));
  }
  return { module: out.join("\n") + "\n", problems };
}

interface StringLiteral {
  value: string;
  start: number;
}

/**
 * Find import specifiers and uses of import() in a block. Comments and the
 * contents of strings and templates are blanked first, so text that merely
 * mentions "import(" does not trip the check.
 */
function checkImports(path: string, part: CodePart): SourceProblem[] {
  const { code, strings } = blankStringsAndComments(part.code);
  const problems: SourceProblem[] = [];
  const lines = part.code.split("\n");
  const locate = (offset: number, message: string): SourceProblem => {
    const before = part.code.slice(0, offset).split("\n");
    const lineInBlock = before.length - 1;
    return {
      path,
      line: part.startLine + lineInBlock,
      column: before[before.length - 1]!.length + 1,
      message,
      excerpt: lines[lineInBlock] ?? "",
    };
  };
  // A string right after the keyword `from` or `import` is a module specifier.
  for (const s of strings) {
    const head = code.slice(0, s.start).replace(/\s+$/, "");
    if (/(^|[^\w$.])(from|import)$/.test(head) && !allowedImports.includes(s.value)) {
      problems.push(locate(s.start, messages.assemble.forbiddenImport(s.value)));
    }
  }
  const dynamic = /(^|[^\w$.])import\s*\(/g;
  for (let m = dynamic.exec(code); m !== null; m = dynamic.exec(code)) {
    problems.push(locate(m.index + m[1]!.length, messages.assemble.dynamicImport));
  }
  // The runner's own names (the block marker) are reserved, also as a property.
  const forbidden = /(^|[^\w$.])(require|Worker|SharedWorker)\b|(^|[^\w$])(__tapsheet\w*)/g;
  for (let m = forbidden.exec(code); m !== null; m = forbidden.exec(code)) {
    const lead = m[1] ?? m[3] ?? "";
    problems.push(locate(m.index + lead.length, messages.assemble.forbiddenName(m[2] ?? m[4]!)));
  }
  return problems;
}

/**
 * Replace comments and the insides of string and template literals with
 * spaces (newlines kept), returning the literal strings with their offsets.
 * Template substitutions `${…}` stay as code.
 */
export function blankStringsAndComments(
  source: string,
): { code: string; strings: StringLiteral[] } {
  const out = source.split("");
  const strings: StringLiteral[] = [];
  const blank = (from: number, to: number) => {
    for (let k = from; k < to; k++) if (out[k] !== "\n") out[k] = " ";
  };
  // Stack of open template literals: depth of braces inside the current substitution.
  const templates: number[] = [];
  let i = 0;
  const n = source.length;
  const readTemplateText = () => {
    // At a position inside a template's text; read to the closing ` or a ${.
    const start = i;
    while (i < n) {
      const c = source[i]!;
      if (c === "\\") {
        i += 2;
        continue;
      }
      if (c === "`") {
        blank(start, i);
        i++;
        return;
      }
      if (c === "$" && source[i + 1] === "{") {
        blank(start, i);
        i += 2;
        templates.push(0);
        return;
      }
      i++;
    }
    blank(start, i);
  };
  while (i < n) {
    const c = source[i]!;
    const next = source[i + 1];
    if (c === "/" && next === "/") {
      const end = source.indexOf("\n", i);
      const stop = end < 0 ? n : end;
      blank(i, stop);
      i = stop;
    } else if (c === "/" && next === "*") {
      const end = source.indexOf("*/", i + 2);
      const stop = end < 0 ? n : end + 2;
      blank(i, stop);
      i = stop;
    } else if (c === '"' || c === "'") {
      const start = i;
      i++;
      let value = "";
      while (i < n && source[i] !== c && source[i] !== "\n") {
        if (source[i] === "\\") {
          value += source[i + 1] ?? "";
          i += 2;
        } else {
          value += source[i];
          i++;
        }
      }
      strings.push({ value, start });
      blank(start + 1, i);
      i++;
    } else if (c === "`") {
      i++;
      readTemplateText();
    } else if (templates.length > 0 && c === "{") {
      templates[templates.length - 1]!++;
      i++;
    } else if (templates.length > 0 && c === "}") {
      if (templates[templates.length - 1] === 0) {
        templates.pop();
        i++;
        readTemplateText();
      } else {
        templates[templates.length - 1]!--;
        i++;
      }
    } else {
      i++;
    }
  }
  return { code: out.join(""), strings };
}
