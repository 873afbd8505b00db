/**
 * A whole coil: every tracked segment goes through the line with its own entry temperature and
 * speed history. Segments are independent, so they run in parallel on worker threads; each is
 * computed by the same code from the same inputs, so the result is identical to a serial run (and
 * to a run with any number of workers).
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import type { Case } from "./case-schema.js";
import { coilSegments, resolveCase, type CoilSegment } from "./resolve-case.js";
import { simulateResolved } from "./run-case.js";
import { DECIMALS, round } from "./format.js";

/** Results of one coil segment (plain data: it crosses thread boundaries). */
export interface SegmentResult {
  readonly segment: number;
  readonly position_m: number;
  readonly entry_C: number;
  readonly pyrometers_C: number[];
  readonly coiling_C: { top: number; centre: number; bottom: number; mean: number };
  readonly time_on_table_s: number;
  readonly time_under_water_s: number;
  readonly cooling_rate_under_water_K_s: number | null;
  readonly phases: Record<string, number> | null;
  /** Product fields (grain size, strength) when the product model reports them. */
  readonly product: Record<string, number | null> | null;
  readonly energy_relative_error: number;
}

/** Simulates one segment of a coil case. */
export function simulateSegment(file: string, c: Case, seg: CoilSegment): SegmentResult {
  const resolved = resolveCase(file, c, { coilPosition_m: seg.position_m, entry_C: seg.entry_C, segment: seg.index });
  const { summary, readings } = simulateResolved(c, resolved, undefined, true);
  const s = summary as {
    final: { T_C: { top: number; centre: number; bottom: number; mean: number }; phases?: Record<string, number>; product?: Record<string, number | null> };
    line: { time_on_table_s: number; time_under_water_s: number; mean_cooling_rate_under_water_K_s: number | null };
    energy: { relative_error: number };
  };
  return {
    segment: seg.index,
    position_m: round(seg.position_m, DECIMALS.position_m),
    entry_C: round(seg.entry_C, DECIMALS.T_C),
    pyrometers_C: readings.pyrometers_C.map((v) => round(v, DECIMALS.T_C)),
    coiling_C: s.final.T_C,
    time_on_table_s: s.line.time_on_table_s,
    time_under_water_s: s.line.time_under_water_s,
    cooling_rate_under_water_K_s: s.line.mean_cooling_rate_under_water_K_s,
    phases: s.final.phases ?? null,
    product: s.final.product ?? null,
    energy_relative_error: s.energy.relative_error,
  };
}

/** The compiled worker next to this module, when it exists (not under a TS test runner). */
function workerFile(): string | null {
  const url = new URL("./coil-worker.js", import.meta.url);
  if (url.protocol !== "file:") return null;
  const path = fileURLToPath(url);
  return existsSync(path) ? path : null;
}

/** Serial work [s] per worker below which starting threads does not pay (measured start-up ≈ 0.5–0.8 s). */
const THREAD_WORTH_s = 1.5;

export interface CoilRunOptions {
  /** Number of worker threads (1 = in this thread). Default: available cores. */
  readonly workers?: number;
  /** Called after each finished segment. */
  readonly onProgress?: (done: number, total: number) => void;
}

/** Runs every segment of a coil case; results in segment order. */
export async function runCoil(file: string, c: Case, options: CoilRunOptions = {}): Promise<SegmentResult[]> {
  if (!("line" in c.cooling) || !c.cooling.coil) throw new Error("runCoil needs a case with cooling.line and cooling.coil");
  const segments = coilSegments(file, c.cooling.coil);
  const requested = options.workers ?? c.cooling.coil.workers;
  let workers = Math.max(1, Math.min(requested ?? availableParallelism(), segments.length));
  const worker = workerFile();
  const results: SegmentResult[] = new Array(segments.length);
  let done = 0;
  // The first segments run here and are timed: a worker thread costs about half a second to start
  // (module loading, tables, JIT), so unless the user asked for a number of workers, threads are
  // used only when the remaining segments would take longer than that per core saved.
  // The first segment warms up this thread; the second is timed.
  const first = Math.min(2, segments.length);
  let perSegment_s = 0;
  for (let k = 0; k < first; k++) {
    const t0 = performance.now();
    results[k] = simulateSegment(file, c, segments[k]);
    perSegment_s = (performance.now() - t0) / 1000;
    options.onProgress?.(++done, segments.length);
  }
  const rest = segments.slice(first);
  if (requested === undefined && perSegment_s * rest.length < THREAD_WORTH_s * workers) workers = 1;
  if (workers === 1 || worker === null || rest.length === 0) {
    for (const seg of rest) {
      results[seg.index] = simulateSegment(file, c, seg);
      options.onProgress?.(++done, segments.length);
    }
    return results;
  }
  const { Piscina } = await import("piscina");
  const pool = new Piscina({ filename: worker, minThreads: workers, maxThreads: workers });
  try {
    await Promise.all(
      rest.map(async (seg) => {
        results[seg.index] = (await pool.run({ file, caseData: c, segment: seg })) as SegmentResult;
        options.onProgress?.(++done, segments.length);
      }),
    );
  } finally {
    await pool.destroy();
  }
  return results;
}
