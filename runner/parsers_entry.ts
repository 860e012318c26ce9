// What the runner uses of yaml and marked, as one module for bundles.ts to
// bundle. Import these from parsers.ts, which loads the bundle.
export { isMap, isScalar, isSeq, LineCounter, parse, parseDocument, stringify } from "yaml";
export { Lexer, Marked } from "marked";
