// The YAML and Markdown parsers (the yaml and marked packages), loaded from
// their bundle (bundles.ts): the same code as the packages, in a tenth of the
// load time. If the bundle cannot be built or loaded, the packages are
// imported as they are.
import { pathToFileURL } from "node:url";
import { parserBundle } from "./bundles.ts";
import type * as Entry from "./parsers_entry.ts";

async function load(): Promise<typeof Entry> {
  const path = await parserBundle();
  if (path !== undefined) {
    try {
      return await import(pathToFileURL(path).href);
    } catch {
      // a damaged bundle: the packages themselves
    }
  }
  return await import("./parsers_entry.ts");
}

const parsers = await load();

/** yaml's functions and classes the runner uses. */
export const { isMap, isScalar, isSeq, LineCounter, parse, parseDocument, stringify } = parsers;
/** marked's lexer and renderer. */
export const { Lexer, Marked } = parsers;
