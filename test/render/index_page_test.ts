import assert from "node:assert/strict";
import { reportOrder } from "../../render/index_page.ts";
import { runToEnd } from "../_process.ts";

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
  const py = await runToEnd("/usr/bin/python3", [
    "-c",
    "import json,sys; print(json.dumps(sorted(json.loads(sys.argv[1]), key=lambda s: (s.lower(), s))))",
    JSON.stringify(names),
  ]);
  const expected = JSON.parse(py.stdout);
  assert.deepEqual([...names].sort(reportOrder), expected);
});
