import assert from "node:assert/strict";
import { reportOrder } from "../../render/index_page.ts";

Deno.test("reports index: names in order of their letters without regard to case, then code units", async () => {
  // source: Python's sorted(key=lambda s: (s.lower(), s)), outside this project, as the reference order
  const names = [
    "pump_monitor_antialias",
    "Pump_monitor_antialias",
    "fir-design-comparison",
    "fir_design_comparison",
    "hum_removal-1a2b3c4d",
    "hum_removal",
    "Zeta",
    "alpha",
    "ALPHA",
    "x2",
    "x10",
  ];
  const py = new Deno.Command("/usr/bin/python3", {
    args: [
      "-c",
      "import json,sys; print(json.dumps(sorted(json.load(sys.stdin), key=lambda s: (s.lower(), s))))",
    ],
    stdin: "piped",
    stdout: "piped",
  }).spawn();
  const writer = py.stdin.getWriter();
  await writer.write(new TextEncoder().encode(JSON.stringify(names)));
  await writer.close();
  const expected = JSON.parse(new TextDecoder().decode((await py.output()).stdout));
  assert.deepEqual([...names].sort(reportOrder), expected);
});
