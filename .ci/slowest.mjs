// After a test run: the ten slowest tests, any test still running when the
// run was stopped, and the closing "N passed, N failed" line.
// Usage: node .ci/slowest.mjs JUNIT.xml LOG [exit-status-of-the-run]
import { existsSync, readFileSync } from "node:fs";

const [junitPath, logPath, statusText = "0"] = process.argv.slice(2);
const status = Number(statusText);
// deno-lint-ignore no-control-regex -- colour codes, in case NO_COLOR was not honoured
const log = readFileSync(logPath, "utf8").replace(/\x1b\[[0-9;]*m/g, "");

/** Seconds from Deno's duration text: "513ms", "4s", "2m0s". */
function seconds(text) {
  let total = 0;
  for (const [, value, unit] of text.matchAll(/(\d+(?:\.\d+)?)(µs|ms|m|s)/g)) {
    total += Number(value) * (unit === "µs" ? 1e-6 : unit === "ms" ? 0.001 : unit === "m" ? 60 : 1);
  }
  return total;
}

const tests = [];
if (existsSync(junitPath) && readFileSync(junitPath, "utf8").includes("<testcase")) {
  const xml = readFileSync(junitPath, "utf8");
  const unescape = (s) =>
    s.replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&lt;/g, "<").replace(/&gt;/g, ">")
      .replace(/&amp;/g, "&");
  for (const m of xml.matchAll(/<testcase name="([^"]*)" classname="([^"]*)" time="([\d.]+)"/g)) {
    tests.push({ name: unescape(m[1]), file: unescape(m[2]), seconds: Number(m[3]) });
  }
} else {
  // No JUnit file (the run was stopped): take the durations from the log.
  for (const m of log.matchAll(/^(.+?) \.\.\. (?:ok|FAILED)(?: \([^)]*\))? \(([\dmsµ.]+)\)$/gm)) {
    tests.push({ name: m[1], file: "", seconds: seconds(m[2]) });
  }
}
tests.sort((a, b) => b.seconds - a.seconds);
console.log("\nSlowest tests:");
for (const t of tests.slice(0, 10)) {
  console.log(`  ${t.seconds.toFixed(2).padStart(8)} s  ${t.name}${t.file ? `  (${t.file})` : ""}`);
}

// Deno names a test that runs long: "'name' has been running for over (1m0s)".
const finishedNames = new Set(
  [...log.matchAll(/^(.+?) \.\.\. (?:ok|FAILED|ignored)/gm)].map((m) => m[1].trim()),
);
// A test line with no result after its "..." was still running when the run ended.
const started = [...log.matchAll(/^(\S.*?) \.\.\.(.*)$/gm)]
  .filter((m) => !/^\s*(ok|FAILED|ignored)\b/.test(m[2]))
  .map((m) => m[1].trim());
const hung = [
  ...new Set(
    [...started, ...[...log.matchAll(/'(.+)' has been running for over/g)].map((m) => m[1])]
      .filter((n) => !finishedNames.has(n)),
  ),
];
// Deno's closing line looks like "ok | 12 passed (3 steps) | 0 failed (1s)".
const summary = [...log.matchAll(/^(?:ok|FAILED) \| (\d+) passed.*?\| (\d+) failed/gm)].at(-1);
// With a closing line every test finished (a "..." line can be split by other output).
if (!summary && hung.length > 0) {
  console.log("\nStill running when the run ended:");
  for (const name of hung) console.log(`  ${name}`);
}

let passed, failed;
if (summary) {
  [passed, failed] = [Number(summary[1]), Number(summary[2])];
} else {
  // Stopped before its summary: count what finished, and each stuck test as failed.
  passed = [...log.matchAll(/^.+? \.\.\. ok/gm)].length;
  failed = [...log.matchAll(/^.+? \.\.\. FAILED/gm)].length + Math.max(hung.length, 1);
  console.error(`CI: the test run printed no summary line (exit status ${status})`);
}
if (status !== 0 && failed === 0) failed = 1;
console.log(`${passed} passed, ${failed} failed`);
