/**
 * `recalesce sweep`: run a case over a grid of values of its numeric fields and write one row per
 * point to DIR/sweep.csv, plus DIR/summary.json describing the grid (and the caution).
 *
 * Every varied case is re-validated with the case schema before anything runs, so a value that
 * makes the case invalid stops the sweep with the path and value named and no output. Points run on
 * worker threads (task-pool.ts); rows are written in point order, and each row's text depends only
 * on its point, so a sweep cut into shards and merged again is byte-identical to the whole sweep.
 */
import { availableParallelism } from "node:os";
import type { Case } from "./case-schema.js";
import { InputError } from "./errors.js";
import { validateCase } from "./load-case.js";
import { parseCasePath, setValueAt, valueAt, type PathKey } from "./case-path.js";
import { gridSize, MAX_POINTS, pointValues, shardPoints, type Shard, type VarySpec } from "./sweep-grid.js";
import { sweepResultColumns, type SweepPointTask } from "./sweep-point.js";
import { withPool, type PoolOptions } from "./task-pool.js";
import { writeResultFolder } from "./write-folder.js";
import { SAFETY_NOTICE } from "./safety.js";

export interface SweepRequest {
  readonly vary: readonly VarySpec[];
  readonly shard: Shard | null;
}

export interface PreparedSweep {
  readonly file: string;
  readonly base: Case;
  readonly vary: readonly VarySpec[];
  readonly total: number;
  /** Point indices this run computes (all, or one shard's). */
  readonly points: readonly number[];
  /** The validated case of each of those points. */
  readonly cases: readonly Case[];
}

/** `path=value, path=value` for messages. */
function assignments(vary: readonly VarySpec[], values: readonly number[]): string {
  return vary.map((v, d) => `${v.path}=${values[d]}`).join(", ");
}

/** Checks the paths against the case and validates every varied case of this run. */
export function prepareSweep(file: string, base: Case, request: SweepRequest): PreparedSweep {
  if (request.vary.length === 0) throw new InputError(file, "--vary", "give at least one --vary path=values");
  const keys: PathKey[][] = [];
  const seen = new Set<string>();
  for (const v of request.vary) {
    const k = parseCasePath(v.path);
    if (!k) throw new InputError(file, `--vary ${v.path}`, "is not a case path; expected dotted keys with array indices, e.g. product.thickness_mm or cooling.line.banks[2].multiplier");
    if (seen.has(v.path)) throw new InputError(file, `--vary ${v.path}`, "is given twice; give each path once");
    seen.add(v.path);
    const current = valueAt(base, k);
    if (current === undefined) throw new InputError(file, v.path, "does not exist in the case (--vary needs an existing numeric field)");
    if (typeof current !== "number") throw new InputError(file, v.path, `is not a number in the case (found ${Array.isArray(current) ? "a list" : typeof current}); --vary needs a numeric field`);
    keys.push(k);
  }
  const total = gridSize(request.vary);
  if (total > MAX_POINTS) throw new InputError(file, "--vary", `the grid has ${total} points, more than ${MAX_POINTS}`);
  const points = shardPoints(total, request.shard);
  const cases = points.map((i) => {
    const values = pointValues(request.vary, i);
    const data = structuredClone(base);
    values.forEach((v, d) => setValueAt(data, keys[d], v));
    try {
      return validateCase(file, data);
    } catch (e) {
      if (e instanceof InputError) throw new InputError(file, `--vary ${assignments(request.vary, values)}`, `makes the case invalid: ${e.field}: ${e.expected}`);
      throw e;
    }
  });
  return { file, base, vary: request.vary, total, points, cases };
}

/** Header line of sweep.csv. */
export function sweepHeader(base: Case, vary: readonly VarySpec[]): string {
  return ["point", ...vary.map((v) => v.path), ...sweepResultColumns(base)].join(",") + "\n";
}

/** DIR/summary.json of a sweep (the same for the whole sweep and for merged shards). */
export function sweepSummary(p: { file: string; base: Case; vary: readonly VarySpec[]; total: number }, shard: Shard | null, pointsInFile: number): Record<string, unknown> {
  return {
    title: p.base.title,
    caution: SAFETY_NOTICE,
    case: p.file,
    vary: p.vary.map((v) => ({ path: v.path, values: v.values })),
    points: p.total,
    shard: shard ? { index: shard.index, count: shard.count } : null,
    points_in_file: pointsInFile,
    order: "point = 0-based index; the first --vary varies slowest",
    columns: ["point", ...p.vary.map((v) => v.path), ...sweepResultColumns(p.base)],
    strip_point: "line" in p.base.cooling && p.base.cooling.coil ? "body (middle) segment of the coil" : "the case's strip point",
  };
}

export interface SweepOutcome {
  readonly prepared: PreparedSweep;
  readonly summary: Record<string, unknown>;
  /** Result cells per computed point, in point order. */
  readonly rows: string[][];
}

export interface SweepRunOptions extends PoolOptions {
  readonly onProgress?: (done: number, total: number) => void;
}

/** Runs the (shard of the) sweep and writes DIR/sweep.csv and DIR/summary.json atomically. */
export async function runSweep(file: string, base: Case, request: SweepRequest, outDir: string, options: SweepRunOptions = {}): Promise<SweepOutcome> {
  // The pool starts first: its threads load their modules while this one validates the cases.
  const total = gridSize(request.vary);
  const count = total > MAX_POINTS ? 1 : shardPoints(total, request.shard).length;
  const workers = Math.max(1, Math.min(options.workers ?? availableParallelism(), count));
  const { prepared, rows } = await withPool({ workers, workerFile: options.workerFile }, async (pool) => {
    const prepared = prepareSweep(file, base, request);
    const tasks: SweepPointTask[] = prepared.cases.map((c, k) => ({ kind: "sweep-point", file, caseData: c, label: assignments(prepared.vary, pointValues(prepared.vary, prepared.points[k])) }));
    return { prepared, rows: await pool.map<string[]>(tasks, options.onProgress) };
  });
  const summary = sweepSummary(prepared, request.shard, prepared.points.length);
  writeResultFolder(outDir, (folder) => {
    const csv = folder.stream("sweep.csv");
    csv.write(sweepHeader(base, prepared.vary));
    prepared.points.forEach((point, k) => csv.write([String(point), ...pointValues(prepared.vary, point).map(String), ...rows[k]].join(",") + "\n"));
    csv.close();
    folder.writeFile("summary.json", JSON.stringify(summary, null, 2) + "\n");
  });
  return { prepared, summary, rows };
}
