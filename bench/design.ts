/**
 * Design benchmark (issue 6): `recalesce design` of the 30-segment demo coil
 * (cases/coil-6mm-acceleration.json, 6 mm, 40 cells, threading 5 m/s accelerating to 8 m/s) for a
 * 600 °C early-cooling target with flow trim, on 1 and 2 worker threads. Target: under 10 s on
 * these 2-core machines. Runs the compiled code, as `node dist/cli/main.js design` does. Prints
 * figures only; also whether both runs chose the same patterns.
 */
import { fileURLToPath } from "node:url";
import { importCompiled } from "./compiled.js";

const CASE = "cases/coil-6mm-acceleration.json";

export async function benchDesign(): Promise<Record<string, unknown>> {
  const { loadCase } = await importCompiled<typeof import("../src/io/load-case.js")>("io/load-case.js");
  const { designCooling } = await importCompiled<typeof import("../src/io/design.js")>("io/design.js");
  const c = loadCase(CASE);
  const request = { coiling_C: 600, tolerance_K: 10, strategy: "early" as const, flowRange: [0.5, 1.5] as const };
  const runs: Record<string, unknown> = {};
  const patterns: string[] = [];
  for (const workers of [1, 2]) {
    const t0 = process.hrtime.bigint();
    const o = await designCooling(CASE, c, request, { workers });
    const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
    patterns.push(JSON.stringify(o.segments.map((d) => [d.pattern, d.evaluation.coiling_C.mean])));
    runs[`workers_${workers}`] = {
      seconds: Number(seconds.toFixed(2)),
      runs: o.evaluations,
      ms_per_run: Number(((seconds * 1000) / o.evaluations).toFixed(1)),
      all_within_tolerance: o.reachable,
      worst_error_K: Math.max(...o.segments.map((d) => Math.abs(d.error_K))),
    };
  }
  return {
    case: `${CASE}: 30 segments, target 600 °C ± 10 K, early cooling, flow trim 0.5–1.5×`,
    ...runs,
    same_patterns_for_1_and_2_workers: patterns[0] === patterns[1],
    target_max_seconds: 10,
  };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  benchDesign().then((r) => process.stdout.write(JSON.stringify(r, null, 2) + "\n"));
}
