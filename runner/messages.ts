// Every message the runner shows a user, in one place.

export const messages = {
  parse: {
    noFrontMatter:
      "A worksheet must start with front matter: a line '---', YAML with at least 'title:', then '---'",
    unclosedFrontMatter: "Front matter starts on line 1 but has no closing '---' line",
    badYaml: (detail: string) => `Front matter is not valid YAML: ${detail}`,
    frontMatterNotMapping: "Front matter must be a YAML mapping (name: value lines)",
    unknownKey: (key: string, suggestion: string | undefined) =>
      `Unknown front-matter key '${key}'${
        suggestion ? ` (did you mean '${suggestion}'?)` : ""
      }; front matter holds title, document, revision, settings, requirements and signoff`,
    requirementsShape:
      "'requirements' must be a list, each item a mapping with id, text, atMost or atLeast, and unit",
    requirementKey: (key: string, suggestion: string | undefined) =>
      `Unknown requirement field '${key}'${
        suggestion ? ` (did you mean '${suggestion}'?)` : ""
      }; a requirement has id, text, atMost or atLeast, unit, and optionally check with its band fields`,
    requirementText: (key: string) => `Each requirement needs '${key}:' as text`,
    duplicateRequirement: (id: string, line: number) =>
      `Requirement id '${id}' is declared twice (first on line ${line}); ids must be unique`,
    requirementNumber: (id: string, key: string, found: string) =>
      `Requirement ${id}: '${key}' must be a number or the name of a number setting, got '${found}'`,
    requirementLimit: (id: string) =>
      `Requirement ${id} needs exactly one limit: 'atMost:' or 'atLeast:'`,
    requirementKind: (kind: string, suggestion: string | undefined) =>
      `Unknown requirement check '${kind}'${suggestion ? ` (did you mean '${suggestion}'?)` : ""}`,
    requirementRule: (id: string, problem: string) => `Requirement ${id}: ${problem}`,
    missingField: (key: string) => `Front matter must have '${key}:'`,
    fieldNotText: (key: string) => `Front matter '${key}' must be text or a number`,
    signoffShape: "'signoff' must be a list of roles, each a text or { role: …, name: … }",
    paramsShape: "'settings' must be a mapping of setting names to values",
    renamedKey: (old: string, now: string) =>
      `Front matter '${old}:' is now called '${now}:'; rename the key (the values stay as they are)`,
    paramName: (name: string) =>
      `Setting name '${name}' must start with a letter or '_' and hold only letters, digits and '_'`,
    paramDeclaration: (name: string) =>
      `Setting '${name}' is a mapping, so it must declare 'value:' (and may declare min, max, unit, description)`,
    paramRule: (name: string, key: string) => `Setting '${name}': '${key}' must be a number`,
    paramType: (name: string, found: string) =>
      `Setting '${name}' must be a number, text, true/false or a list of numbers, got ${found}`,
    unclosedFence: "This ```ts block is never closed: add a closing ``` line",
  },
  assemble: {
    forbiddenImport: (specifier: string) =>
      `Worksheets may import only "tapsheet" and "tapsheet/sheet", not "${specifier}"`,
    dynamicImport:
      'Worksheets may not use import(): import "tapsheet" or "tapsheet/sheet" at the top of a block',
    forbiddenName: (name: string) => `Worksheets may not use '${name}'`,
  },
  params: {
    unknown: (name: string, known: string[]) =>
      `Unknown setting '${name}'; this worksheet declares: ${known.join(", ") || "none"}`,
    badSetting: (text: string) => `A setting must look like name=value, got '${text}'`,
    wrongType: (name: string, expected: string, got: string) =>
      `Setting '${name}' must be ${expected}, got '${got}'`,
    outOfRange: (name: string, value: number, min?: number, max?: number, unit = "") =>
      `Setting '${name}' must be ${
        min !== undefined && max !== undefined
          ? `between ${min}${unit} and ${max}${unit}`
          : min !== undefined
          ? `at least ${min}${unit}`
          : `at most ${max}${unit}`
      }, got ${value}${unit}`,
  },
  execute: {
    timeout: (seconds: number) =>
      `The worksheet did not finish within ${seconds} s and was stopped (raise the limit with --timeout)`,
    memory: (mb: number) =>
      `The worksheet used more than ${mb} MB of memory and was stopped (raise the limit with --memory)`,
    heap: (mb: number) =>
      `The worksheet ran out of its ${mb} MB JavaScript heap and was stopped (raise it with --memory)`,
    output: (mb: number) => `The worksheet printed more than ${mb} MB and was stopped`,
    crashed: (code: number) => `The worksheet process ended unexpectedly (exit code ${code})`,
    notCapable: (detail: string) => {
      // Deno says: Requires read access to "/etc/hostname", run again with the --allow-read flag
      const m = /Requires (\w+) access to "?([^",]*)"?/.exec(detail);
      const what: Record<string, string> = {
        read: "read",
        write: "write",
        net: "use the network to reach",
        env: "read the environment variable",
        run: "run the program",
        ffi: "load the native library (ffi)",
        sys: "read the system information",
        import: "import",
      };
      const tried = m
        ? `the worksheet tried to ${what[m[1]!] ?? `use ${m[1]} access to`} ${m[2]}`
        : detail.split(", run again")[0];
      return `Blocked by the sandbox: ${tried}. Worksheets cannot use the network, write files, run programs, read environment variables, or read anything but the library and the data/ folder beside them`;
    },
    linkLeaves: (link: string, target: string) =>
      `${link} is a link to ${target}, outside the worksheet's data/ folder: the sandbox does not follow links out of it. Copy the file into data/ instead`,
    protocol: (detail: string) =>
      `The worksheet's run broke the sandbox protocol (${detail}), so none of its results can be trusted`,
    notRun: "Not run: an earlier block failed",
    noWatchdog:
      "tapsheet: cannot read the worksheet process's memory use (no /proc access and no 'ps'); only the JavaScript heap cap applies",
  },
  cli: {
    usage: `tapsheet: turn filter-design worksheets into signed-off design reports

Usage (in the tapsheet folder; without Deno installed, start each with npx -y deno@2.9.6):
  deno task tapsheet run <worksheet.md or folder>... [options]   run worksheets, write reports
  deno task tapsheet check <worksheet.md or folder>...           type-check without running
  deno task tapsheet new <template> <file.md>                    start from a template
  deno task tapsheet verify <worksheet.md> [--out DIR]           prove a report is what it says
  deno task tapsheet approve <worksheet.md> --role R --name N    record an approval of its report
  deno task tapsheet watch <worksheet.md> [--out DIR]            re-run on every change
  deno task tapsheet compare <old> <new> [--out DIR]             what changed between two records
  deno task tapsheet help [command]                              show help

Run 'deno task tapsheet <command> --help' for the options of a command.`,
    runUsage: `deno task tapsheet run <worksheet.md or folder>... [options]

Runs each worksheet in a sandbox and writes reports/<name>/index.html with its
figures, exports and manifest.json.

Options:
  --out DIR            output folder (default: reports)
  --set name=value     change a setting declared in front matter (repeatable)
  --settings FILE      read settings from a YAML or JSON file of name: value pairs
  --timeout SECONDS    wall-clock limit per worksheet (default: 60)
  --memory MB          memory limit per worksheet (default: 1024)
  --jobs N             worksheets run at once (default: one per processor core)
  --date YYYY-MM-DD    date printed in the report (default: SOURCE_DATE_EPOCH, else today)
  --json FILE          write machine-readable results to FILE ('-' for standard output)
  --pdf                also write report.pdf with headless Chromium, when installed
                       (the PDF is not part of the report's fingerprint)
  --force              run even when nothing changed since the last report
  --timings            print where each run's time went (child start, worksheet,
                       vega, each figure, writing)
  --exit-zero          exit with 0 even when a requirement is not met (a failed
                       worksheet still exits with 2); for rendering demos
  --help               show this help

Exit codes:
  0  every requirement met
  1  a requirement is not met
  2  a worksheet failed (error, timeout, sandbox refusal) or bad command-line use`,
    checkUsage: `deno task tapsheet check <worksheet.md or folder>...

Type-checks each worksheet's code without running it, and applies the
sandbox's import rules. Exit code 0 when all pass, 2 otherwise.`,
    newUsage: (templates: string[]) =>
      `deno task tapsheet new <template> <file.md> [--force]

Copies a template worksheet to a new file for you to edit.
Templates: ${templates.join(", ") || "none"}`,
    noTemplate: (name: string, templates: string[]) =>
      `No template '${name}'. Templates: ${templates.join(", ")}`,
    exists: (path: string) => `${path} exists already; pass --force to overwrite it`,
    wroteTemplate: (path: string, template: string) =>
      `Wrote ${path} from template '${template}'. Edit its front matter and prose, then:\n  deno task tapsheet run ${path}`,
    verifyUsage: `deno task tapsheet verify <worksheet.md> [--out DIR]

Proves that the worksheet's report is exactly what the worksheet produces:
  1. every file of the report against the SHA-256 its manifest lists, naming
     each file that changed, is missing or was added;
  2. a fresh run with the settings and date recorded in the report, compared
     byte for byte with every file of the report, the manifest included.
report.pdf (from run --pdf) is a printed copy and is not checked.
Exit code 0 when both hold, 1 when either does not, 2 on error.`,
    noReport: (manifest: string) => `No report to verify: ${manifest} is missing or unreadable`,
    approveUsage:
      `deno task tapsheet approve <worksheet.md> --role ROLE --name NAME [--date YYYY-MM-DD] [--key FILE] [--out DIR]

Records an approval of the worksheet's report in <worksheet>.approvals.yaml
beside the worksheet (keep it in version control): role, name, date, the
document and revision, and the report's fingerprint. Only an intact report of
the worksheet as it is now can be approved. The report's page shows every
approval and whether it still holds; verify checks each one, and any change to
the record voids it. With --key, the approval is signed with an Ed25519 private
key (PEM; for example from 'openssl genpkey -algorithm ed25519 -out key.pem');
the public key is recorded beside the signature.`,
    approveNeeds:
      "approve needs a worksheet, --role and --name. Run 'deno task tapsheet approve --help'.",
    noKey: (path: string) => `Key file ${path} does not exist or cannot be read`,
    approved: (
      a: { role: string; name: string; fingerprint: string; signature?: string },
      file: string,
      dir: string,
    ) =>
      `approved  ${dir} by ${a.name} (${a.role}), fingerprint ${a.fingerprint}${
        a.signature ? ", signed (Ed25519)" : ""
      }\n  recorded in ${file}`,
    verify: {
      matches: (file: string, dir: string, fingerprint: string) =>
        `${file}: every file of ${dir} is as its manifest lists, and a fresh run gives the same bytes (fingerprint ${
          fingerprint.slice(0, 16)
        })`,
      differs: (file: string, dir: string) => `${file}: ${dir} is not what this worksheet produces`,
      manifestEdited:
        "manifest.json  edited: its digest or fingerprint does not match its own content",
      changed: (path: string) => `${path}  changed since the report was written`,
      missing: (path: string) => `${path}  missing from the report`,
      added: (path: string) => `${path}  added: not part of the report`,
      cannotRerun: (why: string) => `the worksheet cannot be re-run as recorded: ${why}`,
      differsFromRerun: (path: string) => `${path}  differs from what the worksheet produces now`,
      notProduced: (path: string) => `${path}  is not produced by the worksheet now`,
      notInReport: (path: string) => `${path}  is produced by the worksheet but not in the report`,
      unchecked: (path: string) => `${path}  not checked: a printed copy, not part of the record`,
      approval: (
        s: {
          approval: { role: string; name: string; date: string; fingerprint: string };
          state: string;
          why?: string;
        },
      ) =>
        `approval  ${s.approval.name} (${s.approval.role}, ${s.approval.date}): ${
          s.state === "holds" ? "holds" : s.state.toUpperCase()
        }${s.why ? ` — ${s.why}` : ""}`,
      voided: (n: number) =>
        `${n} approval${n === 1 ? " no longer holds" : "s no longer hold"}: the report ${
          n === 1 ? "it names is" : "they name is"
        } not the one the worksheet produces now`,
    },
    watching: (dir: string) => `Watching ${dir} for changes (Ctrl-C to stop)`,
    watchRunning: (path: string) => `running ${path}…`,
    watchedFileGone: (path: string) => `${path} is gone; waiting for it to come back`,
    interrupted: (signal: string) =>
      `tapsheet: stopped by ${signal}; no report was left half-written`,
    badParamsFile: (path: string) => `Settings file ${path} must hold name: value pairs`,
    renamedOption: (old: string, now: string) =>
      `Option '${old}' is now called '${now}'. Run 'deno task tapsheet run --help'.`,
    rerunBecause: (why: string) => `re-run: ${why}`,
    watchUsage:
      `deno task tapsheet watch <worksheet.md> [--out DIR] [--set name=value]... [--date YYYY-MM-DD]

Runs the worksheet, then runs it again whenever it or a file under its data/
folder changes. Figures whose content did not change are not rendered again.
Stop with Ctrl-C.`,
    noChromium: "No PDF written: Chromium is not installed (on Debian: apt-get install chromium)",
    unknownCommand: (name: string) =>
      `Unknown command '${name}'. Run 'deno task tapsheet help' for the commands.`,
    unknownOption: (name: string, command: string) =>
      `Unknown option '${name}'. Run 'deno task tapsheet ${command} --help' for its options.`,
    missingValue: (name: string) => `Option '${name}' needs a value`,
    noWorksheets: "Give at least one worksheet file or folder",
    notFound: (path: string) => `No such worksheet or folder: ${path}`,
    noWorksheetsIn: (path: string, subfolders: number) =>
      subfolders > 0
        ? `${path} holds no worksheets (*.md), only ${subfolders} subfolder${
          subfolders === 1 ? "" : "s"
        }; folders are not searched below their top level: name the subfolder instead`
        : `${path} is empty: it holds no worksheets (*.md)`,
    notMarkdown: (path: string) =>
      `${path} is not a worksheet: worksheets are Markdown files (*.md)`,
    outIsFile: (path: string) => `--out must name a folder for the reports, but ${path} is a file`,
    paramsFileMissing: (path: string) => `Settings file ${path} does not exist or cannot be read`,
    paramsFileYaml: (path: string, detail: string) =>
      `Settings file ${path} is not valid YAML or JSON: ${detail}`,
    badNumber: (name: string, text: string) =>
      `Option '${name}' needs a positive number, got '${text}'`,
    badDate: (text: string) => `--date needs a real calendar date as YYYY-MM-DD, got '${text}'`,
  },
  compare: {
    usage: `deno task tapsheet compare <old> <new> [--out DIR]

Compares two design records of a worksheet and writes a comparison page
(DIR/index.html, its figures, and comparison.json). Each side is one of:
  reports/<name>          a report folder (one written by 'run')
  worksheet.md            the working copy, run now in the sandbox
  worksheet.md@REV        the worksheet and its data/ folder as git has them at
                          revision REV (HEAD~1, a tag, a commit), run in the sandbox
Worksheets are run with their own settings into a temporary folder, which is
removed afterwards.

It names what changed: title, document, revision and settings; requirements
added, removed or with another limit; verdicts; each coefficient listing
(length, layout, largest change of a value, of a code in LSBs); implementation
costs; exports; and overlays each magnitude, passband, phase and group-delay
figure of the old record on the new, with the new mask and new − old beneath.

Got worse, for the exit code, means: a requirement removed; a limit made looser
(or changed in relation or unit); a requirement that was met is not met or no
longer checked on a design; one that was checked and not met is no longer
checked; or one not met on both sides falls further short of its limit.

Options:
  --out DIR   folder for the comparison (default: reports/<name>-comparison);
              an existing folder must be empty or an earlier comparison
  --help      show this help

Exit codes:
  0  nothing a requirement covers got worse
  1  something a requirement covers got worse
  2  bad command-line use, or a side that cannot be read or fetched`,
    notFound: (arg: string) =>
      `'${arg}' is neither a report folder nor a worksheet; give reports/<name>, worksheet.md or worksheet.md@REV`,
    notAReport: (dir: string) =>
      `${dir} is a folder but not a report: it has no readable manifest.json (write one with 'deno task tapsheet run')`,
    noGit: "Comparing a worksheet at a revision needs git, which is not installed",
    gitFailed: (what: string, detail: string) => `git could not ${what}: ${detail}`,
    folderMissing: (dir: string) =>
      `The folder ${dir} does not exist here, so git cannot be asked about it`,
    notInRepository: (path: string) => `${path} is not inside a git repository`,
    unknownRevision: (rev: string) => `git knows no revision '${rev}'`,
    notAtRevision: (path: string, rev: string) => `${path} does not exist at revision ${rev}`,
    linkAtRevision: (path: string, rev: string) =>
      `${path} is a symbolic link at revision ${rev}; the sandbox reads only plain files under data/`,
    outIsFile: (dir: string) => `--out must name a folder for the comparison, but ${dir} is a file`,
    outNotComparison: (dir: string) =>
      `${dir} holds files but no comparison.json; choose an empty or new folder for --out (it is replaced whole)`,
    running: (label: string) => `running ${label}…`,
    sideIncomplete: (side: string, label: string, where: string, message: string) =>
      `the ${side} side (${label}) did not run to the end: ${where}: ${message}`,
    sideAltered: (side: string, dir: string, files: string) =>
      `the ${side} report ${dir} is not as its manifest lists (${files}); compared as it is`,
    unreadable: (side: string, path: string, reason: string) =>
      `${side} ${path} could not be read: ${reason}`,
    headline: {
      unchanged: "unchanged",
      changed: "changed",
      worse: "worse",
    },
    counts: (worse: number, changes: number) =>
      `${worse > 0 ? `${worse} got worse, ` : ""}${changes} change${changes === 1 ? "" : "s"}`,
    worse: {
      "met to not met": (row: string) => `got worse: ${row} was met and is not met now`,
      "met to not checked": (row: string) => `got worse: ${row} was met and is no longer checked`,
      "no longer checked": (row: string) =>
        `got worse: ${row} was not met and is no longer checked`,
      "shortfall grew": (row: string) => `got worse: ${row} falls further short of its limit`,
      "removed": (row: string) => `got worse: ${row} is no longer declared`,
      "limit looser": (row: string) => `got worse: ${row} has a looser limit`,
      "limit not comparable": (row: string) =>
        `got worse: ${row} changed its relation or unit, so its limit cannot be shown to be as strict`,
    },
    identity: (field: string, old: string, now: string) => `${field}: ${old} → ${now}`,
    settingChanged: (name: string, old: string, now: string) => `setting ${name}: ${old} → ${now}`,
    settingAdded: (name: string, value: string) => `setting ${name} added: ${value}`,
    settingRemoved: (name: string, value: string) => `setting ${name} removed (was ${value})`,
    requirementAdded: (id: string, text: string, limit: string) =>
      `requirement ${id} added: ${text}, ${limit}`,
    requirementRemoved: (id: string, text: string, limit: string) =>
      `requirement ${id} removed: ${text}, ${limit}`,
    requirementLimit: (id: string, old: string, now: string, move: string) =>
      `requirement ${id} limit: ${old} → ${now} (${move})`,
    requirementText: (id: string, old: string, now: string) =>
      `requirement ${id} text: "${old}" → "${now}"`,
    verdict: (row: string, old: string, now: string, margins: string) =>
      `${row}: ${old} → ${now}${margins}`,
    designPaired: (old: string, now: string) =>
      `design "${old}" is compared with "${now}" (no design of that name; paired by order)`,
    shortfall: (row: string, margins: string) => `${row}: not met, further short${margins}`,
    listingAdded: (name: string, count: number) => `listing ${name} added (${count} values)`,
    listingRemoved: (name: string, count: number) => `listing ${name} removed (had ${count})`,
    listingShape: (name: string, what: string) => `listing ${name}: ${what}`,
    listingValues: (name: string, largest: string, at: string, changed: number, count: number) =>
      `listing ${name}: largest change of a value ${largest} at ${at} (${changed} of ${count} changed)`,
    listingCodes: (name: string, lsb: number, at: string, changed: number, format: string) =>
      `listing ${name}: largest change of a code ${lsb} LSB${
        lsb === 1 ? "" : "s"
      } of ${format} at ${at} (${changed} code${changed === 1 ? "" : "s"} changed)`,
    listingCodesNotCompared: (name: string, why: string) =>
      `listing ${name}: codes not compared, ${why}`,
    costAdded: (name: string) => `cost ${name} added`,
    costRemoved: (name: string) => `cost ${name} removed`,
    costChanged: (name: string, fields: string) => `cost ${name}: ${fields}`,
    exportChange: (path: string, change: string) => `export ${path} ${change}`,
    figure: (title: string, delta: string, at: string, series: string) =>
      `figure ${title}: largest change ${delta} at ${at}${series}`,
    figureMask: (title: string) => `figure ${title}: its mask changed`,
    figureOnly: (title: string, side: string) => `figure ${title} only in the ${side} record`,
    wrote: (path: string) => `→ ${path}`,
  },
} as const;
