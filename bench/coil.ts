/**
 * Whole-coil benchmark (issue 4): the demo mill's coil case (cases/coil-6mm-acceleration.json:
 * 30 segments of a 6 mm C-Mn strip, 40 cells, 10 ms steps, 100 m table with water banks B1–B3,
 * composition-based kinetics) run through the compiled CLI, so that segments go to worker threads
 * as in real use. Wall time of the whole process (start-up, threads, writing the result folder),
 * median of 3 runs, with the default worker count (all cores) and serially (--workers 1).
 * Target: under 3 s on the project's 2-core machines. Figures only, no assertions.
 *
 * Builds dist/ first (npm run build). Run alone: npx tsx bench/coil.ts
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { availableParallelism, tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { pathToFileURL } from "node:url";

const REPO = resolve(import.meta.dirname, "..");
const CASE = "cases/coil-6mm-acceleration.json";
const RUNS = 3;

interface Timing {
  readonly workers: number | "default";
  readonly wall_s: number[];
  readonly median_wall_s: number;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** One whole CLI process; returns its wall time [s], or throws with its stderr. */
function runOnce(out: string, workers: number | "default"): number {
  const args = ["dist/cli/main.js", "run", CASE, "--out", out, "--quiet"];
  if (workers !== "default") args.push("--workers", String(workers));
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, args, { cwd: REPO, encoding: "utf8" });
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`recalesce run exited ${r.status}: ${r.stderr.trim()}`);
  return seconds;
}

function timeRuns(scratch: string, workers: number | "default"): Timing {
  const wall: number[] = [];
  for (let i = 0; i < RUNS; i++) wall.push(runOnce(join(scratch, `w${workers}-${i}`), workers));
  return { workers, wall_s: wall.map((s) => Number(s.toFixed(3))), median_wall_s: Number(median(wall).toFixed(3)) };
}

export function benchCoil(): Record<string, unknown> {
  const about = {
    case: `${CASE}: 30 segments, 6 mm, 40 cells, 10 ms steps, 100 m table, Li 1998 kinetics, through dist/cli/main.js`,
    cores: availableParallelism(),
    runs: RUNS,
    target_max_wall_s: 3,
  };
  try {
    execFileSync("npm", ["run", "build"], { cwd: REPO, stdio: "pipe", encoding: "utf8" });
  } catch (e) {
    return { ...about, error: `npm run build failed: ${String((e as { stdout?: string }).stdout ?? e).trim()}` };
  }
  const scratch = mkdtempSync(join(tmpdir(), "recalesce-bench-coil-"));
  try {
    const parallel = timeRuns(scratch, "default");
    const serial = timeRuns(scratch, 1);
    const summary = JSON.parse(readFileSync(join(scratch, "wdefault-0", "summary.json"), "utf8")) as { coil?: { segments: number } };
    return {
      ...about,
      segments_run: summary.coil?.segments ?? null,
      parallel,
      serial,
      speedup_serial_over_parallel: Number((serial.median_wall_s / parallel.median_wall_s).toFixed(3)),
    };
  } catch (e) {
    return { ...about, error: (e as Error).message };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  process.stdout.write(JSON.stringify({ node: process.version, coil: benchCoil() }, null, 2) + "\n");
}
