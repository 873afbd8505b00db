/**
 * Sweep benchmark (issue 6): throughput of `recalesce sweep` on 1 and 2 worker threads, 403 points
 * of the 3 mm demo strip (cases/demo-thin-cmn.json: thickness 2.5–4 mm × line multiplier
 * 0.8–1.4). Target on these 2-core machines: 2 workers ≥ 1.7 × the points per second of one.
 * Runs the compiled code, as `node dist/cli/main.js sweep` does. Prints figures only; also whether
 * both runs wrote the same sweep.csv.
 */
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { parseVary } from "../src/io/sweep-grid.js";
import { importCompiled } from "./compiled.js";

const CASE = "cases/demo-thin-cmn.json";

export async function benchSweep(): Promise<Record<string, unknown>> {
  const { loadCase } = await importCompiled<typeof import("../src/io/load-case.js")>("io/load-case.js");
  const { runSweep } = await importCompiled<typeof import("../src/io/sweep.js")>("io/sweep.js");
  const c = loadCase(CASE);
  const request = { vary: [parseVary("product.thickness_mm=2.5:4:0.125"), parseVary("cooling.line.htc_multiplier=0.8:1.4:0.02")], shard: null };
  const root = mkdtempSync(join(tmpdir(), "recalesce-bench-sweep-"));
  const out: Record<string, unknown> = {};
  const rate: number[] = [];
  const csv: string[] = [];
  try {
    for (const workers of [1, 2]) {
      const dir = join(root, `w${workers}`);
      const t0 = process.hrtime.bigint();
      const o = await runSweep(CASE, c, request, dir, { workers });
      const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
      rate.push(o.rows.length / seconds);
      csv.push(readFileSync(join(dir, "sweep.csv"), "utf8"));
      out[`workers_${workers}`] = { points: o.rows.length, seconds: Number(seconds.toFixed(2)), points_per_s: Number((o.rows.length / seconds).toFixed(2)) };
    }
  } finally {
    rmSync(root, { recursive: true, force: true });
  }
  return {
    case: `${CASE}: thickness 2.5–4 mm (13 values) × htc_multiplier 0.8–1.4 (31 values)`,
    ...out,
    speedup_2_workers: Number((rate[1] / rate[0]).toFixed(2)),
    same_sweep_csv: csv[0] === csv[1],
    target_min_speedup: 1.7,
  };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  benchSweep().then((r) => process.stdout.write(JSON.stringify(r, null, 2) + "\n"));
}
