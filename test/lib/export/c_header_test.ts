import assert from "node:assert";
import {
  cHeader,
  type FilterDesign,
  qFormat,
  quantiseDesign,
  quantiseValues,
} from "../../../lib/mod.ts";
import { referenceCase } from "../verify/_fixture.ts";
import { runToEnd } from "../../_process.ts";

async function hasGcc(): Promise<boolean> {
  try {
    return (await runToEnd("gcc", ["--version"], { timeoutMs: 30_000 })).code === 0;
  } catch {
    return false;
  }
}
const gcc = await hasGcc();

async function run(cmd: string, args: string[], cwd: string): Promise<string> {
  const r = await runToEnd(cmd, args, { cwd, timeoutMs: 60_000 });
  if (r.code !== 0) throw new Error(`${cmd} ${args.join(" ")} failed:\n${r.stderr}`);
  return r.stdout;
}

const strict = ["-std=c99", "-Wall", "-Wextra", "-Werror"];

const fir = referenceCase("fir31").design;
const sections = referenceCase("butter4").design;

Deno.test({
  name: "C header compiles with gcc -std=c99 -Wall -Wextra -Werror, alone and included",
  ignore: !gcc,
  fn: async () => {
    const dir = await Deno.makeTempDir({ prefix: "tapsheet_c_" });
    try {
      const designs: [string, FilterDesign][] = [
        ["ecg_lowpass", fir],
        ["ecg_sections", sections],
        ["ecg_rational", { kind: "rational", numerator: [0.2, 0.2], denominator: [1, -0.6] }],
      ];
      for (const [name, design] of designs) {
        const header = cHeader(design, {
          name,
          fs: 500,
          title: "Novacardia ECG-2 front end */ ??/ – lowpass",
          document: "NV-ECG2-FLT-007",
          revision: "C",
          formats: ["float", "double", "q15", "q31", qFormat(16, 13), quantiseDesign(design, 12)],
        });
        await Deno.writeTextFile(`${dir}/${name}.h`, header);
        // source: the acceptance rule of the issue, gcc -std=c99 -Wall -Wextra -Werror -c
        await run("gcc", [...strict, "-c", "-x", "c", `${name}.h`, "-o", `${name}_h.o`], dir);
        await Deno.writeTextFile(
          `${dir}/${name}_use.c`,
          `#include "${name}.h"\n#include "${name}.h"\nint ${name}_unused_probe(void);\nint ${name}_unused_probe(void) { return 0; }\n`,
        );
        await run(
          "gcc",
          [...strict, "-pedantic", "-c", `${name}_use.c`, "-o", `${name}_use.o`],
          dir,
        );
      }
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});

Deno.test({
  name: "values read back from the compiled header equal the quantised codes and floats",
  ignore: !gcc,
  fn: async () => {
    const dir = await Deno.makeTempDir({ prefix: "tapsheet_c_" });
    try {
      const taps = fir.kind === "fir" ? Array.from(fir.taps) : [];
      const header = cHeader(fir, { name: "lp", fs: 8000, formats: ["float", "q15", "q31"] });
      await Deno.writeTextFile(`${dir}/lp.h`, header);
      await Deno.writeTextFile(
        `${dir}/main.c`,
        `#include <stdio.h>
#include "lp.h"
int main(void) {
    int i;
    for (i = 0; i < LP_TAP_COUNT; i++) {
        printf("%.9g %d %ld\\n", (double)lp_taps_float[i], (int)lp_taps_q15[i], (long)lp_taps_q31[i]);
    }
    printf("%d %d %.1f\\n", LP_Q15_FRACTION_BITS, LP_Q31_FRACTION_BITS, LP_SAMPLE_RATE_HZ);
    return 0;
}
`,
      );
      await run("gcc", [...strict, "main.c", "-o", "main"], dir);
      const lines = (await run(`${dir}/main`, [], dir)).trim().split("\n");
      const q15 = quantiseValues(taps, qFormat(16, 15)).codes;
      const q31 = quantiseValues(taps, qFormat(32, 31)).codes;
      taps.forEach((v, i) => {
        const [f, a, b] = lines[i]!.split(" ");
        // C's float is IEEE-754 binary32: the literal must round to Math.fround(v).
        assert.equal(Math.fround(Number(f)), Math.fround(v), `float tap ${i}`);
        assert.equal(Number(a), q15[i], `q15 tap ${i}`);
        assert.equal(Number(b), q31[i], `q31 tap ${i}`);
      });
      assert.equal(lines[taps.length], "15 31 8000.0");
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  },
});

Deno.test("C header comment names format, rate, document, revision and digest", () => {
  const h = cHeader(sections, {
    name: "ecg",
    fs: 500,
    document: "NV-ECG2-FLT-007",
    revision: "C",
    formats: ["float", qFormat(16, 13)],
  });
  assert.ok(h.includes(" * Design document: NV-ECG2-FLT-007"));
  assert.ok(h.includes(" * Revision:        C"));
  assert.ok(h.includes(" * Sample rate:     500 Hz"));
  assert.ok(h.includes("q2_13: Q2.13 (16-bit, 13 fraction bits)"));
  assert.ok(h.includes(`Coefficient SHA-256: ${referenceCase("butter4").sha256}`));
  assert.ok(h.includes("static const int16_t ecg_sections_q2_13[2][5]"));
  assert.ok(h.includes("#define ECG_SECTION_COUNT 2"));
  // Per-section formats of an as-verified quantised design are exported with their shifts.
  const verified = cHeader(sections, {
    name: "ecg",
    fs: 500,
    formats: [quantiseDesign(sections, 12)],
  });
  assert.ok(verified.includes("static const int ecg_sections_w12_fraction_bits[2]"));
});

Deno.test("bad header requests give a clear error", () => {
  const cases: [() => unknown, ErrorConstructor, string][] = [
    [() => cHeader(fir, { name: "2lowpass", fs: 8000 }), TypeError, "C identifier"],
    [() => cHeader(fir, { name: "low-pass", fs: 8000 }), TypeError, "C identifier"],
    [() => cHeader(fir, { name: "lp", fs: 0 }), RangeError, "Sample rate"],
    [() => cHeader(fir, { name: "lp", fs: 8000, formats: ["q15", "q15"] }), RangeError, "twice"],
    [() => cHeader(fir, { name: "lp", fs: 8000, formats: ["q7" as "q15"] }), TypeError, "q7"],
    [
      () => cHeader(fir, { name: "lp", fs: 8000, formats: [{ wordLength: 16, fractionBits: 99 }] }),
      RangeError,
      "Fraction bits",
    ],
    [
      () => cHeader(fir, { name: "lp", fs: 8000, formats: [quantiseDesign(sections, 16)] }),
      RangeError,
      "shape",
    ],
  ];
  for (const [f, kind, part] of cases) {
    assert.throws(f, (e: Error) => e instanceof kind && e.message.includes(part), part);
  }
});
